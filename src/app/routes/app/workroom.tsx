import { useState } from "react";
import { Route, Routes, useParams, useSearchParams } from "react-router-dom";
import { parseISO, isValid } from "date-fns";
import { isoDateOf } from "@shared/format";
import type { View } from "react-big-calendar";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { Badge, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { cn } from "@/utils/cn";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { useCapacity, useEmailJobs, useFitting, useFittings, useWorkroomOptions, useWorkroomPlan } from "@/features/workroom/api/workroom";
import { FittingsList } from "@/features/workroom/components/fittings-list";
import { FittingForm } from "@/features/workroom/components/fitting-form";
import { FittingView } from "@/features/workroom/components/fitting-view";
import { TicketsTable } from "@/features/workroom/components/tickets-table";
import { CapacityEditor } from "@/features/workroom/components/capacity-editor";
import { WorkroomCalendar } from "@/features/workroom/components/workroom-calendar";
import { EmailFailures } from "@/features/workroom/components/email-failures";
import { onTabListKeyDown } from "@/components/ui/tabs";

const TABS = [
  { key: "fittings", label: "Fittings" },
  { key: "tickets", label: "Tickets" },
  { key: "calendar", label: "Calendar" },
  { key: "capacity", label: "Hours" },
] as const;
type Tab = (typeof TABS)[number]["key"];

function Overview() {
  const { productionId, production, can, today } = useCurrentProduction();
  const [params, setParams] = useSearchParams();
  const tab = (TABS.some((t) => t.key === params.get("tab")) ? params.get("tab") : "fittings") as Tab;
  const from = params.get("from") ?? undefined;
  const dateParam = params.get("date");
  // The calendar opens on the production's today (from the server's clock), never the browser's.
  const calDate = dateParam && isValid(parseISO(dateParam)) ? parseISO(dateParam) : today ? parseISO(today) : null;
  const calView = (["month", "week", "day"].includes(params.get("view") ?? "") ? params.get("view") : "week") as View;
  const [booking, setBooking] = useState(false);
  const plan = useWorkroomPlan(productionId, from);
  const fittings = useFittings(productionId);
  const options = useWorkroomOptions(productionId);
  const capacity = useCapacity(productionId);
  const emailJobs = useEmailJobs(productionId, can("workroom.mail"));
  const units = production?.units ?? "cm";
  const setParam = (patch: Record<string, string | null>) =>
    setParams((p) => {
      const n = new URLSearchParams(p);
      for (const [k, v] of Object.entries(patch))
        if (v === null) n.delete(k);
        else n.set(k, v);
      return n;
    });

  return (
    <div className="grid gap-4">
      <PageHeader
        title="Workroom"
        subtitle={`What must be finished before which ${scheduleLabels(production).day}, who does it, and what will be late`}
        actions={
          can("fitting.update") && (
            <Button size="lg" onClick={() => setBooking(true)}>
              Book a fitting
            </Button>
          )
        }
      />
      {booking && options.data && (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">Book a fitting</h2>
          <FittingForm productionId={productionId} options={options.data} onDone={() => setBooking(false)} />
        </Card>
      )}

      {plan.data && plan.data.snags.length > 0 && (
        <Card role="region" aria-label="Workroom snags">
          <h2 className="mb-2 font-semibold text-ink">What will be late</h2>
          <ul className="grid gap-2">
            {plan.data.snags.map((s) => (
              <li key={s.key} className="text-sm">
                <Badge tone={s.severity}>{s.severity}</Badge> <span className="font-semibold">{s.title}</span>
                <p className="text-slate">{s.explanation}</p>
              </li>
            ))}
          </ul>
        </Card>
      )}

      <div
        role="tablist"
        aria-label="Workroom sections"
        tabIndex={-1}
        onKeyDown={onTabListKeyDown}
        className="flex flex-wrap gap-1 border-b border-chalk-200"
      >
        {TABS.map((t) => (
          <button
            key={t.key}
            type="button"
            role="tab"
            aria-selected={tab === t.key}
            tabIndex={tab === t.key ? 0 : -1}
            onClick={() => setParam({ tab: t.key })}
            className={cn(
              "min-h-11 rounded-t-md px-4 text-sm font-semibold",
              tab === t.key ? "bg-white text-ink border border-b-0 border-chalk-200" : "text-slate hover:text-ink",
            )}
          >
            {t.label}
          </button>
        ))}
      </div>

      {tab === "fittings" && (
        <Card>
          {fittings.isPending ? (
            <Spinner />
          ) : fittings.error ? (
            <ErrorAlert error={fittings.error} />
          ) : (
            <FittingsList productionId={productionId} fittings={fittings.data} />
          )}
        </Card>
      )}

      {(tab === "tickets" || tab === "calendar") && (
        <div className="flex flex-wrap items-end gap-2 text-sm">
          <label className="flex flex-col gap-1 font-semibold text-ink-900">
            Plan from
            <input
              type="date"
              className="rounded-md border border-ink-100 px-2 py-1"
              value={plan.data?.from ?? ""}
              onChange={(e) => setParam({ from: e.target.value || null })}
            />
          </label>
          {plan.data && (
            <p className="pb-1 text-slate">
              {plan.data.summary.openCount} open · {plan.data.summary.lateCount} late · buffer {plan.data.bufferWorkingDays} working day
              {plan.data.bufferWorkingDays === 1 ? "" : "s"}
            </p>
          )}
        </div>
      )}

      {tab === "tickets" && (
        <Card>
          {plan.isPending ? (
            <Spinner />
          ) : plan.error ? (
            <ErrorAlert error={plan.error} />
          ) : (
            <TicketsTable
              productionId={productionId}
              tickets={plan.data.tickets}
              units={units}
              canUpdate={can("alteration.update")}
              canEstimate={can("alteration.estimate")}
              focusTicketId={params.get("ticket")}
            />
          )}
        </Card>
      )}

      {tab === "calendar" &&
        (plan.isPending || fittings.isPending || !calDate || !production ? (
          <Spinner />
        ) : plan.error || fittings.error ? (
          <ErrorAlert error={plan.error ?? fittings.error} />
        ) : (
          <WorkroomCalendar
            productionId={productionId}
            plan={plan.data!}
            fittings={fittings.data!}
            canMoveFittings={can("fitting.update")}
            date={calDate}
            view={calView}
            timeZone={production.timeZone}
            today={production.today}
            onNavigate={(d, v) => setParam({ date: isoDateOf(d), view: v })}
          />
        ))}

      {tab === "capacity" && (
        <Card>
          {capacity.isPending || options.isPending ? (
            <Spinner />
          ) : capacity.error ? (
            <ErrorAlert error={capacity.error} />
          ) : (
            <CapacityEditor
              productionId={productionId}
              people={capacity.data}
              settings={options.data?.settings ?? { bufferWorkingDays: 1, reminderHour: 18 }}
              canEdit={can("workroom.capacity")}
            />
          )}
        </Card>
      )}

      {can("workroom.mail") && tab === "capacity" && (
        <Card>
          <h2 className="mb-2 font-semibold text-ink">Invitations and reminders not sent</h2>
          {emailJobs.isPending ? (
            <Spinner />
          ) : emailJobs.error ? (
            <ErrorAlert error={emailJobs.error} />
          ) : (
            <EmailFailures productionId={productionId} jobs={emailJobs.data} />
          )}
        </Card>
      )}
    </div>
  );
}

function FittingPage() {
  const { fittingId = "" } = useParams();
  const { productionId, production, can } = useCurrentProduction();
  const fitting = useFitting(productionId, fittingId);
  const options = useWorkroomOptions(productionId);
  if (fitting.isPending || options.isPending) return <Spinner />;
  if (fitting.error) return <ErrorAlert error={fitting.error} />;
  if (options.error) return <ErrorAlert error={options.error} />;
  return (
    <FittingView
      productionId={productionId}
      fitting={fitting.data}
      options={options.data}
      units={production?.units ?? "cm"}
      canEdit={can("alteration.update")}
      canLink={can("fitting.link_garment")}
    />
  );
}

/** The Workroom screen: fittings, tickets with their plan, calendar, hours; a fitting's own page for tablets. */
export default function WorkroomPage() {
  return (
    <Routes>
      <Route path="fittings/:fittingId" element={<FittingPage />} />
      <Route path="*" element={<Overview />} />
    </Routes>
  );
}
