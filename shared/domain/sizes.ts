// Size designations from body measurements (stored in mm): EN 13402-3 for garments, ISO 9407 for shoes.
//
// Source status (see docs/references.md, "EN 13402"):
// - Verified: EN 13402 designates sizes by body dimensions in cm; men's tops use chest girth and women's
//   tops bust girth as the primary dimension; women's jackets take height and hip girth as secondary.
// - From memory [M], NOT checked against the purchased standard: trousers waist primary / inside leg
//   secondary, every interval grid below, and every letter-code band. All of it sits in SIZE_TABLES and
//   LETTER_BANDS so a reader with EN 13402-3:2013 in hand can correct it in one place.

import type { MeasurementKey } from "./plausibility";

/** Garment groups that have a size designation rule. */
export type SizedGarment = "mens_top" | "womens_top" | "trousers" | "skirt";

/** An open-ended interval grid in cm: points `from + k·step` per segment, the step changing at each `from`. */
export interface IntervalGrid {
  /** Ordered segments; a segment's points are from, from + step, … up to the next segment's `from`. */
  segments: readonly { from: number; step: number }[];
  /** Where this grid came from. */
  source: string;
}

/** One dimension in a designation: which body measurement and which grid it snaps to. */
export interface DesignationDimension {
  key: MeasurementKey;
  grid: IntervalGrid;
}

/** Designation rule for one garment group: primary dimension first, then secondaries in pictogram order. */
export interface SizeTable {
  primary: DesignationDimension;
  secondary: readonly DesignationDimension[];
  /** Which letter-band table applies to the primary dimension, if any. */
  letterBands?: keyof typeof LETTER_BANDS;
  source: string;
}

// [M] Interval grids recalled for EN 13402-3; the sheet says "girth steps of 4 cm then 6 cm at larger sizes
// and height steps are [M]".
const GRID = {
  // 2 + 4k gives …, 86, 90, 94, 98, … so the letter-band edges are grid points.
  mensChest: { segments: [{ from: 2, step: 4 }], source: "EN 13402-3, 4 cm chest steps [M]" },
  womensBust: {
    segments: [
      { from: 0, step: 4 },
      { from: 104, step: 6 },
    ],
    source: "EN 13402-3, 4 cm bust steps, 6 cm above 104 cm [M]",
  },
  mensHeight: { segments: [{ from: 2, step: 6 }], source: "EN 13402-3, 6 cm height steps [M]" },
  womensHeight: { segments: [{ from: 0, step: 8 }], source: "EN 13402-3, 8 cm height steps [M]" },
  hip: { segments: [{ from: 0, step: 4 }], source: "EN 13402-3, 4 cm hip steps [M]" },
  waist: { segments: [{ from: 0, step: 4 }], source: "EN 13402-3, 4 cm waist steps [M]" },
  insideLeg: { segments: [{ from: 0, step: 2 }], source: "EN 13402-3, 2 cm inside-leg steps [M]" },
} satisfies Record<string, IntervalGrid>;

/** Designation rules per garment group (EN 13402-2/-3; details [M] as noted per grid). */
export const SIZE_TABLES: Record<SizedGarment, SizeTable> = {
  mens_top: {
    primary: { key: "chest_girth", grid: GRID.mensChest },
    secondary: [{ key: "height", grid: GRID.mensHeight }],
    letterBands: "mens_chest",
    source: "EN 13402-2: men's tops, chest girth primary; height secondary [M]",
  },
  womens_top: {
    primary: { key: "bust_girth", grid: GRID.womensBust },
    secondary: [
      { key: "height", grid: GRID.womensHeight },
      { key: "hip_girth", grid: GRID.hip },
    ],
    letterBands: "womens_bust",
    source: "EN 13402-2: women's jackets, bust primary, height and hip secondary",
  },
  trousers: {
    primary: { key: "waist_girth", grid: GRID.waist },
    secondary: [
      { key: "inside_leg_length", grid: GRID.insideLeg },
      { key: "height", grid: GRID.mensHeight },
    ],
    source: "EN 13402-2: trousers, waist primary, inside leg secondary [M]",
  },
  skirt: {
    primary: { key: "waist_girth", grid: GRID.waist },
    secondary: [
      { key: "hip_girth", grid: GRID.hip },
      { key: "height", grid: GRID.womensHeight },
    ],
    source: "EN 13402-2: skirts, waist primary, hip and height secondary [M]",
  },
};

