// Curves of pattern drawings turned into polylines: circular arcs (ARC, CIRCLE, polyline bulges),
// elliptical arcs (ELLIPSE) and NURBS curves (SPLINE, weights allowed). Every curve is cut into chords
// whose greatest distance from the true curve (the sagitta) is at most the chord tolerance, so an
// outline's area and length stay within a known distance of the drawn shape.
import type { Point } from "./geometry";

/**
 * Greatest distance between a curve and the chords that replace it, mm. Finer than the 0.1 mm a cutter
 * can see on paper; with {@link ARC_RELATIVE_TOLERANCE} it keeps areas within 0.1 % of the exact shape.
 */
export const CHORD_TOLERANCE_MM = 0.01;
/**
 * For small circles the chord tolerance is also held to this fraction of the radius: a full circle then
 * loses at most 4/3 of it in area (the segment area of a shallow arc is ⅔·chord·sagitta), 0.067 %.
 */
export const ARC_RELATIVE_TOLERANCE = 5e-4;
/** Fewest chords per knot span of a spline before refinement, so S-bends are not mistaken for straight runs. */
const MIN_CHORDS_PER_SPAN = 8;
const MAX_DEPTH = 24;

/** Chord tolerance for a circular arc of radius r (mm). */
export function arcTolerance(radius: number, tolerance = CHORD_TOLERANCE_MM): number {
  return Math.min(tolerance, Math.abs(radius) * ARC_RELATIVE_TOLERANCE);
}

/** Number of equal chords for a circular arc so the sagitta stays within the tolerance. */
export function arcChordCount(radius: number, sweep: number, tolerance = CHORD_TOLERANCE_MM): number {
  const r = Math.abs(radius);
  const tol = arcTolerance(r, tolerance);
  if (r === 0 || sweep === 0) return 1;
  // Sagitta of a chord spanning angle φ: r·(1 − cos(φ/2)) ≤ tol  ⇔  φ ≤ 2·acos(1 − tol/r).
  const maxStep = tol >= r ? Math.PI / 2 : 2 * Math.acos(1 - tol / r);
  return Math.max(1, Math.ceil(Math.abs(sweep) / Math.min(maxStep, Math.PI / 2)));
}

/**
 * Points along a circular arc from `start` to `start + sweep` (radians, counter-clockwise when sweep > 0),
 * both ends included.
 */
export function flattenArc(center: Point, radius: number, start: number, sweep: number, tolerance = CHORD_TOLERANCE_MM): Point[] {
  const n = arcChordCount(radius, sweep, tolerance);
  const out: Point[] = [];
  for (let i = 0; i <= n; i++) {
    const a = start + (sweep * i) / n;
    out.push([center[0] + radius * Math.cos(a), center[1] + radius * Math.sin(a)]);
  }
  return out;
}

/** Centre, radius, start angle and signed sweep of the arc a polyline bulge draws from p to q. */
export function bulgeArc(p: Point, q: Point, bulge: number): { center: Point; radius: number; start: number; sweep: number } {
  // bulge = tan(θ/4), θ the included angle; positive bulges turn counter-clockwise from p to q.
  const sweep = 4 * Math.atan(bulge);
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const chord = Math.hypot(dx, dy);
  const radius = (chord * (1 + bulge * bulge)) / (4 * Math.abs(bulge));
  // The centre sits on the chord's perpendicular bisector, at distance r·cos(θ/2) from the chord.
  const mx = (p[0] + q[0]) / 2;
  const my = (p[1] + q[1]) / 2;
  const h = (chord * (1 - bulge * bulge)) / (4 * bulge);
  const center: Point = [mx - (dy / chord) * h, my + (dx / chord) * h];
  const start = Math.atan2(p[1] - center[1], p[0] - center[0]);
  return { center, radius, start, sweep };
}

/** Points strictly between p and q along the bulge arc (p and q themselves are left to the caller). */
export function flattenBulge(p: Point, q: Point, bulge: number, tolerance = CHORD_TOLERANCE_MM): Point[] {
  if (!bulge || (p[0] === q[0] && p[1] === q[1])) return [];
  const arc = bulgeArc(p, q, bulge);
  return flattenArc(arc.center, arc.radius, arc.start, arc.sweep, tolerance).slice(1, -1);
}

