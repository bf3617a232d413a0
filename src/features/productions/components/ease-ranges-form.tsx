import { useState } from "react";
import type { ProductionDto } from "@shared/schemas/productions";
import type { EaseOverrides } from "@shared/domain/snags/types";
import { EASE_TABLE, easeRangeFor } from "@shared/domain/snags/fit";
import { formatLength, parseLength } from "@shared/domain/units";
import { useUpdateProduction } from "../api/productions";
import { Button } from "@/components/ui/button";
import { InputField, SelectField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";

type Intent = "fitted" | "regular" | "loose";
const intents: Intent[] = ["fitted", "regular", "loose"];
const label = (s: string) => s.replace(/_/g, " ");

interface Row {
  category: string;
  point: string;
  intent: Intent;
  min: number;
  max: number | null;
}

function rowsOf(o: EaseOverrides | undefined): Row[] {
  const rows: Row[] = [];
  for (const [category, points] of Object.entries(o ?? {}))
    for (const [point, byIntent] of Object.entries(points))
      for (const intent of intents) {
        const r = byIntent[intent];
        if (r) rows.push({ category, point, intent, min: r.min, max: r.max });
      }
  return rows;
}

function overridesOf(rows: Row[]): EaseOverrides {
  const o: EaseOverrides = {};
  for (const r of rows) ((o[r.category] ??= {})[r.point] ??= {})[r.intent] = { min: r.min, max: r.max };
  return o;
}

/** The department's own ease ranges; the fit check uses them instead of the handbook's. */
export function EaseRangesForm({ production }: { production: ProductionDto }) {
  const update = useUpdateProduction(production.id);
  const unit = production.units;
  const [rows, setRows] = useState<Row[]>(() => rowsOf(production.settings.easeOverrides));
  const categories = Object.keys(EASE_TABLE);
  const [category, setCategory] = useState(categories[0]!);
  const points = Object.keys(EASE_TABLE[category] ?? {});
  const [point, setPoint] = useState(points[0]!);
  const [intent, setIntent] = useState<Intent>("fitted");
  const [min, setMin] = useState("");
  const [max, setMax] = useState("");
  const [errors, setErrors] = useState<{ min?: string; max?: string }>({});
  const handbook = easeRangeFor(category, point, intent);

  const add = () => {
    const lo = parseLength(min, unit);
    const hi = max.trim() ? parseLength(max, unit) : null;
    const e: typeof errors = {};
    if (!lo.ok) e.min = lo.reason;
    if (hi && !hi.ok) e.max = hi.reason;
    if (lo.ok && hi && hi.ok && hi.mm < lo.mm) e.max = "must be at least the minimum";
    setErrors(e);
    if (Object.keys(e).length || !lo.ok) return;
    const next = rows.filter((r) => !(r.category === category && r.point === point && r.intent === intent));
    next.push({ category, point, intent, min: Math.round(lo.mm), max: hi && hi.ok ? Math.round(hi.mm) : null });
    setRows(next);
    setMin("");
    setMax("");
  };
  const save = (next: Row[]) => update.mutate({ settings: { easeOverrides: overridesOf(next) } });
  const dirty = JSON.stringify(overridesOf(rows)) !== JSON.stringify(production.settings.easeOverrides ?? {});

  return (
    <div className="grid gap-3">
      <p className="text-sm text-slate">
        The fit check compares finished measurement minus body measurement with a range per garment and fit intent, from published
        pattern-cutting values. Set your own where the department works differently.
      </p>
      {rows.length ? (
        <ul className="divide-y divide-chalk-200 text-sm" aria-label="Ease ranges set for this production">
          {rows.map((r) => (
            <li key={`${r.category}.${r.point}.${r.intent}`} className="flex flex-wrap items-center justify-between gap-2 py-1.5">
              <span>
                <span className="font-semibold text-ink-900">
                  {label(r.category)} · {label(r.point)} · {r.intent}
                </span>{" "}
                {formatLength(r.min, unit)} to {r.max === null ? "no limit" : formatLength(r.max, unit)}
              </span>
              <Button size="sm" variant="ghost" onClick={() => setRows(rows.filter((x) => x !== r))}>
                Remove
              </Button>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-sm text-slate">No own ranges: the handbook values apply everywhere.</p>
      )}
      <div className="grid gap-2 sm:grid-cols-5 sm:items-end">
        <SelectField
          label="Garment"
          value={category}
          onChange={(e) => {
            setCategory(e.target.value);
            setPoint(Object.keys(EASE_TABLE[e.target.value] ?? {})[0]!);
          }}
        >
          {categories.map((c) => (
            <option key={c} value={c}>
              {label(c)}
            </option>
          ))}
        </SelectField>
        <SelectField label="Point" value={point} onChange={(e) => setPoint(e.target.value)}>
          {points.map((p) => (
            <option key={p} value={p}>
              {label(p)}
            </option>
          ))}
        </SelectField>
        <SelectField label="Fit" value={intent} onChange={(e) => setIntent(e.target.value as Intent)}>
          {intents.map((i) => (
            <option key={i} value={i}>
              {i}
            </option>
          ))}
        </SelectField>
        <InputField
          label={`Min ease (${unit})`}
          value={min}
          onChange={(e) => setMin(e.target.value)}
          error={errors.min}
          inputMode="decimal"
        />
        <InputField
          label={`Max ease (${unit})`}
          value={max}
          onChange={(e) => setMax(e.target.value)}
          error={errors.max}
          inputMode="decimal"
          hint="Empty: no upper limit"
        />
      </div>
      {handbook && (
        <p className="text-xs text-slate">
          Handbook value here: {formatLength(handbook.range.min, unit)} to{" "}
          {handbook.range.max === null ? "no limit" : formatLength(handbook.range.max, unit)} ({handbook.source}).
        </p>
      )}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={add}>
          Add or replace range
        </Button>
        <Button onClick={() => save(rows)} disabled={!dirty} busy={update.isPending}>
          Save ease ranges
        </Button>
        {update.isSuccess && !dirty && <span className="self-center text-sm text-ink">Saved.</span>}
      </div>
      {update.error && <ErrorAlert error={update.error} title="Not saved" />}
    </div>
  );
}
