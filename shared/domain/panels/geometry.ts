// Plane geometry for flat pattern pieces (panels). Pure functions, no I/O; runs in the browser too.
// Frame: millimetres, y up. A polygon lists its vertices once (the closing edge from the last
// vertex back to the first is implied); a positive signed area means counter-clockwise.

import { findCrossings, type EdgeCrossing } from "./crossings";

/** Most crossings listed for one outline; a badly crossed outline would otherwise list millions. */
export const MAX_LISTED_CROSSINGS = 20;

/** A point [x, y] in millimetres. */
export type Point = readonly [number, number];
/** A closed polygon given by its vertices, without repeating the first one at the end. */
export type Polygon = readonly Point[];

/** A notch: a point on the outline and the index of the edge it sits on (edge i runs from vertex i to i+1). */
export interface Notch {
  /** Position of the notch on the outline, mm. */
  point: Point;
  /** Edge index: edge i goes from vertex i to vertex (i + 1) mod n. */
  edge: number;
}

/** How a piece may turn on the fabric: "straight" keeps the grainline along the warp (0°/180°); "bias" and "free" may also lie cross-grain (90°/270°). */
export type GrainMode = "straight" | "bias" | "free";

/** The geometry of one panel as the panel tools, nesting and exporters use it. */
export interface PanelShape {
  /** Stable id of the panel. */
  id: string;
  /** Display name, e.g. "Front bodice". */
  name: string;
  /** Outline (sew line unless the caller says otherwise), mm, y up. */
  outline: Polygon;
  /** Grainline as two points; the arrow runs from the first to the second. */
  grainline?: readonly [Point, Point] | null;
  /** Notches on the outline. */
  notches?: readonly Notch[];
  /** Seam allowance added outside the outline to get the cut line, mm. */
  seamAllowanceMm?: number;
  /** How many copies are cut. */
  cutCount: number;
  /** True when copies are cut as mirrored pairs (every second copy is the mirror image). */
  mirrored?: boolean;
  /** Rotation freedom on the fabric; default "straight". */
  grainMode?: GrainMode;
}

/** Axis-aligned bounding box. */
export interface BoundingBox {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
  width: number;
  height: number;
}

/** A position on an outline: along edge `edge` at fraction `t` (0 = its start vertex, 1 = its end vertex). */
export interface OutlinePosition {
  edge: number;
  t: number;
}

/** A run end: a vertex index (number) or a position on an edge (e.g. from a notch). */
export type RunEnd = number | OutlinePosition;

/** Signed shoelace area, mm²: ½ Σ (x_i·y_{i+1} − x_{i+1}·y_i); positive when counter-clockwise (y up). */
export function signedArea(poly: Polygon): number {
  const n = poly.length;
  if (n < 3) return 0;
  let twice = 0;
  // Subtracting the first vertex keeps the products small, which limits cancellation far from the origin.
  const [ox, oy] = poly[0];
  for (let i = 0; i < n; i++) {
    const [x1, y1] = poly[i];
    const [x2, y2] = poly[(i + 1) % n];
    twice += (x1 - ox) * (y2 - oy) - (x2 - ox) * (y1 - oy);
  }
  return twice / 2;
}

/** Unsigned shoelace area, mm². */
export function polygonArea(poly: Polygon): number {
  return Math.abs(signedArea(poly));
}

/** Returns the polygon in counter-clockwise order (positive signed area). */
export function toCounterClockwise(poly: Polygon): Point[] {
  return signedArea(poly) < 0 ? [...poly].reverse() : [...poly];
}

/** Distance between two points. */
export function distance(a: Point, b: Point): number {
  return Math.hypot(b[0] - a[0], b[1] - a[1]);
}

/** Lengths of every edge; entry i is the edge from vertex i to vertex (i + 1) mod n. */
export function edgeLengths(poly: Polygon): number[] {
  const n = poly.length;
  return poly.map((p, i) => distance(p, poly[(i + 1) % n]));
}

/** Perimeter of the closed polygon, mm. */
export function perimeter(poly: Polygon): number {
  return edgeLengths(poly).reduce((s, l) => s + l, 0);
}

/** Axis-aligned bounding box of a point list. */
export function boundingBox(points: readonly Point[]): BoundingBox {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of points) {
    if (x < minX) minX = x;
    if (y < minY) minY = y;
    if (x > maxX) maxX = x;
    if (y > maxY) maxY = y;
  }
  return { minX, minY, maxX, maxY, width: maxX - minX, height: maxY - minY };
}

