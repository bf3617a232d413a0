import { useState } from "react";
import { useOutbox } from "../api/team";
import { Spinner, ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useProductionTime } from "@/hooks/use-production-time";

/**
 * Mail the local SMTP fake caught for this production (development only): reminders, fitting and packet
 * notices sent to its members. Sign-in mail (password resets, invitations) never shows here.
 */
export function Outbox({ productionId }: { productionId: string }) {
  const q = useOutbox(productionId, true);
  const [open, setOpen] = useState<string | null>(null);
  const { dateTime } = useProductionTime();
  if (q.isPending) return <Spinner />;
  if (q.error instanceof ApiError && q.error.status === 404)
    return <p className="text-sm text-slate">This server has no outbox: mail goes to the configured mail relay.</p>;
  if (q.error) return <ErrorAlert error={q.error} title="Outbox unavailable" />;
  if (!q.data.length)
    return <EmptyState title="No messages yet">Reminders and notices sent to this production's members appear here.</EmptyState>;
  return (
    <ul className="divide-y divide-chalk-200 text-sm">
      {q.data.map((m) => (
        <li key={m.id} className="py-2">
          <button
            type="button"
            className="w-full text-left"
            aria-expanded={open === m.id}
            onClick={() => setOpen(open === m.id ? null : m.id)}
          >
            <span className="block font-semibold text-ink-900">{m.subject || "(no subject)"}</span>
            <span className="block text-xs text-slate">
              to {m.recipients} · {dateTime(m.receivedAt)}
              {m.attachments.length ? ` · ${m.attachments.map((a) => a.filename ?? a.contentType).join(", ")}` : ""}
            </span>
          </button>
          {open === m.id && (
            <pre className="mt-2 whitespace-pre-wrap break-words rounded bg-chalk p-3 font-sans text-xs text-ink-900">{m.textBody}</pre>
          )}
        </li>
      ))}
    </ul>
  );
}
