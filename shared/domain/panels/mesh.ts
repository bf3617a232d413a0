// Simulation-ready panel meshes: each panel's sew line triangulated to a target edge length with a
// minimum angle, and the seams' two sides split into the same number of vertices at matching arc
// length so a cloth solver can join them vertex to vertex (stitches). Pure; runs in Node and the browser.
//
// Method. Boundary first: every outline vertex stays a mesh vertex (so the mesh covers the panel's
// exact area). Along each seam the two runs get paired points at equal fractions of each side's
// length, so an eased side's extra length is spread evenly; an outline vertex of one side is paired
// with a vertex of the other side when they lie within a third of the target length of each other,
// otherwise the other side gets a point at the same fraction. Free edges are split evenly. Interior
// points come from an equilateral lattice at the target length, kept half a target length clear of
// the outline. The points are triangulated by Delaunator with the boundary enforced by
// Constrainautor (a constrained Delaunay triangulation); then Delaunay refinement
// inserts the circumcentre of every triangle below the minimum angle, or splits the boundary segment
// that circumcentre would encroach on. A split on a seam is made on both of its sides, so the stitch
// counts stay equal, and both panels are meshed again.
import Delaunator from "delaunator";
import Constrainautor from "@kninnug/constrainautor";
import { pointInPolygon, toOutlinePosition, type Point, type Polygon, type RunEnd } from "./geometry";

/** Default target edge length, mm. */
export const DEFAULT_MESH_EDGE_MM = 10;
/** Smallest and largest target edge length offered, mm (below 5 mm the demo change exceeds 200,000 triangles). */
export const MESH_EDGE_RANGE_MM = { min: 5, max: 50 } as const;
/** Minimum triangle angle the mesher guarantees, degrees. */
export const MESH_MIN_ANGLE_DEG = 20;

/** One panel to mesh: its sew line as stored (seam run ends index this outline). */
export interface MeshPanelInput {
  id: string;
  outline: Polygon;
}

/** One side of a seam, as stored. */
export interface MeshSeamSide {
  panelId: string;
  from: RunEnd;
  to: RunEnd;
  direction: "forward" | "backward";
}

/** A seam to stitch. */
export interface MeshSeamInput {
  id: string;
  a: MeshSeamSide;
  b: MeshSeamSide;
}

/** A flat triangle mesh of one panel. */
export interface SimulationMesh {
  panelId: string;
  /** Vertex positions, mm, in the panel's own frame (y up); vertices 0…boundaryCount − 1 run along the outline. */
  vertices: Point[];
  /** Triangles as vertex index triples (0-based), counter-clockwise seen from +z. */
  triangles: number[];
  /** Number of boundary vertices (the first ones). */
  boundaryCount: number;
  /** Smallest angle of any triangle, degrees. */
  minAngleDeg: number;
  /** Longest edge of any triangle, mm. */
  maxEdgeMm: number;
  /** Sum of the triangle areas, mm². */
  areaMm2: number;
}

/** The vertex pairs a simulator joins for one seam. */
export interface SeamStitches {
  seamId: string;
  a: { panelId: string; indices: number[] };
  b: { panelId: string; indices: number[] };
  /** Fraction of side A's run length at each pair (side B's fraction is equal up to vertex pairing). */
  fractions: number[];
}

/** Meshes of all panels and the stitches of every seam that could be stitched. */
export interface SimulationMeshes {
  targetEdgeMm: number;
  minAngleTargetDeg: number;
  meshes: SimulationMesh[];
  stitches: SeamStitches[];
  /** Seams left without stitches, with the reason (e.g. a run that overlaps another seam). */
  skipped: { seamId: string; reason: string }[];
}

/** Options for {@link meshPanelsForSimulation}. */
export interface MeshOptions {
  /** Target edge length, mm; default 10. */
  targetEdgeMm?: number;
}

// ---------------------------------------------------------------------------------------------
// Arc-length parameterisation of an outline

