import { useMemo, useState } from "react";
import { snagKinds, snagKindLabels, snagSeverities, type SnagDto, type SnagListDto } from "@shared/schemas/snags";
import type { SnagKind } from "@shared/domain/snags/types";
import { SelectField } from "@/components/ui/field";
import { EmptyState, ErrorAlert } from "@/components/ui/feedback";
import { Badge } from "@/components/ui/feedback";
import { useUndoDismissal } from "../api/snags";
import { DismissDialog } from "./dismiss-dialog";
import { SnagCard } from "./snag-card";
import { formatDate } from "@shared/format";

export type SnagGrouping = "severity" | "shootDay" | "character" | "kind";

const groupingLabels: Record<SnagGrouping, string> = { severity: "Severity", shootDay: "Shoot day", character: "Character", kind: "Kind" };
const severityRank = { blocking: 0, warning: 1, note: 2 } as const;
const NONE = "\uffff"; // sorts after every real key

/** Group keys (and their headings) a snag falls under for a grouping; a snag may sit in several groups. */
function groupsOf(s: SnagDto, by: SnagGrouping): { key: string; label: string }[] {
  switch (by) {
    case "severity":
      return [{ key: String(severityRank[s.severity]), label: s.severity }];
    case "kind":
      return [{ key: String(snagKinds.indexOf(s.kind)), label: snagKindLabels[s.kind] }];
    case "shootDay":
      return s.shootDays.length ? s.shootDays.map((d) => ({ key: d.date, label: `Shoot day ${formatDate(d.date)}` })) : [{ key: NONE, label: "Not tied to one day" }];
    case "character":
      return s.characters.length ? s.characters.map((c) => ({ key: c.name.toLowerCase(), label: c.name })) : [{ key: NONE, label: "No character" }];
  }
}

/** Groups snags, headings in order, snags inside by severity then title. Pure, for the list and tests. */
export function groupSnags(snags: SnagDto[], by: SnagGrouping): { key: string; label: string; snags: SnagDto[] }[] {
  const groups = new Map<string, { key: string; label: string; snags: SnagDto[] }>();
  for (const s of snags) {
    for (const g of groupsOf(s, by)) {
      const cur = groups.get(g.key) ?? { ...g, snags: [] };
      cur.snags.push(s);
      groups.set(g.key, cur);
    }
  }
  const out = Array.from(groups.values()).sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  for (const g of out) g.snags.sort((a, b) => severityRank[a.severity] - severityRank[b.severity] || a.title.localeCompare(b.title));
  return out;
}

export interface SnagFilters {
  kind: SnagKind | "";
  characterId: string;
  shootDayId: string;
  includeDismissed: boolean;
}

interface SnagsListProps {
  productionId: string;
  data: SnagListDto;
  filters: SnagFilters;
  onFiltersChange: (f: SnagFilters) => void;
  canDismiss: boolean;
}

/** Filters, grouping and the grouped snag cards with dismiss and undo. */
export function SnagsList({ productionId, data, filters, onFiltersChange, canDismiss }: SnagsListProps) {
  const [grouping, setGrouping] = useState<SnagGrouping>("severity");
  const [dismissing, setDismissing] = useState<SnagDto | null>(null);
  const undo = useUndoDismissal(productionId);
  const groups = useMemo(() => groupSnags(data.snags, grouping), [data.snags, grouping]);
  const set = (patch: Partial<SnagFilters>) => onFiltersChange({ ...filters, ...patch });

  return (
    <div className="grid gap-4" role="region" aria-label="All snags">
      <div className="flex flex-wrap items-center gap-2" aria-label="Open snags by severity">
        {snagSeverities.map((s) => (
          <Badge key={s} tone={s}>
            {data.counts.bySeverity[s]} {s}
          </Badge>
        ))}
        <span className="text-xs text-slate">
          {data.counts.dismissed} dismissed{data.counts.lapsed ? ` · ${data.counts.lapsed} dismissal${data.counts.lapsed > 1 ? "s" : ""} lapsed` : ""} · judged on {formatDate(data.today)}
        </span>
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-5">
        <SelectField label="Group by" value={grouping} onChange={(e) => setGrouping(e.target.value as SnagGrouping)}>
          {(Object.keys(groupingLabels) as SnagGrouping[]).map((g) => (
            <option key={g} value={g}>
              {groupingLabels[g]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Kind" value={filters.kind} onChange={(e) => set({ kind: e.target.value as SnagKind | "" })}>
          <option value="">All kinds</option>
          {snagKinds.map((k) => (
            <option key={k} value={k}>
              {snagKindLabels[k]} ({data.counts.byKind[k]})
            </option>
          ))}
        </SelectField>
        <SelectField label="Character" value={filters.characterId} onChange={(e) => set({ characterId: e.target.value })}>
          <option value="">All characters</option>
          {data.characters.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
        <SelectField label="Shoot day" value={filters.shootDayId} onChange={(e) => set({ shootDayId: e.target.value })}>
          <option value="">All days</option>
          <option value="next">Next day{data.nextShootDay ? ` (${formatDate(data.nextShootDay.date)})` : ""}</option>
          {data.shootDays.map((d) => (
            <option key={d.id} value={d.id}>
              {formatDate(d.date)}
            </option>
          ))}
        </SelectField>
        <label className="flex min-h-12 items-center gap-2 self-end text-sm text-ink-900">
          <input type="checkbox" className="size-5" checked={filters.includeDismissed} onChange={(e) => set({ includeDismissed: e.target.checked })} />
          Show dismissed
        </label>
      </div>
      {undo.error && <ErrorAlert error={undo.error} title="Not undone" />}
      {groups.length === 0 ? (
        <EmptyState title="No snags">
          {data.counts.dismissed ? "Every snag that matches is dismissed." : "Nothing in the breakdown, wardrobe or schedule conflicts with anything else right now."}
        </EmptyState>
      ) : (
        groups.map((g) => (
          <section key={g.key} aria-label={g.label} className="grid gap-2">
            <h2 className="text-sm font-bold tracking-wide text-ink uppercase">
              {g.label} <span className="font-normal text-slate">({g.snags.length})</span>
            </h2>
            {g.snags.map((s) => (
              <SnagCard
                key={s.key}
                snag={s}
                canDismiss={canDismiss}
                onDismiss={setDismissing}
                onUndo={(id) => undo.mutate(id)}
                undoBusy={undo.isPending && undo.variables === s.dismissal?.id}
              />
            ))}
          </section>
        ))
      )}
      <DismissDialog productionId={productionId} snag={dismissing} onClose={() => setDismissing(null)} />
    </div>
  );
}