/** A letter code covering a girth band in cm: lower bound inclusive, upper bound exclusive. */
export interface LetterBand {
  code: string;
  minCm: number;
  maxCm: number;
}

// Letter codes by girth, EN 13402-3. ALL FROM MEMORY [M]; only men's S/M/L were corroborated by a secondary
// source (docs/references.md). Bands are half-open [min, max): a value exactly on an edge takes the LARGER
// letter (94 cm men's chest → M), because the published bands share their edges (86–94, 94–102).
// The letter is looked up with the designated (pictogram) value, not the raw girth, so the two never
// disagree: a 92 cm chest is designated 94 and labelled M (not "94" beside "S").
/** Letter-code band tables by primary girth (values in cm; [min, max)). */
export const LETTER_BANDS = {
  mens_chest: [
    { code: "XS", minCm: 78, maxCm: 86 }, // [M]
    { code: "S", minCm: 86, maxCm: 94 }, // [M], corroborated
    { code: "M", minCm: 94, maxCm: 102 }, // [M], corroborated
    { code: "L", minCm: 102, maxCm: 110 }, // [M], corroborated
    { code: "XL", minCm: 110, maxCm: 118 }, // [M]
    { code: "XXL", minCm: 118, maxCm: 129 }, // [M]
    { code: "3XL", minCm: 129, maxCm: 141 }, // [M]
  ],
  womens_bust: [
    { code: "XS", minCm: 74, maxCm: 82 }, // [M]
    { code: "S", minCm: 82, maxCm: 90 }, // [M]
    { code: "M", minCm: 90, maxCm: 98 }, // [M]
    { code: "L", minCm: 98, maxCm: 107 }, // [M]
    { code: "XL", minCm: 107, maxCm: 119 }, // [M]
    { code: "XXL", minCm: 119, maxCm: 131 }, // [M]
    { code: "3XL", minCm: 131, maxCm: 143 }, // [M]
  ],
} as const satisfies Record<string, readonly LetterBand[]>;

/**
 * Snaps a value in cm to the nearest point of an interval grid; an exact midpoint goes to the larger point.
 * @returns the grid value in cm
 */
export function snapToGrid(cm: number, grid: IntervalGrid): number {
  // The segment is picked by the value itself; a value just below a threshold may snap onto it.
  let seg = grid.segments[0];
  for (const s of grid.segments) if (cm >= s.from) seg = s;
  const k = Math.floor((cm - seg.from) / seg.step + 0.5 + 1e-9);
  let snapped = seg.from + k * seg.step;
  // Do not snap below the segment start when a lower segment exists (keeps the grid points of that segment).
  if (snapped < seg.from) snapped = seg.from;
  return snapped;
}

/** Finds the letter code whose [min, max) band in cm holds the girth (mm), or null outside the table. */
export function letterCode(table: keyof typeof LETTER_BANDS, girthMm: number): string | null {
  // Compare in whole mm against band edges × 10 to avoid 93.9 / 94.0 float noise.
  for (const band of LETTER_BANDS[table]) {
    if (girthMm >= band.minCm * 10 && girthMm < band.maxCm * 10) return band.code;
  }
  return null;
}

/** One dimension of a computed designation. */
export interface DesignatedValue {
  key: MeasurementKey;
  /** The body measurement rounded to whole cm. */
  measuredCm: number;
  /** The grid value used in the designation. */
  designatedCm: number;
}

/** Result of designating a size. */
export type SizeDesignationResult =
  | {
      ok: true;
      garment: SizedGarment;
      primary: DesignatedValue;
      secondary: DesignatedValue[];
      /** Secondary dimensions that were not measured (left out of the pictogram). */
      missing: MeasurementKey[];
      /** Pictogram-style designation in cm, primary first, e.g. "94-182". */
      pictogram: string;
      /** Letter code from the band table, or null when no table applies or the girth is outside it. */
      letter: string | null;
    }
  | { ok: false; missing: MeasurementKey[]; reason: string };

