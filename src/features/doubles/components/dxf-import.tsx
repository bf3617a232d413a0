import { useState } from "react";
import type { DoublesFabricOptionDto } from "@shared/schemas/doubles";
import { Button } from "@/components/ui/button";
import { InputField, SelectField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";
import { useDxfImport, useDxfPreview } from "../api/doubles";
import { PanelCanvas } from "./panel-canvas";

/** Upload a DXF file, look at the pieces found (and any warnings), then import them onto the garment. */
export function DxfImport({ productionId, garmentId, fabrics, onDone }: { productionId: string; garmentId: string; fabrics: DoublesFabricOptionDto[]; onDone: () => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [allowance, setAllowance] = useState(10);
  const [fabricId, setFabricId] = useState("");
  const preview = useDxfPreview(productionId);
  const importer = useDxfImport(productionId);
  return (
    <div className="grid gap-3" aria-label="DXF import">
      <div className="grid gap-3 sm:grid-cols-3 sm:items-end">
        <InputField
          label="DXF file"
          type="file"
          accept=".dxf"
          onChange={(e) => {
            const f = e.target.files?.[0] ?? null;
            setFile(f);
            if (f) preview.mutate(f);
          }}
        />
        <InputField label="Seam allowance (mm)" type="number" min={0} value={allowance} onChange={(e) => setAllowance(Number(e.target.value))} />
        <SelectField label="Fabric" value={fabricId} onChange={(e) => setFabricId(e.target.value)}>
          <option value="">Garment's fabric</option>
          {fabrics.map((f) => (
            <option key={f.id} value={f.id}>
              {f.name}
            </option>
          ))}
        </SelectField>
      </div>
      <p className="text-xs text-slate">Each closed polyline is a piece; text inside it gives the name and "CUT n" (add "MIRRORED" for pairs); a longer line inside is the grainline; short lines from the edge are notches.</p>
      {preview.isPending && <p className="text-sm text-slate">Reading the file…</p>}
      {preview.error && <ErrorAlert error={preview.error} title="Cannot read this file" />}
      {preview.data && (
        <>
          {preview.data.warnings.length > 0 && (
            <ul className="list-disc pl-5 text-sm text-[#8a5d17]">
              {preview.data.warnings.map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          )}
          <div className="grid gap-2 sm:grid-cols-3">
            {preview.data.panels.map((p) => (
              <div key={p.id}>
                <PanelCanvas height={180} showVertices={false} panel={{ name: `${p.name} ×${p.cutCount}`, outline: p.outline as [number, number][], grainline: (p.grainline as [[number, number], [number, number]] | null) ?? null, notches: (p.notches ?? []) as { point: [number, number]; edge: number }[], seamAllowanceMm: allowance }} />
              </div>
            ))}
          </div>
          <div className="flex gap-2">
            <Button busy={importer.isPending} onClick={() => file && importer.mutate({ file, garmentId, seamAllowanceMm: allowance, fabricId }, { onSuccess: onDone })}>
              Import {preview.data.panels.length} piece{preview.data.panels.length === 1 ? "" : "s"}
            </Button>
            <Button variant="secondary" onClick={onDone}>
              Cancel
            </Button>
          </div>
        </>
      )}
      {importer.error && <ErrorAlert error={importer.error} title="Not imported" />}
    </div>
  );
}
