import type { ReactNode } from "react";
import { Navigate, NavLink, Route, Routes, useSearchParams } from "react-router-dom";
import type { Action } from "@shared/permissions";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { SelectField } from "@/components/ui/field";
import { cn } from "@/utils/cn";
import { reportFileUrls, useBudget, useContinuityBooks, useRackList, useReturns } from "@/features/reports/api/reports";
import { ContinuityBooks } from "@/features/reports/components/continuity-books";
import { RackList, rackDayLabel } from "@/features/reports/components/rack-list";
import { ReturnsReport } from "@/features/reports/components/returns";
import { BudgetReport } from "@/features/reports/components/budget";
import { formatDay } from "@/features/reports/format";

const tabs: Array<{ path: string; label: string; action: Action }> = [
  { path: "rack", label: "Rack list", action: "report.rack" },
  { path: "continuity", label: "Continuity books", action: "report.continuity" },
  { path: "returns", label: "Returns & wrap", action: "report.returns" },
  { path: "budget", label: "Budget", action: "report.budget" },
];

function Tabs() {
  const { can } = useCurrentProduction();
  return (
    <nav aria-label="Reports" className="mb-4 flex gap-1 overflow-x-auto border-b border-chalk-200">
      {tabs
        .filter((t) => can(t.action))
        .map((t) => (
          <NavLink
            key={t.path}
            to={`../${t.path}`}
            relative="path"
            className={({ isActive }) =>
              cn(
                "whitespace-nowrap border-b-2 px-3 py-2 text-sm font-semibold",
                isActive ? "border-ink text-ink" : "border-transparent text-slate hover:text-ink",
              )
            }
          >
            {t.label}
          </NavLink>
        ))}
    </nav>
  );
}

function Guard({ action, children }: { action: Action; children: ReactNode }) {
  const { can } = useCurrentProduction();
  if (!can(action)) return <Card className="text-sm text-slate">Your role in this production does not open this report.</Card>;
  return <>{children}</>;
}

function RackListPage() {
  const { productionId } = useCurrentProduction();
  const [params, setParams] = useSearchParams();
  const dayId = params.get("day") ?? undefined;
  const q = useRackList(productionId, dayId);
  return (
    <div>
      <PageHeader
        title={q.data?.productionKind === "stage" ? "Rack list for the next performance" : "Tomorrow's rack list"}
        subtitle={q.data ? `${rackDayLabel(q.data)} · today is ${formatDay(q.data.today)}` : undefined}
        actions={
          q.data?.day ? (
            <a
              className="inline-flex min-h-11 items-center rounded-md bg-ink px-4 text-sm font-semibold text-chalk hover:bg-ink-700"
              href={reportFileUrls.rackListPdf(productionId, dayId)}
              target="_blank"
              rel="noreferrer"
            >
              PDF for the rack
            </a>
          ) : undefined
        }
      />
      <Tabs />
      {q.isPending ? (
        <Spinner />
      ) : q.error ? (
        <ErrorAlert error={q.error} title="The rack list could not be built" />
      ) : (
        <div className="grid gap-3">
          {q.data.upcoming.length > 1 && (
            <SelectField
              label="Day"
              value={q.data.day?.id ?? ""}
              onChange={(e) =>
                setParams(e.target.value && e.target.value !== q.data.upcoming[0]?.id ? { day: e.target.value } : {}, { replace: true })
              }
              className="max-w-sm"
            >
              {q.data.day && !q.data.upcoming.some((d) => d.id === q.data.day!.id) && (
                <option value={q.data.day.id}>{formatDay(q.data.day.date)}</option>
              )}
              {q.data.upcoming.map((d, i) => (
                <option key={d.id} value={d.id}>
                  {i === 0 ? "Next: " : ""}
                  {d.kind === "performance" ? "Performance" : `Shoot day ${d.dayNumber}`} · {formatDay(d.date)}
                </option>
              ))}
            </SelectField>
          )}
          {q.data.day && (
            <p className="text-sm text-slate">
              {q.data.counts.characters} character{q.data.counts.characters === 1 ? "" : "s"} in call order · {q.data.counts.garments}{" "}
              garment{q.data.counts.garments === 1 ? "" : "s"}
              {q.data.counts.warnings > 0 && (
                <strong className="text-madder">
                  {" "}
                  · {q.data.counts.warnings} warning{q.data.counts.warnings === 1 ? "" : "s"}
                </strong>
              )}
              . Tap a code (or scan it with another phone) to check the garment out.
            </p>
          )}
          <RackList list={q.data} />
        </div>
      )}
    </div>
  );
}

function ContinuityPage() {
  const { productionId } = useCurrentProduction();
  const q = useContinuityBooks(productionId);
  return (
    <div>
      <PageHeader title="Continuity books" subtitle="Per character or per change, in story order, for the set costumers' folders" />
      <Tabs />
      {q.isPending ? <Spinner /> : q.error ? <ErrorAlert error={q.error} /> : <ContinuityBooks productionId={productionId} data={q.data} />}
    </div>
  );
}

function ReturnsPage() {
  const { productionId, can } = useCurrentProduction();
  const q = useReturns(productionId);
  return (
    <div>
      <PageHeader
        title="Returns and wrap"
        subtitle={
          q.data
            ? `Hires by hire house, overdue first (today is ${formatDay(q.data.today)}); lost; out of the store; what happens at wrap`
            : undefined
        }
        actions={
          <a
            className="inline-flex min-h-10 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50"
            href={reportFileUrls.returnsXlsx(productionId)}
            download
          >
            Workbook (XLSX)
          </a>
        }
      />
      <Tabs />
      {q.isPending ? (
        <Spinner />
      ) : q.error ? (
        <ErrorAlert error={q.error} />
      ) : (
        <ReturnsReport productionId={productionId} data={q.data} canEditWrap={can("garment.update")} />
      )}
    </div>
  );
}

function BudgetPage() {
  const { productionId } = useCurrentProduction();
  const q = useBudget(productionId);
  return (
    <div>
      <PageHeader title="Budget" subtitle={q.data ? `Costs in ${q.data.currency}: built, bought, and hired by the week` : undefined} />
      <Tabs />
      {q.isPending ? <Spinner /> : q.error ? <ErrorAlert error={q.error} /> : <BudgetReport productionId={productionId} data={q.data} />}
    </div>
  );
}

/** The first report the role may open. */
function FirstReport() {
  const { can } = useCurrentProduction();
  const first = tabs.find((t) => can(t.action));
  return first ? <Navigate to={first.path} replace /> : <Card className="text-sm text-slate">Your role opens no report here.</Card>;
}

/** Reports screen: the paperwork the department hands out (loaded only when opened). */
export default function ReportsScreen() {
  return (
    <Routes>
      <Route index element={<FirstReport />} />
      <Route
        path="rack"
        element={
          <Guard action="report.rack">
            <RackListPage />
          </Guard>
        }
      />
      <Route
        path="continuity"
        element={
          <Guard action="report.continuity">
            <ContinuityPage />
          </Guard>
        }
      />
      <Route
        path="returns"
        element={
          <Guard action="report.returns">
            <ReturnsPage />
          </Guard>
        }
      />
      <Route
        path="budget"
        element={
          <Guard action="report.budget">
            <BudgetPage />
          </Guard>
        }
      />
      <Route path="*" element={<FirstReport />} />
    </Routes>
  );
}