interface Outline {
  pts: Point[];
  /** Arc position of vertex i from vertex 0, mm; cum[n] = perimeter. */
  cum: number[];
  perimeter: number;
}

function parameterise(poly: Polygon): Outline {
  const pts = poly.map((p) => [p[0], p[1]] as Point);
  const cum = [0];
  for (let i = 0; i < pts.length; i++) {
    const a = pts[i];
    const b = pts[(i + 1) % pts.length];
    cum.push(cum[i] + Math.hypot(b[0] - a[0], b[1] - a[1]));
  }
  return { pts, cum, perimeter: cum[pts.length] };
}

const wrap = (s: number, P: number) => ((s % P) + P) % P;

function arcOf(o: Outline, end: RunEnd): number {
  const pos = toOutlinePosition(o.pts, end);
  return o.cum[pos.edge] + pos.t * (o.cum[pos.edge + 1] - o.cum[pos.edge]);
}

/** Vertex index whose arc position equals s (within 1 nm), else -1. */
function vertexAt(o: Outline, s: number): number {
  const n = o.pts.length;
  let lo = 0;
  let hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (o.cum[mid] <= s) lo = mid;
    else hi = mid;
  }
  if (Math.abs(o.cum[lo] - s) < 1e-6) return lo;
  if (Math.abs(o.cum[hi] - s) < 1e-6) return hi % n;
  return -1;
}

function pointAtArc(o: Outline, s: number): Point {
  const n = o.pts.length;
  s = wrap(s, o.perimeter);
  const v = vertexAt(o, s);
  if (v >= 0) return o.pts[v];
  let lo = 0;
  let hi = n;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (o.cum[mid] <= s) lo = mid;
    else hi = mid;
  }
  const a = o.pts[lo];
  const b = o.pts[(lo + 1) % n];
  const t = (s - o.cum[lo]) / (o.cum[lo + 1] - o.cum[lo]);
  return [a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1])];
}

// ---------------------------------------------------------------------------------------------
// Seam plans: paired run-relative distances on both sides

interface SidePlan {
  panelId: string;
  start: number;
  dir: 1 | -1;
  length: number;
}

interface SeamPlan {
  seamId: string;
  a: SidePlan;
  b: SidePlan;
  /** Paired distances along each run from its start, increasing; first (0, 0), last (lengthA, lengthB). */
  pairs: { ra: number; rb: number }[];
}

const arcOnPanel = (side: SidePlan, r: number, P: number) => wrap(side.start + side.dir * r, P);

function sidePlan(o: Outline, side: MeshSeamSide): SidePlan {
  const s0 = arcOf(o, side.from);
  const s1 = arcOf(o, side.to);
  const dir = side.direction === "backward" ? -1 : 1;
  const length = wrap(dir * (s1 - s0), o.perimeter);
  return { panelId: side.panelId, start: s0, dir, length };
}

/** Run-relative distances of the outline vertices strictly inside a run. */
function verticesInRun(o: Outline, side: SidePlan): number[] {
  const out: number[] = [];
  for (let i = 0; i < o.pts.length; i++) {
    const r = wrap(side.dir * (o.cum[i] - side.start), o.perimeter);
    if (r > 1e-6 && r < side.length - 1e-6) out.push(r);
  }
  return out.sort((x, y) => x - y);
}

