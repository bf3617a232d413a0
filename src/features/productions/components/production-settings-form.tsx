import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { z } from "zod";
import { DEFAULT_CURRENCY, DEFAULT_PAPER_SIZE, type ProductionDto } from "@shared/schemas/productions";
import { useUpdateProduction } from "../api/productions";
import { InputField, SelectField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { ApiError } from "@/lib/api-client";

const num = (min: number, max: number) =>
  z.union([z.literal(""), z.coerce.number().min(min, `at least ${min}`).max(max, `at most ${max}`)]);
const formSchema = z.object({
  title: z.string().trim().min(1, "is required").max(200),
  startsOn: z.string(),
  endsOn: z.string(),
  units: z.enum(["cm", "in"]),
  bufferWorkingDays: num(0, 10),
  quickChangeThresholdMin: num(0, 60),
  reminderHour: num(0, 23),
  seamToleranceMm: num(0, 50),
  currency: z.union([
    z.literal(""),
    z
      .string()
      .trim()
      .regex(/^[A-Za-z]{3}$/, "three letters, such as GBP, EUR or USD"),
  ]),
  paperSize: z.enum(["A4", "Letter"]),
});
type FormValues = z.input<typeof formSchema>;

const opt = (v: unknown) => (v === "" || v === undefined ? undefined : Number(v));

/** Title, dates, units and the thresholds the computations use. Supervisor only. */
export function ProductionSettingsForm({ production }: { production: ProductionDto }) {
  const update = useUpdateProduction(production.id);
  const s = production.settings;
  const form = useForm<FormValues>({
    resolver: formResolver(zodResolver(formSchema)),
    defaultValues: {
      title: production.title,
      startsOn: production.startsOn ?? "",
      endsOn: production.endsOn ?? "",
      units: production.units,
      bufferWorkingDays: s.bufferWorkingDays ?? "",
      quickChangeThresholdMin: s.quickChangeThresholdMin ?? "",
      reminderHour: s.reminderHour ?? "",
      seamToleranceMm: s.seamToleranceMm ?? "",
      currency: s.currency ?? "",
      paperSize: s.paperSize ?? DEFAULT_PAPER_SIZE,
    },
  });
  const e = form.formState.errors;
  const onSubmit = form.handleSubmit((v) =>
    update.mutate(
      {
        title: v.title,
        startsOn: v.startsOn || null,
        endsOn: v.endsOn || null,
        units: v.units,
        settings: {
          bufferWorkingDays: opt(v.bufferWorkingDays),
          quickChangeThresholdMin: opt(v.quickChangeThresholdMin),
          reminderHour: opt(v.reminderHour),
          seamToleranceMm: opt(v.seamToleranceMm),
          currency: v.currency ? v.currency.toUpperCase() : undefined,
          paperSize: v.paperSize,
        },
      },
      {
        onError: (err) => {
          if (err instanceof ApiError)
            for (const [k, m] of Object.entries(err.fields))
              form.setError(k.replace(/^settings\./, "") as keyof FormValues, { message: m });
        },
      },
    ),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-2" aria-label="Production settings">
      <InputField label="Title" className="sm:col-span-2" {...form.register("title")} error={e.title?.message} />
      <InputField label="First day" type="date" {...form.register("startsOn")} error={e.startsOn?.message} />
      <InputField label="Last day" type="date" {...form.register("endsOn")} error={e.endsOn?.message} />
      <SelectField
        label="Measurement units"
        {...form.register("units")}
        hint="Everything is stored in millimetres; this is how it is shown and entered."
      >
        <option value="cm">Centimetres</option>
        <option value="in">Inches</option>
      </SelectField>
      <InputField
        label="Workroom buffer (working days)"
        type="number"
        inputMode="numeric"
        {...form.register("bufferWorkingDays")}
        error={e.bufferWorkingDays?.message}
        hint={`Finished alterations are due this many working days before the ${scheduleLabels(production).day}.`}
      />
      {production.kind === "stage" && (
        <InputField
          label="Quick change threshold (minutes)"
          type="number"
          step="0.5"
          {...form.register("quickChangeThresholdMin")}
          error={e.quickChangeThresholdMin?.message}
        />
      )}
      <InputField label="Evening reminder hour (0–23)" type="number" {...form.register("reminderHour")} error={e.reminderHour?.message} />
      <InputField
        label="Seam length tolerance (mm)"
        type="number"
        step="0.5"
        {...form.register("seamToleranceMm")}
        error={e.seamToleranceMm?.message}
      />
      <InputField
        label="Currency"
        placeholder={DEFAULT_CURRENCY}
        autoCapitalize="characters"
        maxLength={3}
        {...form.register("currency")}
        error={e.currency?.message}
        hint={`ISO 4217 code for every cost and the budget (default ${DEFAULT_CURRENCY}).`}
      />
      <SelectField
        label="Paper for printed reports"
        {...form.register("paperSize")}
        error={e.paperSize?.message}
        hint="Continuity books and rack lists."
      >
        <option value="A4">A4 (210 × 297 mm)</option>
        <option value="Letter">US Letter (8.5 × 11 in)</option>
      </SelectField>
      <div className="flex items-center gap-3 sm:col-span-2">
        <Button type="submit" busy={update.isPending} disabled={!form.formState.isDirty}>
          Save settings
        </Button>
        {update.isSuccess && !form.formState.isDirty && <span className="text-sm text-ink">Saved.</span>}
      </div>
      {update.error && !(update.error instanceof ApiError && Object.keys(update.error.fields).length) && (
        <div className="sm:col-span-2">
          <ErrorAlert error={update.error} title="Not saved" />
        </div>
      )}
    </form>
  );
}
