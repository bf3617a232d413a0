// What the measurement screens show beside the raw numbers: EN 13402-3 designations for the garment
// groups the set can size, ISO 9407 Mondopoint, and the change since the previous set.
import { MEASUREMENT_KEYS, type MeasurementKey } from "./plausibility";
import { mondopoint, sizeDesignation, type SizedGarment, type MondopointSize } from "./sizes";

/** Garment groups in display order with their labels. */
export const SIZED_GARMENT_LABELS: Record<SizedGarment, string> = {
  mens_top: "Tops and jackets (chest)",
  womens_top: "Tops and jackets (bust)",
  trousers: "Trousers",
  skirt: "Skirts",
};

/** One designation line for a measurement set. */
export interface SizeLine {
  garment: SizedGarment;
  label: string;
  pictogram: string;
  letter: string | null;
  dimensions: Array<{ key: MeasurementKey; measuredCm: number; designatedCm: number }>;
  missing: MeasurementKey[];
}

/**
 * EN 13402-3 designations for every garment group whose primary dimension was measured.
 * A set with a chest girth gets the chest-based top line, one with a bust girth the bust-based one.
 */
export function sizeLines(valuesMm: Partial<Record<MeasurementKey, number>>): SizeLine[] {
  const out: SizeLine[] = [];
  for (const garment of Object.keys(SIZED_GARMENT_LABELS) as SizedGarment[]) {
    const r = sizeDesignation(garment, valuesMm);
    if (!r.ok) continue;
    out.push({
      garment,
      label: SIZED_GARMENT_LABELS[garment],
      pictogram: r.pictogram,
      letter: r.letter,
      dimensions: [r.primary, ...r.secondary].map((d) => ({ key: d.key, measuredCm: d.measuredCm, designatedCm: d.designatedCm })),
      missing: r.missing,
    });
  }
  return out;
}

/** ISO 9407 Mondopoint from a set's foot length (and width), or null when the foot was not measured. */
export function shoeSize(valuesMm: Partial<Record<MeasurementKey, number>>): MondopointSize | null {
  const len = valuesMm.foot_length;
  if (len === undefined || !(len > 0)) return null;
  const w = valuesMm.foot_width;
  return mondopoint(len, w !== undefined && w > 0 ? w : undefined);
}

/** Change of one measurement since the previous set (mm; null when either set lacks it). */
export interface MeasurementChange {
  key: MeasurementKey;
  currentMm: number | null;
  previousMm: number | null;
  deltaMm: number | null;
}

/** Per-key differences between a set and the one before it, in MEASUREMENT_KEYS order. */
export function measurementChanges(
  current: Partial<Record<MeasurementKey, number>>,
  previous: Partial<Record<MeasurementKey, number>> | null,
): MeasurementChange[] {
  const out: MeasurementChange[] = [];
  for (const key of MEASUREMENT_KEYS) {
    const c = current[key] ?? null;
    const p = previous?.[key] ?? null;
    if (c === null && p === null) continue;
    out.push({ key, currentMm: c, previousMm: p, deltaMm: c !== null && p !== null ? c - p : null });
  }
  return out;
}
