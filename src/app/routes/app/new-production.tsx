import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { useNavigate } from "react-router-dom";
import { z } from "zod";
import { createProductionInputSchema, productionKinds } from "@shared/schemas/productions";
import { useCreateProduction } from "@/features/productions/api/productions";
import { AuthLayout } from "@/components/layouts/auth-layout";
import { InputField, SelectField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { paths } from "@/config/paths";

type FormValues = z.input<typeof createProductionInputSchema>;

export default function NewProductionPage() {
  const navigate = useNavigate();
  const create = useCreateProduction();
  const form = useForm<FormValues>({
    resolver: formResolver(zodResolver(createProductionInputSchema)),
    defaultValues: { title: "", kind: "film", units: "cm", startsOn: null, endsOn: null },
  });
  const onSubmit = form.handleSubmit((v) =>
    create.mutate(createProductionInputSchema.parse({ ...v, startsOn: v.startsOn || null, endsOn: v.endsOn || null }), {
      onSuccess: (p) => void navigate(paths.production.screen.getHref(p.id, "team")),
    }),
  );
  const e = form.formState.errors;
  return (
    <AuthLayout title="New production">
      <form onSubmit={onSubmit} noValidate className="grid gap-4">
        <InputField label="Title" autoFocus {...form.register("title")} error={e.title?.message} />
        <SelectField label="Kind" {...form.register("kind")} error={e.kind?.message}>
          {productionKinds.map((k) => (
            <option key={k} value={k}>
              {k === "film" ? "Feature film" : k === "series" ? "Series" : "Stage"}
            </option>
          ))}
        </SelectField>
        <div className="grid grid-cols-2 gap-3">
          <InputField
            label="First day"
            type="date"
            {...form.register("startsOn", { setValueAs: (v) => v || null })}
            error={e.startsOn?.message}
          />
          <InputField
            label="Last day"
            type="date"
            {...form.register("endsOn", { setValueAs: (v) => v || null })}
            error={e.endsOn?.message}
          />
        </div>
        <SelectField label="Measurement units" {...form.register("units")} hint="Stored in millimetres either way.">
          <option value="cm">Centimetres</option>
          <option value="in">Inches</option>
        </SelectField>
        {create.error && <ErrorAlert error={create.error} title="Not created" />}
        <Button type="submit" size="lg" busy={create.isPending}>
          Create production
        </Button>
        <Button variant="ghost" onClick={() => navigate(-1)}>
          Cancel
        </Button>
      </form>
    </AuthLayout>
  );
}
