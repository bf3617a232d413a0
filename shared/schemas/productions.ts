import { z } from "zod";
import { Limits } from "../constants.js";
import { isoDateSchema, nameSchema } from "./common.js";
import type { Role } from "../permissions.js";

export const productionKinds = ["film", "series", "stage"] as const;
export type ProductionKind = (typeof productionKinds)[number];
export type Units = "cm" | "in";

/** One ease range in millimetres (negative minimums are for knits worn with negative ease). */
const easeRangeSchema = z
  .object({ min: z.number().min(-500).max(500), max: z.number().min(-500).max(1000).nullable() })
  .refine((r) => r.max === null || r.max >= r.min, { message: "max must be at least min", path: ["max"] });

/** Per-production settings; every field optional with a documented default. */
/** True for a time zone name the platform knows (IANA, e.g. "Europe/London"). */
export function isKnownTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: name });
    return true;
  } catch {
    return false;
  }
}

/** Paper sizes for printed reports. */
export const paperSizes = ["A4", "Letter"] as const;
export type PaperSize = (typeof paperSizes)[number];
/** Defaults when a production sets none. */
export const DEFAULT_CURRENCY = "GBP";
export const DEFAULT_PAPER_SIZE: PaperSize = "A4";

/** True for an ISO 4217 code the platform can format (e.g. "EUR"). */
export function isKnownCurrency(code: string): boolean {
  try {
    new Intl.NumberFormat("en", { style: "currency", currency: code });
    return typeof Intl.supportedValuesOf !== "function" || Intl.supportedValuesOf("currency").includes(code);
  } catch {
    return false;
  }
}

export const productionSettingsSchema = z.object({
  /** The department's local time zone (IANA name): "today", shoot days, reminders and fitting times. */
  timeZone: z.string().trim().min(1).max(64).refine(isKnownTimeZone, "is not a time zone name such as Europe/London").optional(),
  /** Stage: flag a quick change shorter than this many minutes. */
  quickChangeThresholdMin: z.number().min(0).max(60).optional(),
  /** Workroom: working days between finishing an alteration and the shoot day (pressing, rack prep). */
  bufferWorkingDays: z.number().int().min(0).max(10).optional(),
  /** Hour (0–23, production's local time) at which evening reminders go out. */
  reminderHour: z.number().int().min(0).max(23).optional(),
  /** Currency of every cost (ISO 4217 code, e.g. GBP, EUR, USD); amounts are stored in cents. */
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, "must be a three-letter currency code such as GBP")
    .refine(isKnownCurrency, "is not a currency code this system knows")
    .optional(),
  /** Paper for printed reports (continuity books, rack lists): ISO A4 or US Letter. */
  paperSize: z.enum(paperSizes).optional(),
  /** Seam length mismatch tolerance in mm. */
  seamToleranceMm: z.number().min(0).max(50).optional(),
  /**
   * The department's own ease ranges (mm), replacing the handbook values for the fit check:
   * garment category → garment point → fit intent → { min, max } (max null = no upper limit).
   */
  easeOverrides: z
    .record(
      z.string().trim().min(1).max(40),
      z.record(
        z.string().trim().min(1).max(40),
        z.object({ fitted: easeRangeSchema, regular: easeRangeSchema, loose: easeRangeSchema }).partial(),
      ),
    )
    .optional(),
});
export type ProductionSettings = z.infer<typeof productionSettingsSchema>;

export const createProductionInputSchema = z
  .object({
    /** Working title shown everywhere. */
    title: nameSchema(Limits.titleMax),
    kind: z.enum(productionKinds),
    startsOn: isoDateSchema.nullish(),
    endsOn: isoDateSchema.nullish(),
    /** Units the department reads measurements in; storage is always millimetres. */
    units: z.enum(["cm", "in"]).default("cm"),
  })
  .refine((v) => !v.startsOn || !v.endsOn || v.endsOn >= v.startsOn, {
    message: "must be on or after the start date",
    path: ["endsOn"],
  });
export type CreateProductionInput = z.infer<typeof createProductionInputSchema>;

export const updateProductionInputSchema = z.object({
  title: nameSchema(Limits.titleMax).optional(),
  startsOn: isoDateSchema.nullish(),
  endsOn: isoDateSchema.nullish(),
  units: z.enum(["cm", "in"]).optional(),
  settings: productionSettingsSchema.optional(),
});
export type UpdateProductionInput = z.infer<typeof updateProductionInputSchema>;

export interface ProductionDto {
  id: string;
  title: string;
  kind: ProductionKind;
  startsOn: string | null;
  endsOn: string | null;
  units: Units;
  settings: ProductionSettings;
  /** The signed-in user's role in this production. */
  role: Role;
  /** The production's time zone (its setting, else the server's). */
  timeZone: string;
  /** Today's date in that zone, from the server's clock (the client never guesses "today"). */
  today: string;
}

/** The record an audit event is about, named as people know it, with a link to where it is shown. */
export interface AuditRecordDto {
  /** Kind of record ("garment", "scene", …; a photo's event names its owner). */
  type: string;
  label: string;
  /** Client path of the screen that shows it; null when it is gone or has no page. */
  href: string | null;
  /** The record was deleted since (the label comes from the event itself). */
  gone: boolean;
}

export interface AuditEventDto {
  id: string;
  action: string;
  entityType: string;
  entityId: string | null;
  /** What changed: the record's name and a link to it. */
  record: AuditRecordDto | null;
  actorName: string | null;
  before: unknown;
  after: unknown;
  createdAt: string;
}
