import { useState } from "react";
import type { DoublesChangeDto, SeamDto } from "@shared/schemas/doubles";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { InputField, SelectField } from "@/components/ui/field";
import { Badge, EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useCreateSeam, useDeleteSeam, usePanels, useSeams } from "../api/doubles";
import { ConfirmDialog } from "@/components/ui/dialog";

const mm = (v: number) => `${v.toFixed(1)} mm`;
const runText = (s: SeamDto["a"]) =>
  `${s.panelName} ${typeof s.from === "number" ? s.from : `${s.from.edge}+${s.from.t}`}→${typeof s.to === "number" ? s.to : `${s.to.edge}+${s.to.t}`}${s.direction === "backward" ? " (backward)" : ""}`;

function statusBadge(s: SeamDto) {
  if (s.status === "ok") return <Badge tone="note">matches</Badge>;
  if (s.status === "eased_within_range") return <Badge tone="neutral">eased, in range</Badge>;
  if (s.status === "eased_out_of_range") return <Badge tone="blocking">ease out of range</Badge>;
  return <Badge tone="blocking">mismatch</Badge>;
}

interface SideForm {
  panelId: string;
  from: number;
  to: number;
  direction: "forward" | "backward";
}

/** Seams of the change with both lengths, the difference and a mismatch flag; a form to join two runs. */
export function SeamsTab({ productionId, change, canEdit }: { productionId: string; change: DoublesChangeDto; canEdit: boolean }) {
  const seams = useSeams(productionId, { changeId: change.id });
  const panels = usePanels(productionId, { changeId: change.id });
  const create = useCreateSeam(productionId);
  const del = useDeleteSeam(productionId);
  const [deleting, setDeleting] = useState<{ id: string; name: string } | null>(null);
  const [name, setName] = useState("");
  const [a, setA] = useState<SideForm>({ panelId: "", from: 0, to: 1, direction: "forward" });
  const [b, setB] = useState<SideForm>({ panelId: "", from: 0, to: 1, direction: "forward" });
  const [eased, setEased] = useState(false);
  const [ease, setEase] = useState({ minMm: 5, maxMm: 25 });
  const [tolerance, setTolerance] = useState("");
  const garmentName = new Map(change.garments.map((g) => [g.id, g.name]));
  const fields = create.error instanceof ApiError ? create.error.fields : {};

  const side = (label: string, v: SideForm, set: (x: SideForm) => void, key: "a" | "b") => (
    <fieldset className="grid grid-cols-2 gap-2 sm:grid-cols-4">
      <legend className="text-sm font-semibold text-ink-900">{label}</legend>
      <SelectField
        label="Panel"
        value={v.panelId}
        onChange={(e) => set({ ...v, panelId: e.target.value })}
        error={fields[`${key}.panelId`]}
      >
        <option value="">Choose…</option>
        {(panels.data ?? []).map((p) => (
          <option key={p.id} value={p.id}>
            {garmentName.get(p.garmentId)}: {p.name} (0–{p.outline.length - 1})
          </option>
        ))}
      </SelectField>
      <InputField
        label="From point"
        type="number"
        min={0}
        value={v.from}
        onChange={(e) => set({ ...v, from: Number(e.target.value) })}
        error={fields[`${key}.from`]}
      />
      <InputField
        label="To point"
        type="number"
        min={0}
        value={v.to}
        onChange={(e) => set({ ...v, to: Number(e.target.value) })}
        error={fields[`${key}.to`]}
      />
      <SelectField label="Walk" value={v.direction} onChange={(e) => set({ ...v, direction: e.target.value as SideForm["direction"] })}>
        <option value="forward">forward</option>
        <option value="backward">backward</option>
      </SelectField>
    </fieldset>
  );

  return (
    <div className="grid grid-cols-1 gap-4">
      <Card>
        <h2 className="mb-3 font-semibold text-ink">Seams</h2>
        {seams.isPending ? (
          <Spinner />
        ) : seams.error ? (
          <ErrorAlert error={seams.error} />
        ) : seams.data.length === 0 ? (
          <EmptyState title="No seams yet">Join an edge (or a run of edges between two points) of one panel to another.</EmptyState>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" aria-label="Seams">
              <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
                <tr>
                  <th className="px-2 py-1">Seam</th>
                  <th className="px-2 py-1">Side A</th>
                  <th className="px-2 py-1">Side B</th>
                  <th className="px-2 py-1">A</th>
                  <th className="px-2 py-1">B</th>
                  <th className="px-2 py-1">A − B</th>
                  <th className="px-2 py-1">Check</th>
                  <th>
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {seams.data.map((s) => (
                  <tr key={s.id} className="border-b border-chalk-200 last:border-0" title={s.message}>
                    <td className="px-2 py-1 font-semibold">{s.name}</td>
                    <td className="px-2 py-1">{runText(s.a)}</td>
                    <td className="px-2 py-1">{runText(s.b)}</td>
                    <td className="px-2 py-1">{mm(s.lengthA)}</td>
                    <td className="px-2 py-1">{mm(s.lengthB)}</td>
                    <td className="px-2 py-1">
                      {s.differenceMm >= 0 ? "+" : ""}
                      {mm(s.differenceMm)}
                    </td>
                    <td className="px-2 py-1">
                      {statusBadge(s)}{" "}
                      <span className="block text-xs text-slate">
                        {s.eased ? `ease ${s.eased.minMm} to ${s.eased.maxMm} mm` : `± ${s.effectiveToleranceMm} mm`}
                      </span>
                    </td>
                    <td className="px-2 py-1">
                      {canEdit && (
                        <Button size="sm" variant="ghost" onClick={() => setDeleting(s)} aria-label={`Delete seam ${s.name}`}>
                          Delete
                        </Button>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </Card>
      {del.error && <ErrorAlert error={del.error} title="Seam not deleted" />}
      <ConfirmDialog
        open={Boolean(deleting)}
        title={`Delete seam ${deleting?.name ?? ""}?`}
        confirmLabel="Delete seam"
        danger
        busy={del.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={() => deleting && del.mutate(deleting.id, { onSettled: () => setDeleting(null) })}
      >
        The pairing of the two edges goes; the panels stay. Packets already published keep their copy.
      </ConfirmDialog>
      {canEdit && (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">Join two runs</h2>
          <form
            className="grid gap-3"
            aria-label="New seam"
            onSubmit={(e) => {
              e.preventDefault();
              create.mutate(
                { name, a, b, toleranceMm: tolerance === "" ? null : Number(tolerance), eased: eased ? ease : null },
                { onSuccess: () => setName("") },
              );
            }}
          >
            <InputField label="Seam name" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} />
            {side("Side A", a, setA, "a")}
            {side("Side B", b, setB, "b")}
            <div className="grid grid-cols-2 gap-3 sm:grid-cols-4 sm:items-end">
              <InputField
                label="Tolerance (mm)"
                placeholder="production default"
                type="number"
                min={0}
                value={tolerance}
                onChange={(e) => setTolerance(e.target.value)}
              />
              <label className="flex items-center gap-2 pb-2 text-sm font-semibold">
                <input type="checkbox" checked={eased} onChange={(e) => setEased(e.target.checked)} /> Eased (e.g. sleeve cap)
              </label>
              {eased && (
                <>
                  <InputField
                    label="Ease from (mm)"
                    type="number"
                    value={ease.minMm}
                    onChange={(e) => setEase({ ...ease, minMm: Number(e.target.value) })}
                  />
                  <InputField
                    label="Ease to (mm)"
                    type="number"
                    value={ease.maxMm}
                    onChange={(e) => setEase({ ...ease, maxMm: Number(e.target.value) })}
                    error={fields["eased.maxMm"]}
                  />
                </>
              )}
            </div>
            {create.error && <ErrorAlert error={create.error} title="Seam not added" />}
            <div>
              <Button type="submit" busy={create.isPending}>
                Add seam
              </Button>
            </div>
          </form>
        </Card>
      )}
    </div>
  );
}
