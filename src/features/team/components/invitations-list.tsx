import { useState } from "react";
import type { InvitationDto } from "@shared/schemas/members";
import { ConfirmDialog } from "@/components/ui/dialog";
import { ErrorAlert } from "@/components/ui/feedback";
import { roleLabels } from "@shared/permissions";
import { Badge } from "@/components/ui/feedback";
import { Button } from "@/components/ui/button";
import { useRevokeInvitation } from "../api/team";

/** Pending and past invitations; pending ones can be withdrawn. */
export function InvitationsList({ productionId, invitations }: { productionId: string; invitations: InvitationDto[] }) {
  const revoke = useRevokeInvitation(productionId);
  const [withdrawing, setWithdrawing] = useState<InvitationDto | null>(null);
  if (!invitations.length) return <p className="text-sm text-slate">No invitations sent yet.</p>;
  return (
    <>
      {revoke.error && <ErrorAlert error={revoke.error} title="Not withdrawn" />}
      <ConfirmDialog
        open={Boolean(withdrawing)}
        title={`Withdraw the invitation to ${withdrawing?.email ?? ""}?`}
        confirmLabel="Withdraw invitation"
        danger
        busy={revoke.isPending}
        onCancel={() => setWithdrawing(null)}
        onConfirm={() => withdrawing && revoke.mutate(withdrawing.id, { onSettled: () => setWithdrawing(null) })}
      >
        The link in their e-mail stops working. To let them in later, send a new invitation.
      </ConfirmDialog>
      <ul className="divide-y divide-chalk-200 text-sm">
        {invitations.map((i) => (
          <li key={i.id} className="flex flex-wrap items-center justify-between gap-2 py-2">
            <span>
              <span className="font-semibold">{i.email}</span> · {roleLabels[i.role]}
            </span>
            <span className="flex items-center gap-2">
              <Badge tone={i.status === "pending" ? "warning" : i.status === "accepted" ? "neutral" : "note"}>{i.status}</Badge>
              {i.status === "pending" && (
                <Button size="sm" variant="ghost" busy={revoke.isPending && revoke.variables === i.id} onClick={() => setWithdrawing(i)}>
                  Withdraw
                </Button>
              )}
            </span>
          </li>
        ))}
      </ul>
    </>
  );
}
