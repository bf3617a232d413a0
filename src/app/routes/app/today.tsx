import { Link } from "react-router-dom";
import { calendarDateIn, formatClockTime, formatDate as nice } from "@shared/format";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { useProductionTime } from "@/hooks/use-production-time";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Badge, EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { SnagsForDay } from "@/features/snags/components/snags-for-day";
import { useShootDays } from "@/features/breakdown/api/breakdown";
import { useFittings, useWorkroomPlan } from "@/features/workroom/api/workroom";
import { scheduleLabels } from "@shared/domain/schedule-labels";

/** The next shoot day (or performance) with its scenes. */
function NextDay({ productionId, stage, today }: { productionId: string; stage: boolean; today: string }) {
  const days = useShootDays(productionId);
  const words = scheduleLabels(stage ? "stage" : "film");
  if (days.isPending) return <Spinner />;
  if (days.error) return <ErrorAlert error={days.error} />;
  const kind = stage ? "performance" : "shoot";
  const next = days.data
    .filter((d) => d.kind === kind && d.date >= today)
    .sort((a, b) => a.date.localeCompare(b.date) || a.dayNumber - b.dayNumber)[0];
  if (!next) return <EmptyState title={`No ${words.days} ahead`}>Add them on the Breakdown screen.</EmptyState>;
  return (
    <div>
      <p className="font-semibold text-ink-900">
        {next.date === today ? "Today" : nice(next.date)} · {stage ? words.day : `${words.day} ${next.dayNumber}`}
        {next.startsAt ? ` · ${formatClockTime(next.startsAt)}` : ""}
      </p>
      {next.notes && <p className="text-sm text-slate">{next.notes}</p>}
      <ul className="mt-2 divide-y divide-chalk-200 text-sm" aria-label="Scenes of the next day">
        {next.scenes.map((s) => (
          <li key={s.id} className="flex flex-wrap justify-between gap-2 py-1.5">
            <Link className="font-semibold text-ink underline-offset-2 hover:underline" to={`/p/${productionId}/breakdown/scenes/${s.id}`}>
              Scene {s.number}
            </Link>
            <span className="text-slate">
              {s.setName ?? "—"}
              {s.storyDay != null ? ` · story day ${s.storyDay}` : ""}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Fittings from today on (the next few). */
function UpcomingFittings({ productionId, today }: { productionId: string; today: string }) {
  const fittings = useFittings(productionId);
  const { timeZone, dateTime } = useProductionTime();
  if (fittings.isPending) return <Spinner />;
  if (fittings.error) return <ErrorAlert error={fittings.error} />;
  const next = fittings.data
    .filter((f) => f.status === "booked" && calendarDateIn(f.startsAt, timeZone) >= today)
    .sort((a, b) => a.startsAt.localeCompare(b.startsAt))
    .slice(0, 5);
  if (!next.length) return <p className="text-sm text-slate">No fittings booked from today on.</p>;
  return (
    <ul className="divide-y divide-chalk-200 text-sm" aria-label="Upcoming fittings">
      {next.map((f) => (
        <li key={f.id} className="py-1.5">
          <Link className="font-semibold text-ink underline-offset-2 hover:underline" to={`/p/${productionId}/workroom/fittings/${f.id}`}>
            {f.performerName}
          </Link>{" "}
          <span className="text-slate">
            · {dateTime(f.startsAt)} · {f.room ?? "room not set"}
            {f.changeLabel ? ` · ${f.changeLabel}` : ""}
          </span>
        </li>
      ))}
    </ul>
  );
}

/** Alterations due in the next few days, late ones first. */
function WorkDue({ productionId }: { productionId: string }) {
  const plan = useWorkroomPlan(productionId);
  if (plan.isPending) return <Spinner />;
  if (plan.error) return <ErrorAlert error={plan.error} />;
  const soon = plan.data.tickets
    .filter((t) => t.planStatus !== "done" && t.dueDate)
    .sort((a, b) => Number(b.late) - Number(a.late) || (a.dueDate ?? "").localeCompare(b.dueDate ?? ""))
    .slice(0, 6);
  if (!soon.length) return <p className="text-sm text-slate">No open alterations.</p>;
  return (
    <ul className="divide-y divide-chalk-200 text-sm" aria-label="Work due">
      {soon.map((t) => (
        <li key={t.id} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
          <span>
            <span className="font-semibold text-ink-900">
              {t.tagCode} {t.garmentName}
            </span>
            <span className="text-slate">
              {" "}
              · due {nice(t.dueDate!)}
              {t.plannedAssigneeName ? ` · ${t.plannedAssigneeName}` : ""}
            </span>
          </span>
          {t.late ? (
            <Badge tone="blocking">
              late by {t.lateness} working day{t.lateness === 1 ? "" : "s"}
            </Badge>
          ) : (
            <Badge tone="neutral">on time</Badge>
          )}
        </li>
      ))}
    </ul>
  );
}

/** The next shoot day or performance at a glance: scenes, snags, fittings and work due. */
export default function TodayPage() {
  const { production, productionId, can, today } = useCurrentProduction();
  if (!production) return <Spinner />;
  const stage = production.kind === "stage";
  const words = scheduleLabels(production);
  return (
    <div className="grid gap-4">
      <PageHeader title="Today" subtitle={`${production.title} · ${nice(production.today)}`} />
      <div className="grid gap-4 lg:grid-cols-2">
        {can("breakdown.read") && (
          <Card>
            <h2 className="mb-2 font-semibold text-ink">{words.Next}</h2>
            <NextDay productionId={productionId} stage={stage} today={today} />
            {can("report.rack") && (
              <Link
                to={`/p/${productionId}/reports/rack`}
                className="mt-3 inline-flex min-h-11 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50"
              >
                {stage ? "Rack list for the next performance" : "Tomorrow's rack list"}
              </Link>
            )}
          </Card>
        )}
        {can("snag.read") && <SnagsForDay productionId={productionId} kind={production.kind} />}
        {can("fitting.read") && (
          <Card>
            <h2 className="mb-2 font-semibold text-ink">Fittings</h2>
            <UpcomingFittings productionId={productionId} today={today} />
          </Card>
        )}
        {can("alteration.read") && (
          <Card>
            <h2 className="mb-2 font-semibold text-ink">Work due</h2>
            <WorkDue productionId={productionId} />
          </Card>
        )}
      </div>
    </div>
  );
}
