import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { Link } from "react-router-dom";
import { requestPasswordResetInputSchema, type RequestPasswordResetInput } from "@shared/schemas/auth";
import { useRequestPasswordReset } from "@/features/auth/api/auth";
import { AuthLayout } from "@/components/layouts/auth-layout";
import { InputField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { paths } from "@/config/paths";

export default function ForgotPasswordPage() {
  const reset = useRequestPasswordReset();
  const form = useForm<RequestPasswordResetInput>({
    resolver: formResolver(zodResolver(requestPasswordResetInputSchema)),
    defaultValues: { email: "" },
  });
  return (
    <AuthLayout title="Reset your password">
      {reset.isSuccess ? (
        <p className="text-sm text-ink-900">{reset.data.message} The link works once and expires in an hour.</p>
      ) : (
        <form onSubmit={form.handleSubmit((v) => reset.mutate(v))} noValidate className="grid gap-4">
          <InputField
            label="E-mail"
            type="email"
            autoComplete="username"
            autoFocus
            {...form.register("email")}
            error={form.formState.errors.email?.message}
          />
          {reset.error && <ErrorAlert error={reset.error} />}
          <Button type="submit" size="lg" busy={reset.isPending}>
            Send reset link
          </Button>
        </form>
      )}
      <Link to={paths.auth.login.getHref()} className="mt-4 block text-center text-sm text-ink underline-offset-2 hover:underline">
        Back to sign in
      </Link>
    </AuthLayout>
  );
}
