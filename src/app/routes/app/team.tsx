import { useMe } from "@/features/auth/api/auth";
import { useInvitations, useMembers } from "@/features/team/api/team";
import { MembersTable } from "@/features/team/components/members-table";
import { InviteForm } from "@/features/team/components/invite-form";
import { InvitationsList } from "@/features/team/components/invitations-list";
import { Outbox } from "@/features/team/components/outbox";
import { AuditLog } from "@/features/team/components/audit-log";
import { ProductionSettingsForm } from "@/features/productions/components/production-settings-form";
import { EaseRangesForm } from "@/features/productions/components/ease-ranges-form";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Spinner, ErrorAlert } from "@/components/ui/feedback";

/** Members, roles, invitations and (in development) the local outbox. */
export default function TeamPage() {
  const { productionId, production } = useCurrentProduction();
  const me = useMe();
  const members = useMembers(productionId);
  const invitations = useInvitations(productionId);
  return (
    // grid-cols-1 is minmax(0, 1fr): wide tables scroll inside their cards instead of widening the page on a phone.
    <div className="grid grid-cols-1 gap-4">
      <PageHeader title="Team" subtitle={production ? `Who works on ${production.title}, and in which role` : undefined} />
      <Card>
        <h2 className="mb-3 font-semibold text-ink">Members</h2>
        {members.isPending ? (
          <Spinner />
        ) : members.error ? (
          <ErrorAlert error={members.error} />
        ) : (
          <MembersTable productionId={productionId} members={members.data} currentUserId={me.data?.id ?? ""} />
        )}
      </Card>
      <Card>
        <h2 className="mb-3 font-semibold text-ink">Invite someone</h2>
        <InviteForm productionId={productionId} />
        <h3 className="mt-5 mb-1 text-sm font-semibold text-ink">Invitations</h3>
        {invitations.isPending ? (
          <Spinner />
        ) : invitations.error ? (
          <ErrorAlert error={invitations.error} />
        ) : (
          <InvitationsList productionId={productionId} invitations={invitations.data} />
        )}
      </Card>
      {production && (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">Production settings</h2>
          <ProductionSettingsForm key={production.id} production={production} />
        </Card>
      )}
      {production && (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">Ease ranges for the fit check</h2>
          <EaseRangesForm key={production.id} production={production} />
        </Card>
      )}
      <Card>
        <h2 className="mb-3 font-semibold text-ink">Recent changes</h2>
        <AuditLog productionId={productionId} />
      </Card>
      <Card>
        <h2 className="mb-1 font-semibold text-ink">Outbox (development)</h2>
        <p className="mb-3 text-xs text-slate">
          Mail to this production's members, caught by the local SMTP server; nothing here left the machine. Password-reset and invitation
          mail is never shown.
        </p>
        <Outbox productionId={productionId} />
      </Card>
    </div>
  );
}
