import { Link } from "react-router-dom";
import type { FittingDto } from "@shared/schemas/workroom";
import { Badge, EmptyState } from "@/components/ui/feedback";
import { useProductionTime } from "@/hooks/use-production-time";

/** Fittings by start time, each a large link to the tablet view. */
export function FittingsList({ productionId, fittings }: { productionId: string; fittings: FittingDto[] }) {
  const { dateTime: when } = useProductionTime();
  if (fittings.length === 0) return <EmptyState title="No fittings booked">Book the first one with the button above.</EmptyState>;
  return (
    <ul className="grid gap-2" aria-label="Fittings">
      {fittings.map((f) => (
        <li key={f.id}>
          <Link
            to={`/p/${productionId}/workroom/fittings/${f.id}`}
            className="flex min-h-14 flex-wrap items-center justify-between gap-2 rounded-md border border-chalk-200 bg-white px-3 py-2 hover:border-ink-100"
          >
            <span>
              <span className="font-semibold text-ink-900">{f.performerName}</span>
              <span className="text-sm text-slate"> · {f.changeLabel ?? "general fitting"}</span>
              <span className="block text-sm text-slate">
                {when(f.startsAt)} · {f.durationMinutes} min{f.room ? ` · ${f.room}` : ""}
                {f.attendeeNames.length ? ` · ${f.attendeeNames.join(", ")}` : ""}
              </span>
            </span>
            <span className="flex gap-1">
              {f.ticketCount > 0 && (
                <Badge>
                  {f.ticketCount} ticket{f.ticketCount === 1 ? "" : "s"}
                </Badge>
              )}
              <Badge tone={f.status === "cancelled" ? "blocking" : f.status === "done" ? "note" : "neutral"}>{f.status}</Badge>
            </span>
          </Link>
        </li>
      ))}
    </ul>
  );
}
