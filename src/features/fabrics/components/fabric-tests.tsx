import { useState, type FormEvent } from "react";
import type { FabricDetailDto, FabricTestDto, FabricTestKind, SimValueDto } from "@shared/schemas/fabrics";
import { formatLength } from "@shared/domain/units";
import { formatDate, formatNumber, formatSignificant } from "@shared/format";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { InputField, SelectField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { useAddFabricTest, useDeleteFabricTest } from "../api/fabrics";

// 1 mg·cm (the older cgs unit for bending rigidity) = 0.0980665 µN·m (ASTM D1388-18).
const MICRO_NM_PER_MG_CM = 0.0980665;
const sig = formatSignificant;
const num = (x: number) => formatNumber(x, 3);

function readingsText(t: FabricTestDto): string {
  const r = t.readings;
  switch (r.kind) {
    case "mass":
      return `${num(r.massG)} g on ${num(r.lengthMm)} × ${num(r.widthMm)} mm`;
    case "cantilever":
      return `${t.direction} overhang ${num(r.overhangMm)} mm at ${num(r.angleDeg)}°`;
    case "strip":
      return `${t.direction} ${num(r.loadN)} N at ${num(r.extensionMm)} mm on ${num(r.stripWidthMm)} × ${num(r.gaugeLengthMm)} mm`;
    case "thickness":
      return `${num(r.thicknessMm)} mm`;
  }
}

function derivedText(t: FabricTestDto): string {
  const d = t.derived;
  switch (t.kind) {
    case "mass":
      return d.massPerAreaGsm === undefined ? "—" : `${sig(d.massPerAreaGsm)} g/m² (${sig(d.massPerAreaOzYd2!)} oz/yd²) = ${sig(d.massPerAreaKgM2!)} kg/m²`;
    case "cantilever":
      return d.bendingLengthMm === undefined
        ? "—"
        : `c = ${sig(d.bendingLengthMm)} mm (${formatLength(d.bendingLengthMm, "in", "decimal")})` +
            (d.flexuralRigidityMicroNm !== undefined
              ? `; G = ${sig(d.flexuralRigidityMicroNm)} µN·m = ${sig(d.flexuralRigidityNm!)} N·m (${sig(d.flexuralRigidityMicroNm / MICRO_NM_PER_MG_CM)} mg·cm) using ${sig(d.massPerAreaUsedGsm!)} g/m² ${d.massBasis}`
              : "; rigidity needs a mass per area");
    case "strip":
      return d.tensileStiffnessNPerM === undefined ? "—" : `k = ${sig(d.tensileStiffnessNPerM)} N/m (strain ${num(d.strain! * 100)} %, ${sig(d.forcePerWidthNPerM!)} N/m load per width)`;
    case "thickness":
      return d.thicknessM === undefined ? "—" : `${sig(d.thicknessM)} m`;
  }
}

const kindLabels: Record<FabricTestKind, string> = {
  mass: "Mass per area (ASTM D3776)",
  cantilever: "Cantilever bending (ASTM D1388)",
  strip: "Strip stretch",
  thickness: "Thickness",
};

/** A fabric's tests: raw readings beside derived values, a form to record one, and the SI simulation values. */
export function FabricTests({ productionId, fabric, canUpdate, today }: { productionId: string; fabric: FabricDetailDto; canUpdate: boolean; today: string }) {
  const add = useAddFabricTest(productionId, fabric.id);
  const del = useDeleteFabricTest(productionId, fabric.id);
  const [kind, setKind] = useState<FabricTestKind>("mass");
  const [deleting, setDeleting] = useState<FabricTestDto | null>(null);
  const fields = add.error instanceof ApiError ? add.error.fields : {};
  const f = (k: string) => fields[`readings.${k}`];

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    const fd = new FormData(form);
    const n = (k: string) => Number(String(fd.get(k) ?? "").replace(",", "."));
    const readings =
      kind === "mass"
        ? { kind, massG: n("massG"), lengthMm: n("lengthMm"), widthMm: n("widthMm") }
        : kind === "cantilever"
          ? { kind, direction: String(fd.get("direction")) as "warp" | "weft", overhangMm: n("overhangMm"), angleDeg: n("angleDeg") }
          : kind === "strip"
            ? { kind, direction: String(fd.get("direction")) as "warp" | "weft", loadN: n("loadN"), stripWidthMm: n("stripWidthMm"), gaugeLengthMm: n("gaugeLengthMm"), extensionMm: n("extensionMm") }
            : { kind, thicknessMm: n("thicknessMm") };
    add.mutate({ testedOn: String(fd.get("testedOn")), readings, notes: String(fd.get("notes") ?? "") || null }, { onSuccess: () => form.reset() });
  };

  const simRow = (label: string, v: SimValueDto) => (
    <tr className="border-t border-chalk-200">
      <th className="px-2 py-1 text-left font-normal text-slate">{label}</th>
      <td className="px-2 py-1 font-mono">
        {sig(v.value, 5)} {v.unit}
      </td>
      <td className="px-2 py-1">{v.basis}</td>
      <td className="px-2 py-1 text-xs text-slate">{v.note ?? ""}</td>
    </tr>
  );

  return (
    <div className="grid gap-4">
      <section>
        <h3 className="mb-2 font-semibold text-ink">Tests</h3>
        {fabric.tests.length === 0 ? (
          <p className="text-sm text-slate">No tests recorded yet.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" aria-label="Fabric tests">
              <thead className="text-xs uppercase tracking-wide text-slate">
                <tr>
                  <th className="px-2 py-1">Date</th>
                  <th className="px-2 py-1">Test</th>
                  <th className="px-2 py-1">Readings</th>
                  <th className="px-2 py-1">Derived</th>
                  <th className="px-2 py-1">By</th>
                  {canUpdate && <th className="px-2 py-1"><span className="sr-only">Actions</span></th>}
                </tr>
              </thead>
              <tbody>
                {fabric.tests.map((t) => (
                  <tr key={t.id} className="border-t border-chalk-200 align-top">
                    <td className="px-2 py-1 whitespace-nowrap">{formatDate(t.testedOn)}</td>
                    <td className="px-2 py-1">{kindLabels[t.kind]}</td>
                    <td className="px-2 py-1">{readingsText(t)}</td>
                    <td className="px-2 py-1">{derivedText(t)}</td>
                    <td className="px-2 py-1">{t.testedByName ?? "—"}</td>
                    {canUpdate && (
                      <td className="px-2 py-1">
                        <Button size="sm" variant="ghost" onClick={() => setDeleting(t)} aria-label={`Delete ${t.kind} test of ${formatDate(t.testedOn)}`}>
                          Delete
                        </Button>
                      </td>
                    )}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>

      {canUpdate && (
        <section>
          <h3 className="mb-2 font-semibold text-ink">Record a test</h3>
          <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6" aria-label="Record a test">
            <SelectField label="Test" value={kind} onChange={(e) => setKind(e.target.value as FabricTestKind)} className="sm:col-span-2">
              {(Object.keys(kindLabels) as FabricTestKind[]).map((k) => (
                <option key={k} value={k}>
                  {kindLabels[k]}
                </option>
              ))}
            </SelectField>
            <InputField label="Tested on" name="testedOn" type="date" defaultValue={today} error={fields.testedOn} />
            {kind === "mass" && (
              <>
                <InputField label="Specimen mass (g)" name="massG" inputMode="decimal" error={f("massG")} />
                <InputField label="Length (mm)" name="lengthMm" inputMode="decimal" defaultValue="100" error={f("lengthMm")} />
                <InputField label="Width (mm)" name="widthMm" inputMode="decimal" defaultValue="100" error={f("widthMm")} />
              </>
            )}
            {(kind === "cantilever" || kind === "strip") && (
              <SelectField label="Direction" name="direction" defaultValue="warp">
                <option value="warp">warp (wales)</option>
                <option value="weft">weft (courses)</option>
              </SelectField>
            )}
            {kind === "cantilever" && (
              <>
                <InputField label="Overhang (mm)" name="overhangMm" inputMode="decimal" error={f("overhangMm")} hint="Length pushed out until the tip touches the incline" />
                <InputField label="Incline (°)" name="angleDeg" inputMode="decimal" defaultValue="41.5" error={f("angleDeg")} />
              </>
            )}
            {kind === "strip" && (
              <>
                <InputField label="Load (N)" name="loadN" inputMode="decimal" error={f("loadN")} />
                <InputField label="Extension (mm)" name="extensionMm" inputMode="decimal" error={f("extensionMm")} />
                <InputField label="Strip width (mm)" name="stripWidthMm" inputMode="decimal" defaultValue="50" error={f("stripWidthMm")} />
                <InputField label="Gauge length (mm)" name="gaugeLengthMm" inputMode="decimal" defaultValue="200" error={f("gaugeLengthMm")} />
              </>
            )}
            {kind === "thickness" && <InputField label="Thickness (mm)" name="thicknessMm" inputMode="decimal" error={f("thicknessMm")} />}
            <InputField label="Notes" name="notes" className="sm:col-span-2" />
            <div className="flex items-end">
              <Button type="submit" busy={add.isPending}>
                Record test
              </Button>
            </div>
          </form>
          {add.error != null && <div className="mt-2"><ErrorAlert error={add.error} title="Test not recorded" /></div>}
        </section>
      )}

      <ConfirmDialog
        open={Boolean(deleting)}
        title="Delete this test?"
        confirmLabel="Delete test"
        danger
        busy={del.isPending}
        onCancel={() => setDeleting(null)}
        onConfirm={() => deleting && del.mutate(deleting.id, { onSettled: () => setDeleting(null) })}
      >
        {deleting ? `${kindLabels[deleting.kind]} of ${formatDate(deleting.testedOn)}: ${readingsText(deleting)}. ` : ""}The other tests are recomputed without it.
      </ConfirmDialog>
      {del.error != null && <ErrorAlert error={del.error} title="Test not deleted" />}
      <section>
        <h3 className="mb-1 font-semibold text-ink">Simulation values (SI)</h3>
        <p className="mb-2 text-xs text-slate">
          For digital doubles. Measured values come from the tests above; anything not tested falls back to the {fabric.simulation.fabricClass.replace("_", " ")} class default
          (common practice, no source).
        </p>
        <table className="w-full text-sm" aria-label="Simulation values">
          <tbody>
            {simRow("Mass per area", fabric.simulation.massPerArea)}
            {simRow("Bending stiffness, warp", fabric.simulation.bendingStiffness.warp)}
            {simRow("Bending stiffness, weft", fabric.simulation.bendingStiffness.weft)}
            {simRow("Stretch stiffness, warp", fabric.simulation.stretchStiffness.warp)}
            {simRow("Stretch stiffness, weft", fabric.simulation.stretchStiffness.weft)}
            {simRow("Thickness", fabric.simulation.thickness)}
          </tbody>
        </table>
      </section>
    </div>
  );
}