/** Rotates points counter-clockwise by `degrees` about `about` (default origin); multiples of 90° are exact. */
export function rotatePoints(points: readonly Point[], degrees: number, about: Point = [0, 0]): Point[] {
  const [cx, cy] = about;
  const quarter = ((Math.round(degrees / 90) % 4) + 4) % 4;
  const exact = Number.isInteger(degrees / 90);
  const rad = (degrees * Math.PI) / 180;
  const c = Math.cos(rad);
  const s = Math.sin(rad);
  return points.map(([x, y]) => {
    const dx = x - cx;
    const dy = y - cy;
    if (exact) {
      // Swapping coordinates avoids cos(90°) ≈ 6e-17 noise, so rectangles stay rectangles.
      if (quarter === 0) return [cx + dx, cy + dy] as Point;
      if (quarter === 1) return [cx - dy, cy + dx] as Point;
      if (quarter === 2) return [cx - dx, cy - dy] as Point;
      return [cx + dy, cy - dx] as Point;
    }
    return [cx + dx * c - dy * s, cy + dx * s + dy * c] as Point;
  });
}

/** Mirrors points across the vertical line x = axisX (left/right flip); note that this reverses a polygon's winding. */
export function mirrorPoints(points: readonly Point[], axisX = 0): Point[] {
  return points.map(([x, y]) => [2 * axisX - x, y] as Point);
}

/** Translates points by (dx, dy). */
export function translatePoints(points: readonly Point[], dx: number, dy: number): Point[] {
  return points.map(([x, y]) => [x + dx, y + dy] as Point);
}

/** Distance from point p to segment ab, and the fraction t of the closest point along ab. */
export function pointSegmentDistance(p: Point, a: Point, b: Point): { distance: number; t: number } {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const len2 = vx * vx + vy * vy;
  let t = len2 === 0 ? 0 : ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2;
  t = Math.max(0, Math.min(1, t));
  return { distance: Math.hypot(a[0] + t * vx - p[0], a[1] + t * vy - p[1]), t };
}

/**
 * Where a point lies relative to a polygon (even-odd rule).
 * @param eps distance within which a point counts as on the boundary, mm
 */
