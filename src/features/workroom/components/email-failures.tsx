import { useState } from "react";
import type { EmailJobDto } from "@shared/schemas/workroom";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Button } from "@/components/ui/button";
import { Badge, ErrorAlert } from "@/components/ui/feedback";
import { useRetryEmailJob } from "../api/workroom";

/** Workroom e-mails that are not sent yet or failed (supervisors), with a retry. */
export function EmailFailures({ productionId, jobs }: { productionId: string; jobs: EmailJobDto[] }) {
  const retry = useRetryEmailJob(productionId);
  const [again, setAgain] = useState<EmailJobDto | null>(null);
  if (jobs.length === 0) return <p className="text-sm text-slate">Every invitation and reminder went out.</p>;
  return (
    <div className="grid gap-2">
      {retry.error && <ErrorAlert error={retry.error} title="Not queued" />}
      <ul className="grid gap-2" aria-label="Unsent e-mails">
        {jobs.map((j) => (
          <li key={j.id} className="flex flex-wrap items-center justify-between gap-2 rounded border border-chalk-200 p-2 text-sm">
            <span>
              <Badge tone={j.status === "failed" ? "blocking" : "warning"}>{j.status}</Badge>{" "}
              <span className="font-semibold">{j.subject}</span> → {j.recipient}
              <span className="block text-xs text-slate">
                {j.attempts} attempt{j.attempts === 1 ? "" : "s"}
                {j.lastError ? ` · ${j.lastError}` : ""}
              </span>
            </span>
            {j.status !== "sent" && (
              <Button size="sm" variant="secondary" busy={retry.isPending && retry.variables === j.id} onClick={() => setAgain(j)}>
                Send again
              </Button>
            )}
          </li>
        ))}
      </ul>
      <ConfirmDialog
        open={Boolean(again)}
        title="Send this e-mail again?"
        confirmLabel="Send again"
        busy={retry.isPending}
        onCancel={() => setAgain(null)}
        onConfirm={() => again && retry.mutate(again.id, { onSettled: () => setAgain(null) })}
      >
        “{again?.subject}” goes to {again?.recipient}. If an earlier attempt did reach them, they get it twice.
      </ConfirmDialog>
    </div>
  );
}
