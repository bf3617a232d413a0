// Packet exports of panels: JSON, an SVG sheet, and flat OBJ meshes with a seam map for cloth set-up.
import earcut from "earcut";
import {
  boundingBox,
  insertOutlinePoints,
  notchPosition,
  signedArea,
  translatePoints,
  type PanelShape,
  type Point,
  type RunEnd,
} from "./geometry";
import { cutLineFromSewLine } from "./offset";

/** Format version written into JSON and seam maps. */
export const PANEL_EXPORT_VERSION = 1;

/** Panels as pretty-printed JSON (mm, y up). */
export function panelsToJson(panels: readonly PanelShape[]): string {
  return JSON.stringify({ version: PANEL_EXPORT_VERSION, units: "mm", yAxis: "up", panels }, null, 2);
}

/** One side of a seam for export: a run on one panel. */
export interface SeamRunRef {
  panelId: string;
  from: RunEnd;
  to: RunEnd;
  /** Walking direction along the outline; default "forward". */
  direction?: "forward" | "backward";
}

/** A seam joining two runs, in sewing order (vertex k of side a meets the same fraction along side b). */
export interface SeamRef {
  id: string;
  a: SeamRunRef;
  b: SeamRunRef;
}

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const n2 = (v: number) => String(Math.round(v * 100) / 100);

/** Options for {@link panelsToSvg}. */
export interface SvgOptions {
  /** Gap between pieces laid left to right, mm (default 30). */
  gapMm?: number;
}

/**
 * Draws panels side by side as an SVG sheet at 1:1 (mm): sew line solid, cut line dashed when a seam
 * allowance is set, grainline with an arrowhead, notches as ticks, name and cut count.
 */
export function panelsToSvg(panels: readonly PanelShape[], options: SvgOptions = {}): string {
  const gap = options.gapMm ?? 30;
  const items = panels.map((p) => {
    const cut = p.seamAllowanceMm ? cutLineFromSewLine(p.outline, p.seamAllowanceMm) : null;
    return { p, cut, bb: boundingBox(cut ?? p.outline) };
  });
  const height = Math.max(1, ...items.map((i) => i.bb.height));
  const width = items.reduce((s, i) => s + i.bb.width, 0) + gap * Math.max(0, items.length - 1);
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${n2(width + 2 * gap)}mm" height="${n2(height + 2 * gap)}mm" viewBox="${n2(-gap)} ${n2(-gap)} ${n2(width + 2 * gap)} ${n2(height + 2 * gap)}">`,
    `<defs><marker id="grain-arrow" viewBox="0 0 10 10" refX="10" refY="5" markerWidth="6" markerHeight="6" orient="auto"><path d="M0 0 L10 5 L0 10 z"/></marker></defs>`,
  ];
  let x0 = 0;
  for (const { p, cut, bb } of items) {
    // Shift the piece to the sheet position and flip y, since SVG's y axis points down.
    const tx = (pt: Point): [number, number] => [pt[0] - bb.minX + x0, height - (pt[1] - bb.minY)];
    const path = (pts: readonly Point[]) => pts.map((pt, i) => `${i ? "L" : "M"}${n2(tx(pt)[0])} ${n2(tx(pt)[1])}`).join(" ") + " Z";
    const g: string[] = [`<g data-panel="${esc(p.id)}">`];
    if (cut) g.push(`<path d="${path(cut)}" fill="none" stroke="#000" stroke-width="0.4" stroke-dasharray="3 2"/>`);
    g.push(`<path d="${path(p.outline)}" fill="#f4f1e8" stroke="#000" stroke-width="0.6"/>`);
    if (p.grainline) {
      const [a, b] = p.grainline.map(tx);
      g.push(
        `<line x1="${n2(a[0])}" y1="${n2(a[1])}" x2="${n2(b[0])}" y2="${n2(b[1])}" stroke="#000" stroke-width="0.5" marker-end="url(#grain-arrow)"/>`,
      );
    }
    const n = p.outline.length;
    for (const notch of p.notches ?? []) {
      const a = p.outline[notch.edge % n];
      const b = p.outline[(notch.edge + 1) % n];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
      const s = signedArea(p.outline) > 0 ? 1 : -1;
      // Ticks cross the sew line outward into the allowance, the way notches are cut.
      const out: Point = [notch.point[0] + (s * (b[1] - a[1]) * 6) / len, notch.point[1] - (s * (b[0] - a[0]) * 6) / len];
      const [p1, p2] = [tx(notch.point), tx(out)];
      g.push(`<line x1="${n2(p1[0])}" y1="${n2(p1[1])}" x2="${n2(p2[0])}" y2="${n2(p2[1])}" stroke="#000" stroke-width="0.6"/>`);
    }
    const c = tx([(bb.minX + bb.maxX) / 2, (bb.minY + bb.maxY) / 2]);
    g.push(
      `<text x="${n2(c[0])}" y="${n2(c[1])}" font-size="10" text-anchor="middle" font-family="sans-serif">${esc(p.name)}</text>`,
      `<text x="${n2(c[0])}" y="${n2(c[1] + 12)}" font-size="8" text-anchor="middle" font-family="sans-serif">${esc(`CUT ${p.cutCount}${p.mirrored ? " (mirrored pair)" : ""}`)}</text>`,
      "</g>",
    );
    parts.push(g.join(""));
    x0 += bb.width + gap;
  }
  parts.push("</svg>");
  return parts.join("\n");
}

