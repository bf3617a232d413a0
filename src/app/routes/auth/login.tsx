import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { Link, Navigate, useNavigate, useSearchParams } from "react-router-dom";
import { loginInputSchema, type LoginInput } from "@shared/schemas/auth";
import { isAuthPath, useLogin, useMe } from "@/features/auth/api/auth";
import { AuthLayout } from "@/components/layouts/auth-layout";
import { InputField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { paths } from "@/config/paths";

export default function LoginPage() {
  const [params] = useSearchParams();
  const asked = params.get("redirectTo");
  // Only a page of the app is a place to return to (not another sign-in page, not another site).
  const redirectTo = asked && asked.startsWith("/") && !asked.startsWith("//") && !isAuthPath(asked.split("?")[0]!) ? asked : null;
  const navigate = useNavigate();
  const me = useMe();
  const login = useLogin();
  const form = useForm<LoginInput>({ resolver: formResolver(zodResolver(loginInputSchema)), defaultValues: { email: "", password: "" } });
  if (me.data) return <Navigate to={redirectTo?.startsWith("/") ? redirectTo : "/"} replace />;
  const onSubmit = form.handleSubmit((v) =>
    login.mutate(v, { onSuccess: () => void navigate(redirectTo?.startsWith("/") ? redirectTo : "/", { replace: true }) }),
  );
  return (
    <AuthLayout title="Sign in">
      <form onSubmit={onSubmit} noValidate className="grid gap-4">
        <InputField
          label="E-mail"
          type="email"
          autoComplete="username"
          autoFocus
          {...form.register("email")}
          error={form.formState.errors.email?.message}
        />
        <InputField
          label="Password"
          type="password"
          autoComplete="current-password"
          {...form.register("password")}
          error={form.formState.errors.password?.message}
        />
        {login.error && <ErrorAlert error={login.error} title="Not signed in" />}
        <Button type="submit" size="lg" busy={login.isPending}>
          Sign in
        </Button>
        <Link to={paths.auth.forgot.getHref()} className="text-center text-sm text-ink underline-offset-2 hover:underline">
          Forgot your password?
        </Link>
      </form>
    </AuthLayout>
  );
}
