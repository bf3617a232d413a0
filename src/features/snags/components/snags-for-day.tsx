import { Link } from "react-router-dom";
import { scheduleLabels, type ScheduleKind } from "@shared/domain/schedule-labels";
import { Card } from "@/components/ui/card";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { formatDate } from "@shared/format";
import { useSnags } from "../api/snags";
import { SnagCard } from "./snag-card";

/**
 * The open snags of the next shoot day (or performance), or of the day given, compact, with a link
 * to the Snags screen.
 */
export function SnagsForDay({
  productionId,
  kind = "film",
  max = 8,
  day: given,
}: {
  productionId: string;
  kind?: ScheduleKind;
  max?: number;
  day?: { id: string; date: string; kind: "shoot" | "performance" };
}) {
  const q = useSnags(productionId, { shootDayId: given?.id ?? "next" });
  const day = given ?? q.data?.nextShootDay;
  return (
    <Card role="region" aria-label={given ? `Snags for ${formatDate(given.date)}` : "Snags for the next day"}>
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="font-semibold text-ink">
          Snags{day ? ` for ${scheduleLabels(day.kind === "performance" ? "stage" : "film").on(day.date)}` : ""}
        </h2>
        <Link to={`/p/${productionId}/snags`} className="text-sm font-semibold text-ink underline-offset-2 hover:underline">
          All snags
        </Link>
      </div>
      {q.isPending ? (
        <Spinner />
      ) : q.error ? (
        <ErrorAlert error={q.error} />
      ) : !day ? (
        <p className="text-sm text-slate">No {scheduleLabels(kind).day} is scheduled from today on.</p>
      ) : q.data.snags.length === 0 ? (
        <p className="text-sm text-slate">Nothing conflicts on that day.</p>
      ) : (
        <div className="grid gap-2">
          {q.data.snags.slice(0, max).map((s) => (
            <SnagCard key={s.key} snag={s} canDismiss={false} compact />
          ))}
          {q.data.snags.length > max && <p className="text-sm text-slate">and {q.data.snags.length - max} more.</p>}
        </div>
      )}
    </Card>
  );
}