function planSeam(seamId: string, oa: Outline, ob: Outline, a: SidePlan, b: SidePlan, h: number): SeamPlan {
  const La = a.length;
  const Lb = b.length;
  type Entry = { u: number; ra?: number; rb?: number };
  const entries: Entry[] = [
    ...verticesInRun(oa, a).map((ra) => ({ u: ra / La, ra })),
    ...verticesInRun(ob, b).map((rb) => ({ u: rb / Lb, rb })),
  ].sort((x, y) => x.u - y.u);
  // Pair an A vertex with a B vertex when they are within a third of the target length (in either side's terms).
  const merged: Entry[] = [];
  const near = h / 3 / Math.max(La, Lb);
  for (const e of entries) {
    const last = merged[merged.length - 1];
    if (
      last &&
      e.u - last.u < near &&
      (last.ra === undefined) !== (e.ra === undefined) &&
      (last.rb === undefined) !== (e.rb === undefined)
    ) {
      merged[merged.length - 1] = { u: (last.u + e.u) / 2, ra: last.ra ?? e.ra, rb: last.rb ?? e.rb };
    } else merged.push(e);
  }
  const anchors = [{ ra: 0, rb: 0 }, ...merged.map((e) => ({ ra: e.ra ?? e.u * La, rb: e.rb ?? e.u * Lb })), { ra: La, rb: Lb }];
  const pairs: { ra: number; rb: number }[] = [anchors[0]];
  for (let k = 1; k < anchors.length; k++) {
    const p = anchors[k - 1];
    const q = anchors[k];
    const m = Math.max(1, Math.ceil(Math.max(q.ra - p.ra, q.rb - p.rb) / h - 1e-9));
    for (let j = 1; j < m; j++) pairs.push({ ra: p.ra + ((q.ra - p.ra) * j) / m, rb: p.rb + ((q.rb - p.rb) * j) / m });
    pairs.push(q);
  }
  return { seamId, a, b, pairs };
}

// ---------------------------------------------------------------------------------------------
// One panel's mesh

interface BoundaryPoint {
  s: number;
  p: Point;
}

/** Intervals [start, start + length] (forward arcs, may wrap) covered by seam runs. */
function covered(interval: { start: number; length: number }, s: number, P: number): boolean {
  const r = wrap(s - interval.start, P);
  return r > 1e-9 && r < interval.length - 1e-9;
}

const angleAt = (a: Point, b: Point, c: Point) => {
  // Angle at a of triangle abc, degrees.
  const ux = b[0] - a[0];
  const uy = b[1] - a[1];
  const vx = c[0] - a[0];
  const vy = c[1] - a[1];
  return (Math.atan2(Math.abs(ux * vy - uy * vx), ux * vx + uy * vy) * 180) / Math.PI;
};

function minAngle(a: Point, b: Point, c: Point): number {
  return Math.min(angleAt(a, b, c), angleAt(b, c, a), angleAt(c, a, b));
}

function circumcentre(a: Point, b: Point, c: Point): Point {
  const bx = b[0] - a[0];
  const by = b[1] - a[1];
  const cx = c[0] - a[0];
  const cy = c[1] - a[1];
  const d = 2 * (bx * cy - by * cx);
  const b2 = bx * bx + by * by;
  const c2 = cx * cx + cy * cy;
  return [a[0] + (cy * b2 - by * c2) / d, a[1] + (bx * c2 - cx * b2) / d];
}

function segmentDistance(p: Point, a: Point, b: Point): number {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const len2 = vx * vx + vy * vy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2));
  return Math.hypot(a[0] + t * vx - p[0], a[1] + t * vy - p[1]);
}

interface PanelMeshRequest {
  /** Boundary arcs to split on free edges were handled inside; these are seam segments to split. */
  seamSplits: { seamId: string; side: "a" | "b"; r0: number; r1: number }[];
}

interface BoundarySegmentOwner {
  seamId: string;
  side: "a" | "b";
  plan: SidePlan;
}