/** Options for {@link panelsToObj}. */
export interface ObjOptions {
  /** "row" lays pieces left to right with a gap so UV islands do not overlap (default); "as-drafted" keeps pattern coordinates. */
  layout?: "row" | "as-drafted";
  /** Gap between pieces in the row layout, mm (default 50). */
  gapMm?: number;
}

/** One side of a seam in the OBJ: the 1-based vertex indices of the run, in walking order. */
export interface ObjSeamSide {
  panelId: string;
  /** OBJ group name of the panel. */
  group: string;
  /** 1-based OBJ vertex (and texture vertex) indices. */
  vertices: number[];
}

/** Seam map entry written as seams.json next to the OBJ. */
export interface ObjSeam {
  id: string;
  a: ObjSeamSide;
  b: ObjSeamSide;
}

/** Result of {@link panelsToObj}. */
export interface ObjExport {
  /** Wavefront OBJ text: metres, z = 0, one group per panel, vt = flat position in metres. */
  obj: string;
  /** Seam map: sewn vertex runs by OBJ index. */
  seams: { version: number; units: "m"; seams: ObjSeam[] };
}

/** OBJ group name: whitespace would split it into several groups, so it becomes "_". */
export function objGroupName(panel: PanelShape): string {
  return (panel.name.trim() || panel.id).replace(/\s+/g, "_");
}

/**
 * Exports panels as flat triangulated OBJ meshes with UVs equal to the flat positions (metres), and
 * maps every seam side to its OBJ vertex run. Seam ends and notches that fall mid-edge are inserted
 * as vertices first, so each run starts and ends on a mesh vertex.
 */
export function panelsToObj(panels: readonly PanelShape[], seams: readonly SeamRef[] = [], options: ObjOptions = {}): ObjExport {
  const layout = options.layout ?? "row";
  const gap = options.gapMm ?? 50;
  const lines: string[] = ["# Seamscene flat panels", "# units: metres; z = 0; vt = flat position in metres"];
  const byId = new Map(panels.map((p) => [p.id, p]));
  for (const s of seams) {
    for (const side of [s.a, s.b]) if (!byId.has(side.panelId)) throw new Error(`seam ${s.id}: unknown panel ${side.panelId}`);
  }
  const mapping = new Map<string, { group: string; base: number; count: number; index: (end: RunEnd) => number }>();
  let base = 0;
  let x0 = 0;
  for (const panel of panels) {
    const ends: RunEnd[] = [];
    for (const s of seams) for (const side of [s.a, s.b]) if (side.panelId === panel.id) ends.push(side.from, side.to);
    for (const notch of panel.notches ?? []) ends.push(notchPosition(panel.outline, notch));
    const ins = insertOutlinePoints(panel.outline, ends);
    const outline = ins.outline;
    const bb = boundingBox(outline);
    const placed = layout === "row" ? translatePoints(outline, x0 - bb.minX, -bb.minY) : outline;
    x0 += bb.width + gap;
    const group = objGroupName(panel);
    lines.push(`g ${group}`);
    for (const [x, y] of placed) lines.push(`v ${x / 1000} ${y / 1000} 0`);
    for (const [x, y] of placed) lines.push(`vt ${x / 1000} ${y / 1000}`);
    const tris = earcut(placed.flatMap(([x, y]) => [x, y]));
    for (let i = 0; i < tris.length; i += 3) {
      // Faces counter-clockwise seen from +z (normals towards the viewer), checked per triangle.
      const [pa, pb, pc] = [placed[tris[i]], placed[tris[i + 1]], placed[tris[i + 2]]];
      const ccw = (pb[0] - pa[0]) * (pc[1] - pa[1]) - (pc[0] - pa[0]) * (pb[1] - pa[1]) >= 0;
      const [a, b, c] = ccw ? [tris[i], tris[i + 1], tris[i + 2]] : [tris[i], tris[i + 2], tris[i + 1]];
      lines.push(`f ${base + a + 1}/${base + a + 1} ${base + b + 1}/${base + b + 1} ${base + c + 1}/${base + c + 1}`);
    }
    const endIndex = new Map<RunEnd, number>();
    ends.forEach((e, k) => endIndex.set(e, ins.indices[k]));
    mapping.set(panel.id, {
      group,
      base,
      count: outline.length,
      index: (e) => {
        const local = endIndex.get(e);
        if (local === undefined) throw new Error("seam end not registered");
        return local;
      },
    });
    base += outline.length;
  }
  const side = (ref: SeamRunRef): ObjSeamSide => {
    const m = mapping.get(ref.panelId)!;
    const from = m.index(ref.from);
    const to = m.index(ref.to);
    const step = (ref.direction ?? "forward") === "forward" ? 1 : -1;
    const vertices = [m.base + from + 1];
    for (let k = from; k !== to;) {
      k = (k + step + m.count) % m.count;
      vertices.push(m.base + k + 1);
    }
    return { panelId: ref.panelId, group: m.group, vertices };
  };
  return {
    obj: lines.join("\n") + "\n",
    seams: { version: PANEL_EXPORT_VERSION, units: "m", seams: seams.map((s) => ({ id: s.id, a: side(s.a), b: side(s.b) })) },
  };
}
