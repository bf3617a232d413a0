import { useState, type ReactNode } from "react";
import type { ReturnsDto, WrapAction, WrapLineDto } from "@shared/schemas/reports";
import { garmentStatusLabels, type WrapDisposition } from "@shared/schemas/garments";
import { wrapActionLabels } from "@shared/domain/reports/returns";
import { Badge, EmptyState } from "@/components/ui/feedback";
import { Card } from "@/components/ui/card";
import { reportFileUrls, useSetWrapDisposition } from "../api/reports";
import { formatDay, formatMoney } from "../format";

const th = "px-2 py-1.5 text-left text-xs font-semibold uppercase tracking-wide text-slate";
const td = "px-2 py-1.5 align-top";
const download = "text-sm font-semibold text-ink underline underline-offset-2";

function Section({ title, count, children, csv }: { title: string; count: number; children: ReactNode; csv: string }) {
  return (
    <Card className="p-0">
      <div className="flex flex-wrap items-baseline justify-between gap-2 border-b border-chalk-200 px-3 py-2">
        <h2 className="font-semibold text-ink">
          {title} <span className="font-normal text-slate">({count})</span>
        </h2>
        <a className={download} href={csv} download>
          CSV
        </a>
      </div>
      <div className="overflow-x-auto">{children}</div>
    </Card>
  );
}

function WrapChoice({ productionId, line, canEdit }: { productionId: string; line: WrapLineDto; canEdit: boolean }) {
  const set = useSetWrapDisposition(productionId);
  if (line.source === "rented" || !canEdit) return <span>{wrapActionLabels[line.action]}</span>;
  return (
    <div>
      <select
        aria-label={`At wrap: ${line.tagCode}`}
        className="rounded-md border border-ink-100 bg-white px-2 py-1 text-sm"
        value={line.action === "undecided" ? "" : line.action}
        disabled={set.isPending}
        onChange={(e) => set.mutate({ garmentId: line.garmentId, wrapDisposition: (e.target.value || null) as WrapDisposition | null })}
      >
        <option value="">Not decided</option>
        <option value="keep">Keep in stock</option>
        <option value="sell">Sell</option>
      </select>
      {set.error && <p className="text-xs text-madder">Not saved: {set.error.message}</p>}
    </div>
  );
}

const actionTone: Record<WrapAction, "neutral" | "warning" | "note" | "blocking"> = {
  return: "warning",
  keep: "neutral",
  sell: "note",
  undecided: "blocking",
};

