// Seam length match: two outline runs sewn together must be equally long within a tolerance, unless the
// seam is eased (one side deliberately longer, e.g. a sleeve head into an armhole) by an allowed amount.
import { runLength, type Polygon, type RunEnd } from "./geometry";

/** Default tolerance for a plain seam, mm (common practice, no source). */
export const DEFAULT_SEAM_TOLERANCE_MM = 3;

/** One side of a seam: a run along a panel outline. */
export interface SeamSide {
  /** The panel outline (sew line), mm. */
  outline: Polygon;
  /** Run start: vertex index or edge position (e.g. a notch). */
  from: RunEnd;
  /** Run end: vertex index or edge position. */
  to: RunEnd;
  /** Walking direction along the outline; default "forward" (increasing vertex index). */
  direction?: "forward" | "backward";
}

/** The allowed ease: side A minus side B must lie in [minMm, maxMm]. */
export interface EaseRange {
  minMm: number;
  maxMm: number;
}

/** Input of {@link checkSeam}. */
export interface SeamCheckInput {
  a: SeamSide;
  b: SeamSide;
  /** Plain-seam tolerance on |A − B|, mm; default 3 mm. */
  toleranceMm?: number;
  /** When set, the seam is eased and the signed difference A − B must fall in this range. */
  eased?: EaseRange | null;
}

/** Outcome of a seam length check. */
export type SeamStatus = "ok" | "mismatch" | "eased_within_range" | "eased_out_of_range";

/** Result of {@link checkSeam}. */
export interface SeamCheckResult {
  /** Length of side A's run, mm. */
  lengthA: number;
  /** Length of side B's run, mm. */
  lengthB: number;
  /** Signed difference A − B, mm. */
  differenceMm: number;
  status: SeamStatus;
  /** Plain-language explanation with the numbers. */
  message: string;
}

const fmt = (mm: number) => `${(Math.round(mm * 10) / 10).toFixed(1)} mm`;

/** Length of one seam side's run, mm. */
export function seamSideLength(side: SeamSide): number {
  return runLength(side.outline, side.from, side.to, side.direction ?? "forward");
}

/** Compares the two runs of a seam and classifies the difference. */
export function checkSeam(input: SeamCheckInput): SeamCheckResult {
  const lengthA = seamSideLength(input.a);
  const lengthB = seamSideLength(input.b);
  const differenceMm = lengthA - lengthB;
  if (input.eased) {
    const { minMm, maxMm } = input.eased;
    if (minMm > maxMm) throw new Error(`ease range is empty: min ${minMm} > max ${maxMm}`);
    const within = differenceMm >= minMm && differenceMm <= maxMm;
    return {
      lengthA,
      lengthB,
      differenceMm,
      status: within ? "eased_within_range" : "eased_out_of_range",
      message: `${fmt(lengthA)} eased into ${fmt(lengthB)}: ease ${fmt(differenceMm)}, allowed ${fmt(minMm)} to ${fmt(maxMm)}`,
    };
  }
  const tolerance = input.toleranceMm ?? DEFAULT_SEAM_TOLERANCE_MM;
  if (tolerance < 0) throw new Error("tolerance must not be negative");
  const ok = Math.abs(differenceMm) <= tolerance;
  return {
    lengthA,
    lengthB,
    differenceMm,
    status: ok ? "ok" : "mismatch",
    message: ok
      ? `${fmt(lengthA)} and ${fmt(lengthB)} match within ${fmt(tolerance)}`
      : `${fmt(lengthA)} and ${fmt(lengthB)} differ by ${fmt(Math.abs(differenceMm))}, more than ${fmt(tolerance)}`,
  };
}
