// Tests a costume workroom runs on a fabric before cutting: how much it shrinks (or grows) when
// washed or dry-cleaned, and how fast its colour is, read on the grey scales. Pure arithmetic; the
// standards each reading follows are named where the readings are defined (shared/schemas/fabrics.ts)
// and listed in docs/references.md.

/** One pair of marks on the specimen, measured before and after the wash or dry-clean (mm). */
export interface MarkPair {
  beforeMm: number;
  afterMm: number;
}

/**
 * Dimensional change of one pair of marks in per cent of the original distance:
 * (after − before) / before × 100. Negative is shrinkage, positive is extension (ISO 5077's convention).
 */
export function dimensionalChangePct(p: MarkPair): number {
  if (!(p.beforeMm > 0)) throw new RangeError("the distance before must be greater than 0");
  return ((p.afterMm - p.beforeMm) / p.beforeMm) * 100;
}

/** Mean dimensional change of several pairs in one direction (each pair's change, then their mean). */
export function meanDimensionalChangePct(pairs: readonly MarkPair[]): number {
  if (pairs.length === 0) throw new RangeError("give at least one pair of marks");
  return pairs.reduce((s, p) => s + dimensionalChangePct(p), 0) / pairs.length;
}

/**
 * How much longer to cut so a piece ends at its finished size after the same treatment:
 * cut = finished / (1 + change / 100). Common practice, no source (most workrooms pre-shrink instead).
 */
export function cutAllowanceFactor(changePct: number): number {
  if (!(changePct > -100)) throw new RangeError("a change of −100 % or less leaves nothing to cut");
  return 1 / (1 + changePct / 100);
}

/** Shrinkage results in both directions of the cloth. */
export interface ShrinkageResult {
  /** Mean change along the length (warp, wales), per cent; negative = shrinkage. */
  lengthChangePct: number;
  /** Mean change across the width (weft, courses), per cent. */
  widthChangePct: number;
  /** Cut-length factors that give the finished size after the same treatment. */
  lengthCutFactor: number;
  widthCutFactor: number;
}

/** Mean dimensional change in length and width, and the cutting factors they imply. */
export function shrinkageResult(length: readonly MarkPair[], width: readonly MarkPair[]): ShrinkageResult {
  const lengthChangePct = meanDimensionalChangePct(length);
  const widthChangePct = meanDimensionalChangePct(width);
  return {
    lengthChangePct,
    widthChangePct,
    lengthCutFactor: cutAllowanceFactor(lengthChangePct),
    widthCutFactor: cutAllowanceFactor(widthChangePct),
  };
}

/**
 * Grey-scale grades for colour fastness, 1 (much change or staining) to 5 (none), in half steps:
 * the nine steps of the ISO 105-A02 (change in colour) and ISO 105-A03 (staining) scales.
 */
export const greyScaleGrades = [1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5, 5] as const;
export type GreyScaleGrade = (typeof greyScaleGrades)[number];

/** Whether a number is one of the nine grey-scale steps. */
export function isGreyScaleGrade(x: number): x is GreyScaleGrade {
  return (greyScaleGrades as readonly number[]).includes(x);
}

/** A grade as the trade writes it: 4.5 → "4-5", 3 → "3". */
export function greyScaleLabel(g: GreyScaleGrade): string {
  return Number.isInteger(g) ? String(g) : `${Math.floor(g)}-${Math.ceil(g)}`;
}

/**
 * What each step of the change-in-colour scale stands for: the CIELAB colour difference ΔE*ab between the
 * two chips of its pair, with the tolerance a working scale must meet (ISO 105-A02:1993 §2.4, the table of
 * colorimetric values; the half steps belong to the 9-step scale). Shown beside a grade so a reading can be
 * compared with an instrument's ΔE*ab; the grade itself stays the person's visual assessment.
 */
export const greyScaleChangeCielab: Readonly<Record<GreyScaleGrade, { deltaE: number; tolerance: number }>> = {
  5: { deltaE: 0, tolerance: 0.2 },
  4.5: { deltaE: 0.8, tolerance: 0.2 },
  4: { deltaE: 1.7, tolerance: 0.3 },
  3.5: { deltaE: 2.5, tolerance: 0.35 },
  3: { deltaE: 3.4, tolerance: 0.4 },
  2.5: { deltaE: 4.8, tolerance: 0.5 },
  2: { deltaE: 6.8, tolerance: 0.6 },
  1.5: { deltaE: 9.6, tolerance: 0.7 },
  1: { deltaE: 13.6, tolerance: 1.0 },
};

/** Reads "4-5", "4/5", "4–5" or "4.5" as 4.5 and "4" as 4; null for anything not on the scale. */
export function parseGreyScaleGrade(text: string): GreyScaleGrade | null {
  const t = text.trim();
  const half = /^([1-4])\s*[-/–]\s*([2-5])$/.exec(t);
  if (half) return Number(half[2]) === Number(half[1]) + 1 ? ((Number(half[1]) + 0.5) as GreyScaleGrade) : null;
  const n = Number(t.replace(",", "."));
  return t !== "" && isGreyScaleGrade(n) ? n : null;
}
