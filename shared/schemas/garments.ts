import { z } from "zod";
import { Limits } from "../constants.js";
import { isoDateSchema, idSchema, paginationQuerySchema, nameSchema, optionalNameSchema } from "./common.js";
import { parseTagCode } from "../domain/tag-codes.js";

/** Where a garment is in its life; every change is kept as a history row. */
export const garmentStatuses = ["in_stock", "fitting", "workroom", "on_set", "cleaning", "returned", "lost"] as const;
export type GarmentStatus = (typeof garmentStatuses)[number];
export const garmentStatusLabels: Record<GarmentStatus, string> = {
  in_stock: "In stock",
  fitting: "Fitting",
  workroom: "Workroom",
  on_set: "On set",
  cleaning: "Cleaning",
  returned: "Returned",
  lost: "Lost",
};

export const garmentSources = ["built", "bought", "rented"] as const;
export type GarmentSource = (typeof garmentSources)[number];

/** What happens to an owned garment at wrap; rented garments always go back to the hire house. */
export const wrapDispositions = ["keep", "sell"] as const;
export type WrapDisposition = (typeof wrapDispositions)[number];

export const fitIntents = ["fitted", "regular", "loose"] as const;
export type FitIntentValue = (typeof fitIntents)[number];

/** Categories offered in forms; the column takes any short word so a department can add its own. */
export const garmentCategories = [
  "jacket",
  "coat",
  "shirt",
  "blouse",
  "dress",
  "skirt",
  "trousers",
  "waistcoat",
  "knitwear",
  "boots",
  "shoes",
  "hat",
  "shawl",
  "apron",
  "underwear",
  "accessory",
] as const;

/** Finished-measurement points (mm); names match the fit check's points. */
export const finishedPoints = [
  "chest",
  "bust",
  "waist",
  "hip",
  "back_length",
  "sleeve",
  "inside_leg",
  "neck",
  "shoulder",
  "across_back",
  "upper_arm",
  "thigh",
  "wrist",
  "head",
  "length",
  "foot_length",
] as const;
export type FinishedPoint = (typeof finishedPoints)[number];
export const finishedPointLabels: Record<FinishedPoint, string> = {
  chest: "Chest",
  bust: "Bust",
  waist: "Waist",
  hip: "Hip",
  back_length: "Back length",
  sleeve: "Sleeve length",
  inside_leg: "Inside leg",
  neck: "Neck",
  shoulder: "Shoulder",
  across_back: "Across back",
  upper_arm: "Upper arm",
  thigh: "Thigh",
  wrist: "Wrist",
  head: "Head",
  length: "Garment length",
  foot_length: "Inside foot length",
};

/** A finished length in mm: positive and below 3 m (no garment point is longer). */
const lengthMm = z
  .number({ message: "must be a number of millimetres" })
  .positive("must be greater than 0")
  .max(3000, "must be under 3000 mm");

/** Finished measurements keyed by point, in mm. */
export const finishedMeasurementsSchema = z.partialRecord(
  z.enum(finishedPoints, { message: "is not a known measurement point" }),
  lengthMm,
);

/** A tag code typed by hand (re-using an old label): normalised and check-verified. */
export const tagCodeSchema = z.string().transform((v, ctx) => {
  const r = parseTagCode(v);
  if (!r.ok) {
    ctx.addIssue({ code: "custom", message: r.reason });
    return z.NEVER;
  }
  return r.code;
});

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullish()
    .transform((v) => (v ? v : null));

const garmentFields = {
  /** Short name people use ("keeper's jacket"). */
  name: nameSchema(Limits.nameMax),
  category: nameSchema(40).toLowerCase(),
  sizeLabel: text(40),
  fitIntent: z.enum(fitIntents).default("regular"),
  finishedMeasurements: finishedMeasurementsSchema.default({}),
  fabricId: idSchema.nullish().transform((v) => v ?? null),
  colour: text(80),
  source: z.enum(garmentSources),
  vendor: text(160),
  /** Cost in cents (whole currency units × 100). */
  costCents: z
    .number()
    .int("must be whole cents")
    .min(0, "cannot be negative")
    .max(100_000_000)
    .nullish()
    .transform((v) => v ?? null),
  /** Only meaningful for rented garments. */
  rentalDueOn: isoDateSchema.nullish().transform((v) => v ?? null),
  /** Rented: the weekly hire rate in cents of the production's currency. */
  rentalCostPerWeekCents: z
    .number()
    .int("must be whole cents")
    .min(0, "cannot be negative")
    .max(10_000_000)
    .nullish()
    .transform((v) => v ?? null),
  /** Owned garments at wrap: keep in stock or sell; null = not decided. */
  wrapDisposition: z
    .enum(wrapDispositions)
    .nullish()
    .transform((v) => v ?? null),
  locationRack: text(40),
  locationBin: text(40),
  distressStage: z.number().int().min(0, "cannot be negative").max(10).default(0),
  notes: text(Limits.notesMax),
};

