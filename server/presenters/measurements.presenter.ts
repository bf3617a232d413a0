import type { MeasurementSetDto } from "@shared/schemas/measurements.js";
import type { MeasurementSet } from "../models/index.js";

/** Measurement set → wire shape (values stay in mm; the client formats them). */
export function presentMeasurementSet(m: MeasurementSet): MeasurementSetDto {
  return {
    id: m.id,
    performerId: m.performerId,
    takenOn: m.takenOn,
    takenBy: m.takenBy,
    takenByName: m.taker?.name ?? null,
    enteredUnit: m.enteredUnit,
    valuesMm: m.valuesMm,
    notes: m.notes,
    createdAt: m.createdAt.toISOString(),
  };
}
