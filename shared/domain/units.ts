// Exact unit conversions and length formatting/parsing for a production's unit preference.
// Lengths are stored in millimetres everywhere; these helpers only convert at the edges.
// Factors are the exact definitions of the 1959 international yard and pound agreement.

/** Millimetres in one inch (exact: 1 in = 1/36 yd = 25.4 mm). */
export const MM_PER_INCH = 25.4;
/** Millimetres in one centimetre. */
export const MM_PER_CM = 10;
/** Metres in one yard (exact, 1959 agreement). */
export const M_PER_YARD = 0.9144;
/** Grams in one avoirdupois ounce (exact: 1/16 of 0.45359237 kg). */
export const G_PER_OUNCE = 28.349523125;
/** Square metres in one square yard (exact: 0.9144²). */
export const M2_PER_SQ_YARD = 0.83612736;
/** g/m² in one oz/yd² (≈ 33.9057474748823), derived from the exact ounce and square yard. */
export const GSM_PER_OZ_PER_SQ_YARD = G_PER_OUNCE / M2_PER_SQ_YARD;

/** A production's display unit for lengths. */
export type LengthUnit = "cm" | "in";

/** Converts millimetres to centimetres. */
export function mmToCm(mm: number): number {
  return mm / MM_PER_CM;
}

/** Converts centimetres to millimetres. */
export function cmToMm(cm: number): number {
  return cm * MM_PER_CM;
}

/** Converts millimetres to inches. */
export function mmToIn(mm: number): number {
  return mm / MM_PER_INCH;
}

/** Converts inches to millimetres. */
export function inToMm(inches: number): number {
  return inches * MM_PER_INCH;
}

/** Converts centimetres to inches (1 in = 2.54 cm exactly). */
export function cmToIn(cm: number): number {
  // Divide via millimetres so 100 cm gives exactly 1000 / 25.4.
  return (cm * MM_PER_CM) / MM_PER_INCH;
}

/** Converts inches to centimetres. */
export function inToCm(inches: number): number {
  return (inches * MM_PER_INCH) / MM_PER_CM;
}

/** Converts metres to yards. */
export function mToYd(m: number): number {
  return m / M_PER_YARD;
}

/** Converts yards to metres. */
export function ydToM(yd: number): number {
  return yd * M_PER_YARD;
}

/** Converts fabric mass per area from g/m² to oz/yd². */
export function gsmToOzPerSqYd(gsm: number): number {
  // Multiply before dividing so each step uses an exact decimal factor.
  return (gsm * M2_PER_SQ_YARD) / G_PER_OUNCE;
}

/** Converts fabric mass per area from oz/yd² to g/m². */
export function ozPerSqYdToGsm(ozPerSqYd: number): number {
  return (ozPerSqYd * G_PER_OUNCE) / M2_PER_SQ_YARD;
}

/** Converts a length in millimetres to the given display unit (cm or in). */
export function mmToUnit(mm: number, unit: LengthUnit): number {
  return unit === "cm" ? mmToCm(mm) : mmToIn(mm);
}

/** Converts a length in the given display unit (cm or in) to millimetres. */
export function unitToMm(value: number, unit: LengthUnit): number {
  return unit === "cm" ? cmToMm(value) : inToMm(value);
}

// Values like 9.525 are not exact in binary; nudging by a few ulps makes a printed tie round away from zero.
function roundHalfAwayFromZero(x: number): number {
  const a = Math.abs(x);
  const r = Math.floor(a + 0.5 + a * 4 * Number.EPSILON);
  return x < 0 ? -r : r;
}

/** Rounds `value` to `decimals` places, ties away from zero, without binary-representation surprises. */
export function roundTo(value: number, decimals: number): number {
  const f = 10 ** decimals;
  const r = roundHalfAwayFromZero(value * f) / f;
  return r === 0 ? 0 : r; // no "-0"
}

/** An inch value split into whole inches and a reduced fraction. */
export interface InchFraction {
  /** True when the rounded value is below zero (e.g. a negative ease). */
  negative: boolean;
  /** Whole inches (non-negative). */
  whole: number;
  /** Numerator of the reduced fraction; 0 when the value is whole. */
  numerator: number;
  /** Denominator of the reduced fraction; 1 when the value is whole. */
  denominator: number;
}

function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return a;
}

/**
 * Rounds an inch value to the nearest 1/denominator (default 1/8) and reduces the fraction.
 * @param inches value in inches
 * @param denominator fraction step, e.g. 8 for eighths or 16 for sixteenths
 */
export function toInchFraction(inches: number, denominator = 8): InchFraction {
  if (!Number.isInteger(denominator) || denominator < 1) throw new RangeError("denominator must be a positive integer");
  const steps = roundHalfAwayFromZero(inches * denominator);
  const abs = Math.abs(steps);
  const whole = Math.floor(abs / denominator);
  const rest = abs - whole * denominator;
  const g = rest === 0 ? denominator : gcd(rest, denominator);
  return { negative: steps < 0, whole, numerator: rest / g, denominator: denominator / g };
}

