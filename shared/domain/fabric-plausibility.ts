// Plausibility checks for raw fabric test readings, like plausibility.ts does for body measurements.
// Ranges are deliberately wide: they catch slips (a unit mix-up, a missing decimal point, 1e-300),
// not unusual cloth. Ranges: common practice, no source. Specimen sizes the methods use are noted
// beside each range (from memory).
import type { FabricTestReadings } from "../schemas/fabrics.js";

/** Inclusive plausible range of one reading, with the unit shown in messages. */
interface ReadingRange {
  min: number;
  max: number;
  unit: string;
  label: string;
  /** Said when a value falls outside, after the range itself. */
  why: string;
}

/** Plausible ranges per reading. */
export const FABRIC_READING_RANGES = {
  // ASTM D3776: a cut specimen weighed; 100 × 100 mm is usual. 0.01 g is ten steps of a 0.001 g balance.
  massG: { min: 0.01, max: 1000, unit: "g", label: "specimen mass", why: "a specimen is weighed on a balance reading to 0.001 g" },
  lengthMm: { min: 10, max: 1000, unit: "mm", label: "specimen length", why: "specimens are cut between 1 cm and 1 m" },
  widthMm: { min: 10, max: 1000, unit: "mm", label: "specimen width", why: "specimens are cut between 1 cm and 1 m" },
  // ASTM D1388 option A: a 25 × 200 mm strip slides over the edge, so the overhang is at most its length.
  overhangMm: { min: 5, max: 200, unit: "mm", label: "overhang length", why: "the cantilever strip is 200 mm long" },
  // ISO 13934-1 / ASTM D5035 strips: 25 or 50 mm wide, 100 or 200 mm between the jaws.
  loadN: { min: 0.01, max: 10_000, unit: "N", label: "load", why: "a strip tester reads from about 0.01 N to 10 kN" },
  stripWidthMm: { min: 10, max: 100, unit: "mm", label: "strip width", why: "test strips are 25 or 50 mm wide" },
  gaugeLengthMm: { min: 20, max: 500, unit: "mm", label: "gauge length", why: "the jaws are usually 100 or 200 mm apart" },
  extensionMm: { min: 0.01, max: 2500, unit: "mm", label: "extension", why: "extensions are read to 0.01 mm" },
  // ISO 5084: thickness under a presser foot; organza ~0.05 mm, thick felt ~20 mm.
  thicknessMm: {
    min: 0.02,
    max: 30,
    unit: "mm",
    label: "thickness",
    why: "the thinnest organza is about 0.05 mm and thick felt about 20 mm",
  },
} satisfies Record<string, ReadingRange>;

/** Mass per area a cloth can have, g/m²: the lightest nets about 10, heavy felts and canvases about 1,500. */
export const PLAUSIBLE_MASS_PER_AREA_GSM = { min: 5, max: 3000 };
/** Highest strain a strip test can plausibly read (500 %: elastane knits stretch to about 300 %). */
export const PLAUSIBLE_MAX_STRAIN = 5;

/** One implausible reading: the field it belongs to and a plain-language reason. */
export interface ReadingProblem {
  field: string;
  reason: string;
}

function fmt(n: number): string {
  return Math.abs(n) >= 0.01 || n === 0 ? String(Math.round(n * 1000) / 1000) : n.toExponential(2);
}

/**
 * Checks raw fabric test readings against plausible ranges and against each other.
 * @returns every problem found, empty when the readings are plausible
 */
export function checkFabricReadings(r: FabricTestReadings): ReadingProblem[] {
  const problems: ReadingProblem[] = [];
  for (const [field, value] of Object.entries(r)) {
    const range = (FABRIC_READING_RANGES as Record<string, ReadingRange>)[field];
    if (!range || typeof value !== "number") continue;
    if (value < range.min)
      problems.push({
        field,
        reason: `${range.label} ${fmt(value)} ${range.unit} is below the plausible minimum of ${range.min} ${range.unit}: ${range.why}`,
      });
    else if (value > range.max)
      problems.push({
        field,
        reason: `${range.label} ${fmt(value)} ${range.unit} is above the plausible maximum of ${range.max} ${range.unit}: ${range.why}`,
      });
  }
  if (problems.length) return problems;
  if (r.kind === "mass") {
    const gsm = r.massG / ((r.lengthMm / 1000) * (r.widthMm / 1000));
    const { min, max } = PLAUSIBLE_MASS_PER_AREA_GSM;
    if (gsm < min || gsm > max) {
      problems.push({
        field: "massG",
        reason: `${fmt(r.massG)} g on ${fmt(r.lengthMm)} × ${fmt(r.widthMm)} mm is ${fmt(gsm)} g/m², outside the ${min}–${max} g/m² any cloth weighs; check the grams and the specimen size`,
      });
    }
  }
  if (r.kind === "strip" && r.extensionMm / r.gaugeLengthMm > PLAUSIBLE_MAX_STRAIN) {
    problems.push({
      field: "extensionMm",
      reason: `extension ${fmt(r.extensionMm)} mm on a ${fmt(r.gaugeLengthMm)} mm gauge is a strain above ${PLAUSIBLE_MAX_STRAIN * 100} %`,
    });
  }
  return problems;
}