function chordDistance(p: Point, a: Point, b: Point): number {
  const vx = b[0] - a[0];
  const vy = b[1] - a[1];
  const len2 = vx * vx + vy * vy;
  if (len2 === 0) return Math.hypot(p[0] - a[0], p[1] - a[1]);
  let t = ((p[0] - a[0]) * vx + (p[1] - a[1]) * vy) / len2;
  t = Math.max(0, Math.min(1, t));
  return Math.hypot(a[0] + t * vx - p[0], a[1] + t * vy - p[1]);
}

/**
 * Adaptive chords for a parametric curve on [t0, t1]: each interval is halved until the points at
 * ¼, ½ and ¾ of it lie within the tolerance of its chord. Both ends included.
 */
export function flattenParametric(f: (t: number) => Point, t0: number, t1: number, tolerance: number, initialChords = 8): Point[] {
  const out: Point[] = [f(t0)];
  const refine = (a: number, b: number, pa: Point, pb: Point, depth: number) => {
    const m = (a + b) / 2;
    const pm = f(m);
    const close =
      chordDistance(pm, pa, pb) <= tolerance &&
      chordDistance(f(a + (b - a) / 4), pa, pb) <= tolerance &&
      chordDistance(f(a + (3 * (b - a)) / 4), pa, pb) <= tolerance;
    if (close || depth >= MAX_DEPTH) {
      out.push(pb);
      return;
    }
    refine(a, m, pa, pm, depth + 1);
    refine(m, b, pm, pb, depth + 1);
  };
  const n = Math.max(1, initialChords);
  let prev = out[0];
  for (let i = 1; i <= n; i++) {
    const a = t0 + ((t1 - t0) * (i - 1)) / n;
    const b = i === n ? t1 : t0 + ((t1 - t0) * i) / n;
    const pb = f(b);
    refine(a, b, prev, pb, 0);
    prev = pb;
  }
  return out;
}

/** An elliptical arc as DXF's ELLIPSE gives it (centre and major-axis end relative to it, in the drawing plane). */
export interface EllipseArc {
  center: Point;
  /** Major-axis end point relative to the centre. */
  majorAxis: Point;
  /** Minor / major axis length. */
  ratio: number;
  /** Start and end parameter, radians (0 and 2π for a full ellipse). */
  startParam: number;
  endParam: number;
  /** −1 when the ellipse's plane normal points down (a mirrored drawing); the parameter then runs clockwise. */
  normalZ?: number;
}

/** Points along an elliptical arc, both ends included; the chord tolerance also respects the sharpest curvature (b²/a). */
export function flattenEllipse(e: EllipseArc, tolerance = CHORD_TOLERANCE_MM): Point[] {
  const [mx, my] = e.majorAxis;
  const a = Math.hypot(mx, my);
  const b = a * e.ratio;
  // Minor axis = ratio · (N × major); N = (0, 0, ±1).
  const s = (e.normalZ ?? 1) < 0 ? -1 : 1;
  const nx = -s * my * e.ratio;
  const ny = s * mx * e.ratio;
  let end = e.endParam;
  while (end <= e.startParam) end += 2 * Math.PI;
  const f = (t: number): Point => [e.center[0] + Math.cos(t) * mx + Math.sin(t) * nx, e.center[1] + Math.cos(t) * my + Math.sin(t) * ny];
  const tol = arcTolerance(a > 0 ? (b * b) / a : 0, tolerance);
  return flattenParametric(f, e.startParam, end, tol, Math.max(8, Math.ceil(((end - e.startParam) / (2 * Math.PI)) * 32)));
}

/** A NURBS curve as DXF's SPLINE gives it. */
export interface NurbsCurve {
  degree: number;
  /** Knot vector: control points + degree + 1 values (or control points + 1 for a periodic spline). */
  knots: number[];
  controlPoints: Point[];
  /** One weight per control point; absent = all 1 (non-rational). */
  weights?: number[];
  /** Periodic (closed, smooth through the join). */
  periodic?: boolean;
}

