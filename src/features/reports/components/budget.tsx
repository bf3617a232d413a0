import { lazy, Suspense, useState } from "react";
import { budgetGroupingLabels, budgetGroupings, type BudgetDto, type BudgetGrouping } from "@shared/schemas/reports";
import { Card } from "@/components/ui/card";
import { EmptyState, Spinner } from "@/components/ui/feedback";
import { cn } from "@/utils/cn";
import { reportFileUrls } from "../api/reports";
import { formatDay, formatMoney } from "../format";

const BudgetChart = lazy(() => import("./budget-chart"));
const download =
  "inline-flex min-h-10 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50";

/** Costs by category, character, change and source, with a chart per grouping and the rental cost per week. */
export function BudgetReport({ productionId, data }: { productionId: string; data: BudgetDto }) {
  const [by, setBy] = useState<BudgetGrouping>("category");
  const money = (c: number) => formatMoney(c, data.currency);
  const rows = data.groupings[by];
  const rental = data.groupings.source.find((r) => r.key === "rented")?.cents ?? 0;
  if (!data.garments.length)
    return (
      <EmptyState title="No garments yet">
        Costs come from the garments in the Wardrobe: purchase or making cost, and the weekly hire rate of rentals.
      </EmptyState>
    );
  return (
    <div className="grid gap-4">
      <div className="grid gap-3 sm:grid-cols-3">
        <Card>
          <p className="text-sm text-slate">Total</p>
          <p className="text-2xl font-bold text-ink tabular-nums">{money(data.totalCents)}</p>
          <p className="text-xs text-slate">
            {data.garments.length} garments · {data.currency}
          </p>
        </Card>
        <Card>
          <p className="text-sm text-slate">Hire</p>
          <p className="text-2xl font-bold text-ink tabular-nums">{money(rental)}</p>
          <p className="text-xs text-slate">
            {data.hireFrom
              ? `counted from ${formatDay(data.hireFrom)}${data.hireTo ? ` to ${formatDay(data.hireTo)} at the latest` : ""}`
              : "set the production's first day to count hire weeks"}
          </p>
        </Card>
        <Card className="flex flex-wrap content-center gap-2">
          <a className={download} href={reportFileUrls.budgetXlsx(productionId)} download>
            Workbook (XLSX)
          </a>
          <a className={download} href={reportFileUrls.budgetCsv(productionId, by)} download>
            {budgetGroupingLabels[by]} (CSV)
          </a>
          <a className={download} href={reportFileUrls.budgetCsv(productionId, "garment")} download>
            Every garment (CSV)
          </a>
        </Card>
      </div>

      <Card className="grid gap-3">
        <div role="tablist" aria-label="Group costs by" className="flex flex-wrap gap-1">
          {budgetGroupings.map((g) => (
            <button
              key={g}
              role="tab"
              type="button"
              aria-selected={by === g}
              onClick={() => setBy(g)}
              className={cn(
                "min-h-10 rounded-md px-3 text-sm font-semibold",
                by === g ? "bg-ink text-chalk" : "border border-ink-100 bg-white text-ink hover:bg-ink-50",
              )}
            >
              By {budgetGroupingLabels[g].toLowerCase()}
            </button>
          ))}
        </div>
        <div
          className="grid gap-4 lg:grid-cols-[3fr_2fr]"
          role="tabpanel"
          aria-label={`Costs by ${budgetGroupingLabels[by].toLowerCase()}`}
        >
          <Suspense fallback={<Spinner label="Loading the chart…" />}>
            <BudgetChart rows={rows} currency={data.currency} title={`Costs by ${budgetGroupingLabels[by].toLowerCase()}`} />
          </Suspense>
          <table className="w-full text-sm" aria-label={`Budget by ${budgetGroupingLabels[by].toLowerCase()}`}>
            <thead>
              <tr className="text-left text-xs uppercase tracking-wide text-slate">
                <th className="py-1">{budgetGroupingLabels[by]}</th>
                <th className="py-1 text-right">Garments</th>
                <th className="py-1 text-right">Cost</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-chalk-200">
              {rows.map((r) => (
                <tr key={r.key}>
                  <td className="py-1 pr-2">{r.label}</td>
                  <td className="py-1 text-right tabular-nums">{r.garments}</td>
                  <td className="py-1 text-right tabular-nums">{money(r.cents)}</td>
                </tr>
              ))}
            </tbody>
            <tfoot>
              <tr className="border-t-2 border-ink font-semibold">
                <td className="py-1">Total</td>
                <td className="py-1 text-right tabular-nums">{data.garments.length}</td>
                <td className="py-1 text-right tabular-nums">{money(data.totalCents)}</td>
              </tr>
            </tfoot>
          </table>
        </div>
        {(by === "character" || by === "change") && (
          <p className="text-xs text-slate">
            A garment worn in several characters' or changes' costumes is shared evenly between them, so every grouping adds up to the same
            total.
          </p>
        )}
      </Card>

      {data.rentalWeeks.length > 0 && (
        <Card className="grid gap-3">
          <h2 className="font-semibold text-ink">Hire cost per week over the shoot</h2>
          <Suspense fallback={<Spinner label="Loading the chart…" />}>
            <BudgetChart
              rows={data.rentalWeeks.map((w) => ({ label: `Week ${w.week} (${formatDay(w.starts).slice(4, -5)})`, cents: w.cents }))}
              currency={data.currency}
              title="Hire cost per week"
            />
          </Suspense>
          <a className="text-sm font-semibold text-ink underline" href={reportFileUrls.budgetCsv(productionId, "week")} download>
            Hire per week (CSV)
          </a>
        </Card>
      )}
    </div>
  );
}
