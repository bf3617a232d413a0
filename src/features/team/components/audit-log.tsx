import { Link } from "react-router-dom";
import { useAuditEvents } from "../api/team";
import { Spinner, ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { useProductionTime } from "@/hooks/use-production-time";

const label = (action: string) => action.replace(/[._]/g, " ");

/** The latest changes in the production: who did what to which record (with a link to it), and when. */
export function AuditLog({ productionId }: { productionId: string }) {
  const q = useAuditEvents(productionId);
  const { dateTime } = useProductionTime();
  if (q.isPending) return <Spinner />;
  if (q.error) return <ErrorAlert error={q.error} />;
  if (!q.data.length) return <EmptyState title="Nothing recorded yet" />;
  return (
    <ul className="divide-y divide-chalk-200 text-sm" aria-label="Recent changes">
      {q.data.map((e) => (
        <li key={e.id} className="flex flex-wrap justify-between gap-x-2 gap-y-0.5 py-1.5">
          <span className="min-w-0">
            <span className="font-semibold text-ink-900">{e.actorName ?? "System"}</span> · {label(e.action)}
            {e.record && (
              <>
                {" · "}
                {e.record.href ? (
                  <Link to={e.record.href} className="font-semibold break-words text-ink underline underline-offset-2">
                    {e.record.label}
                  </Link>
                ) : (
                  <span className="break-words">
                    {e.record.label}
                    {e.record.gone && <span className="text-slate"> (deleted)</span>}
                  </span>
                )}
              </>
            )}
          </span>
          <time className="text-xs text-slate" dateTime={e.createdAt}>
            {dateTime(e.createdAt)}
          </time>
        </li>
      ))}
    </ul>
  );
}
