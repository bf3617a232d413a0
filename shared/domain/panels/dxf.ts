// Pattern pieces as ASCII DXF, the open drawing-interchange format pattern software exchanges pieces in.
// Writer: R12-style entities (POLYLINE/VERTEX/SEQEND, LINE, TEXT), units millimetres ($INSUNITS 4).
// Each piece sits on its own layer: a closed boundary polyline, the grainline as a LINE inside the piece,
// each notch as a short LINE starting on the boundary and pointing inward, its name as one TEXT and
// "CUT n" (plus " MIRRORED" for mirrored pairs) as a second TEXT. Non-ASCII characters are written as
// \U+XXXX, the DXF escape for characters outside the file's code page.
// Reader: dxf-parser; closed polylines become pieces, and TEXT/LINE/POINT entities are given to the
// smallest piece that contains them (same layer preferred on ties).
import DxfParser from "dxf-parser";
import type { IEntity, ILineEntity, ILwpolylineEntity, IPointEntity, IPolylineEntity, ITextEntity } from "dxf-parser";
import {
  pointInPolygon,
  pointSegmentDistance,
  polygonArea,
  signedArea,
  type Notch,
  type PanelShape,
  type Point,
} from "./geometry";
import { interiorPoint } from "./triangulate";

/** Notch tick length drawn into the piece, mm (about ¼ in; common practice, no source). */
const NOTCH_DEPTH_MM = 6;
/** Lines at most this long that start on the boundary are read as notches, mm. */
const NOTCH_MAX_MM = 15;
const TEXT_HEIGHT_MM = 10;
const CUT_TEXT = /^CUT\s+(\d+)(\s+MIRRORED)?$/i;

function num(v: number): string {
  if (Object.is(v, -0)) return "0";
  const s = String(v);
  // Plain decimals keep every digit; exponent forms (very small or large) are spelled out.
  return s.includes("e") ? v.toFixed(15).replace(/\.?0+$/, "") : s;
}

/** Escapes text for a DXF group value: non-ASCII and edge spaces as \U+XXXX, backslash doubled. */
function encodeText(s: string): string {
  let out = "";
  const chars = [...s.replace(/[\r\n]+/g, " ")];
  chars.forEach((ch, i) => {
    const cp = ch.codePointAt(0)!;
    const edgeSpace = ch === " " && (i === 0 || i === chars.length - 1);
    if (ch === "\\") out += "\\\\";
    else if (cp > 126 || cp < 32 || edgeSpace) {
      // Characters beyond the BMP are written as their UTF-16 halves, each as \U+XXXX.
      for (const unit of ch.split("")) out += `\\U+${unit.charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}`;
    } else out += ch;
  });
  return out;
}

function decodeText(s: string): string {
  return s.replace(/\\\\|\\U\+([0-9A-Fa-f]{4})/g, (m, hex: string | undefined) => (hex ? String.fromCharCode(parseInt(hex, 16)) : "\\"));
}

function layerName(index: number, name: string): string {
  const clean = name
    .toUpperCase()
    .normalize("NFKD")
    .replace(/[^A-Z0-9_-]+/g, "_")
    .replace(/^_+|_+$/g, "");
  // R12 layer names: at most 31 characters of letters, digits, "_", "-", "$".
  return `PIECE_${index + 1}${clean ? `_${clean}` : ""}`.slice(0, 31);
}