/** Create one garment, or a multiples group of N copies (#1..#N) in one step. */
export const createGarmentInputSchema = z
  .object({
    ...garmentFields,
    status: z.enum(garmentStatuses).default("in_stock"),
    /** Optional: re-use a printed label; otherwise the app generates one. Only with a single copy. */
    tagCode: tagCodeSchema.optional(),
    /** How many copies to make; more than 1 creates a multiples group. */
    copies: z.number().int().min(1).max(20).default(1),
    /** Name of the multiples group (defaults to the garment name). */
    groupName: optionalNameSchema(Limits.nameMax).optional(),
  })
  .refine((v) => !(v.tagCode && v.copies > 1), { message: "give a tag code only when making one copy", path: ["tagCode"] });
export type CreateGarmentInput = z.infer<typeof createGarmentInputSchema>;

/** Edit a garment's description; status moves go through the move endpoints so history is kept. */
export const updateGarmentInputSchema = z
  .object({
    name: garmentFields.name,
    category: garmentFields.category,
    sizeLabel: garmentFields.sizeLabel,
    fitIntent: z.enum(fitIntents),
    finishedMeasurements: finishedMeasurementsSchema,
    fabricId: garmentFields.fabricId,
    colour: garmentFields.colour,
    source: z.enum(garmentSources),
    vendor: garmentFields.vendor,
    costCents: garmentFields.costCents,
    rentalDueOn: garmentFields.rentalDueOn,
    rentalCostPerWeekCents: garmentFields.rentalCostPerWeekCents,
    wrapDisposition: garmentFields.wrapDisposition,
    distressStage: z.number().int().min(0, "cannot be negative").max(10),
    notes: garmentFields.notes,
    tagCode: tagCodeSchema,
  })
  .partial();
export type UpdateGarmentInput = z.infer<typeof updateGarmentInputSchema>;

/** Make more copies of a garment; it becomes #1 of a new group if it is not in one yet. */
export const addCopiesInputSchema = z.object({
  count: z.number().int().min(1).max(20),
  groupName: optionalNameSchema(Limits.nameMax).optional(),
});
export type AddCopiesInput = z.infer<typeof addCopiesInputSchema>;

/** Statuses in which a garment is out with a person; a move to any other status checks it back in. */
export const checkedOutStatuses = ["on_set", "fitting"] as const satisfies readonly GarmentStatus[];

/** Whom a garment is checked out to. */
export const checkoutToKinds = ["member", "performer"] as const;
export type CheckoutToKind = (typeof checkoutToKinds)[number];

/**
 * Check a garment out to a person: a member of the production (their user id) or a performer, for a
 * shoot day / performance and scene, due back on a date (default: that day's date, else today).
 */
export const checkoutInputSchema = z
  .object({
    /** A member of the production (user id), e.g. the set costumer who dresses the scene. */
    toUserId: idSchema.nullish(),
    /** A performer of the production (for a fitting at home, a photo call, a rehearsal). */
    toPerformerId: idSchema.nullish(),
    /** The shoot day or performance it goes out for. */
    shootDayId: idSchema.nullish(),
    /** The scene it goes out for (on that day, when a day is given). */
    sceneId: idSchema.nullish(),
    /** The date it must be back; defaults to the day's date, else today. */
    dueBackOn: isoDateSchema.nullish(),
  })
  .refine((v) => Boolean(v.toUserId) !== Boolean(v.toPerformerId), {
    message: "choose who takes it: one member or one performer",
    path: ["toUserId"],
  });
export type CheckoutInput = z.infer<typeof checkoutInputSchema>;

const moveFields = {
  status: z.enum(garmentStatuses, { message: "must be one of: " + garmentStatuses.join(", ") }),
  /** Omit to keep the current rack / bin; null or "" clears it. */
  locationRack: z.string().trim().max(40).nullish(),
  locationBin: z.string().trim().max(40).nullish(),
  note: z.string().trim().max(500).nullish(),
  /** Check the garment out to a person (only with status On set or Fitting). */
  checkout: checkoutInputSchema.nullish(),
};

/** Move one or many garments to a status (and location), one history row each, in one transaction. */
export const moveGarmentsInputSchema = z.object({
  garmentIds: z.array(idSchema).min(1, "choose at least one garment").max(500),
  ...moveFields,
});
export type MoveGarmentsInput = z.infer<typeof moveGarmentsInputSchema>;

/** Check in / out by a scanned or typed tag code. */
export const scanGarmentInputSchema = z.object({ tagCode: tagCodeSchema, ...moveFields });
export type ScanGarmentInput = z.infer<typeof scanGarmentInputSchema>;

const csv = <T extends string>(values: readonly [T, ...T[]]) =>
  z
    .string()
    .optional()
    .transform((v) => (v ? v.split(",").filter(Boolean) : []))
    .pipe(z.array(z.enum(values)));

