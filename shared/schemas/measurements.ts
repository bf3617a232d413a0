import { z } from "zod";
import { Limits } from "../constants.js";
import { isoDateSchema } from "./common.js";
import { MEASUREMENT_KEYS, type MeasurementKey } from "../domain/plausibility.js";

/** A measurement set as entered: values in the chosen unit; the server stores millimetres. */
export const createMeasurementSetInputSchema = z.object({
  takenOn: isoDateSchema,
  /** Unit the values are typed in. */
  unit: z.enum(["cm", "in"]),
  values: z
    .partialRecord(z.enum(MEASUREMENT_KEYS, { message: "is not a known measurement" }), z.number({ message: "must be a number" }))
    .refine((v) => Object.keys(v).length > 0, { message: "enter at least one measurement" }),
  notes: z
    .string()
    .trim()
    .max(Limits.notesMax)
    .nullish()
    .transform((v) => (v ? v : null)),
});
export type CreateMeasurementSetInput = z.infer<typeof createMeasurementSetInputSchema>;

export interface MeasurementSetDto {
  id: string;
  performerId: string;
  takenOn: string;
  takenBy: string | null;
  takenByName: string | null;
  enteredUnit: "cm" | "in";
  valuesMm: Partial<Record<MeasurementKey, number>>;
  notes: string | null;
  createdAt: string;
}

export interface SizeLineDto {
  garment: "mens_top" | "womens_top" | "trousers" | "skirt";
  label: string;
  pictogram: string;
  letter: string | null;
  /** Dimensions in pictogram order with their measured and designated values (cm). */
  dimensions: Array<{ key: MeasurementKey; measuredCm: number; designatedCm: number }>;
  missing: MeasurementKey[];
}

export interface PerformerMeasurementsDto {
  performer: { id: string; name: string };
  /** Newest first. */
  sets: MeasurementSetDto[];
  /** Sizes from the newest set. */
  sizes: SizeLineDto[];
  /** ISO 9407 Mondopoint from the newest foot length (and width). */
  mondopoint: { label: string; lengthMm: number; widthMm?: number } | null;
}
