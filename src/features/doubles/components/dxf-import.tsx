import { useEffect, useState } from "react";
import type { DoublesFabricOptionDto } from "@shared/schemas/doubles";
import type { DxfImport as DxfReport, DxfPiece } from "@shared/domain/panels/dxf";
import type { DxfUnit } from "@shared/domain/panels/dxf-units";
import { formatQuantity } from "@shared/domain/number-format";
import { Button } from "@/components/ui/button";
import { InputField, SelectField } from "@/components/ui/field";
import { Badge, ErrorAlert } from "@/components/ui/feedback";
import { useDxfImport, useDxfPreview } from "../api/doubles";
import { PanelCanvas } from "./panel-canvas";

const UNIT_NAMES: Record<DxfUnit, string> = { mm: "millimetres", cm: "centimetres", m: "metres", in: "inches", ft: "feet" };
const UNIT_FROM: Record<DxfReport["units"]["from"], string> = {
  header: "as the file's header says",
  annotation: 'from the file\'s "Units:" text',
  override: "as chosen here",
  assumed: "assumed: the file does not say",
};
const cm = (mm: number) => formatQuantity(mm / 10, "cm", { decimals: 1 });
const cm2 = (mm2: number) => formatQuantity(mm2 / 100, "cm²", { decimals: 0 });