export function pointInPolygon(p: Point, poly: Polygon, eps = 1e-9): "inside" | "outside" | "boundary" {
  const n = poly.length;
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = poly[j];
    const b = poly[i];
    if (pointSegmentDistance(p, a, b).distance <= eps) return "boundary";
    if (a[1] > p[1] !== b[1] > p[1]) {
      const xCross = a[0] + ((p[1] - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
      if (p[0] < xCross) inside = !inside;
    }
  }
  return inside ? "inside" : "outside";
}

/** Point at fraction t along edge `edge` of the polygon. */
export function pointAt(poly: Polygon, pos: OutlinePosition): Point {
  const n = poly.length;
  const a = poly[((pos.edge % n) + n) % n];
  const b = poly[(((pos.edge + 1) % n) + n) % n];
  return [a[0] + (b[0] - a[0]) * pos.t, a[1] + (b[1] - a[1]) * pos.t];
}

/** Converts a run end (vertex index or edge position) to an edge position with t in [0, 1). */
export function toOutlinePosition(poly: Polygon, end: RunEnd): OutlinePosition {
  const n = poly.length;
  if (typeof end === "number") return { edge: ((end % n) + n) % n, t: 0 };
  const edge = ((end.edge % n) + n) % n;
  // t = 1 is the next vertex; normalise so equal points compare equal.
  if (end.t >= 1) return { edge: (edge + 1) % n, t: 0 };
  return { edge, t: Math.max(0, end.t) };
}

/** Edge position of a notch: its point projected onto its recorded edge. */
export function notchPosition(poly: Polygon, notch: Notch): OutlinePosition {
  const n = poly.length;
  const edge = ((notch.edge % n) + n) % n;
  const { t } = pointSegmentDistance(notch.point, poly[edge], poly[(edge + 1) % n]);
  return toOutlinePosition(poly, { edge, t });
}

/**
 * The points of the outline run from `from` to `to`, walking forward (increasing vertex index, wrapping)
 * or backward. Equal ends give a single point (an empty run).
 */
export function runPoints(poly: Polygon, from: RunEnd, to: RunEnd, direction: "forward" | "backward" = "forward"): Point[] {
  const n = poly.length;
  if (direction === "backward") {
    // Walking backward on poly is walking forward on the reversed polygon; map edge positions across.
    const rev = [...poly].reverse();
    const mapEnd = (e: RunEnd): OutlinePosition => {
      const p = toOutlinePosition(poly, e);
      // Edge i (v_i → v_{i+1}) is reversed-edge (n − 2 − i) mod n, with fraction 1 − t.
      return toOutlinePosition(rev, { edge: (((n - 2 - p.edge) % n) + n) % n, t: 1 - p.t });
    };
    return runPoints(rev, mapEnd(from), mapEnd(to), "forward");
  }
  const a = toOutlinePosition(poly, from);
  const b = toOutlinePosition(poly, to);
  const out: Point[] = [pointAt(poly, a)];
  if (a.edge === b.edge && a.t === b.t) return out;
  if (a.edge === b.edge && b.t > a.t) {
    out.push(pointAt(poly, b));
    return out;
  }
  let e = a.edge;
  for (let k = 0; k < n; k++) {
    e = (e + 1) % n;
    out.push(poly[e]);
    if (e === b.edge) break;
  }
  if (b.t > 0) out.push(pointAt(poly, b));
  return out;
}

/** Length of a polyline (open). */
export function polylineLength(points: readonly Point[]): number {
  let s = 0;
  for (let i = 1; i < points.length; i++) s += distance(points[i - 1], points[i]);
  return s;
}

/** Length of the outline run between two vertex indices or edge positions (wrapping), mm. */
export function runLength(poly: Polygon, from: RunEnd, to: RunEnd, direction: "forward" | "backward" = "forward"): number {
  return polylineLength(runPoints(poly, from, to, direction));
}

export type { EdgeCrossing } from "./crossings";

/** One problem found by {@link validatePolygon}. */
export interface PolygonIssue {
  code: "too_few_points" | "not_finite" | "not_closed" | "zero_length_edge" | "zero_area" | "self_intersection";
  message: string;
}

/** Result of {@link validatePolygon}. */
export interface PolygonValidation {
  valid: boolean;
  issues: PolygonIssue[];
  crossings: EdgeCrossing[];
}

const round3 = (v: number) => Math.round(v * 1000) / 1000;

/**
 * Checks a polygon: at least 3 finite points, closed, no zero-length edges, non-zero area and no
 * self-intersection; crossing edge pairs are listed, at most {@link MAX_LISTED_CROSSINGS} of them
 * (sweep line, O(n log n)).
 * @param options.closed false when the source polyline was not marked closed (then last must equal first)
 */
export function validatePolygon(points: readonly Point[], options: { closed?: boolean } = {}): PolygonValidation {
  const issues: PolygonIssue[] = [];
  const crossings: EdgeCrossing[] = [];
  let poly = [...points];
  if (poly.some(([x, y]) => !Number.isFinite(x) || !Number.isFinite(y))) {
    issues.push({ code: "not_finite", message: "a coordinate is not a finite number" });
    return { valid: false, issues, crossings };
  }
  const first = poly[0];
  const last = poly[poly.length - 1];
  const repeatsFirst = poly.length > 1 && first[0] === last[0] && first[1] === last[1];
  if (repeatsFirst) poly = poly.slice(0, -1);
  else if (options.closed === false) issues.push({ code: "not_closed", message: "the outline is open: last point differs from the first" });
  if (poly.length < 3) {
    issues.push({ code: "too_few_points", message: `an outline needs at least 3 points, got ${poly.length}` });
    return { valid: false, issues, crossings };
  }
  const n = poly.length;
  for (let i = 0; i < n; i++) {
    const a = poly[i];
    const b = poly[(i + 1) % n];
    if (a[0] === b[0] && a[1] === b[1]) {
      issues.push({ code: "zero_length_edge", message: `edge ${i} has zero length (vertices ${i} and ${(i + 1) % n} coincide)` });
    }
  }
  if (signedArea(poly) === 0) issues.push({ code: "zero_area", message: "the outline encloses no area" });
  const found = findCrossings(poly, MAX_LISTED_CROSSINGS);
  crossings.push(...found.crossings);
  for (const c of crossings) {
    issues.push({
      code: "self_intersection",
      message: `edges ${c.edgeA} and ${c.edgeB} cross at (${round3(c.point[0])}, ${round3(c.point[1])})`,
    });
  }
  if (found.truncated)
    issues.push({ code: "self_intersection", message: `the first ${MAX_LISTED_CROSSINGS} crossings are listed; there may be more` });
  return { valid: issues.length === 0, issues, crossings };
}

/**
 * Inserts extra points on the outline (e.g. notches or seam ends) as vertices, splitting edges.
 * @returns the new outline and, for each requested position, the index of its vertex in it
 */
export function insertOutlinePoints(poly: Polygon, positions: readonly RunEnd[]): { outline: Point[]; indices: number[] } {
  const n = poly.length;
  const norm = positions.map((p) => toOutlinePosition(poly, p));
  // Per edge, the distinct interior fractions to insert, in order.
  const perEdge = new Map<number, number[]>();
  for (const p of norm) {
    if (p.t <= 0) continue;
    const list = perEdge.get(p.edge) ?? [];
    if (!list.includes(p.t)) list.push(p.t);
    perEdge.set(p.edge, list);
  }
  const outline: Point[] = [];
  const vertexIndex: number[] = [];
  const inserted = new Map<string, number>();
  for (let i = 0; i < n; i++) {
    vertexIndex[i] = outline.length;
    outline.push(poly[i]);
    const ts = (perEdge.get(i) ?? []).sort((x, y) => x - y);
    for (const t of ts) {
      inserted.set(`${i}:${t}`, outline.length);
      outline.push(pointAt(poly, { edge: i, t }));
    }
  }
  const indices = norm.map((p) => (p.t <= 0 ? vertexIndex[p.edge] : inserted.get(`${p.edge}:${p.t}`)!));
  return { outline, indices };
}