/** Filters shared by the list, CSV export and tag-label sheet. */
export const garmentFiltersSchema = z.object({
  /** Name, tag code, colour or vendor contains. */
  q: z.string().trim().max(100).optional(),
  category: z.string().trim().toLowerCase().max(40).optional(),
  status: csv(garmentStatuses),
  source: z.enum(garmentSources).optional(),
  /** Garments used in this character's changes (directly or through a multiples group). */
  characterId: idSchema.optional(),
  rack: z.string().trim().max(40).optional(),
  fabricId: idSchema.optional(),
  multiplesGroupId: idSchema.optional(),
  /** Rented and due back within N days of `asOf` (overdue included), not yet returned. */
  dueWithinDays: z.coerce.number().int().min(0).max(366).optional(),
  /** The day "due within" counts from (defaults to today on the server). */
  asOf: isoDateSchema.optional(),
  /** Checked out: `out` = with someone now, `past_due` = with someone past the due-back date. */
  out: z.enum(["out", "past_due"]).optional(),
  /** Explicit ids (tag sheets of a selection). */
  ids: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(",").filter(Boolean) : []))
    .pipe(z.array(idSchema).max(500)),
});
export type GarmentFilters = z.infer<typeof garmentFiltersSchema>;

/** Label sheets: the filters plus the first free position on a partly used sheet (1 = top left, row by row). */
export const labelSheetQuerySchema = garmentFiltersSchema.extend({
  start: z.coerce
    .number({ message: "must be a label position" })
    .int("must be a whole label position")
    .min(1, "must be 1 or more")
    .max(24, "must be 24 or less (3 × 8 labels)")
    .default(1),
});
export type LabelSheetQuery = z.infer<typeof labelSheetQuerySchema>;

export const garmentSortKeys = ["tagCode", "name", "category", "status", "rentalDueOn", "locationRack", "updatedAt"] as const;
export const listGarmentsQuerySchema = paginationQuerySchema.extend(garmentFiltersSchema.shape).extend({
  sort: z.enum(garmentSortKeys).default("tagCode"),
  dir: z.enum(["asc", "desc"]).default("asc"),
});
export type ListGarmentsQuery = z.infer<typeof listGarmentsQuerySchema>;

export interface GarmentDto {
  id: string;
  tagCode: string;
  name: string;
  category: string;
  sizeLabel: string | null;
  fitIntent: FitIntentValue;
  finishedMeasurements: Partial<Record<FinishedPoint, number>>;
  fabricId: string | null;
  fabricName: string | null;
  colour: string | null;
  source: GarmentSource;
  vendor: string | null;
  costCents: number | null;
  rentalDueOn: string | null;
  rentalCostPerWeekCents: number | null;
  wrapDisposition: WrapDisposition | null;
  locationRack: string | null;
  locationBin: string | null;
  status: GarmentStatus;
  distressStage: number;
  multiplesGroupId: string | null;
  multiplesGroupName: string | null;
  copyNumber: number | null;
  notes: string | null;
  updatedAt: string;
  /** Who has it now, when it is checked out. */
  checkout: GarmentCheckoutDto | null;
}

/** A check-out: who has the garment, for which day and scene, and when it is due back. */
export interface GarmentCheckoutDto {
  id: string;
  garmentId: string;
  to: { kind: CheckoutToKind; /** user id (member) or performer id; null once that record is gone */ id: string | null; name: string };
  shootDay: { id: string; date: string; kind: "shoot" | "performance"; dayNumber: number } | null;
  scene: { id: string; number: string } | null;
  dueBackOn: string;
  /** Due back before today (judged on the server's clock in the production's time zone). */
  pastDue: boolean;
  checkedOutAt: string;
  checkedOutByName: string | null;
  returnedAt: string | null;
}

/** An open check-out with the garment it concerns (the wardrobe's "who has what" list, reports). */
export interface OpenCheckoutDto extends GarmentCheckoutDto {
  garment: { id: string; tagCode: string; name: string; status: GarmentStatus };
}

/** Choices for the check-out form: members, performers and the days from today on with their scenes. */
export interface CheckoutOptionsDto {
  today: string;
  members: Array<{ userId: string; name: string; role: string }>;
  performers: Array<{ id: string; name: string; characters: string[] }>;
  days: Array<{
    id: string;
    date: string;
    kind: "shoot" | "performance";
    dayNumber: number;
    scenes: Array<{ id: string; number: string }>;
  }>;
}

export interface GarmentStatusEventDto {
  id: string;
  fromStatus: GarmentStatus | null;
  toStatus: GarmentStatus;
  fromLocation: string | null;
  toLocation: string | null;
  note: string | null;
  actorId: string | null;
  actorName: string | null;
  at: string;
}

/** A change (costume change of a character) that uses this garment. */
export interface GarmentChangeRefDto {
  changeId: string;
  changeNumber: number;
  characterId: string;
  characterName: string;
  label: string;
  /** True when the change item names the multiples group rather than this copy. */
  viaGroup: boolean;
}

export interface GarmentDetailDto extends GarmentDto {
  history: GarmentStatusEventDto[];
  /** Every check-out of this garment, newest first (the open one included). */
  checkouts: GarmentCheckoutDto[];
  changes: GarmentChangeRefDto[];
  /** Other copies of the same multiples group (including this one). */
  groupCopies: Array<{ id: string; tagCode: string; copyNumber: number | null; status: GarmentStatus; distressStage: number }>;
}

export interface GarmentMoveResultDto {
  garment: GarmentDto;
  event: GarmentStatusEventDto | null;
}
