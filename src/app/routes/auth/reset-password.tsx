import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { z } from "zod";
import { useNavigate, useParams } from "react-router-dom";
import { passwordSchema } from "@shared/schemas/auth";
import { useResetPassword } from "@/features/auth/api/auth";
import { AuthLayout } from "@/components/layouts/auth-layout";
import { InputField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";

const schema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { message: "does not match", path: ["confirm"] });

export default function ResetPasswordPage() {
  const { token = "" } = useParams();
  const navigate = useNavigate();
  const reset = useResetPassword();
  const form = useForm<z.infer<typeof schema>>({
    resolver: formResolver(zodResolver(schema)),
    defaultValues: { password: "", confirm: "" },
  });
  return (
    <AuthLayout title="Choose a new password">
      <form
        onSubmit={form.handleSubmit((v) =>
          reset.mutate({ token, password: v.password }, { onSuccess: () => void navigate("/", { replace: true }) }),
        )}
        noValidate
        className="grid gap-4"
      >
        <InputField
          label="New password"
          type="password"
          autoComplete="new-password"
          hint="At least 10 characters."
          {...form.register("password")}
          error={form.formState.errors.password?.message}
        />
        <InputField
          label="Repeat it"
          type="password"
          autoComplete="new-password"
          {...form.register("confirm")}
          error={form.formState.errors.confirm?.message}
        />
        {reset.error && <ErrorAlert error={reset.error} title="Not changed" />}
        <Button type="submit" size="lg" busy={reset.isPending}>
          Save password and sign in
        </Button>
      </form>
    </AuthLayout>
  );
}
