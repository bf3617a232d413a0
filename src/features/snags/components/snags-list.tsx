import { useMemo, useState } from "react";
import { snagKinds, snagKindLabels, snagSeverities, type SnagDismissalDto, type SnagDto, type SnagListDto } from "@shared/schemas/snags";
import { scheduleLabels, type ScheduleKind } from "@shared/domain/schedule-labels";
import type { SnagKind } from "@shared/domain/snags/types";
import { SelectField } from "@/components/ui/field";
import { EmptyState, ErrorAlert } from "@/components/ui/feedback";
import { Badge } from "@/components/ui/feedback";
import { Button } from "@/components/ui/button";
import { useUndoDismissal } from "../api/snags";
import { DismissDialog } from "./dismiss-dialog";
import { SnagCard } from "./snag-card";
import { formatDate } from "@shared/format";

export type SnagGrouping = "severity" | "shootDay" | "character" | "kind";

const groupingLabels = (kind: ScheduleKind): Record<SnagGrouping, string> => ({
  severity: "Severity",
  shootDay: scheduleLabels(kind).Day,
  character: "Character",
  kind: "Kind",
});
const severityRank = { blocking: 0, warning: 1, note: 2 } as const;
const NONE = "\uffff"; // sorts after every real key

/** Group keys (and their headings) a snag falls under for a grouping; a snag may sit in several groups. */
function groupsOf(s: SnagDto, by: SnagGrouping, kind: ScheduleKind): { key: string; label: string }[] {
  switch (by) {
    case "severity":
      return [{ key: String(severityRank[s.severity]), label: s.severity }];
    case "kind":
      return [{ key: String(snagKinds.indexOf(s.kind)), label: snagKindLabels[s.kind] }];
    case "shootDay":
      return s.shootDays.length
        ? s.shootDays.map((d) => ({ key: d.date, label: `${scheduleLabels(kind).Day} ${formatDate(d.date)}` }))
        : [{ key: NONE, label: "Not tied to one day" }];
    case "character":
      return s.characters.length
        ? s.characters.map((c) => ({ key: c.name.toLowerCase(), label: c.name }))
        : [{ key: NONE, label: "No character" }];
  }
}