/** Formats millimetres as centimetres with a fixed number of decimals (default 1), e.g. `95.3 cm`. */
export function formatCm(mm: number, decimals = 1): string {
  return `${roundTo(mmToCm(mm), decimals).toFixed(decimals)} cm`;
}

/** Formats millimetres as inches with a fraction to the nearest 1/8 (default), e.g. `37 1/2"`. */
export function formatInchesFraction(mm: number, denominator = 8): string {
  const f = toInchFraction(mmToIn(mm), denominator);
  const sign = f.negative ? "-" : "";
  if (f.numerator === 0) return `${sign}${f.whole}"`;
  const frac = `${f.numerator}/${f.denominator}`;
  return f.whole === 0 ? `${sign}${frac}"` : `${sign}${f.whole} ${frac}"`;
}

/** Formats millimetres as decimal inches with fixed decimals (default 2), e.g. `37.50"`. */
export function formatInchesDecimal(mm: number, decimals = 2): string {
  return `${roundTo(mmToIn(mm), decimals).toFixed(decimals)}"`;
}

/**
 * Formats a millimetre value in a production's unit: cm to 1 decimal, inches as an eighth-inch fraction
 * (or decimal inches when `inchStyle` is "decimal").
 */
export function formatLength(mm: number, unit: LengthUnit, inchStyle: "fraction" | "decimal" = "fraction"): string {
  if (unit === "cm") return formatCm(mm);
  return inchStyle === "fraction" ? formatInchesFraction(mm) : formatInchesDecimal(mm);
}

/** Result of parsing a typed length. */
export type ParseLengthResult = { ok: true; mm: number } | { ok: false; reason: string };

// Unicode vulgar fractions people paste or type on phones.
const VULGAR_FRACTIONS: Record<string, [number, number]> = {
  "½": [1, 2],
  "⅓": [1, 3],
  "⅔": [2, 3],
  "¼": [1, 4],
  "¾": [3, 4],
  "⅕": [1, 5],
  "⅖": [2, 5],
  "⅗": [3, 5],
  "⅘": [4, 5],
  "⅙": [1, 6],
  "⅚": [5, 6],
  "⅐": [1, 7],
  "⅛": [1, 8],
  "⅜": [3, 8],
  "⅝": [5, 8],
  "⅞": [7, 8],
  "⅑": [1, 9],
  "⅒": [1, 10],
};

const UNIT_SUFFIXES: Record<string, LengthUnit | "mm"> = {
  cm: "cm",
  mm: "mm",
  in: "in",
  inch: "in",
  inches: "in",
  '"': "in",
  "″": "in",
  "''": "in",
};

/**
 * Parses a typed length in cm or inches into millimetres. Accepts "37.5", "37,5", "37 1/2", "37-1/2",
 * "37½", "½", an optional sign, and an optional unit suffix (cm, mm, in, ") that overrides `unit`.
 */
export function parseLength(input: string, unit: LengthUnit): ParseLengthResult {
  let s = input
    .trim()
    .toLowerCase()
    .replace(/\u2212/g, "-")
    .replace(/\u2044/g, "/");
  if (s === "") return { ok: false, reason: "enter a length" };

  let effective: LengthUnit | "mm" = unit;
  const suffix = /\s*(inches|inch|in|cm|mm|''|"|″)$/.exec(s);
  if (suffix) {
    effective = UNIT_SUFFIXES[suffix[1]];
    s = s.slice(0, suffix.index).trim();
  }

  let sign = 1;
  if (s.startsWith("-") || s.startsWith("+")) {
    if (s[0] === "-") sign = -1;
    s = s.slice(1).trim();
  }

  // Replace a trailing vulgar fraction by " n/d" so one grammar handles both spellings.
  const last = s.slice(-1);
  if (last in VULGAR_FRACTIONS) {
    const [n, d] = VULGAR_FRACTIONS[last];
    s = `${s.slice(0, -1).trim()} ${n}/${d}`.trim();
  }

  const m = /^(?:(\d+(?:[.,]\d+)?|[.,]\d+)(?:(?:\s+|-)(\d+)\/(\d+))?|(\d+)\/(\d+))$/.exec(s);
  if (!m) return { ok: false, reason: `"${input.trim()}" is not a length; write e.g. 37.5 or 37 1/2` };

  let value: number;
  if (m[4] !== undefined) {
    value = fractionValue(Number(m[4]), Number(m[5]));
  } else {
    value = Number(m[1].replace(",", "."));
    if (m[2] !== undefined) {
      if (m[1].includes(".") || m[1].includes(",")) {
        return { ok: false, reason: "use either a decimal or a whole number with a fraction, not both" };
      }
      value += fractionValue(Number(m[2]), Number(m[3]));
    }
  }
  if (!Number.isFinite(value)) return { ok: false, reason: "a fraction cannot have 0 as its denominator" };

  const signed = sign * value;
  const mm = effective === "mm" ? signed : unitToMm(signed, effective);
  return { ok: true, mm: mm === 0 ? 0 : mm };
}

function fractionValue(n: number, d: number): number {
  return d === 0 ? Number.NaN : n / d;
}
