import type { PacketContents, PacketDetailDto, PacketFabricSnapshot } from "@shared/schemas/packets";
import type { TaggedValue } from "@shared/domain/fabric-physics";
import { runPoints, type Point } from "@shared/domain/panels/geometry";
import { formatQuantity, type Precision } from "@shared/domain/number-format";
import { Badge } from "@/components/ui/feedback";
import { useProductionTime } from "@/hooks/use-production-time";
import { PanelCanvas, type CanvasSeamMark } from "./panel-canvas";
import { PacketDiffList } from "./packet-detail";
import { RetestFigure } from "./physics-tab";

/** How each SI unit of fabrics.json is shown: in the units summary.pdf prints, three significant digits. */
const DISPLAY: Record<string, { unit: string; factor: number; precision: Precision }> = {
  "kg/m²": { unit: "g/m²", factor: 1000, precision: { significant: 3 } },
  "N·m": { unit: "µN·m", factor: 1e6, precision: { significant: 3 } },
  "N/m": { unit: "N/m", factor: 1, precision: { significant: 3 } },
  m: { unit: "mm", factor: 1000, precision: { significant: 3 } },
};
const shown = (value: number, unit: string) => {
  const d = DISPLAY[unit] ?? { unit, factor: 1, precision: { significant: 3 } };
  return formatQuantity(value * d.factor, d.unit, d.precision);
};

/** A simulation value with its measured / assumed mark. */
function SimValue({ v, label }: { v?: TaggedValue<string>; label?: string }) {
  if (!v) return <span className="text-slate">—</span>;
  return (
    <span
      className="block"
      title={v.basis === "measured" ? `measured (${v.testIds.length} test${v.testIds.length > 1 ? "s" : ""})` : v.note}
    >
      {label ? <span className="text-xs text-slate">{label} </span> : null}
      <span className="whitespace-nowrap">{shown(v.value, v.unit)}</span>{" "}
      <Badge tone={v.basis === "measured" ? "note" : "warning"}>{v.basis === "measured" ? "measured" : "assumed"}</Badge>
    </span>
  );
}

/** Seam runs on each panel, numbered in the packet's seam order. */
function seamMarks(c: PacketContents): Map<string, CanvasSeamMark[]> {
  const marks = new Map<string, CanvasSeamMark[]>();
  const outline = new Map(c.panels.map((p) => [p.id, p.outline as Point[]]));
  c.seams.forEach((s, i) => {
    for (const side of [s.a, s.b]) {
      const o = outline.get(side.panelId);
      if (!o) continue;
      const list = marks.get(side.panelId) ?? [];
      list.push({ label: String(i + 1), points: runPoints(o, side.from, side.to, side.direction) });
      marks.set(side.panelId, list);
    }
  });
  return marks;
}

function FabricTable({ fabrics }: { fabrics: PacketFabricSnapshot[] }) {
  if (!fabrics.length) return <p className="text-sm text-slate">No fabric is set for these garments.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm" aria-label="Fabrics in this packet">
        <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
          <tr>
            <th className="px-2 py-1">Fabric</th>
            <th className="px-2 py-1">Mass per area</th>
            <th className="px-2 py-1">Bending warp / weft</th>
            <th className="px-2 py-1">Stretch warp / weft</th>
            <th className="px-2 py-1">Thickness</th>
          </tr>
        </thead>
        {/* Each fabric: its values, then the re-test across the full width so the table fits a tablet. */}
        {fabrics.map((f) => (
          <tbody key={f.id} className="border-b border-chalk-200 last:border-0">
            <tr className="align-top">
              <th scope="row" rowSpan={2} className="px-2 py-2 font-semibold">
                {f.name}
                <span className="block text-xs font-normal text-slate">{f.construction}</span>
              </th>
              <td className="px-2 py-2">
                <SimValue v={f.simulation.massPerArea} />
              </td>
              <td className="px-2 py-2">
                <div className="grid gap-1">
                  <SimValue label="warp" v={f.simulation.bendingStiffness.warp} />
                  <SimValue label="weft" v={f.simulation.bendingStiffness.weft} />
                </div>
              </td>
              <td className="px-2 py-2">
                <div className="grid gap-1">
                  <SimValue label="warp" v={f.simulation.stretchStiffness.warp} />
                  <SimValue label="weft" v={f.simulation.stretchStiffness.weft} />
                </div>
              </td>
              <td className="px-2 py-2">
                <SimValue v={f.simulation.thickness} />
              </td>
            </tr>
            <tr>
              <td colSpan={4} className="px-2 pb-2 text-sm">
                <span className="font-semibold">Cantilever re-test: </span>
                {f.retest === undefined ? (
                  <span className="text-xs text-slate">not in this version</span>
                ) : (
                  <RetestFigure retest={f.retest} />
                )}
              </td>
            </tr>
          </tbody>
        ))}
      </table>
    </div>
  );
}

/**
 * What a digital-double artist is about to download: every garment's panels drawn (sew line, cut
 * line, grain, notches, numbered seam runs), the fabrics with measured / assumed marks and the
 * cantilever re-test, the effects shots, and what changed since the version they last marked received.
 */