/** Rentals by hire house (overdue first), lost items, garments out, and what happens to everything at wrap. */
export function ReturnsReport({ productionId, data, canEditWrap }: { productionId: string; data: ReturnsDto; canEditWrap: boolean }) {
  const [wrapShown, setWrapShown] = useState<WrapAction | null>(null);
  const wrapRows = wrapShown ? data.wrap.filter((w) => w.action === wrapShown) : data.wrap;
  const money = (c: number | null) => (c === null ? "—" : formatMoney(c, data.currency));
  const lines = data.rentals.reduce((n, v) => n + v.lines.length, 0);
  return (
    <div className="grid gap-4">
      <Section title="Hires to return" count={lines} csv={reportFileUrls.returnsCsv(productionId, "rentals")}>
        {lines === 0 ? (
          <div className="p-3">
            <EmptyState title="Nothing on hire">Rented garments that are not returned yet show here, by hire house.</EmptyState>
          </div>
        ) : (
          data.rentals.map((v) => (
            <table key={v.vendor} className="w-full min-w-[640px] text-sm" aria-label={`Hires from ${v.vendor}`}>
              <caption className="bg-chalk px-2 py-1.5 text-left font-semibold text-ink-900">
                {v.vendor} · {v.lines.length} garment{v.lines.length === 1 ? "" : "s"} · hire {money(v.hireCents)}
                {v.overdue > 0 && (
                  <span className="ml-2">
                    <Badge tone="blocking">{v.overdue} overdue</Badge>
                  </span>
                )}
              </caption>
              <thead>
                <tr>
                  <th className={th}>Tag</th>
                  <th className={th}>Garment</th>
                  <th className={th}>Due back</th>
                  <th className={th}>Status · where</th>
                  <th className={`${th} text-right`}>Weekly</th>
                  <th className={`${th} text-right`}>Hire</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-200">
                {v.lines.map((l) => (
                  <tr key={l.garmentId} className={l.overdue ? "bg-madder-50" : undefined}>
                    <td className={`${td} font-mono font-semibold`}>{l.tagCode}</td>
                    <td className={td}>{l.name}</td>
                    <td className={td}>
                      {l.dueOn ? formatDay(l.dueOn) : "not set"}
                      {l.overdue && (
                        <span className="block text-xs font-semibold text-madder">
                          {l.daysOverdue} day{l.daysOverdue === 1 ? "" : "s"} overdue
                        </span>
                      )}
                    </td>
                    <td className={td}>
                      {garmentStatusLabels[l.status]}
                      {l.location ? ` · ${l.location}` : ""}
                    </td>
                    <td className={`${td} text-right tabular-nums`}>{money(l.weeklyCents)}</td>
                    <td className={`${td} text-right tabular-nums`}>
                      {money(l.hireCents)}
                      {l.weeks > 0 && <span className="block text-xs text-slate">{l.weeks} wk</span>}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          ))
        )}
      </Section>

      <div className="grid gap-4 lg:grid-cols-2">
        <Section title="Lost" count={data.lost.length} csv={reportFileUrls.returnsCsv(productionId, "lost")}>
          {data.lost.length === 0 ? (
            <p className="p-3 text-sm text-slate">Nothing is marked lost.</p>
          ) : (
            <table className="w-full text-sm" aria-label="Lost garments">
              <tbody className="divide-y divide-chalk-200">
                {data.lost.map((l) => (
                  <tr key={l.garmentId}>
                    <td className={`${td} font-mono font-semibold`}>{l.tagCode}</td>
                    <td className={td}>
                      {l.name}
                      {l.source === "rented" && (
                        <span className="block text-xs text-madder">hired from {l.vendor ?? "a hire house"}: settle with them</span>
                      )}
                    </td>
                    <td className={td}>{l.lostOn ? formatDay(l.lostOn) : "—"}</td>
                    <td className={`${td} text-right tabular-nums`}>{money(l.costCents)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </Section>
        <Section title="Out of the store" count={data.out.length} csv={reportFileUrls.returnsCsv(productionId, "out")}>
          {data.out.length === 0 ? (
            <p className="p-3 text-sm text-slate">Everything is on its rack.</p>
          ) : (
            <table className="w-full text-sm" aria-label="Garments out">
              <tbody className="divide-y divide-chalk-200">
                {data.out.map((o) => (
                  <tr key={o.garmentId}>
                    <td className={`${td} font-mono font-semibold`}>{o.tagCode}</td>
                    <td className={td}>{o.name}</td>
                    <td className={td}>
                      {garmentStatusLabels[o.status]}
                      {o.holder ? ` · with ${o.holder}` : ""}
                    </td>
                    <td className={td}>
                      {o.since ? `since ${formatDay(o.since)}` : ""}
                      {o.movedBy ? <span className="block text-xs text-slate">by {o.movedBy}</span> : null}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </Section>
      </div>

      <Section title="At wrap" count={data.wrap.length} csv={reportFileUrls.returnsCsv(productionId, "wrap")}>
        <div className="flex flex-wrap gap-2 px-3 pt-2 text-sm" role="group" aria-label="Show at wrap">
          {(Object.keys(data.wrapCounts) as WrapAction[]).map((a) => (
            <button
              key={a}
              type="button"
              aria-pressed={wrapShown === a}
              onClick={() => setWrapShown(wrapShown === a ? null : a)}
              className="rounded focus:outline-2 focus:outline-ink aria-pressed:ring-2 aria-pressed:ring-ink"
            >
              <Badge tone={actionTone[a]}>
                {wrapActionLabels[a]}: {data.wrapCounts[a]}
              </Badge>
            </button>
          ))}
          {wrapShown && (
            <button type="button" className="text-sm text-ink underline" onClick={() => setWrapShown(null)}>
              Show all
            </button>
          )}
        </div>
        {data.wrap.length === 0 ? (
          <p className="p-3 text-sm text-slate">No garments yet.</p>
        ) : (
          <table className="w-full min-w-[640px] text-sm" aria-label="At wrap">
            <thead>
              <tr>
                <th className={th}>At wrap</th>
                <th className={th}>Tag</th>
                <th className={th}>Garment</th>
                <th className={th}>Source</th>
                <th className={th}>Status</th>
                <th className={`${th} text-right`}>Cost</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-chalk-200">
              {wrapRows.map((w) => (
                <tr key={w.garmentId}>
                  <td className={td}>
                    <WrapChoice productionId={productionId} line={w} canEdit={canEditWrap} />
                  </td>
                  <td className={`${td} font-mono font-semibold`}>{w.tagCode}</td>
                  <td className={td}>{w.name}</td>
                  <td className={td}>
                    {w.source}
                    {w.vendor ? ` · ${w.vendor}` : ""}
                    {w.dueOn ? <span className="block text-xs text-slate">due {formatDay(w.dueOn)}</span> : null}
                  </td>
                  <td className={td}>{garmentStatusLabels[w.status]}</td>
                  <td className={`${td} text-right tabular-nums`}>{money(w.costCents)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </Section>
    </div>
  );
}
