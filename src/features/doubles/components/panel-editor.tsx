import { useState } from "react";
import type { DoublesFabricOptionDto, PanelDto } from "@shared/schemas/doubles";
import { validatePolygon, type Point } from "@shared/domain/panels/geometry";
import { Button } from "@/components/ui/button";
import { InputField, SelectField, controlClass } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";
import { useCreatePanel, useUpdatePanel } from "../api/doubles";
import { PanelCanvas } from "./panel-canvas";

type Pt = [number, number];

interface Draft {
  name: string;
  outline: Pt[];
  grainline: [Pt, Pt] | null;
  notches: { point: Pt; edge: number }[];
  seamAllowanceMm: number;
  cutCount: number;
  mirrored: boolean;
  grainMode: "straight" | "bias" | "free";
  fabricId: string | null;
}

const blank: Draft = {
  name: "",
  outline: [],
  grainline: null,
  notches: [],
  seamAllowanceMm: 10,
  cutCount: 1,
  mirrored: false,
  grainMode: "straight",
  fabricId: null,
};

/**
 * Creates or edits a panel: points typed in millimetres (or clicked on the canvas), grainline,
 * notches as edge + position, allowance, cut count, mirroring, grain freedom and fabric.
 */
export function PanelEditor({
  productionId,
  garmentId,
  panel,
  fabrics,
  onDone,
}: {
  productionId: string;
  garmentId: string;
  panel: PanelDto | null;
  fabrics: DoublesFabricOptionDto[];
  onDone: () => void;
}) {
  const [d, setD] = useState<Draft>(() =>
    panel
      ? {
          ...panel,
          outline: panel.outline.map((p) => [...p] as Pt),
          notches: panel.notches.map((n) => ({ point: [...n.point] as Pt, edge: n.edge })),
        }
      : blank,
  );
  const create = useCreatePanel(productionId);
  const update = useUpdatePanel(productionId);
  const save = panel ? update : create;
  const set = <K extends keyof Draft>(k: K, v: Draft[K]) => setD((x) => ({ ...x, [k]: v }));
  const check = d.outline.length >= 3 ? validatePolygon(d.outline as Point[]) : null;
  const setPoint = (i: number, axis: 0 | 1, v: number) =>
    set(
      "outline",
      d.outline.map((p, k) => (k === i ? ((axis === 0 ? [v, p[1]] : [p[0], v]) as Pt) : p)),
    );
  const fieldError = save.error && "fields" in save.error ? (save.error as { fields: Record<string, string> }).fields : {};

  const submit = () => {
    const input = { ...d, name: d.name.trim() };
    if (panel) update.mutate({ id: panel.id, input }, { onSuccess: onDone });
    else create.mutate({ ...input, garmentId }, { onSuccess: onDone });
  };

  return (
    <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]" aria-label="Panel editor">
      <div className="grid gap-3">
        <div className="grid grid-cols-2 gap-3">
          <InputField label="Piece name" value={d.name} onChange={(e) => set("name", e.target.value)} error={fieldError.name} />
          <SelectField label="Fabric" value={d.fabricId ?? ""} onChange={(e) => set("fabricId", e.target.value || null)}>
            <option value="">Garment's fabric</option>
            {fabrics.map((f) => (
              <option key={f.id} value={f.id}>
                {f.name}
              </option>
            ))}
          </SelectField>
          <InputField
            label="Seam allowance (mm)"
            type="number"
            min={0}
            step={1}
            value={d.seamAllowanceMm}
            onChange={(e) => set("seamAllowanceMm", Number(e.target.value))}
            error={fieldError.seamAllowanceMm}
          />
          <InputField
            label="Cut count"
            type="number"
            min={1}
            max={99}
            value={d.cutCount}
            onChange={(e) => set("cutCount", Number(e.target.value))}
            error={fieldError.cutCount}
          />
          <SelectField label="Grain" value={d.grainMode} onChange={(e) => set("grainMode", e.target.value as Draft["grainMode"])}>
            <option value="straight">Straight grain (0° / 180°)</option>
            <option value="bias">Bias piece (may turn)</option>
            <option value="free">Free (may turn)</option>
          </SelectField>
          <label className="flex items-center gap-2 self-end pb-2 text-sm font-semibold text-ink-900">
            <input type="checkbox" checked={d.mirrored} onChange={(e) => set("mirrored", e.target.checked)} /> Cut in mirrored pairs
          </label>
        </div>
        <fieldset className="grid gap-1">
          <legend className="text-sm font-semibold text-ink-900">Outline points (mm, y up)</legend>
          <div className="max-h-64 overflow-y-auto rounded border border-chalk-200">
            <table className="w-full text-sm" aria-label="Outline points">
              <thead className="text-xs text-slate">
                <tr>
                  <th className="px-2 text-left">#</th>
                  <th className="px-2 text-left">x</th>
                  <th className="px-2 text-left">y</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {d.outline.map((p, i) => (
                  <tr key={i}>
                    <td className="px-2 text-slate">{i}</td>
                    <td className="px-1">
                      <input
                        aria-label={`Point ${i} x`}
                        type="number"
                        step="0.1"
                        className={`${controlClass} py-1`}
                        value={p[0]}
                        onChange={(e) => setPoint(i, 0, Number(e.target.value))}
                      />
                    </td>
                    <td className="px-1">
                      <input
                        aria-label={`Point ${i} y`}
                        type="number"
                        step="0.1"
                        className={`${controlClass} py-1`}
                        value={p[1]}
                        onChange={(e) => setPoint(i, 1, Number(e.target.value))}
                      />
                    </td>
                    <td className="px-1">
                      <Button
                        size="sm"
                        variant="ghost"
                        aria-label={`Remove point ${i}`}
                        onClick={() =>
                          set(
                            "outline",
                            d.outline.filter((_, k) => k !== i),
                          )
                        }
                      >
                        ✕
                      </Button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <div className="flex flex-wrap gap-2">
            <Button
              size="sm"
              variant="secondary"
              onClick={() => set("outline", [...d.outline, (d.outline.at(-1) ?? [0, 0]).map((v) => v + 10) as Pt])}
            >
              Add point
            </Button>
            <span className="text-xs text-slate">or click on the drawing to add a point there.</span>
          </div>
          {check && !check.valid && <p className="text-sm text-madder">{check.issues.map((i) => i.message).join("; ")}</p>}
          {fieldError.outline && <p className="text-sm text-madder">{fieldError.outline}</p>}
        </fieldset>
        <fieldset className="grid grid-cols-4 gap-2">
          <legend className="text-sm font-semibold text-ink-900">Grainline (from → to, mm)</legend>
          {[0, 1].flatMap((end) =>
            [0, 1].map((axis) => (
              <input
                key={`${end}${axis}`}
                aria-label={`Grainline ${end === 0 ? "start" : "end"} ${axis === 0 ? "x" : "y"}`}
                type="number"
                className={`${controlClass} py-1`}
                value={d.grainline ? d.grainline[end][axis] : ""}
                onChange={(e) => {
                  const g: [Pt, Pt] = d.grainline
                    ? [[...d.grainline[0]] as Pt, [...d.grainline[1]] as Pt]
                    : [
                        [0, 0],
                        [0, 100],
                      ];
                  g[end][axis] = Number(e.target.value);
                  set("grainline", g);
                }}
              />
            )),
          )}
        </fieldset>
        <fieldset className="grid gap-1">
          <legend className="text-sm font-semibold text-ink-900">Notches (edge i runs from point i to i+1; position 0–1 along it)</legend>
          {d.notches.map((n, i) => {
            const a = d.outline[n.edge];
            const b = d.outline[(n.edge + 1) % Math.max(1, d.outline.length)];
            const t = a && b ? Math.hypot(n.point[0] - a[0], n.point[1] - a[1]) / (Math.hypot(b[0] - a[0], b[1] - a[1]) || 1) : 0;
            const place = (edge: number, tt: number): { point: Pt; edge: number } => {
              const p = d.outline[edge] ?? [0, 0];
              const q = d.outline[(edge + 1) % Math.max(1, d.outline.length)] ?? p;
              return {
                edge,
                point: [Math.round((p[0] + (q[0] - p[0]) * tt) * 100) / 100, Math.round((p[1] + (q[1] - p[1]) * tt) * 100) / 100],
              };
            };
            return (
              <div key={i} className="flex items-center gap-2">
                <input
                  aria-label={`Notch ${i + 1} edge`}
                  type="number"
                  min={0}
                  className={`${controlClass} w-20 py-1`}
                  value={n.edge}
                  onChange={(e) =>
                    set(
                      "notches",
                      d.notches.map((x, k) => (k === i ? place(Number(e.target.value), t) : x)),
                    )
                  }
                />
                <input
                  aria-label={`Notch ${i + 1} position`}
                  type="number"
                  min={0}
                  max={1}
                  step={0.05}
                  className={`${controlClass} w-24 py-1`}
                  value={Math.round(t * 100) / 100}
                  onChange={(e) =>
                    set(
                      "notches",
                      d.notches.map((x, k) => (k === i ? place(x.edge, Number(e.target.value)) : x)),
                    )
                  }
                />
                <Button
                  size="sm"
                  variant="ghost"
                  onClick={() =>
                    set(
                      "notches",
                      d.notches.filter((_, k) => k !== i),
                    )
                  }
                >
                  Remove
                </Button>
              </div>
            );
          })}
          <div>
            <Button
              size="sm"
              variant="secondary"
              disabled={d.outline.length < 2}
              onClick={() => {
                const a = d.outline[0]!;
                const b = d.outline[1]!;
                set("notches", [...d.notches, { edge: 0, point: [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2] }]);
              }}
            >
              Add notch
            </Button>
          </div>
        </fieldset>
        {save.error && !Object.keys(fieldError).length && <ErrorAlert error={save.error} title="Not saved" />}
        <div className="flex gap-2">
          <Button onClick={submit} busy={save.isPending} disabled={!check?.valid || !d.name.trim()}>
            {panel ? "Save panel" : "Create panel"}
          </Button>
          <Button variant="secondary" onClick={onDone}>
            Cancel
          </Button>
        </div>
      </div>
      <PanelCanvas panel={d} height={420} onAddPoint={(p) => set("outline", [...d.outline, p])} />
    </div>
  );
}