/** Triangulates one panel with fixed boundary points; refines until every angle reaches the minimum. */
function meshPanel(
  o: Outline,
  boundaryIn: BoundaryPoint[],
  ownerOf: (s0: number, s1: number) => BoundarySegmentOwner | null,
  h: number,
  minAngleDeg: number,
): { mesh: Omit<SimulationMesh, "panelId">; request: PanelMeshRequest; boundary: BoundaryPoint[] } {
  const P = o.perimeter;
  let boundary = [...boundaryIn];
  const outlineEdges = o.pts.map((p, i) => [p, o.pts[(i + 1) % o.pts.length]] as const);
  // Interior lattice, rows h·√3/2 apart, every other row shifted by h/2; a point is kept when it is
  // inside (crossings of its row) and at least h/2 from every outline edge near its row.
  const interior: Point[] = [];
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const [x, y] of o.pts) {
    minX = Math.min(minX, x);
    minY = Math.min(minY, y);
    maxX = Math.max(maxX, x);
    maxY = Math.max(maxY, y);
  }
  const dy = (h * Math.sqrt(3)) / 2;
  const rows = Math.floor((maxY - minY) / dy);
  const y0 = minY + (maxY - minY - rows * dy) / 2;
  for (let r = 0; r <= rows; r++) {
    const y = y0 + r * dy;
    const crossings: number[] = [];
    const nearEdges = outlineEdges.filter(([a, b]) => Math.min(a[1], b[1]) - h / 2 <= y && y <= Math.max(a[1], b[1]) + h / 2);
    for (const [a, b] of outlineEdges) {
      if (a[1] > y !== b[1] > y) crossings.push(a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]));
    }
    crossings.sort((p, q) => p - q);
    const cols = Math.floor((maxX - minX) / h);
    const x0 = minX + (maxX - minX - cols * h) / 2 + (r % 2 ? h / 2 : 0);
    for (let c = 0; c <= cols; c++) {
      const x = x0 + c * h;
      let inside = false;
      for (const cx of crossings) if (cx < x) inside = !inside;
      if (!inside) continue;
      const p: Point = [x, y];
      if (
        nearEdges.some(
          ([a, b]) => Math.min(a[0], b[0]) - h / 2 <= x && x <= Math.max(a[0], b[0]) + h / 2 && segmentDistance(p, a, b) < h / 2,
        )
      )
        continue;
      interior.push(p);
    }
  }
  const request: PanelMeshRequest = { seamSplits: [] };
  const requested = new Set<string>();
  let result: Omit<SimulationMesh, "panelId"> | null = null;
  for (let pass = 0; pass < 60; pass++) {
    // Four far corners make the convex hull, so no outline point sits on it: collinear hull points
    // (a straight edge split evenly) would stop the constraining. Triangles outside the outline are dropped.
    const span = Math.max(maxX - minX, maxY - minY);
    const frame: Point[] = [
      [minX - span, minY - span],
      [maxX + span, minY - span],
      [maxX + span, maxY + span],
      [minX - span, maxY + span],
    ];
    const mine: Point[] = [...boundary.map((b) => b.p), ...interior];
    const pts: Point[] = [...mine, ...frame];
    const nb = boundary.length;
    const coords = new Float64Array(pts.length * 2);
    pts.forEach((p, i) => {
      coords[2 * i] = p[0];
      coords[2 * i + 1] = p[1];
    });
    const del = new Delaunator(coords);
    const edges: [number, number][] = boundary.map((_, i) => [i, (i + 1) % nb]);
    let con: Constrainautor;
    try {
      con = new Constrainautor(del, edges);
    } catch (err) {
      // Refinement put a point too close to the outline for the constrained triangulation: keep the last good mesh.
      if (result) break;
      throw new Error(`the outline could not be triangulated (${err instanceof Error ? err.message : String(err)})`);
    }
    // Triangles reachable from the frame without crossing the outline lie outside the panel.
    const outside = new Uint8Array(del.triangles.length / 3);
    const stack: number[] = [];
    for (let t = 0; t < del.triangles.length / 3; t++) {
      if (del.triangles[3 * t] >= mine.length || del.triangles[3 * t + 1] >= mine.length || del.triangles[3 * t + 2] >= mine.length) {
        outside[t] = 1;
        stack.push(t);
      }
    }
    while (stack.length) {
      const t = stack.pop()!;
      for (let e = 3 * t; e < 3 * t + 3; e++) {
        const twin = del.halfedges[e];
        if (twin < 0 || con.isConstrained(e)) continue;
        const u = Math.floor(twin / 3);
        if (!outside[u]) {
          outside[u] = 1;
          stack.push(u);
        }
      }
    }
    const tris: number[] = [];
    const bad: { tri: [number, number, number]; angle: number }[] = [];
    let worst = 180;
    let maxEdge = 0;
    let area = 0;
    for (let t = 0; t < del.triangles.length; t += 3) {
      const i = del.triangles[t];
      let j = del.triangles[t + 1];
      let k = del.triangles[t + 2];
      const a = pts[i];
      const b = pts[j];
      const c = pts[k];
      if (outside[t / 3]) continue;
      const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
      if (cross < 0) [j, k] = [k, j];
      tris.push(i, j, k);
      area += Math.abs(cross) / 2;
      const ang = minAngle(a, b, c);
      worst = Math.min(worst, ang);
      maxEdge = Math.max(
        maxEdge,
        Math.hypot(b[0] - a[0], b[1] - a[1]),
        Math.hypot(c[0] - b[0], c[1] - b[1]),
        Math.hypot(a[0] - c[0], a[1] - c[1]),
      );
      // Aim a little above the guarantee so float noise never drops a triangle below it.
      if (ang < minAngleDeg + 0.5) bad.push({ tri: [i, j, k], angle: ang });
    }
    result = { vertices: mine, triangles: tris, boundaryCount: nb, minAngleDeg: worst, maxEdgeMm: maxEdge, areaMm2: area };
    if (bad.length === 0) break;
    bad.sort((x, y) => x.angle - y.angle);
    const newInterior: Point[] = [];
    const freeSplits: number[] = [];
    let progress = false;
    for (const { tri } of bad) {
      const [a, b, c] = tri.map((i) => pts[i]);
      const cc = circumcentre(a, b, c);
      const radius = Math.hypot(cc[0] - a[0], cc[1] - a[1]);
      // Boundary segments whose diametral circle holds the circumcentre.
      const encroached: number[] = [];
      for (let i = 0; i < nb; i++) {
        const p = boundary[i].p;
        const q = boundary[(i + 1) % nb].p;
        if ((p[0] - cc[0]) * (q[0] - cc[0]) + (p[1] - cc[1]) * (q[1] - cc[1]) <= 0) encroached.push(i);
      }
      if (encroached.length === 0) {
        // Beyond the outline, or hard against it near a sharp corner, without encroaching: split the nearest segment instead.
        let best = 0;
        let bestD = Infinity;
        for (let i = 0; i < nb; i++) {
          const d = segmentDistance(cc, boundary[i].p, boundary[(i + 1) % nb].p);
          if (d < bestD) {
            bestD = d;
            best = i;
          }
        }
        if (bestD < radius / 2 || pointInPolygon(cc, o.pts) !== "inside") encroached.push(best);
      }
      if (encroached.length > 0) {
        for (const i of encroached) {
          const s0 = boundary[i].s;
          const s1 = i + 1 < nb ? boundary[i + 1].s : boundary[0].s + P;
          const owner = ownerOf(s0, s1);
          if (owner) {
            const r0 = wrap(owner.plan.dir * (s0 - owner.plan.start), P);
            const r1 = wrap(owner.plan.dir * (s1 - owner.plan.start), P);
            const key = `${owner.seamId}:${owner.side}:${Math.min(r0, r1).toFixed(6)}`;
            if (!requested.has(key)) {
              requested.add(key);
              request.seamSplits.push({ seamId: owner.seamId, side: owner.side, r0: Math.min(r0, r1), r1: Math.max(r0, r1) });
            }
          } else if (!freeSplits.includes(i)) {
            freeSplits.push(i);
            progress = true;
          }
        }
        continue;
      }
      // Skip a circumcentre too close to one already added in this pass; the next pass sees the new shape.
      if (newInterior.some((q) => Math.hypot(q[0] - cc[0], q[1] - cc[1]) < radius / 2)) continue;
      newInterior.push(cc);
      progress = true;
    }
    if (request.seamSplits.length > 0 || !progress) break;
    if (freeSplits.length) {
      const added: BoundaryPoint[] = freeSplits.map((i) => {
        const s0 = boundary[i].s;
        const s1 = i + 1 < nb ? boundary[i + 1].s : boundary[0].s + P;
        const s = wrap((s0 + s1) / 2, P);
        return { s, p: pointAtArc(o, s) };
      });
      boundary = [...boundary, ...added].sort((x, y) => x.s - y.s);
      // Interior points now inside a split segment's diametral circle would encroach on it again; drop them.
      const segs = boundary.map((b, i) => [b.p, boundary[(i + 1) % boundary.length].p] as const);
      for (let k = interior.length - 1; k >= 0; k--) {
        const q = interior[k];
        if (segs.some(([p1, p2]) => (p1[0] - q[0]) * (p2[0] - q[0]) + (p1[1] - q[1]) * (p2[1] - q[1]) <= 0)) interior.splice(k, 1);
      }
    }
    interior.push(...newInterior);
  }
  return { mesh: result!, request, boundary };
}

