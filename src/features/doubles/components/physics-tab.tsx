import type { DoublesChangeDto, FabricPhysicsDto } from "@shared/schemas/doubles";
import type { TaggedValue } from "@shared/domain/fabric-physics";
import { RETEST_TOLERANCE_PERCENT, type CantileverRetest } from "@shared/domain/cantilever";
import { Card } from "@/components/ui/card";
import { Badge, EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { usePhysics } from "../api/doubles";
import { formatDate } from "@shared/format";
import { formatQuantity } from "@shared/domain/number-format";

function fmt(v: number): string {
  const a = Math.abs(v);
  return a !== 0 && (a < 0.01 || a >= 1e5) ? v.toExponential(3) : String(Math.round(v * 10000) / 10000);
}

/** One value with its unit and a measured / assumed mark naming the test or the default. */
function Value({ v, f }: { v?: TaggedValue<string>; f: FabricPhysicsDto }) {
  if (!v) return <span className="text-slate">—</span>;
  const test = v.basis === "measured" ? f.tests.find((t) => t.id === v.testId) : undefined;
  const why =
    v.basis === "measured"
      ? `measured: ${v.testIds.length} test${v.testIds.length > 1 ? "s" : ""}${test ? ` (${test.kind}${test.direction ? ` ${test.direction}` : ""}, ${formatDate(test.testedOn)})` : ""}`
      : v.note;
  return (
    <span title={why}>
      {fmt(v.value)} <span className="text-xs text-slate">{v.unit}</span>{" "}
      <Badge tone={v.basis === "measured" ? "note" : "warning"}>{v.basis}</Badge>
      <span className="block text-xs text-slate">{why}</span>
    </span>
  );
}

const mm1 = (v: number) => formatQuantity(v, "mm", { decimals: 1 });

/** The exported bending values put back through the cantilever test: simulated against measured overhang, per direction. */
export function RetestFigure({ retest }: { retest: CantileverRetest | null | undefined }) {
  if (!retest) return <span className="text-xs text-slate">no cantilever test</span>;
  return (
    <ul className="grid gap-1" title={retest.method}>
      {retest.directions.map((d) => {
        const off = Math.abs(d.differencePercent) > RETEST_TOLERANCE_PERCENT;
        return (
          <li key={d.direction}>
            <span className="text-xs text-slate">
              {d.direction} at {d.angleDeg}°:{" "}
            </span>
            {mm1(d.simulatedOverhangMm)} <span className="text-xs text-slate">simulated / {mm1(d.measuredOverhangMm)} measured</span>{" "}
            <Badge
              tone={off ? "blocking" : "note"}
            >{`${d.differencePercent >= 0 ? "+" : "−"}${Math.abs(d.differencePercent).toFixed(2)} %`}</Badge>
          </li>
        );
      })}
    </ul>
  );
}

/** SI simulation values for every fabric of the change, each measured (with its test) or assumed (class default). */
export function PhysicsTab({ productionId, change }: { productionId: string; change: DoublesChangeDto }) {
  const q = usePhysics(productionId, { changeId: change.id });
  if (q.isPending) return <Spinner />;
  if (q.error) return <ErrorAlert error={q.error} />;
  if (!q.data.length)
    return (
      <EmptyState title="No fabrics set">Give the garments a fabric on the Wardrobe screen and record its tests on Fabrics.</EmptyState>
    );
  return (
    <Card>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm" aria-label="Fabric physics">
          <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
            <tr>
              <th className="px-2 py-1">Fabric</th>
              <th className="px-2 py-1">Mass per area</th>
              <th className="px-2 py-1">Bending warp / weft</th>
              <th className="px-2 py-1">Stretch warp / weft</th>
              <th className="px-2 py-1">Thickness</th>
              <th className="px-2 py-1">Shear, friction</th>
              <th className="px-2 py-1">Cantilever re-test (overhang)</th>
            </tr>
          </thead>
          <tbody>
            {q.data.map((f) => (
              <tr key={f.fabricId} className="border-b border-chalk-200 align-top last:border-0">
                <td className="px-2 py-2 font-semibold">
                  {f.name}
                  <span className="block text-xs font-normal text-slate">
                    {f.construction}, class {f.fabricClass.replace("_", " ")}
                  </span>
                </td>
                <td className="px-2 py-2">
                  <Value v={f.values.massPerArea} f={f} />
                </td>
                <td className="px-2 py-2">
                  <Value v={f.values.bendingStiffness.warp} f={f} />
                  <Value v={f.values.bendingStiffness.weft} f={f} />
                </td>
                <td className="px-2 py-2">
                  <Value v={f.values.stretchStiffness.warp} f={f} />
                  <Value v={f.values.stretchStiffness.weft} f={f} />
                </td>
                <td className="px-2 py-2">
                  <Value v={f.values.thickness} f={f} />
                </td>
                <td className="px-2 py-2">
                  <Value v={f.values.shearStiffness} f={f} />
                  <Value v={f.values.friction} f={f} />
                </td>
                <td className="px-2 py-2">
                  <RetestFigure retest={f.retest} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="mt-2 text-xs text-slate">
        Bending from the cantilever test (ASTM D1388: G = mass per area × g × bending length³), mass per area from ASTM D3776 specimens,
        stretch from strip tests. "Assumed" values are class defaults so a simulation can start; replace them with tests. The re-test bends
        a virtual strip with the exported bending stiffness and mass per area (a heavy elastica) and reports the overhang at which its tip
        line reaches the test angle; it should match the measured overhang within {RETEST_TOLERANCE_PERCENT} %.
      </p>
    </Card>
  );
}