export function ArtistPacketView({ packet }: { packet: PacketDetailDto }) {
  const { dateOf } = useProductionTime();
  const c = packet.contents;
  const marks = seamMarks(c);
  const panelName = new Map(c.panels.map((p) => [p.id, p.name]));
  return (
    <div className="grid gap-5">
      <section aria-labelledby="artist-changes" className="grid gap-2">
        <h2 id="artist-changes" className="text-lg font-semibold text-ink">
          What changed for you
        </h2>
        {packet.sinceReceived ? (
          <>
            <p className="text-sm">
              Since version {packet.sinceReceived.version}, which you marked received on {dateOf(packet.sinceReceived.receivedAt)}:
            </p>
            <PacketDiffList diff={packet.sinceReceived.diff} />
          </>
        ) : (
          <p className="text-sm text-slate">
            You have not marked an earlier version of this change received: everything here is new to you.
          </p>
        )}
      </section>

      <section aria-labelledby="artist-panels" className="grid gap-3">
        <h2 id="artist-panels" className="text-lg font-semibold text-ink">
          Panels
        </h2>
        <p className="text-xs text-slate">
          Solid: sew line · dashed: cut line (seam allowance) · arrow: grain · red ticks: notches · numbered ochre runs: seams (listed
          below). The ZIP holds a simulation mesh of each panel and stitches.json pairing the seam vertices.
        </p>
        {c.garments.map((g) => {
          const panels = c.panels.filter((p) => p.garmentId === g.id);
          return (
            <div key={g.id} className="grid gap-2">
              <h3 className="font-semibold text-ink">
                {g.name}{" "}
                <span className="text-xs font-normal text-slate">
                  {g.tagCode} · {panels.length} panels
                </span>
              </h3>
              {panels.length === 0 ? (
                <p className="text-sm text-slate">No panels for this garment in this version.</p>
              ) : (
                <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-3">
                  {panels.map((p) => (
                    <li key={p.id} className="grid gap-1">
                      <PanelCanvas
                        panel={p}
                        height={220}
                        showVertices={false}
                        seams={marks.get(p.id) ?? []}
                        label={`${g.name}, ${p.name}: cut ${p.cutCount}${p.mirrored ? " (mirrored pairs)" : ""}`}
                      />
                      <p className="text-xs text-slate">
                        {p.name} · cut {p.cutCount}
                        {p.mirrored ? " in mirrored pairs" : ""} · allowance {p.seamAllowanceMm} mm · {p.grainMode} grain
                      </p>
                    </li>
                  ))}
                </ul>
              )}
            </div>
          );
        })}
        {c.seams.length > 0 && (
          <ol className="grid list-inside list-decimal gap-0.5 text-sm sm:grid-cols-2" aria-label="Seams">
            {c.seams.map((s) => (
              <li key={s.id}>
                {s.name}: {panelName.get(s.a.panelId)} ↔ {panelName.get(s.b.panelId)}{" "}
                <span className="text-xs text-slate">
                  ({s.lengthAMm.toFixed(0)} / {s.lengthBMm.toFixed(0)} mm{s.eased ? ", eased" : ""})
                </span>
              </li>
            ))}
          </ol>
        )}
      </section>

      <section aria-labelledby="artist-fabrics" className="grid gap-2">
        <h2 id="artist-fabrics" className="text-lg font-semibold text-ink">
          Fabrics
        </h2>
        <FabricTable fabrics={c.fabrics} />
        <p className="text-xs text-slate">
          fabrics.json holds these in SI units (kg/m², N·m, N/m, m); they are shown here as summary.pdf prints them. "Measured" values come
          from the workroom's tests, "assumed" ones from class defaults. The re-test bends a virtual strip with the exported bending
          stiffness and mass per area and compares the overhang at 41.5° with the measured one (ASTM D1388).
        </p>
      </section>

      <section aria-labelledby="artist-shots" className="grid gap-2">
        <h2 id="artist-shots" className="text-lg font-semibold text-ink">
          Effects shots
        </h2>
        {c.shots.length === 0 ? (
          <p className="text-sm text-slate">No effects shots in this version.</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm" aria-label="Effects shots">
              <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
                <tr>
                  <th className="px-2 py-1">Scene</th>
                  <th className="px-2 py-1">Story day</th>
                  <th className="px-2 py-1">Distress stage</th>
                  <th className="px-2 py-1">State</th>
                  <th className="px-2 py-1">Photos</th>
                </tr>
              </thead>
              <tbody>
                {c.shots.map((s) => (
                  <tr key={s.appearanceId} className="border-b border-chalk-200 last:border-0">
                    <td className="px-2 py-1 font-semibold">{s.sceneNumber}</td>
                    <td className="px-2 py-1">{s.storyDay ?? "—"}</td>
                    <td className="px-2 py-1">{s.distressStage}</td>
                    <td className="px-2 py-1">
                      {[s.wet && "wet", s.blood && "blood", s.stunt && "stunt"].filter(Boolean).join(", ") || "—"}
                      {s.notes ? <span className="block text-xs text-slate">{s.notes}</span> : null}
                    </td>
                    <td className="px-2 py-1">{s.photoFiles.length}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