// ---------------------------------------------------------------------------------------------
// All panels and seams

/**
 * Meshes every panel for a cloth simulator and stitches every seam.
 * @throws RangeError when the target edge length is outside 5–50 mm
 */
export function meshPanelsForSimulation(
  panels: readonly MeshPanelInput[],
  seams: readonly MeshSeamInput[],
  options: MeshOptions = {},
): SimulationMeshes {
  const h = options.targetEdgeMm ?? DEFAULT_MESH_EDGE_MM;
  if (!(h >= MESH_EDGE_RANGE_MM.min && h <= MESH_EDGE_RANGE_MM.max)) {
    throw new RangeError(`target edge length must be ${MESH_EDGE_RANGE_MM.min} to ${MESH_EDGE_RANGE_MM.max} mm, got ${h}`);
  }
  const outlines = new Map(panels.map((p) => [p.id, parameterise(p.outline)]));
  const plans: SeamPlan[] = [];
  const skipped: SimulationMeshes["skipped"] = [];
  // Covered intervals per panel, as forward arcs, with the seam that owns them.
  const coverage = new Map<string, { start: number; length: number; seamId: string; side: "a" | "b" }[]>();
  const intervalOf = (side: SidePlan) =>
    side.dir === 1 ? { start: side.start, length: side.length } : { start: side.start - side.length, length: side.length };
  const overlaps = (panelId: string, iv: { start: number; length: number }, P: number) =>
    (coverage.get(panelId) ?? []).find((c) => {
      // Two arcs overlap when either holds an interior point of the other (touching ends is fine).
      const probe = (x: { start: number; length: number }, y: { start: number; length: number }) =>
        covered(x, y.start + Math.min(1e-6, y.length / 2), P) ||
        covered(x, y.start + y.length / 2, P) ||
        covered(x, y.start + y.length - Math.min(1e-6, y.length / 2), P);
      return probe(c, iv) || probe(iv, c);
    });
  for (const s of seams) {
    const oa = outlines.get(s.a.panelId);
    const ob = outlines.get(s.b.panelId);
    if (!oa || !ob) {
      skipped.push({ seamId: s.id, reason: "a side's panel is not in this set" });
      continue;
    }
    const a = sidePlan(oa, s.a);
    const b = sidePlan(ob, s.b);
    if (a.length < 1e-6 || b.length < 1e-6) {
      skipped.push({ seamId: s.id, reason: "a side has no length" });
      continue;
    }
    const ia = intervalOf(a);
    const ib = intervalOf(b);
    const clash = overlaps(a.panelId, ia, oa.perimeter) ?? overlaps(b.panelId, ib, ob.perimeter);
    const selfClash =
      a.panelId === b.panelId &&
      (covered(ia, ib.start + ib.length / 2, oa.perimeter) || covered(ib, ia.start + ia.length / 2, oa.perimeter));
    if (clash || selfClash) {
      skipped.push({ seamId: s.id, reason: clash ? `its run overlaps seam ${clash.seamId}` : "its two sides overlap" });
      continue;
    }
    coverage.set(a.panelId, [...(coverage.get(a.panelId) ?? []), { ...ia, seamId: s.id, side: "a" }]);
    coverage.set(b.panelId, [...(coverage.get(b.panelId) ?? []), { ...ib, seamId: s.id, side: "b" }]);
    plans.push(planSeam(s.id, oa, ob, a, b, h));
  }
  const planById = new Map(plans.map((p) => [p.seamId, p]));

  const boundaryOf = (panelId: string): BoundaryPoint[] => {
    const o = outlines.get(panelId)!;
    const P = o.perimeter;
    const arcs: number[] = o.cum.slice(0, o.pts.length);
    for (const plan of plans) {
      for (const side of ["a", "b"] as const) {
        const sp = plan[side];
        if (sp.panelId !== panelId) continue;
        for (const pr of plan.pairs) arcs.push(arcOnPanel(sp, side === "a" ? pr.ra : pr.rb, P));
      }
    }
    arcs.sort((x, y) => x - y);
    const uniq: number[] = [];
    for (const s of arcs) if (!uniq.length || s - uniq[uniq.length - 1] > 1e-6) uniq.push(s);
    if (uniq.length > 1 && P - uniq[uniq.length - 1] + uniq[0] <= 1e-6) uniq.pop();
    // Split free stretches evenly.
    const ivs = coverage.get(panelId) ?? [];
    const out: number[] = [];
    for (let i = 0; i < uniq.length; i++) {
      const s0 = uniq[i];
      const s1 = i + 1 < uniq.length ? uniq[i + 1] : uniq[0] + P;
      out.push(s0);
      const mid = (s0 + s1) / 2;
      if (ivs.some((iv) => covered(iv, mid, P))) continue;
      const m = Math.max(1, Math.ceil((s1 - s0) / h - 1e-9));
      for (let j = 1; j < m; j++) out.push(wrap(s0 + ((s1 - s0) * j) / m, P));
    }
    return out.sort((x, y) => x - y).map((s) => ({ s, p: pointAtArc(o, s) }));
  };

  const ownerFor =
    (panelId: string) =>
    (s0: number, s1: number): BoundarySegmentOwner | null => {
      const o = outlines.get(panelId)!;
      const mid = wrap((s0 + s1) / 2, o.perimeter);
      const iv = (coverage.get(panelId) ?? []).find((c) => covered(c, mid, o.perimeter));
      if (!iv) return null;
      const plan = planById.get(iv.seamId)!;
      return { seamId: iv.seamId, side: iv.side, plan: plan[iv.side] };
    };

  // Mesh, apply seam splits on both sides, re-mesh the panels they touch; repeat until no split is asked.
  const meshes = new Map<string, { mesh: Omit<SimulationMesh, "panelId">; boundary: BoundaryPoint[] }>();
  const freeExtra = new Map<string, BoundaryPoint[]>();
  let dirty = new Set(panels.map((p) => p.id));
  for (let round = 0; round < 40 && dirty.size > 0; round++) {
    const splits: PanelMeshRequest["seamSplits"] = [];
    for (const id of dirty) {
      const o = outlines.get(id)!;
      const base = boundaryOf(id);
      const extra = freeExtra.get(id) ?? [];
      const merged = [...base, ...extra.filter((e) => !base.some((b) => Math.abs(b.s - e.s) < 1e-6))].sort((x, y) => x.s - y.s);
      const r = meshPanel(o, merged, ownerFor(id), h, MESH_MIN_ANGLE_DEG);
      // Keep the free-edge splits refinement made, so the next round starts from them.
      freeExtra.set(
        id,
        r.boundary.filter((b) => !base.some((x) => Math.abs(x.s - b.s) < 1e-6)),
      );
      meshes.set(id, { mesh: r.mesh, boundary: r.boundary });
      splits.push(...r.request.seamSplits);
    }
    dirty = new Set();
    for (const sp of splits) {
      const plan = planById.get(sp.seamId)!;
      const key = sp.side === "a" ? "ra" : "rb";
      const k = plan.pairs.findIndex(
        (pr, i) => i + 1 < plan.pairs.length && Math.abs(pr[key] - sp.r0) < 1e-6 && Math.abs(plan.pairs[i + 1][key] - sp.r1) < 1e-6,
      );
      if (k < 0) continue;
      const p = plan.pairs[k];
      const q = plan.pairs[k + 1];
      plan.pairs.splice(k + 1, 0, { ra: (p.ra + q.ra) / 2, rb: (p.rb + q.rb) / 2 });
      dirty.add(plan.a.panelId);
      dirty.add(plan.b.panelId);
    }
  }

  const out: SimulationMesh[] = panels.map((p) => ({ panelId: p.id, ...meshes.get(p.id)!.mesh }));
  const stitches: SeamStitches[] = plans.map((plan) => {
    const indexOn = (side: SidePlan, r: number) => {
      const o = outlines.get(side.panelId)!;
      const s = arcOnPanel(side, r, o.perimeter);
      const bnd = meshes.get(side.panelId)!.boundary;
      let best = 0;
      let bestD = Infinity;
      for (let i = 0; i < bnd.length; i++) {
        const d = Math.min(Math.abs(bnd[i].s - s), o.perimeter - Math.abs(bnd[i].s - s));
        if (d < bestD) {
          bestD = d;
          best = i;
        }
      }
      return best;
    };
    return {
      seamId: plan.seamId,
      a: { panelId: plan.a.panelId, indices: plan.pairs.map((pr) => indexOn(plan.a, pr.ra)) },
      b: { panelId: plan.b.panelId, indices: plan.pairs.map((pr) => indexOn(plan.b, pr.rb)) },
      fractions: plan.pairs.map((pr) => pr.ra / plan.a.length),
    };
  });
  return { targetEdgeMm: h, minAngleTargetDeg: MESH_MIN_ANGLE_DEG, meshes: out, stitches, skipped };
}