/** Body measurements in mm keyed by ISO 8559-1 names (only the ones used here). */
export type BodyMeasurementsMm = Partial<Record<MeasurementKey, number>>;

/**
 * EN 13402-3 size designation for a garment group from body measurements in mm.
 * @returns pictogram values in cm (primary first), the letter code where a band table applies
 */
export function sizeDesignation(garment: SizedGarment, body: BodyMeasurementsMm): SizeDesignationResult {
  const table = SIZE_TABLES[garment];
  const primaryMm = body[table.primary.key];
  if (primaryMm === undefined || !Number.isFinite(primaryMm) || primaryMm <= 0) {
    return {
      ok: false,
      missing: [table.primary.key],
      reason: `${table.primary.key.replace(/_/g, " ")} is needed to size this garment`,
    };
  }
  const designate = (dim: DesignationDimension, mm: number): DesignatedValue => ({
    key: dim.key,
    measuredCm: Math.round(mm / 10),
    designatedCm: snapToGrid(mm / 10, dim.grid),
  });
  const primary = designate(table.primary, primaryMm);
  const secondary: DesignatedValue[] = [];
  const missing: MeasurementKey[] = [];
  for (const dim of table.secondary) {
    const mm = body[dim.key];
    if (mm === undefined || !Number.isFinite(mm) || mm <= 0) missing.push(dim.key);
    else secondary.push(designate(dim, mm));
  }
  return {
    ok: true,
    garment,
    primary,
    secondary,
    missing,
    pictogram: [primary, ...secondary].map((d) => d.designatedCm).join("-"),
    // From the designated value, so the letter and the pictogram name the same size.
    letter: table.letterBands ? letterCode(table.letterBands, primary.designatedCm * 10) : null,
  };
}

// ISO 9407 Mondopoint: shoe size = foot length / foot width in mm. The 5 mm length interval is [M]
// (it is the step used in ski-boot and military Mondopoint sizing); width is kept to whole mm because the
// standard's width interval was not verified [M]. Lengths round UP to the next step: a shoe a little long
// beats one too short (a 262 mm foot is size 265, never 260).
/** Mondopoint intervals in mm; change here when checked against ISO 9407. */
export const MONDOPOINT = {
  lengthStepMm: 5, // [M]
  widthStepMm: 1, // [M] not verified; whole mm
  source: "ISO 9407:2019 Mondopoint [M for intervals]",
} as const;

/** A Mondopoint designation. */
export interface MondopointSize {
  /** Foot length rounded up to the length step, mm (never shorter than the foot). */
  lengthMm: number;
  /** Foot width rounded to the width step, mm (when measured). */
  widthMm?: number;
  /** "265" or "265/100". */
  label: string;
}

function roundToStep(mm: number, step: number): number {
  return Math.floor(mm / step + 0.5 + 1e-9) * step;
}

function roundUpToStep(mm: number, step: number): number {
  // The tolerance keeps 265.0000000001 (float noise from a unit conversion) at 265.
  return Math.ceil(mm / step - 1e-9) * step;
}

/** ISO 9407 Mondopoint size from foot length (and width when given), both in mm. */
export function mondopoint(footLengthMm: number, footWidthMm?: number): MondopointSize {
  if (!Number.isFinite(footLengthMm) || footLengthMm <= 0) throw new RangeError("foot length must be positive");
  const lengthMm = roundUpToStep(footLengthMm, MONDOPOINT.lengthStepMm);
  if (footWidthMm === undefined) return { lengthMm, label: `${lengthMm}` };
  if (!Number.isFinite(footWidthMm) || footWidthMm <= 0) throw new RangeError("foot width must be positive");
  const widthMm = roundToStep(footWidthMm, MONDOPOINT.widthStepMm);
  return { lengthMm, widthMm, label: `${lengthMm}/${widthMm}` };
}
