import { useState, type FormEvent } from "react";
import {
  colourfastnessAgentLabels,
  colourfastnessAgents,
  fabricCareTreatmentLabels,
  fabricTestKinds,
  type CreateFabricTestRequest,
  type FabricDetailDto,
  type FabricTestDto,
  type FabricTestKind,
  type SimValueDto,
} from "@shared/schemas/fabrics";
import { greyScaleGrades, greyScaleLabel } from "@shared/domain/fabric-care-tests";
import { formatLength } from "@shared/domain/units";
import { formatDate, formatNumber, formatSignificant } from "@shared/format";
import { Button } from "@/components/ui/button";
import { ErrorAlert, SafetyNote } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { InputField, SelectField } from "@/components/ui/field";
import { OwnerPhotos } from "@/components/photos";
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
    case "shrinkage": {
      const pairs = (xs: Array<{ beforeMm: number; afterMm: number }>) =>
        xs.map((p) => `${num(p.beforeMm)} → ${num(p.afterMm)}`).join(", ");
      return `${fabricCareTreatmentLabels[r.treatment]}${r.cycles > 1 ? ` × ${r.cycles}` : ""}${r.procedure ? ` (${r.procedure})` : ""}: length ${pairs(r.length)} mm; width ${pairs(r.width)} mm`;
    }
    case "colourfastness":
      return `${colourfastnessAgentLabels[r.agent]}${r.procedure ? `, ${r.procedure}` : ""}${r.adjacent ? `; staining read on ${r.adjacent}` : ""}`;
    case "flame_retardancy":
      return `${r.treatment}, treated ${formatDate(r.treatedOn)}${r.standard ? ` · ${r.standard}` : ""}${r.certificateRef ? ` · certificate ${r.certificateRef}` : ""}${r.renewBy ? ` · renew by ${formatDate(r.renewBy)}` : ""}`;
  }
}

/** A signed per cent as people write it: "−2.9 %" (shrinks) or "+0.6 %" (grows). */
const pct = (x: number) => `${x > 0 ? "+" : x < 0 ? "−" : ""}${formatNumber(Math.abs(x), 1)} %`;