// ---------------------------------------------------------------------------------------------
// Writing

const n6 = (v: number) => String(Math.round(v * 1e6) / 1e6);

/**
 * One mesh as Wavefront OBJ: positions in metres (z = 0), texture coordinates = the flat position in
 * millimetres, faces counter-clockwise seen from +z with 1-based v/vt indices.
 */
export function meshToObj(mesh: SimulationMesh, name: string): string {
  const safe = name.replace(/[^A-Za-z0-9_.-]+/g, "_");
  const lines = [
    `# Seamscene simulation mesh: ${name}`,
    `# ${mesh.vertices.length} vertices, ${mesh.triangles.length / 3} triangles; v in metres (z = 0), vt in millimetres (flat pattern position)`,
    `# vertices 1-${mesh.boundaryCount} run along the sew line; stitches.json pairs them (0-based) across seams`,
    `o ${safe}`,
  ];
  for (const [x, y] of mesh.vertices) lines.push(`v ${n6(x / 1000)} ${n6(y / 1000)} 0`);
  for (const [x, y] of mesh.vertices) lines.push(`vt ${n6(x)} ${n6(y)}`);
  for (let t = 0; t < mesh.triangles.length; t += 3) {
    const [a, b, c] = [mesh.triangles[t] + 1, mesh.triangles[t + 1] + 1, mesh.triangles[t + 2] + 1];
    lines.push(`f ${a}/${a} ${b}/${b} ${c}/${c}`);
  }
  return lines.join("\n") + "\n";
}
