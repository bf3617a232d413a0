// The cantilever bending test (ASTM D1388 option A) solved numerically: a strip of fabric pushed over
// a platform edge bends under its own weight. With the exported bending rigidity G (N·m, per unit
// width) and mass per area m (kg/m²), the strip is a planar heavy elastica; the solver finds the
// overhang at which the tip line (the chord from the platform edge to the tip) reaches the test
// angle. Putting the exported values back through this "virtual re-test" shows whether they still
// reproduce what was measured. Pure; no I/O.
//
// Equations (arc length s from the platform edge, θ(s) the slope below horizontal, length l):
//   G·θ''(s) = −w·(l − s)·cos θ(s),   θ(0) = 0 (held flat on the platform),  θ'(l) = 0 (free tip),
// with w = m·g the weight per area. In u = s/l this is θ''(u) = −λ·(1 − u)·cos θ(u), λ = (l/c)³,
// c³ = G / w (c is the bending length). The boundary-value problem is shot from the tip: guess the
// tip slope, integrate towards the platform with RK4 and bisect until θ(0) = 0.
import {
  D1388_CANTILEVER_ANGLE_DEG,
  STANDARD_GRAVITY,
  type FabricDirection,
  type FabricSimulationValues,
  type FabricTest,
} from "./fabric-physics";

/** Integration steps along the strip; RK4 with 400 steps keeps the chord angle within ~1e-9 rad. */
const STEPS = 400;

/** Shape of a heavy cantilever strip in units of its length (x along the platform, y downwards). */
export interface CantileverShape {
  /** λ = (l/c)³ = w·l³ / G. */
  lambda: number;
  /** Tip slope below horizontal, radians. */
  tipSlopeRad: number;
  /** Tip position divided by the overhang length. */
  tipX: number;
  tipY: number;
  /** Angle of the chord from the platform edge to the tip, below horizontal, degrees. */
  chordAngleDeg: number;
}

/** Integrates from the tip (v = 1 − u = 0) to the platform (v = 1) for a given tip slope; returns θ at the platform and the tip offset. */
function integrateFromTip(lambda: number, tipSlope: number): { rootSlope: number; x: number; y: number } {
  // State along v: θ, dθ/dv, and the running integrals of cos θ and sin θ (tip → platform, same as platform → tip).
  const h = 1 / STEPS;
  let th = tipSlope;
  let dth = 0;
  let x = 0;
  let y = 0;
  // d²θ/dv² = −λ·v·cos θ (from θ''(u) with v = 1 − u).
  const f = (v: number, t: number, dt: number): [number, number, number, number] => [
    dt,
    -lambda * v * Math.cos(t),
    Math.cos(t),
    Math.sin(t),
  ];
  for (let i = 0; i < STEPS; i++) {
    const v = i * h;
    const k1 = f(v, th, dth);
    const k2 = f(v + h / 2, th + (h / 2) * k1[0], dth + (h / 2) * k1[1]);
    const k3 = f(v + h / 2, th + (h / 2) * k2[0], dth + (h / 2) * k2[1]);
    const k4 = f(v + h, th + h * k3[0], dth + h * k3[1]);
    th += (h / 6) * (k1[0] + 2 * k2[0] + 2 * k3[0] + k4[0]);
    dth += (h / 6) * (k1[1] + 2 * k2[1] + 2 * k3[1] + k4[1]);
    x += (h / 6) * (k1[2] + 2 * k2[2] + 2 * k3[2] + k4[2]);
    y += (h / 6) * (k1[3] + 2 * k2[3] + 2 * k3[3] + k4[3]);
  }
  return { rootSlope: th, x, y };
}

/**
 * Root of an increasing function on [lo, hi] (f(lo) ≤ 0 ≤ f(hi)) by the Illinois variant of
 * regula falsi: bracketed like bisection, converging superlinearly.
 */
function increasingRoot(f: (x: number) => number, lo: number, hi: number, tolerance: number): number {
  let flo = f(lo);
  let fhi = f(hi);
  if (flo >= 0) return lo;
  if (fhi <= 0) return hi;
  let side = 0;
  for (let i = 0; i < 200 && hi - lo > tolerance; i++) {
    const x = (lo * fhi - hi * flo) / (fhi - flo);
    const fx = f(x);
    if (fx === 0) return x;
    if (fx < 0) {
      lo = x;
      flo = fx;
      if (side === -1) fhi /= 2;
      side = -1;
    } else {
      hi = x;
      fhi = fx;
      if (side === 1) flo /= 2;
      side = 1;
    }
  }
  return (lo + hi) / 2;
}

/**
 * Shape of a strip with load parameter λ = w·l³ / G (dimensionless).
 * @throws RangeError when λ is not a positive finite number
 */
export function cantileverShape(lambda: number): CantileverShape {
  if (!(Number.isFinite(lambda) && lambda > 0)) throw new RangeError(`load parameter must be a positive number, got ${lambda}`);
  // θ at the platform rises with the tip slope; find the tip slope that leaves the root flat.
  const tipSlopeRad = increasingRoot((t) => integrateFromTip(lambda, t).rootSlope, 0, Math.PI / 2, 1e-13);
  const { x, y } = integrateFromTip(lambda, tipSlopeRad);
  return { lambda, tipSlopeRad, tipX: x, tipY: y, chordAngleDeg: (Math.atan2(y, x) * 180) / Math.PI };
}

