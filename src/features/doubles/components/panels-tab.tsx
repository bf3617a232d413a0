import { useState } from "react";
import type { DoublesChangeDto, PanelDto } from "@shared/schemas/doubles";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { useDeletePanel, useFabricOptions, usePanels } from "../api/doubles";
import { PanelCanvas } from "./panel-canvas";
import { PanelEditor } from "./panel-editor";
import { DxfImport } from "./dxf-import";

const cm2 = (mm2: number) => `${(mm2 / 100).toFixed(0)} cm²`;

/** Panels of each garment of the change: table, drawing, editor and DXF import. */
export function PanelsTab({ productionId, change, canEdit }: { productionId: string; change: DoublesChangeDto; canEdit: boolean }) {
  const [garmentId, setGarmentId] = useState(change.garments[0]?.id ?? "");
  const [selected, setSelected] = useState<string | null>(null);
  const [mode, setMode] = useState<"view" | "new" | "edit" | "dxf">("view");
  const [deleting, setDeleting] = useState<PanelDto | null>(null);
  const panels = usePanels(productionId, { garmentId });
  const fabrics = useFabricOptions(productionId);
  const del = useDeletePanel(productionId);
  const garment = change.garments.find((g) => g.id === garmentId);
  const current = panels.data?.find((p) => p.id === selected) ?? panels.data?.[0] ?? null;
  if (!change.garments.length)
    return <EmptyState title="No garments in this change">Add change items on the Changes screen first.</EmptyState>;
  return (
    <div className="grid grid-cols-1 gap-4">
      <div role="tablist" aria-label="Garments" className="flex flex-wrap gap-2">
        {change.garments.map((g) => (
          <Button
            key={g.id}
            role="tab"
            aria-selected={g.id === garmentId}
            variant={g.id === garmentId ? "primary" : "secondary"}
            size="sm"
            onClick={() => {
              setGarmentId(g.id);
              setSelected(null);
              setMode("view");
            }}
          >
            {g.name} ({g.panelCount})
          </Button>
        ))}
      </div>
      {mode === "new" || (mode === "edit" && current) ? (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">{mode === "new" ? `New panel for ${garment?.name}` : `Edit ${current!.name}`}</h2>
          <PanelEditor
            key={mode === "edit" ? current!.id : "new"}
            productionId={productionId}
            garmentId={garmentId}
            panel={mode === "edit" ? current : null}
            fabrics={fabrics.data ?? []}
            onDone={() => setMode("view")}
          />
        </Card>
      ) : mode === "dxf" ? (
        <Card>
          <h2 className="mb-3 font-semibold text-ink">Import pieces from DXF into {garment?.name}</h2>
          <DxfImport productionId={productionId} garmentId={garmentId} fabrics={fabrics.data ?? []} onDone={() => setMode("view")} />
        </Card>
      ) : (
        <div className="grid grid-cols-1 gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <Card>
            <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
              <h2 className="font-semibold text-ink">Panels of {garment?.name}</h2>
              {canEdit && (
                <div className="flex gap-2">
                  <Button size="sm" onClick={() => setMode("new")}>
                    New panel
                  </Button>
                  <Button size="sm" variant="secondary" onClick={() => setMode("dxf")}>
                    Import DXF
                  </Button>
                </div>
              )}
            </div>
            {panels.isPending ? (
              <Spinner />
            ) : panels.error ? (
              <ErrorAlert error={panels.error} />
            ) : panels.data.length === 0 ? (
              <EmptyState title="No panels yet">Draw them point by point or import a DXF file from pattern software.</EmptyState>
            ) : (
              <div className="overflow-x-auto">
                <table className="w-full text-left text-sm" aria-label="Panels">
                  <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
                    <tr>
                      <th className="px-2 py-1">Piece</th>
                      <th className="px-2 py-1">Cut</th>
                      <th className="px-2 py-1">Area</th>
                      <th className="px-2 py-1">With allowance</th>
                      <th className="px-2 py-1">Allowance</th>
                      <th>
                        <span className="sr-only">Actions</span>
                      </th>
                    </tr>
                  </thead>
                  <tbody>
                    {panels.data.map((p) => (
                      <tr key={p.id} className={p.id === current?.id ? "bg-ink-50" : ""}>
                        <td className="px-2 py-1">
                          <button
                            type="button"
                            className="font-semibold text-ink underline-offset-2 hover:underline"
                            onClick={() => setSelected(p.id)}
                          >
                            {p.name}
                          </button>
                        </td>
                        <td className="px-2 py-1">
                          {p.cutCount}
                          {p.mirrored ? " (pairs)" : ""}
                          {p.grainMode !== "straight" ? ` · ${p.grainMode}` : ""}
                        </td>
                        <td className="px-2 py-1">{cm2(p.areaMm2)}</td>
                        <td className="px-2 py-1">
                          {p.cutAreaMm2 === null ? (
                            <span title="The cut line cannot be drawn from this outline; check it in the editor.">
                              —<span className="sr-only">cut line cannot be drawn</span>
                            </span>
                          ) : (
                            cm2(p.cutAreaMm2)
                          )}
                        </td>
                        <td className="px-2 py-1">{p.seamAllowanceMm} mm</td>
                        <td className="px-2 py-1 text-right">
                          {canEdit && (
                            <span className="flex justify-end gap-1">
                              <Button
                                size="sm"
                                variant="ghost"
                                onClick={() => {
                                  setSelected(p.id);
                                  setMode("edit");
                                }}
                              >
                                Edit
                              </Button>
                              <Button size="sm" variant="ghost" onClick={() => setDeleting(p)}>
                                Delete
                              </Button>
                            </span>
                          )}
                        </td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
          </Card>
          <Card>
            {current ? (
              <>
                <PanelCanvas panel={current} height={400} />
                <p className="mt-2 text-xs text-slate">
                  Solid: sew line. Dashed: cut line ({current.seamAllowanceMm} mm allowance). Arrow: grainline. Red ticks: notches. Numbers:
                  points, used by seams.
                </p>
              </>
            ) : (
              <p className="text-sm text-slate">Choose a panel to see it.</p>
            )}
          </Card>
        </div>
      )}
      <ConfirmDialog
        open={Boolean(deleting)}
        title={`Delete ${deleting?.name ?? ""}?`}
        confirmLabel="Delete panel"
        danger
        busy={del.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={() => deleting && del.mutate(deleting.id, { onSettled: () => setDeleting(null) })}
      >
        Seams on this panel are deleted with it. Published packets keep their own copy.
      </ConfirmDialog>
    </div>
  );
}