/** Groups snags, headings in order, snags inside by severity then title. Pure, for the list and tests. */
export function groupSnags(
  snags: SnagDto[],
  by: SnagGrouping,
  kind: ScheduleKind = "film",
): { key: string; label: string; snags: SnagDto[] }[] {
  const groups = new Map<string, { key: string; label: string; snags: SnagDto[] }>();
  for (const s of snags) {
    for (const g of groupsOf(s, by, kind)) {
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
  /** The production's kind: a stage production's days are performances. */
  kind?: ScheduleKind;
  data: SnagListDto;
  filters: SnagFilters;
  onFiltersChange: (f: SnagFilters) => void;
  canDismiss: boolean;
}

/** Filters, grouping and the grouped snag cards with dismiss and undo. */
export function SnagsList({ productionId, kind = "film", data, filters, onFiltersChange, canDismiss }: SnagsListProps) {
  const [grouping, setGrouping] = useState<SnagGrouping>("severity");
  const [dismissing, setDismissing] = useState<SnagDto | null>(null);
  // Snags just dismissed here: they keep their place in the list as an "Undo" line until undone or left.
  const [justDismissed, setJustDismissed] = useState<Map<string, { snag: SnagDto; dismissal: SnagDismissalDto }>>(new Map());
  const undo = useUndoDismissal(productionId);
  const words = scheduleLabels(kind);
  const listed = useMemo(() => {
    const present = new Set(data.snags.map((s) => s.key));
    return [...data.snags, ...[...justDismissed.values()].filter((d) => !present.has(d.snag.key)).map((d) => d.snag)];
  }, [data.snags, justDismissed]);
  const groups = useMemo(() => groupSnags(listed, grouping, kind), [listed, grouping, kind]);
  const set = (patch: Partial<SnagFilters>) => onFiltersChange({ ...filters, ...patch });
  const forget = (key: string) =>
    setJustDismissed((m) => {
      const n = new Map(m);
      n.delete(key);
      return n;
    });

  return (
    <div className="grid gap-4" role="region" aria-label="All snags">
      <div className="flex flex-wrap items-center gap-2" aria-label="Open snags by severity">
        {snagSeverities.map((s) => (
          <Badge key={s} tone={s}>
            {data.counts.bySeverity[s]} {s}
          </Badge>
        ))}
        <span className="text-xs text-slate">
          {data.counts.dismissed} dismissed
          {data.counts.lapsed ? ` · ${data.counts.lapsed} dismissal${data.counts.lapsed > 1 ? "s" : ""} lapsed` : ""} · judged on{" "}
          {formatDate(data.today)}
        </span>
      </div>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4 lg:grid-cols-5">
        <SelectField label="Group by" value={grouping} onChange={(e) => setGrouping(e.target.value as SnagGrouping)}>
          {(Object.entries(groupingLabels(kind)) as [SnagGrouping, string][]).map(([g, label]) => (
            <option key={g} value={g}>
              {label}
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
        <SelectField label={words.Day} value={filters.shootDayId} onChange={(e) => set({ shootDayId: e.target.value })}>
          <option value="">All {words.days}</option>
          <option value="next">
            {words.Next}
            {data.nextShootDay ? ` (${formatDate(data.nextShootDay.date)})` : ""}
          </option>
          {data.shootDays.map((d) => (
            <option key={d.id} value={d.id}>
              {formatDate(d.date)}
            </option>
          ))}
        </SelectField>
        <label className="flex min-h-12 items-center gap-2 self-end text-sm text-ink-900">
          <input
            type="checkbox"
            className="size-5"
            checked={filters.includeDismissed}
            onChange={(e) => set({ includeDismissed: e.target.checked })}
          />
          Show dismissed
        </label>
      </div>
      {undo.error && <ErrorAlert error={undo.error} title="Not undone" />}
      {groups.length === 0 ? (
        <EmptyState title="No snags">
          {data.counts.dismissed
            ? "Every snag that matches is dismissed."
            : "Nothing in the breakdown, wardrobe or schedule conflicts with anything else right now."}
        </EmptyState>
      ) : (
        groups.map((g) => (
          <section key={g.key} aria-label={g.label} className="grid gap-2">
            <h2 className="text-sm font-bold tracking-wide text-ink uppercase">
              {g.label} <span className="font-normal text-slate">({g.snags.length})</span>
            </h2>
            {g.snags.map((s) => {
              const gone = justDismissed.get(s.key);
              if (gone && !s.dismissal) {
                // Where the card was: say what happened and offer to take it back.
                return (
                  <div
                    key={s.key}
                    role="status"
                    className="flex flex-wrap items-center gap-2 rounded-md border border-dashed border-ink-100 bg-white/70 px-3 py-2 text-sm text-ink-900"
                  >
                    <span className="min-w-0 flex-1">
                      Dismissed: <span className="font-semibold">{s.title}</span>
                    </span>
                    <Button
                      size="sm"
                      variant="secondary"
                      busy={undo.isPending && undo.variables === gone.dismissal.id}
                      onClick={() => undo.mutate(gone.dismissal.id, { onSuccess: () => forget(s.key) })}
                    >
                      Undo
                    </Button>
                  </div>
                );
              }
              return (
                <SnagCard
                  key={s.key}
                  snag={s}
                  canDismiss={canDismiss}
                  onDismiss={setDismissing}
                  onUndo={(id) => undo.mutate(id, { onSuccess: () => forget(s.key) })}
                  undoBusy={undo.isPending && undo.variables === s.dismissal?.id}
                />
              );
            })}
          </section>
        ))
      )}
      <DismissDialog
        productionId={productionId}
        snag={dismissing}
        onClose={() => setDismissing(null)}
        onDismissed={(d) => dismissing && setJustDismissed((m) => new Map(m).set(dismissing.key, { snag: dismissing, dismissal: d }))}
      />
    </div>
  );
}
