// Plausibility checks for body measurements (mm) keyed by ISO 8559-1 names.
// Ranges are deliberately wide: they catch typing slips (cm typed as mm, an extra zero), not unusual bodies.
// They cover newborns, including premature ones (film and stage use infant and child performers) up to very large adults.
// All ranges: common practice, no source — chosen by hand to sit outside normal child and adult values.

/** ISO 8559-1 measurement keys stored on a measurement set, plus foot dimensions for ISO 9407. */
export const MEASUREMENT_KEYS = [
  "height",
  "neck_girth",
  "chest_girth",
  "bust_girth",
  "waist_girth",
  "hip_girth",
  "across_back_width",
  "shoulder_width",
  "arm_length",
  "upper_arm_girth",
  "wrist_girth",
  "back_waist_length",
  "inside_leg_length",
  "thigh_girth",
  "head_girth",
  "foot_length",
  "foot_width",
] as const;

/** One body measurement key. */
export type MeasurementKey = (typeof MEASUREMENT_KEYS)[number];

/** Human labels for the measurement keys (lower case, for use inside sentences and headings). */
export const MEASUREMENT_LABELS: Record<MeasurementKey, string> = {
  height: "height",
  neck_girth: "neck girth",
  chest_girth: "chest girth",
  bust_girth: "bust girth",
  waist_girth: "waist girth",
  hip_girth: "hip girth",
  across_back_width: "across-back width",
  shoulder_width: "shoulder width",
  arm_length: "arm length",
  upper_arm_girth: "upper-arm girth",
  wrist_girth: "wrist girth",
  back_waist_length: "back waist length",
  inside_leg_length: "inside leg length",
  thigh_girth: "thigh girth",
  head_girth: "head girth",
  foot_length: "foot length",
  foot_width: "foot width",
};

/** Inclusive plausible range in mm. */
export interface PlausibleRange {
  minMm: number;
  maxMm: number;
}

/** Plausible ranges per key, newborn to very large adult (common practice, no source). */
export const PLAUSIBLE_RANGES_MM: Record<MeasurementKey, PlausibleRange> = {
  height: { minMm: 400, maxMm: 2600 },
  neck_girth: { minMm: 150, maxMm: 700 },
  chest_girth: { minMm: 250, maxMm: 2000 },
  bust_girth: { minMm: 250, maxMm: 2000 },
  waist_girth: { minMm: 250, maxMm: 2000 },
  hip_girth: { minMm: 250, maxMm: 2200 },
  across_back_width: { minMm: 100, maxMm: 700 },
  shoulder_width: { minMm: 100, maxMm: 700 },
  arm_length: { minMm: 120, maxMm: 1000 },
  upper_arm_girth: { minMm: 80, maxMm: 800 },
  wrist_girth: { minMm: 60, maxMm: 300 },
  back_waist_length: { minMm: 100, maxMm: 700 },
  inside_leg_length: { minMm: 120, maxMm: 1200 },
  thigh_girth: { minMm: 120, maxMm: 1100 },
  head_girth: { minMm: 250, maxMm: 700 },
  foot_length: { minMm: 50, maxMm: 400 },
  foot_width: { minMm: 25, maxMm: 160 },
};

/** Result of one plausibility check. */
export type PlausibilityResult = { ok: true } | { ok: false; key: MeasurementKey; reason: string };

/** True when `key` is one of the known measurement keys. */
export function isMeasurementKey(key: string): key is MeasurementKey {
  return (MEASUREMENT_KEYS as readonly string[]).includes(key);
}

/**
 * Checks one measurement against its plausible range.
 * @returns ok, or a plain-language reason such as "waist girth 5000 mm is above the plausible maximum of 2000 mm"
 */
export function checkMeasurement(key: MeasurementKey, mm: number): PlausibilityResult {
  const label = MEASUREMENT_LABELS[key];
  if (!Number.isFinite(mm)) return { ok: false, key, reason: `${label} must be a number of millimetres` };
  if (mm <= 0) return { ok: false, key, reason: `${label} must be greater than 0 mm` };
  const { minMm, maxMm } = PLAUSIBLE_RANGES_MM[key];
  if (mm > maxMm) {
    return { ok: false, key, reason: `${label} ${fmt(mm)} mm is above the plausible maximum of ${maxMm} mm` };
  }
  if (mm < minMm) {
    // A tenfold slip (cm entered where mm is expected) is the usual cause; say so when it fits.
    const hint = mm * 10 >= minMm && mm * 10 <= maxMm ? ` (was it entered in cm? ${fmt(mm)} cm = ${fmt(mm * 10)} mm)` : "";
    return { ok: false, key, reason: `${label} ${fmt(mm)} mm is below the plausible minimum of ${minMm} mm${hint}` };
  }
  return { ok: true };
}

function fmt(n: number): string {
  return Number.isInteger(n) ? String(n) : String(Math.round(n * 10) / 10);
}

/**
 * Checks a whole measurement set: each value against its range, then relations that must hold for any body
 * (inside leg shorter than height, foot width smaller than foot length, back waist length shorter than height).
 * @returns every problem found, empty when the set is plausible
 */
export function checkMeasurementSet(set: Partial<Record<MeasurementKey, number>>): Extract<PlausibilityResult, { ok: false }>[] {
  const problems: Extract<PlausibilityResult, { ok: false }>[] = [];
  for (const key of MEASUREMENT_KEYS) {
    const v = set[key];
    if (v === undefined) continue;
    const r = checkMeasurement(key, v);
    if (!r.ok) problems.push(r);
  }
  const shorter = (part: MeasurementKey, whole: MeasurementKey) => {
    const a = set[part];
    const b = set[whole];
    if (a === undefined || b === undefined || !(a > 0) || !(b > 0)) return;
    if (a >= b) {
      problems.push({
        ok: false,
        key: part,
        reason: `${MEASUREMENT_LABELS[part]} ${fmt(a)} mm is not less than ${MEASUREMENT_LABELS[whole]} ${fmt(b)} mm`,
      });
    }
  };
  shorter("inside_leg_length", "height");
  shorter("back_waist_length", "height");
  shorter("arm_length", "height");
  shorter("foot_width", "foot_length");
  shorter("wrist_girth", "upper_arm_girth");
  return problems;
}