const ratioCache = new Map<number, number>();

/** Ratio overhang / bending length (l/c) at which the chord reaches `angleDeg` below horizontal. */
export function overhangToBendingLengthRatio(angleDeg: number = D1388_CANTILEVER_ANGLE_DEG): number {
  if (!(angleDeg > 0 && angleDeg < 80)) throw new RangeError("angle must be between 0 and 80 degrees");
  const cached = ratioCache.get(angleDeg);
  if (cached !== undefined) return cached;
  // The chord angle grows with λ; bracket λ, then solve in ln λ.
  let hi = 1;
  while (cantileverShape(hi).chordAngleDeg < angleDeg) hi *= 2;
  const lnLambda = increasingRoot((z) => cantileverShape(Math.exp(z)).chordAngleDeg - angleDeg, Math.log(1e-6), Math.log(hi), 1e-12);
  const ratio = Math.exp(lnLambda / 3);
  ratioCache.set(angleDeg, ratio);
  return ratio;
}

/** Bending length c = (G / (m·g))^(1/3) in mm, from rigidity G (N·m) and mass per area m (kg/m²). */
export function bendingLengthFromRigidity(rigidityNm: number, massPerAreaKgM2: number): number {
  if (!(rigidityNm > 0 && massPerAreaKgM2 > 0)) throw new RangeError("rigidity and mass per area must be positive");
  return Math.cbrt(rigidityNm / (massPerAreaKgM2 * STANDARD_GRAVITY)) * 1000;
}

/**
 * Overhang (mm) at which a strip with rigidity G (N·m) and mass per area m (kg/m²) bends until its
 * tip line reaches `angleDeg` (41.5° in ASTM D1388).
 */
export function simulatedOverhangMm(rigidityNm: number, massPerAreaKgM2: number, angleDeg: number = D1388_CANTILEVER_ANGLE_DEG): number {
  return bendingLengthFromRigidity(rigidityNm, massPerAreaKgM2) * overhangToBendingLengthRatio(angleDeg);
}

/** Tip deflection (mm) of a strip of overhang l (mm) with rigidity G (N·m) and mass per area m (kg/m²), solved as an elastica. */
export function tipDeflectionMm(overhangMm: number, rigidityNm: number, massPerAreaKgM2: number): number {
  const l = overhangMm / 1000;
  const lambda = (massPerAreaKgM2 * STANDARD_GRAVITY * l * l * l) / rigidityNm;
  return cantileverShape(lambda).tipY * overhangMm;
}

/** The re-test of one direction: measured and simulated overhangs at the test angle. */
export interface CantileverRetestDirection {
  direction: FabricDirection;
  /** Incline of the tests compared, degrees (41.5° in ASTM D1388). */
  angleDeg: number;
  /** Mean overhang of the recorded tests at that angle, mm. */
  measuredOverhangMm: number;
  /** Overhang at which the exported values reach the angle, mm. */
  simulatedOverhangMm: number;
  /** (simulated − measured) / measured, percent. */
  differencePercent: number;
  /** The tests compared. */
  testIds: string[];
}

/** The virtual re-test of a fabric's exported bending values (one entry per direction with a cantilever test). */
export interface CantileverRetest {
  method: string;
  directions: CantileverRetestDirection[];
}

/** How far a re-test may drift from the measurement before it is flagged, percent (issue requirement; no standard sets it). */
export const RETEST_TOLERANCE_PERCENT = 1;

/**
 * Puts the exported bending stiffness and mass per area of a fabric back into the cantilever and
 * compares the overhang with the recorded tests, per direction. Tests at an angle other than 41.5°
 * are compared at their own angle (the first angle recorded in that direction). Null when the fabric
 * has no cantilever test.
 */
export function cantileverRetest(values: FabricSimulationValues, tests: readonly FabricTest[]): CantileverRetest | null {
  const directions: CantileverRetestDirection[] = [];
  for (const direction of ["warp", "weft"] as const) {
    const bending = tests.filter((t): t is Extract<FabricTest, { kind: "bending" }> => t.kind === "bending" && t.direction === direction);
    if (bending.length === 0) continue;
    const angleDeg = bending[0].angleDeg ?? D1388_CANTILEVER_ANGLE_DEG;
    const same = bending.filter((t) => (t.angleDeg ?? D1388_CANTILEVER_ANGLE_DEG) === angleDeg);
    const measured = same.reduce((s, t) => s + t.overhangMm, 0) / same.length;
    const simulated = simulatedOverhangMm(values.bendingStiffness[direction].value, values.massPerArea.value, angleDeg);
    directions.push({
      direction,
      angleDeg,
      measuredOverhangMm: measured,
      simulatedOverhangMm: simulated,
      differencePercent: ((simulated - measured) / measured) * 100,
      testIds: [...new Set(same.map((t) => t.id))],
    });
  }
  if (directions.length === 0) return null;
  return {
    method: "ASTM D1388 cantilever solved as a planar heavy elastica with the exported bending stiffness and mass per area",
    directions,
  };
}