function derivedText(t: FabricTestDto): string {
  const d = t.derived;
  switch (t.kind) {
    case "mass":
      return d.massPerAreaGsm === undefined
        ? "—"
        : `${sig(d.massPerAreaGsm)} g/m² (${sig(d.massPerAreaOzYd2!)} oz/yd²) = ${sig(d.massPerAreaKgM2!)} kg/m²`;
    case "cantilever":
      return d.bendingLengthMm === undefined
        ? "—"
        : `c = ${sig(d.bendingLengthMm)} mm (${formatLength(d.bendingLengthMm, "in", "decimal")})` +
            (d.flexuralRigidityMicroNm !== undefined
              ? `; G = ${sig(d.flexuralRigidityMicroNm)} µN·m = ${sig(d.flexuralRigidityNm!)} N·m (${sig(d.flexuralRigidityMicroNm / MICRO_NM_PER_MG_CM)} mg·cm) using ${sig(d.massPerAreaUsedGsm!)} g/m² ${d.massBasis}`
              : "; rigidity needs a mass per area");
    case "strip":
      return d.tensileStiffnessNPerM === undefined
        ? "—"
        : `k = ${sig(d.tensileStiffnessNPerM)} N/m (strain ${num(d.strain! * 100)} %, ${sig(d.forcePerWidthNPerM!)} N/m load per width)`;
    case "thickness":
      return d.thicknessM === undefined ? "—" : `${sig(d.thicknessM)} m`;
    case "shrinkage":
      return d.lengthChangePct === undefined
        ? "—"
        : `length ${pct(d.lengthChangePct)}, width ${pct(d.widthChangePct!)} (negative shrinks); to end at size, cut length × ${num(d.lengthCutFactor!)}, width × ${num(d.widthCutFactor!)}`;
    case "colourfastness":
      return d.changeLabel === undefined
        ? "—"
        : `change ${d.changeLabel}${d.changeDeltaE !== undefined ? ` (the scale's pair is ΔE*ab ${num(d.changeDeltaE)} ± ${num(d.changeDeltaETolerance!)})` : ""}${d.stainingLabel ? `, staining ${d.stainingLabel}` : ""}; grey scale, 5 = none`;
    case "flame_retardancy":
      return "Record of treatment; the certificate photo is with the test";
  }
}

const kindLabels: Record<FabricTestKind, string> = {
  mass: "Mass per area (ASTM D3776)",
  cantilever: "Cantilever bending (ASTM D1388)",
  strip: "Strip stretch",
  thickness: "Thickness",
  shrinkage: "Shrinkage after washing or dry-cleaning (ISO 5077)",
  colourfastness: "Colour fastness (ISO 105 grey scales)",
  flame_retardancy: "Flame-retardancy treatment",
};

/** Said wherever a flame-retardancy record is entered or shown. */
const FLAME_CAUTION =
  "This records a treatment and its certificate; the app does not judge whether cloth is safe on stage. Local fire codes, the venue and its fire officer decide what is acceptable and how it is tested. Many treatments wash or clean out: re-treat and re-test as the product and the venue require.";

/** A fabric's tests: raw readings beside derived values, a form to record one, and the SI simulation values. */
export function FabricTests({
  productionId,
  fabric,
  canUpdate,
  today,
}: {
  productionId: string;
  fabric: FabricDetailDto;
  canUpdate: boolean;
  today: string;
}) {
  const add = useAddFabricTest(productionId, fabric.id);
  const del = useDeleteFabricTest(productionId, fabric.id);
  const [kind, setKind] = useState<FabricTestKind>("mass");
  const [deleting, setDeleting] = useState<FabricTestDto | null>(null);
  const [photosFor, setPhotosFor] = useState<string | null>(null);
  const fields = add.error instanceof ApiError ? add.error.fields : {};
  const f = (k: string) => fields[`readings.${k}`];
  const photosTest = fabric.tests.find((t) => t.id === photosFor);

  const submit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    const fd = new FormData(form);
    const str = (k: string) => String(fd.get(k) ?? "").trim();
    const n = (k: string) => Number(str(k).replace(",", "."));
    // Up to three pairs of marks per direction; a pair with no "after" reading is left out.
    const pairs = (dir: "length" | "width") =>
      [1, 2, 3].filter((i) => str(`${dir}After${i}`) !== "").map((i) => ({ beforeMm: n(`${dir}Before`), afterMm: n(`${dir}After${i}`) }));
    const readings: CreateFabricTestRequest["readings"] =
      kind === "mass"
        ? { kind, massG: n("massG"), lengthMm: n("lengthMm"), widthMm: n("widthMm") }
        : kind === "cantilever"
          ? { kind, direction: str("direction") as "warp" | "weft", overhangMm: n("overhangMm"), angleDeg: n("angleDeg") }
          : kind === "strip"
            ? {
                kind,
                direction: str("direction") as "warp" | "weft",
                loadN: n("loadN"),
                stripWidthMm: n("stripWidthMm"),
                gaugeLengthMm: n("gaugeLengthMm"),
                extensionMm: n("extensionMm"),
              }
            : kind === "shrinkage"
              ? {
                  kind,
                  treatment: str("treatment") as "washing" | "dry_cleaning",
                  procedure: str("procedure") || null,
                  cycles: n("cycles"),
                  length: pairs("length"),
                  width: pairs("width"),
                }
              : kind === "colourfastness"
                ? {
                    kind,
                    agent: str("agent") as (typeof colourfastnessAgents)[number],
                    procedure: str("procedure") || null,
                    changeGrade: n("changeGrade"),
                    stainingGrade: str("stainingGrade") ? n("stainingGrade") : null,
                    adjacent: str("adjacent") || null,
                  }
                : kind === "flame_retardancy"
                  ? {
                      kind,
                      treatment: str("treatment"),
                      treatedOn: str("treatedOn"),
                      standard: str("standard") || null,
                      certificateRef: str("certificateRef") || null,
                      renewBy: str("renewBy") || null,
                    }
                  : { kind, thicknessMm: n("thicknessMm") };
    add.mutate(
      { testedOn: str("testedOn"), readings, notes: str("notes") || null },
      {
        onSuccess: (t) => {
          form.reset();
          // A flame-retardancy record wants its certificate next: open its photos.
          if (t.kind === "flame_retardancy") setPhotosFor(t.id);
        },
      },
    );
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
                  <th className="px-2 py-1">
                    <span className="sr-only">Photos and actions</span>
                  </th>
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
                    <td className="px-2 py-1">
                      <span className="flex gap-1">
                        <Button
                          size="sm"
                          variant="ghost"
                          onClick={() => setPhotosFor(photosFor === t.id ? null : t.id)}
                          aria-label={`Photos of the ${t.kind.replace(/_/g, " ")} test of ${formatDate(t.testedOn)}`}
                        >
                          {t.kind === "flame_retardancy" ? "Certificate" : "Photos"}
                        </Button>
                        {canUpdate && (
                          <Button
                            size="sm"
                            variant="ghost"
                            onClick={() => setDeleting(t)}
                            aria-label={`Delete ${t.kind.replace(/_/g, " ")} test of ${formatDate(t.testedOn)}`}
                          >
                            Delete
                          </Button>
                        )}
                      </span>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {photosTest && (
          <div className="mt-3 grid gap-2 rounded-md border border-chalk-200 bg-chalk p-3">
            {photosTest.kind === "flame_retardancy" && <SafetyNote>{FLAME_CAUTION}</SafetyNote>}
            <OwnerPhotos
              productionId={productionId}
              ownerType="fabric_test"
              ownerId={photosTest.id}
              canEdit={canUpdate}
              title={
                photosTest.kind === "flame_retardancy"
                  ? `Certificate: ${readingsText(photosTest)}`
                  : `${kindLabels[photosTest.kind]}, ${formatDate(photosTest.testedOn)}`
              }
            />
          </div>
        )}
      </section>

      {canUpdate && (
        <section>
          <h3 className="mb-2 font-semibold text-ink">Record a test</h3>
          <form onSubmit={submit} noValidate className="grid gap-3 sm:grid-cols-3 lg:grid-cols-6" aria-label="Record a test">
            <SelectField label="Test" value={kind} onChange={(e) => setKind(e.target.value as FabricTestKind)} className="sm:col-span-2">
              {fabricTestKinds.map((k) => (
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
                <InputField
                  label="Overhang (mm)"
                  name="overhangMm"
                  inputMode="decimal"
                  error={f("overhangMm")}
                  hint="Length pushed out until the tip touches the incline"
                />
                <InputField label="Incline (°)" name="angleDeg" inputMode="decimal" defaultValue="41.5" error={f("angleDeg")} />
              </>
            )}
            {kind === "strip" && (
              <>
                <InputField label="Load (N)" name="loadN" inputMode="decimal" error={f("loadN")} />
                <InputField label="Extension (mm)" name="extensionMm" inputMode="decimal" error={f("extensionMm")} />
                <InputField label="Strip width (mm)" name="stripWidthMm" inputMode="decimal" defaultValue="50" error={f("stripWidthMm")} />
                <InputField
                  label="Gauge length (mm)"
                  name="gaugeLengthMm"
                  inputMode="decimal"
                  defaultValue="200"
                  error={f("gaugeLengthMm")}
                />
              </>
            )}
            {kind === "thickness" && <InputField label="Thickness (mm)" name="thicknessMm" inputMode="decimal" error={f("thicknessMm")} />}
            {kind === "shrinkage" && (
              <>
                <p className="text-xs text-slate sm:col-span-3 lg:col-span-6">
                  Mark the specimen and measure before and after, as ISO 3759 describes (a 500 × 500 mm specimen with marks 350 mm apart is
                  usual); wash by an ISO 6330 procedure or dry-clean by ISO 3175; the change is computed as ISO 5077 does: (after − before)
                  ÷ before × 100, negative = shrinkage. Procedure codes from memory: write the one you ran.
                </p>
                <SelectField label="Treatment" name="treatment" defaultValue="washing" error={f("treatment")}>
                  <option value="washing">{fabricCareTreatmentLabels.washing}</option>
                  <option value="dry_cleaning">{fabricCareTreatmentLabels.dry_cleaning}</option>
                </SelectField>
                <InputField label="Procedure" name="procedure" placeholder="ISO 6330 4N, line dry" error={f("procedure")} />
                <InputField label="Cycles" name="cycles" inputMode="numeric" defaultValue="1" error={f("cycles")} />
                {(["length", "width"] as const).map((dir) => (
                  <fieldset
                    key={dir}
                    className="grid grid-cols-2 gap-2 rounded-md border border-chalk-200 p-2 sm:col-span-3 sm:grid-cols-4"
                  >
                    <legend className="px-1 text-sm font-semibold text-ink">
                      {dir === "length" ? "Length (warp / wales)" : "Width (weft / courses)"}
                    </legend>
                    <InputField
                      label="Marks before (mm)"
                      name={`${dir}Before`}
                      inputMode="decimal"
                      defaultValue="350"
                      error={f(`${dir}.0.beforeMm`)}
                    />
                    {[1, 2, 3].map((i) => (
                      <InputField
                        key={i}
                        label={`After, pair ${i} (mm)`}
                        name={`${dir}After${i}`}
                        inputMode="decimal"
                        error={i === 1 ? (f(dir) ?? f(`${dir}.0.afterMm`)) : f(`${dir}.${i - 1}.afterMm`)}
                      />
                    ))}
                  </fieldset>
                ))}
              </>
            )}
            {kind === "colourfastness" && (
              <>
                <p className="text-xs text-slate sm:col-span-3 lg:col-span-6">
                  Read the change in colour on the ISO 105-A02 grey scale and the staining of the adjacent fabric on the ISO 105-A03 grey
                  scale: 5 is no change, 1 the most; half steps are written 4-5. The agent's ISO 105 part is named beside it (from memory).
                </p>
                <SelectField label="Agent" name="agent" defaultValue="washing" className="sm:col-span-2" error={f("agent")}>
                  {colourfastnessAgents.map((a) => (
                    <option key={a} value={a}>
                      {colourfastnessAgentLabels[a]}
                    </option>
                  ))}
                </SelectField>
                <SelectField label="Change in colour (grade)" name="changeGrade" defaultValue="4" error={f("changeGrade")}>
                  {[...greyScaleGrades].reverse().map((g) => (
                    <option key={g} value={g}>
                      {greyScaleLabel(g)}
                    </option>
                  ))}
                </SelectField>
                <SelectField label="Staining (grade)" name="stainingGrade" defaultValue="" error={f("stainingGrade")}>
                  <option value="">Not read</option>
                  {[...greyScaleGrades].reverse().map((g) => (
                    <option key={g} value={g}>
                      {greyScaleLabel(g)}
                    </option>
                  ))}
                </SelectField>
                <InputField label="Adjacent fabric" name="adjacent" placeholder="multifibre, wool strip" error={f("adjacent")} />
                <InputField label="Procedure" name="procedure" placeholder="ISO 105-C06 A1S" error={f("procedure")} />
              </>
            )}
            {kind === "flame_retardancy" && (
              <>
                <div className="sm:col-span-3 lg:col-span-6">
                  <SafetyNote>{FLAME_CAUTION}</SafetyNote>
                </div>
                <InputField label="Treatment (product, applied by)" name="treatment" className="sm:col-span-2" error={f("treatment")} />
                <InputField label="Treated on" name="treatedOn" type="date" defaultValue={today} error={f("treatedOn")} />
                <InputField label="Standard or code on the certificate" name="standard" error={f("standard")} />
                <InputField label="Certificate number" name="certificateRef" error={f("certificateRef")} />
                <InputField label="Renew by" name="renewBy" type="date" error={f("renewBy")} hint="After this, re-treat or re-test." />
                <p className="text-xs text-slate sm:col-span-3 lg:col-span-6">
                  After saving, add the certificate as a photo (it opens below the tests).
                </p>
              </>
            )}
            <InputField label="Notes" name="notes" className="sm:col-span-2" />
            <div className="flex items-end">
              <Button type="submit" busy={add.isPending}>
                Record test
              </Button>
            </div>
          </form>
          {add.error != null && (
            <div className="mt-2">
              <ErrorAlert error={add.error} title="Test not recorded" />
            </div>
          )}
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
        {deleting ? `${kindLabels[deleting.kind]} of ${formatDate(deleting.testedOn)}: ${readingsText(deleting)}. ` : ""}The other tests are
        recomputed without it.
      </ConfirmDialog>
      {del.error != null && <ErrorAlert error={del.error} title="Test not deleted" />}
      <section>
        <h3 className="mb-1 font-semibold text-ink">Simulation values (SI)</h3>
        <p className="mb-2 text-xs text-slate">
          For digital doubles. Measured values come from the tests above; anything not tested falls back to the{" "}
          {fabric.simulation.fabricClass.replace("_", " ")} class default (common practice, no source).
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
