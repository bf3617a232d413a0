import { useMemo } from "react";
import { boundingBox, polygonArea, signedArea, validatePolygon, type Point } from "@shared/domain/panels/geometry";
import { cutLineFromSewLine } from "@shared/domain/panels/offset";
import { interiorPoint } from "@shared/domain/panels/triangulate";

export interface CanvasPanel {
  name: string;
  outline: [number, number][];
  grainline: [[number, number], [number, number]] | null;
  notches: { point: [number, number]; edge: number }[];
  seamAllowanceMm: number;
  /** A cut line to draw as it is (e.g. from an imported file); otherwise it is offset from the sew line. */
  cutLine?: [number, number][] | null;
}

const n1 = (v: number) => Math.round(v * 10) / 10;

/**
 * Draws a panel at scale: sew line (solid), cut line offset by the seam allowance (dashed),
 * grainline arrow, notches, vertex numbers, name and area. y is flipped so the pattern's y runs up.
 * Clicking adds a point (mm, rounded) when `onAddPoint` is given.
 */
/** A seam run drawn on a panel: its points along the sew line and a short label. */
export interface CanvasSeamMark {
  label: string;
  points: readonly Point[];
}

export function PanelCanvas({
  panel,
  height = 320,
  showVertices = true,
  onAddPoint,
  label,
  seams = [],
}: {
  panel: CanvasPanel;
  height?: number;
  showVertices?: boolean;
  onAddPoint?: (p: [number, number]) => void;
  label?: string;
  seams?: readonly CanvasSeamMark[];
}) {
  const drawn = useMemo(() => {
    const valid = panel.outline.length >= 3 && validatePolygon(panel.outline as Point[]).valid;
    let cut: Point[] | null = panel.cutLine ?? null;
    if (!cut && valid && panel.seamAllowanceMm > 0) {
      try {
        cut = cutLineFromSewLine(panel.outline, panel.seamAllowanceMm);
      } catch {
        cut = null;
      }
    }
    const pts: Point[] = [...panel.outline, ...(cut ?? []), ...(panel.grainline ?? [])];
    const bb = pts.length ? boundingBox(pts) : { minX: 0, minY: 0, maxX: 100, maxY: 100, width: 100, height: 100 };
    const pad = Math.max(20, Math.max(bb.width, bb.height) * 0.06);
    return { valid, cut, bb, pad, area: valid ? polygonArea(panel.outline) : 0, label: valid ? interiorPoint(panel.outline) : null };
  }, [panel]);
  const { bb, pad } = drawn;
  const vb = `${bb.minX - pad} ${-(bb.maxY + pad)} ${bb.width + 2 * pad} ${bb.height + 2 * pad}`;
  const path = (pts: readonly Point[]) => pts.map((p, i) => `${i ? "L" : "M"}${p[0]} ${-p[1]}`).join(" ") + (pts.length > 2 ? " Z" : "");
  const stroke = Math.max(bb.width, bb.height) / 300 || 1;
  const font = Math.max(bb.width, bb.height) / 28 || 10;
  return (
    <svg
      role="img"
      aria-label={label ?? `Panel ${panel.name}: ${drawn.valid ? `${n1(drawn.area / 100)} cm²` : "outline not closed yet"}`}
      viewBox={vb}
      className="w-full rounded border border-chalk-200 bg-chalk"
      style={{ height }}
      onClick={(e) => {
        if (!onAddPoint) return;
        const svg = e.currentTarget;
        const pt = svg.createSVGPoint();
        pt.x = e.clientX;
        pt.y = e.clientY;
        const m = svg.getScreenCTM();
        if (!m) return;
        const p = pt.matrixTransform(m.inverse());
        onAddPoint([Math.round(p.x), Math.round(-p.y)]);
      }}
    >
      <defs>
        <marker id="grain-head" viewBox="0 0 10 10" refX="10" refY="5" markerWidth="6" markerHeight="6" orient="auto">
          <path d="M0 0 L10 5 L0 10 z" fill="#2B3A67" />
        </marker>
      </defs>
      {drawn.cut && (
        <path d={path(drawn.cut)} fill="none" stroke="#5B6770" strokeWidth={stroke} strokeDasharray={`${stroke * 6} ${stroke * 4}`} />
      )}
      {panel.outline.length > 1 && (
        <path
          d={path(panel.outline)}
          fill={drawn.valid ? "#fff" : "none"}
          stroke={drawn.valid ? "#2B3A67" : "#B5452E"}
          strokeWidth={stroke * 1.6}
        />
      )}
      {panel.grainline && (
        <line
          x1={panel.grainline[0][0]}
          y1={-panel.grainline[0][1]}
          x2={panel.grainline[1][0]}
          y2={-panel.grainline[1][1]}
          stroke="#2B3A67"
          strokeWidth={stroke}
          markerEnd="url(#grain-head)"
        />
      )}
      {panel.notches.map((n, i) => {
        const a = panel.outline[n.edge % Math.max(1, panel.outline.length)];
        const b = panel.outline[(n.edge + 1) % Math.max(1, panel.outline.length)];
        if (!a || !b) return null;
        const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
        // Outward normal for a counter-clockwise outline; notches cross into the allowance.
        const s = signedArea(panel.outline) >= 0 ? 1 : -1;
        const d = Math.max(6, panel.seamAllowanceMm);
        const ox = n.point[0] + (s * (b[1] - a[1]) * d) / len;
        const oy = n.point[1] - (s * (b[0] - a[0]) * d) / len;
        return <line key={i} x1={n.point[0]} y1={-n.point[1]} x2={ox} y2={-oy} stroke="#B5452E" strokeWidth={stroke * 1.5} />;
      })}
      {seams.map((m, i) => {
        const mid = m.points[Math.floor(m.points.length / 2)];
        return (
          <g key={`seam-${i}`}>
            <polyline
              points={m.points.map((p) => `${p[0]},${-p[1]}`).join(" ")}
              fill="none"
              stroke="#C98B2B"
              strokeWidth={stroke * 4}
              strokeOpacity={0.75}
              strokeLinecap="round"
            />
            {mid && (
              <g>
                <circle cx={mid[0]} cy={-mid[1]} r={font * 1.1} fill="#fff" stroke="#C98B2B" strokeWidth={stroke * 1.5} />
                <text
                  x={mid[0]}
                  y={-mid[1]}
                  fontSize={font * 1.4}
                  fontWeight="bold"
                  fill="#172041"
                  textAnchor="middle"
                  dominantBaseline="central"
                >
                  {m.label}
                </text>
              </g>
            )}
          </g>
        );
      })}
      {showVertices &&
        panel.outline.map((p, i) => (
          <g key={i}>
            <circle cx={p[0]} cy={-p[1]} r={stroke * (panel.outline.length > 60 ? 0.8 : 2)} fill="#C98B2B" />
            {/* Curved pieces have hundreds of points: number every few so the labels stay readable. */}
            {i % Math.max(1, Math.ceil(panel.outline.length / 40)) === 0 && (
              <text x={p[0] + stroke * 3} y={-p[1] - stroke * 3} fontSize={font * 0.6} fill="#5B6770">
                {i}
              </text>
            )}
          </g>
        ))}
      {drawn.label && (
        <text x={drawn.label[0]} y={-drawn.label[1]} fontSize={font} textAnchor="middle" fill="#172041">
          <tspan x={drawn.label[0]}>{panel.name}</tspan>
          <tspan x={drawn.label[0]} dy={font * 1.2} fontSize={font * 0.75}>
            {n1(drawn.area / 100)} cm²
          </tspan>
        </text>
      )}
    </svg>
  );
}
