import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { z } from "zod";
import { useQuery } from "@tanstack/react-query";
import { Link, useNavigate, useParams } from "react-router-dom";
import { passwordSchema } from "@shared/schemas/auth";
import { roleLabels } from "@shared/permissions";
import { invitationQueryOptions, useAcceptInvitation, useMe } from "@/features/auth/api/auth";
import { AuthLayout } from "@/components/layouts/auth-layout";
import { InputField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { paths } from "@/config/paths";

const schema = z.object({ name: z.string().trim().min(1, "is required").max(120), password: passwordSchema });

export default function InvitationPage() {
  const { token = "" } = useParams();
  const navigate = useNavigate();
  const me = useMe();
  const preview = useQuery(invitationQueryOptions(token));
  const accept = useAcceptInvitation();
  const form = useForm<z.infer<typeof schema>>({ resolver: formResolver(zodResolver(schema)), defaultValues: { name: "", password: "" } });
  const go = (productionId: string) => navigate(paths.production.root.getHref(productionId), { replace: true });

  if (preview.isPending)
    return (
      <AuthLayout title="Invitation">
        <Spinner />
      </AuthLayout>
    );
  if (preview.error)
    return (
      <AuthLayout title="Invitation">
        <ErrorAlert error={preview.error} title="Cannot use this link" />
      </AuthLayout>
    );
  const inv = preview.data;
  return (
    <AuthLayout title={`Join ${inv.productionTitle}`}>
      <p className="mb-4 text-sm text-slate">
        You are invited as <strong className="text-ink-900">{roleLabels[inv.role]}</strong> ({inv.email}).
      </p>
      {inv.accountExists ? (
        me.data?.email === inv.email ? (
          <Button
            size="lg"
            className="w-full"
            busy={accept.isPending}
            onClick={() => accept.mutate({ token }, { onSuccess: (r) => void go(r.productionId) })}
          >
            Join the production
          </Button>
        ) : (
          <p className="text-sm">
            An account with this address exists.{" "}
            <Link className="font-semibold text-ink underline" to={paths.auth.login.getHref(paths.auth.invitation.getHref(token))}>
              Sign in as {inv.email}
            </Link>{" "}
            to accept.
          </p>
        )
      ) : (
        <form
          onSubmit={form.handleSubmit((v) => accept.mutate({ token, ...v }, { onSuccess: (r) => void go(r.productionId) }))}
          noValidate
          className="grid gap-4"
        >
          <InputField
            label="Your name"
            autoComplete="name"
            autoFocus
            {...form.register("name")}
            error={form.formState.errors.name?.message}
          />
          <InputField
            label="Choose a password"
            type="password"
            autoComplete="new-password"
            hint="At least 10 characters."
            {...form.register("password")}
            error={form.formState.errors.password?.message}
          />
          <Button type="submit" size="lg" busy={accept.isPending}>
            Create account and join
          </Button>
        </form>
      )}
      {accept.error && (
        <div className="mt-3">
          <ErrorAlert error={accept.error} title="Not joined" />
        </div>
      )}
    </AuthLayout>
  );
}
