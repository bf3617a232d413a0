import { Link, useParams } from "react-router-dom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { MEASUREMENT_KEYS, MEASUREMENT_LABELS } from "@shared/domain/plausibility";
import { formatLength } from "@shared/domain/units";
import { usePerformerMeasurements } from "@/features/measurements/api/measurements";
import { SizesPanel } from "@/features/measurements/components/measurement-history";
import { formatDate, formatNumber } from "@shared/format";

// Only the sheet prints: everything else on the page is hidden in print.
const PRINT_CSS = `@media print {
  body * { visibility: hidden !important; }
  #measurement-sheet, #measurement-sheet * { visibility: visible !important; }
  #measurement-sheet { position: absolute; left: 0; top: 0; width: 100%; padding: 0; }
  @page { margin: 15mm; }
}`;

const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** A one-page measurement sheet for the workroom wall or a hire house: cm and inches side by side. */
export default function PerformerMeasurementSheet() {
  const { performerId = "" } = useParams();
  const { productionId, production, can } = useCurrentProduction();
  const data = usePerformerMeasurements(productionId, can("measurement.read") ? performerId : "");
  if (!production || data.isPending) return <Spinner />;
  if (data.error) return <ErrorAlert error={data.error} />;
  const d = data.data;
  const current = d.sets[0];
  return (
    <div>
      <style>{PRINT_CSS}</style>
      <div className="mb-3 flex gap-2 print:hidden">
        <Link to=".." relative="path" className="rounded-md border border-ink-100 bg-white px-3 py-2 text-sm font-semibold text-ink">
          Back
        </Link>
        <Button onClick={() => window.print()}>Print</Button>
      </div>
      <article id="measurement-sheet" className="max-w-3xl bg-white p-6 text-ink-900">
        <header className="mb-4 border-b border-ink pb-2">
          <p className="text-xs uppercase tracking-wide text-slate">{production.title} · measurement sheet · confidential</p>
          <h1 className="text-2xl font-bold">{d.performer.name}</h1>
          {current ? (
            <p className="text-sm">
              Taken {formatDate(current.takenOn)} by {current.takenByName ?? "—"}
              {current.notes ? ` · ${current.notes}` : ""}
            </p>
          ) : (
            <p className="text-sm">No measurements recorded.</p>
          )}
        </header>
        {current && (
          <table className="mb-4 w-full text-sm" aria-label="Measurements">
            <thead>
              <tr className="text-left text-xs uppercase text-slate">
                <th className="py-1">Measurement (ISO 8559-1)</th>
                <th className="py-1">cm</th>
                <th className="py-1">in</th>
                <th className="py-1">mm</th>
              </tr>
            </thead>
            <tbody>
              {MEASUREMENT_KEYS.filter((k) => current.valuesMm[k] !== undefined).map((k) => (
                <tr key={k} className="border-t border-chalk-200">
                  <td className="py-1">{cap(MEASUREMENT_LABELS[k])}</td>
                  <td className="py-1">{formatLength(current.valuesMm[k]!, "cm")}</td>
                  <td className="py-1">{formatLength(current.valuesMm[k]!, "in")}</td>
                  <td className="py-1 text-slate">{formatNumber(current.valuesMm[k]!, 1)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <SizesPanel data={d} />
      </article>
    </div>
  );
}