/** Writes pieces as an ASCII DXF string (millimetres). */
export function panelsToDxf(panels: readonly PanelShape[]): string {
  const out: string[] = [];
  const g = (code: number, value: string | number) => {
    out.push(String(code), typeof value === "number" ? num(value) : value);
  };
  const layers = panels.map((p, i) => layerName(i, p.name));

  g(0, "SECTION");
  g(2, "HEADER");
  g(9, "$ACADVER");
  g(1, "AC1009");
  g(9, "$INSUNITS");
  g(70, "4");
  g(9, "$MEASUREMENT");
  g(70, "1");
  g(0, "ENDSEC");

  g(0, "SECTION");
  g(2, "TABLES");
  g(0, "TABLE");
  g(2, "LAYER");
  g(70, String(layers.length + 1));
  for (const name of ["0", ...layers]) {
    g(0, "LAYER");
    g(2, name);
    g(70, "0");
    g(62, "7");
    g(6, "CONTINUOUS");
  }
  g(0, "ENDTAB");
  g(0, "ENDSEC");

  g(0, "SECTION");
  g(2, "ENTITIES");
  panels.forEach((panel, i) => {
    const layer = layers[i];
    const outline = panel.outline;
    g(0, "POLYLINE");
    g(8, layer);
    g(66, "1");
    g(10, 0);
    g(20, 0);
    g(30, 0);
    g(70, "1");
    for (const [x, y] of outline) {
      g(0, "VERTEX");
      g(8, layer);
      g(10, x);
      g(20, y);
      g(30, 0);
    }
    g(0, "SEQEND");
    g(8, layer);

    const line = (a: Point, b: Point) => {
      g(0, "LINE");
      g(8, layer);
      g(10, a[0]);
      g(20, a[1]);
      g(30, 0);
      g(11, b[0]);
      g(21, b[1]);
      g(31, 0);
    };
    if (panel.grainline) line(panel.grainline[0], panel.grainline[1]);
    const ccw = signedArea(outline) > 0;
    for (const notch of panel.notches ?? []) {
      const n = outline.length;
      const a = outline[((notch.edge % n) + n) % n];
      const b = outline[(((notch.edge + 1) % n) + n) % n];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
      // Inward normal: left of the edge direction for a counter-clockwise outline.
      const sx = ccw ? -1 : 1;
      const nx = (sx * (b[1] - a[1])) / len;
      const ny = (-sx * (b[0] - a[0])) / len;
      line(notch.point, [notch.point[0] + nx * NOTCH_DEPTH_MM, notch.point[1] + ny * NOTCH_DEPTH_MM]);
    }
    const text = (at: Point, value: string) => {
      g(0, "TEXT");
      g(8, layer);
      g(10, at[0]);
      g(20, at[1]);
      g(30, 0);
      g(40, TEXT_HEIGHT_MM);
      g(1, encodeText(value));
    };
    text(interiorPoint(outline, 0), panel.name);
    text(interiorPoint(outline, 1), `CUT ${panel.cutCount}${panel.mirrored ? " MIRRORED" : ""}`);
  });
  g(0, "ENDSEC");
  g(0, "EOF");
  return out.join("\n") + "\n";
}

/** Result of {@link parseDxfPanels}. */
export interface DxfParseResult {
  /** Pieces found, in file order; id is the layer name of the boundary. */
  panels: PanelShape[];
  /** Things skipped or guessed, in plain language. */
  warnings: string[];
}

const UNIT_TO_MM: Record<number, number> = { 0: 1, 1: 25.4, 2: 304.8, 4: 1, 5: 10, 6: 1000 };

function nearestEdge(outline: readonly Point[], p: Point): { edge: number; distance: number } {
  let best = { edge: 0, distance: Infinity, t: 0 };
  outline.forEach((a, i) => {
    const b = outline[(i + 1) % outline.length];
    const { distance, t } = pointSegmentDistance(p, a, b);
    // On a shared vertex, prefer the edge that starts there (t = 0) over the one ending there (t = 1).
    if (distance < best.distance - 1e-9 || (Math.abs(distance - best.distance) <= 1e-9 && best.t >= 1 && t < 1)) {
      best = { edge: i, distance, t };
    }
  });
  return best;
}

