import { MEASUREMENT_KEYS, MEASUREMENT_LABELS } from "@shared/domain/plausibility";
import { formatLength, type LengthUnit } from "@shared/domain/units";
import type { MeasurementSetDto, PerformerMeasurementsDto } from "@shared/schemas/measurements";
import { Button } from "@/components/ui/button";
import { cn } from "@/utils/cn";
import { formatDate } from "@shared/format";

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Sets side by side, newest first; a value that moved since the set before it is highlighted with the change. */
export function MeasurementHistory({
  sets,
  unit,
  onDelete,
}: {
  sets: MeasurementSetDto[];
  unit: LengthUnit;
  onDelete?: (id: string) => void;
}) {
  const keys = MEASUREMENT_KEYS.filter((k) => sets.some((s) => s.valuesMm[k] !== undefined));
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" aria-label="Measurement history">
        <thead className="text-xs tracking-wide text-slate">
          <tr>
            <th className="px-2 py-1 uppercase">Measurement</th>
            {sets.map((s, i) => (
              <th key={s.id} className="px-2 py-1 align-bottom">
                <span className="block font-semibold text-ink">
                  {formatDate(s.takenOn)}
                  {i === 0 && " (current)"}
                </span>
                <span className="block font-normal">
                  {s.takenByName ?? "—"} · typed in {s.enteredUnit}
                </span>
                {onDelete && (
                  <Button
                    size="sm"
                    variant="ghost"
                    className="px-0"
                    onClick={() => onDelete(s.id)}
                    aria-label={`Delete the set of ${formatDate(s.takenOn)}`}
                  >
                    Delete
                  </Button>
                )}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {keys.map((k) => (
            <tr key={k} className="border-t border-chalk-200">
              <th className="px-2 py-1 font-normal text-slate">{cap(MEASUREMENT_LABELS[k])}</th>
              {sets.map((s, i) => {
                const v = s.valuesMm[k];
                const prev = sets[i + 1]?.valuesMm[k];
                const delta = v !== undefined && prev !== undefined ? v - prev : null;
                // Under 2 mm is tape noise; anything more is worth a look at the next fitting.
                const moved = delta !== null && Math.abs(delta) >= 2;
                return (
                  <td key={s.id} className={cn("px-2 py-1 whitespace-nowrap", moved && "bg-ochre-50 font-semibold")}>
                    {v === undefined ? "—" : formatLength(v, unit)}
                    {moved && (
                      <span className="ml-1 text-xs text-[#8a5d17]" title="Change since the previous set">
                        {delta! > 0 ? "▲ +" : "▼ −"}
                        {formatLength(Math.abs(delta!), unit)}
                      </span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** EN 13402-3 designations and ISO 9407 Mondopoint from the newest set. */
export function SizesPanel({ data }: { data: PerformerMeasurementsDto }) {
  if (data.sizes.length === 0 && !data.mondopoint)
    return <p className="text-sm text-slate">No sizes yet: record a chest or bust girth, a waist girth, or a foot length.</p>;
  return (
    <dl className="grid gap-2 text-sm sm:grid-cols-2" aria-label="Sizes">
      {data.sizes.map((s) => (
        <div key={s.garment} className="rounded-md border border-chalk-200 px-3 py-2">
          <dt className="text-slate">{s.label} — EN 13402-3</dt>
          <dd className="text-lg font-bold text-ink">
            {s.pictogram}
            {s.letter && <span className="ml-2 rounded bg-ink px-1.5 text-base text-chalk">{s.letter}</span>}
          </dd>
          <dd className="text-xs text-slate">
            {s.dimensions.map((d) => `${MEASUREMENT_LABELS[d.key]} ${d.designatedCm}`).join(" · ")}
            {s.missing.length > 0 && ` · not measured: ${s.missing.map((m) => MEASUREMENT_LABELS[m]).join(", ")}`}
          </dd>
        </div>
      ))}
      {data.mondopoint && (
        <div className="rounded-md border border-chalk-200 px-3 py-2">
          <dt className="text-slate">Shoes — ISO 9407 Mondopoint</dt>
          <dd className="text-lg font-bold text-ink">{data.mondopoint.label}</dd>
          <dd className="text-xs text-slate">
            foot length {data.mondopoint.lengthMm} mm{data.mondopoint.widthMm ? `, width ${data.mondopoint.widthMm} mm` : ""}
          </dd>
        </div>
      )}
      <p className="text-xs text-slate sm:col-span-2">
        Letter bands and size intervals are recalled, not yet checked against the purchased standard.
      </p>
    </dl>
  );
}
