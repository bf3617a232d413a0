import { useAuditEvents } from "../api/team";
import { Spinner, ErrorAlert, EmptyState } from "@/components/ui/feedback";
import { useProductionTime } from "@/hooks/use-production-time";

const label = (action: string) => action.replace(/[._]/g, " ");

/** The latest changes in the production: who, what, when. */
export function AuditLog({ productionId }: { productionId: string }) {
  const q = useAuditEvents(productionId);
  const { dateTime } = useProductionTime();
  if (q.isPending) return <Spinner />;
  if (q.error) return <ErrorAlert error={q.error} />;
  if (!q.data.length) return <EmptyState title="Nothing recorded yet" />;
  return (
    <ul className="divide-y divide-chalk-200 text-sm">
      {q.data.map((e) => (
        <li key={e.id} className="flex flex-wrap justify-between gap-2 py-1.5">
          <span>
            <span className="font-semibold text-ink-900">{e.actorName ?? "System"}</span> · {label(e.action)}
          </span>
          <time className="text-xs text-slate" dateTime={e.createdAt}>
            {dateTime(e.createdAt)}
          </time>
        </li>
      ))}
    </ul>
  );
}