/** Reads pieces from DXF text: closed polylines with the TEXT, LINE and POINT entities inside them. */
export function parseDxfPanels(text: string): DxfParseResult {
  const warnings: string[] = [];
  const dxf = new DxfParser().parseSync(text);
  if (!dxf) throw new Error("not a readable DXF file");
  const units = dxf.header?.$INSUNITS;
  const unitCode = typeof units === "number" ? units : 4;
  const scale = UNIT_TO_MM[unitCode];
  if (scale === undefined) throw new Error(`unsupported drawing units ($INSUNITS ${unitCode})`);
  const toMm = (x: number, y: number): Point => [x * scale, y * scale];

  interface Draft {
    layer: string;
    outline: Point[];
    area: number;
    texts: string[];
    lines: [Point, Point][];
    points: Point[];
  }
  const drafts: Draft[] = [];
  const others: IEntity[] = [];
  for (const e of dxf.entities) {
    if (e.type === "POLYLINE" || e.type === "LWPOLYLINE") {
      const poly = e as IPolylineEntity | ILwpolylineEntity;
      let pts = poly.vertices.map((v) => toMm(v.x, v.y));
      const first = pts[0];
      const last = pts[pts.length - 1];
      const repeats = pts.length > 1 && first[0] === last[0] && first[1] === last[1];
      if (repeats) pts = pts.slice(0, -1);
      if (!poly.shape && !repeats) {
        warnings.push(`open polyline on layer ${e.layer} skipped`);
        continue;
      }
      if (pts.length < 3) {
        warnings.push(`polyline with fewer than 3 points on layer ${e.layer} skipped`);
        continue;
      }
      drafts.push({ layer: e.layer, outline: pts, area: polygonArea(pts), texts: [], lines: [], points: [] });
    } else others.push(e);
  }

  const owner = (p: Point, layer: string): Draft | undefined => {
    const containing = drafts.filter((d) => pointInPolygon(p, d.outline, 1e-6) !== "outside");
    containing.sort((a, b) => (a.layer === layer ? 0 : 1) - (b.layer === layer ? 0 : 1) || a.area - b.area);
    return containing[0];
  };

  for (const e of others) {
    if (e.type === "TEXT" || e.type === "MTEXT") {
      const t = e as ITextEntity;
      const at = toMm(t.startPoint.x, t.startPoint.y);
      const d = owner(at, e.layer);
      if (d) d.texts.push(decodeText(t.text));
      else warnings.push(`text "${decodeText(t.text)}" outside every piece ignored`);
    } else if (e.type === "LINE") {
      const l = e as ILineEntity;
      const a = toMm(l.vertices[0].x, l.vertices[0].y);
      const b = toMm(l.vertices[1].x, l.vertices[1].y);
      const d = owner([(a[0] + b[0]) / 2, (a[1] + b[1]) / 2], e.layer);
      if (d) d.lines.push([a, b]);
      else warnings.push(`line outside every piece on layer ${e.layer} ignored`);
    } else if (e.type === "POINT") {
      const p = e as IPointEntity;
      const at = toMm(p.position.x, p.position.y);
      const d = owner(at, e.layer);
      if (d) d.points.push(at);
    }
  }

  const panels = drafts.map((d, i): PanelShape => {
    const notches: Notch[] = [];
    const grainCandidates: [Point, Point][] = [];
    const onBoundary = (p: Point) => nearestEdge(d.outline, p).distance <= 1e-6 * Math.max(1, scale);
    for (const [a, b] of d.lines) {
      const length = Math.hypot(b[0] - a[0], b[1] - a[1]);
      if (length <= NOTCH_MAX_MM && (onBoundary(a) || onBoundary(b))) {
        const p = onBoundary(a) ? a : b;
        notches.push({ point: p, edge: nearestEdge(d.outline, p).edge });
      } else grainCandidates.push([a, b]);
    }
    for (const p of d.points) if (onBoundary(p)) notches.push({ point: p, edge: nearestEdge(d.outline, p).edge });
    grainCandidates.sort((x, y) => Math.hypot(y[1][0] - y[0][0], y[1][1] - y[0][1]) - Math.hypot(x[1][0] - x[0][0], x[1][1] - x[0][1]));
    if (grainCandidates.length > 1) warnings.push(`layer ${d.layer}: ${grainCandidates.length} grainline candidates, the longest kept`);

    // The writer puts the name first and "CUT n" second; a name that itself reads "CUT n" stays a name.
    let cutCount = 1;
    let mirrored = false;
    const texts = [...d.texts];
    const cutIndex = texts.map((t) => CUT_TEXT.test(t.trim())).lastIndexOf(true);
    if (cutIndex >= 0) {
      const m = CUT_TEXT.exec(texts[cutIndex].trim())!;
      cutCount = Number(m[1]);
      mirrored = Boolean(m[2]);
      texts.splice(cutIndex, 1);
    } else warnings.push(`layer ${d.layer}: no "CUT n" text, 1 assumed`);
    let name: string | undefined = texts[0];
    if (name === undefined) {
      name = d.layer;
      warnings.push(`layer ${d.layer}: no name text, layer name used`);
    }
    return {
      id: d.layer || `piece-${i + 1}`,
      name,
      outline: d.outline,
      grainline: grainCandidates[0] ?? null,
      notches,
      cutCount,
      mirrored,
    };
  });
  return { panels, warnings };
}
