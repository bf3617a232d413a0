import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { formResolver } from "@/lib/form-errors";
import { inviteMemberInputSchema, type InviteMemberInput } from "@shared/schemas/members";
import { roles, roleLabels } from "@shared/permissions";
import { InputField, SelectField } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useInviteMember } from "../api/team";

/** Invite by e-mail with a role; schema checked here and again on the server. */
export function InviteForm({ productionId }: { productionId: string }) {
  const invite = useInviteMember(productionId);
  const form = useForm<InviteMemberInput>({
    resolver: formResolver(zodResolver(inviteMemberInputSchema)),
    defaultValues: { email: "", role: "set_costumer" },
  });
  const onSubmit = form.handleSubmit((values) =>
    invite.mutate(values, {
      onSuccess: () => form.reset({ email: "", role: values.role }),
      onError: (err) => {
        if (err instanceof ApiError)
          for (const [k, m] of Object.entries(err.fields)) form.setError(k as keyof InviteMemberInput, { message: m });
      },
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-[1fr_14rem_auto] sm:items-end" aria-label="Invite a member">
      <InputField label="E-mail" type="email" autoComplete="off" {...form.register("email")} error={form.formState.errors.email?.message} />
      <SelectField label="Role" {...form.register("role")} error={form.formState.errors.role?.message}>
        {roles.map((r) => (
          <option key={r} value={r}>
            {roleLabels[r]}
          </option>
        ))}
      </SelectField>
      <Button type="submit" busy={invite.isPending} className="sm:mb-0.5">
        Send invitation
      </Button>
      {invite.isSuccess && <p className="text-sm text-ink sm:col-span-3">Invitation sent to {invite.data.email}.</p>}
      {invite.error && !(invite.error instanceof ApiError && Object.keys(invite.error.fields).length) && (
        <div className="sm:col-span-3">
          <ErrorAlert error={invite.error} title="Not sent" />
        </div>
      )}
    </form>
  );
}