/** Why a spline cannot be drawn, or null when it can. */
export function nurbsProblem(c: NurbsCurve): string | null {
  const n = c.controlPoints.length;
  const p = c.degree;
  if (!Number.isInteger(p) || p < 1) return `degree ${p} is not a positive whole number`;
  if (n < p + 1) return `${n} control points are too few for degree ${p}`;
  if (c.weights && c.weights.length && c.weights.length !== n) return `${c.weights.length} weights for ${n} control points`;
  if (c.weights?.some((w) => !(w > 0))) return "a weight is not positive";
  const periodicShort = c.periodic && c.knots.length === n + 1;
  if (c.knots.length !== n + p + 1 && !periodicShort)
    return `${c.knots.length} knots for ${n} control points of degree ${p} (expected ${n + p + 1})`;
  for (let i = 1; i < c.knots.length; i++) if (c.knots[i] < c.knots[i - 1]) return "the knot values decrease";
  if (c.knots[c.knots.length - 1] === c.knots[0]) return "all knots are equal";
  return null;
}

/**
 * The same curve with the standard knot count (control points + degree + 1): a periodic spline stored
 * with control points + 1 knots gets its first `degree` control points repeated at the end and its knot
 * spacing continued periodically.
 */
function standardForm(c: NurbsCurve): Required<Omit<NurbsCurve, "periodic">> {
  const n = c.controlPoints.length;
  const p = c.degree;
  const weights = c.weights && c.weights.length ? c.weights : c.controlPoints.map(() => 1);
  if (c.knots.length === n + p + 1) return { degree: p, knots: c.knots, controlPoints: c.controlPoints, weights };
  const u = c.knots;
  const period = u[n] - u[0];
  const knots: number[] = [];
  for (let i = 0; i <= n + 2 * p; i++) {
    const k = i - p;
    const wraps = Math.floor(k / n);
    knots.push(u[k - wraps * n] + wraps * period);
  }
  return {
    degree: p,
    knots,
    controlPoints: [...c.controlPoints, ...c.controlPoints.slice(0, p)],
    weights: [...weights, ...weights.slice(0, p)],
  };
}

/** Evaluates a NURBS curve (de Boor's algorithm in homogeneous coordinates). */
function nurbsEvaluator(c: Required<Omit<NurbsCurve, "periodic">>): { f: (t: number) => Point; t0: number; t1: number; spans: number[] } {
  const p = c.degree;
  const U = c.knots;
  const n = c.controlPoints.length;
  const H = c.controlPoints.map(([x, y], i) => [x * c.weights[i], y * c.weights[i], c.weights[i]]);
  const t0 = U[p];
  const t1 = U[n];
  const f = (t: number): Point => {
    // Knot span k with U[k] ≤ t < U[k+1], clamped into [p, n − 1].
    let k = p;
    if (t >= t1) {
      k = n - 1;
      while (k > p && U[k] === U[k + 1]) k--;
    } else {
      let lo = p;
      let hi = n - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (U[mid] <= t) lo = mid;
        else hi = mid - 1;
      }
      k = lo;
    }
    const d = Array.from({ length: p + 1 }, (_, j) => [...H[j + k - p]]);
    for (let r = 1; r <= p; r++) {
      for (let j = p; j >= r; j--) {
        const i = j + k - p;
        const den = U[i + p - r + 1] - U[i];
        const alpha = den === 0 ? 0 : (t - U[i]) / den;
        for (let q = 0; q < 3; q++) d[j][q] = (1 - alpha) * d[j - 1][q] + alpha * d[j][q];
      }
    }
    return [d[p][0] / d[p][2], d[p][1] / d[p][2]];
  };
  const spans: number[] = [];
  for (let i = p; i <= n; i++) if (!spans.length || U[i] > spans[spans.length - 1]) spans.push(U[i]);
  return { f, t0, t1, spans };
}

/** Points along a NURBS curve over its whole domain, both ends included. Throws when the curve is malformed. */
export function flattenNurbs(c: NurbsCurve, tolerance = CHORD_TOLERANCE_MM): Point[] {
  const problem = nurbsProblem(c);
  if (problem) throw new Error(problem);
  const { f, spans } = nurbsEvaluator(standardForm(c));
  const out: Point[] = [];
  for (let i = 1; i < spans.length; i++) {
    const part = flattenParametric(f, spans[i - 1], spans[i], tolerance, MIN_CHORDS_PER_SPAN);
    out.push(...(i === 1 ? part : part.slice(1)));
  }
  return out;
}