/** One piece found in the file: drawing, sizes, what was recognised and any problem. */
function PieceCard({ piece }: { piece: DxfPiece }) {
  return (
    <li className="rounded-md border border-chalk-200 bg-white p-2">
      <PanelCanvas
        height={180}
        showVertices={false}
        label={`${piece.name}: ${cm(piece.widthMm)} by ${cm(piece.heightMm)}`}
        panel={{
          name: `${piece.name} ×${piece.cutCount}`,
          outline: piece.outline as [number, number][],
          grainline: (piece.grainline as [[number, number], [number, number]] | null) ?? null,
          notches: (piece.notches ?? []) as { point: [number, number]; edge: number }[],
          seamAllowanceMm: piece.seamAllowanceMm,
          cutLine: piece.seamAllowanceFrom === "file" ? (piece.cutLine as [number, number][] | null) : null,
        }}
      />
      <p className="mt-1 text-sm font-semibold text-ink">
        {piece.name}{" "}
        <span className="font-normal text-slate">
          cut {piece.cutCount}
          {piece.mirrored ? " (mirrored pairs)" : ""}
          {piece.size ? ` · size ${piece.size}` : ""}
        </span>
      </p>
      <p className="text-xs text-slate">
        {cm(piece.widthMm)} × {cm(piece.heightMm)} · {cm2(piece.areaMm2)} · seam allowance{" "}
        {formatQuantity(piece.seamAllowanceMm, "mm", { decimals: 1 })}{" "}
        {piece.seamAllowanceFrom === "file" ? "(measured in the file)" : "(as entered)"}
      </p>
      <ul className="mt-1 list-disc pl-4 text-xs text-slate">
        {piece.recognised.map((r) => (
          <li key={r}>{r}</li>
        ))}
      </ul>
      {!piece.importable && (
        <div className="mt-1 text-xs text-madder" role="alert">
          <Badge tone="blocking">not imported</Badge>
          <ul className="mt-1 list-disc pl-4">
            {piece.problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </div>
      )}
    </li>
  );
}

/** Upload a DXF file, look at the pieces found and what was left out, then import them onto the garment. */
export function DxfImport({
  productionId,
  garmentId,
  fabrics,
  onDone,
}: {
  productionId: string;
  garmentId: string;
  fabrics: DoublesFabricOptionDto[];
  onDone: () => void;
}) {
  const [file, setFile] = useState<File | null>(null);
  const [units, setUnits] = useState<DxfUnit | "">("");
  const [allowance, setAllowance] = useState("10");
  const [fabricId, setFabricId] = useState("");
  const preview = useDxfPreview(productionId);
  const importer = useDxfImport(productionId);
  const allowanceMm = Number(allowance);
  const allowanceError =
    allowance === "" || !Number.isFinite(allowanceMm) || allowanceMm < 0 || allowanceMm > 100 ? "between 0 and 100 mm" : undefined;
  const { mutate } = preview;

  // Read the file again when the units or the allowance change (pieces without a sew line depend on it).
  useEffect(() => {
    if (!file || allowanceError) return;
    const t = setTimeout(() => mutate({ file, units, seamAllowanceMm: allowanceMm }), 300);
    return () => clearTimeout(t);
  }, [file, units, allowanceMm, allowanceError, mutate]);

  const report = preview.data;
  const importable = report?.pieces.filter((p) => p.importable) ?? [];
  const unitsDeclared = report ? report.units.from === "header" || report.units.from === "annotation" : true;
  return (
    <div className="grid gap-3" aria-label="DXF import">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4 sm:items-start">
        <InputField
          label="DXF file"
          type="file"
          accept=".dxf"
          hint="ASCII DXF up to 5 MB"
          onChange={(e) => {
            importer.reset();
            setFile(e.target.files?.[0] ?? null);
          }}
        />
        <SelectField
          label="Drawing units"
          value={units}
          onChange={(e) => setUnits(e.target.value as DxfUnit | "")}
          error={report && !unitsDeclared && !units ? "The file does not say its units: check the sizes and choose" : undefined}
        >
          <option value="">As the file says{report && unitsDeclared ? ` (${UNIT_NAMES[report.units.unit]})` : ""}</option>
          {(Object.keys(UNIT_NAMES) as DxfUnit[]).map((u) => (
            <option key={u} value={u}>
              {UNIT_NAMES[u]}
            </option>
          ))}
        </SelectField>
        <InputField
          label="Seam allowance (mm)"
          type="number"
          inputMode="decimal"
          min={0}
          max={100}
          step={0.5}
          value={allowance}
          error={allowanceError}
          hint="For pieces whose file has no separate cut and sew line"
          onChange={(e) => setAllowance(e.target.value)}
        />
        <SelectField label="Fabric" value={fabricId} onChange={(e) => setFabricId(e.target.value)}>
          <option value="">Garment's fabric</option>
          {fabrics.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name}
            </option>
          ))}
        </SelectField>
      </div>
      <details className="text-xs text-slate">
        <summary className="cursor-pointer">What is read from a DXF file</summary>
        <p className="mt-1">
          Files using the ASTM D6673 layer numbers: each block is a piece; layer 1 is the cut line, 14 the sew line, 7 the grain line, 4
          (and 80–83) notches; texts "Piece Name:", "Size:" and "Quantity:". Other files: every closed outline is a piece's sew line —
          closed polylines (with bulge arcs), circles, ellipses, closed splines, or lines, arcs and splines meeting end to end; text inside
          names it ("CUT 2" for the count, "MIRRORED" for pairs), the longest line inside is the grain line, short lines from the edge are
          notches. Curves become chords no more than 0.01 mm from the true curve.
        </p>
      </details>
      {!file && <p className="text-sm text-slate">Choose a file to see its pieces before anything is imported.</p>}
      {preview.isPending && (
        <p className="text-sm text-slate" role="status">
          Reading the file…
        </p>
      )}
      {preview.error && <ErrorAlert error={preview.error} title="Cannot read this file" />}
      {report && !preview.isPending && (
        <>
          <p className="text-sm text-ink" role="status">
            {report.pieces.length === 0 ? "No piece found." : `${report.pieces.length} piece${report.pieces.length === 1 ? "" : "s"} found`}{" "}
            · {report.convention === "astm-d6673" ? "ASTM D6673 layers" : "outlines by shape"} · {UNIT_NAMES[report.units.unit]} (
            {UNIT_FROM[report.units.from]}) · chords within {report.chordToleranceMm} mm, ends joined within {report.joinToleranceMm} mm
          </p>
          {report.warnings.length > 0 && (
            <ul className="list-disc pl-5 text-sm text-[#8a5d17]">
              {report.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          )}
          {report.pieces.length > 0 && (
            <ul className="grid gap-2 sm:grid-cols-2 lg:grid-cols-3" aria-label="Pieces found">
              {report.pieces.map((p) => (
                <PieceCard key={p.id} piece={p} />
              ))}
            </ul>
          )}
          {report.ignored.length > 0 && (
            <div className="overflow-x-auto">
              <table className="w-full text-left text-xs" aria-label="Not used from the file">
                <caption className="mb-1 text-left text-sm font-semibold text-ink">Not used from the file</caption>
                <thead className="border-b border-chalk-200 uppercase tracking-wide text-slate">
                  <tr>
                    <th className="px-2 py-1">Entity</th>
                    <th className="px-2 py-1">Layer</th>
                    <th className="px-2 py-1">Count</th>
                    <th className="px-2 py-1">Why</th>
                    <th className="px-2 py-1">Where</th>
                  </tr>
                </thead>
                <tbody>
                  {report.ignored.map((g) => (
                    <tr key={`${g.entity}-${g.layer}-${g.reason}`} className="border-b border-chalk-200 align-top last:border-0">
                      <td className="px-2 py-1 font-semibold">{g.entity}</td>
                      <td className="px-2 py-1">{g.layer}</td>
                      <td className="px-2 py-1">{g.count}</td>
                      <td className="px-2 py-1">{g.reason}</td>
                      <td className="px-2 py-1 text-slate">
                        {g.where.slice(0, 5).join(", ")}
                        {g.where.length > 5 ? ", …" : ""}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </>
      )}
      {importer.error && <ErrorAlert error={importer.error} title="Not imported" />}
      <div className="flex flex-wrap gap-2">
        <Button
          busy={importer.isPending}
          disabled={!file || !report || importable.length === 0 || Boolean(allowanceError) || preview.isPending}
          onClick={() => file && importer.mutate({ file, units, seamAllowanceMm: allowanceMm, garmentId, fabricId }, { onSuccess: onDone })}
        >
          {importable.length ? `Import ${importable.length} piece${importable.length === 1 ? "" : "s"}` : "Import"}
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </div>
  );
}
