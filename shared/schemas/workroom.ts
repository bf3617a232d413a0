import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema, isoDateSchema, nameSchema } from "./common.js";
import { WEEKDAYS, type Weekday } from "../domain/workroom.js";
import type { Snag } from "../domain/snags/types.js";
import { garmentSources, tagCodeSchema } from "./garments.js";

// ---------- fittings ----------

export const fittingStatuses = ["booked", "done", "cancelled"] as const;
export type FittingStatus = (typeof fittingStatuses)[number];

/** An instant with its offset, as the browser's toISOString() sends it. */
const instantSchema = z.iso.datetime({ offset: true, message: "must be a date and time (ISO 8601)" });

export const createFittingInputSchema = z.object({
  /** The person being fitted. */
  performerId: idSchema,
  /** The costume change being fitted (optional for a general fitting). */
  changeId: idSchema.nullish(),
  /** Start, with time zone offset. */
  startsAt: instantSchema,
  /** Length in minutes (5–480). */
  durationMinutes: z.number().int().min(5, "must be at least 5 minutes").max(480, "must be at most 8 hours"),
  /** Fitting room. */
  room: z.string().trim().max(120).nullish(),
  /** Department members who attend (user ids). */
  attendeeIds: z.array(idSchema).max(20).default([]),
  notes: z.string().max(Limits.notesMax).nullish(),
});
export type CreateFittingInput = z.infer<typeof createFittingInputSchema>;

export const updateFittingInputSchema = z.object({
  startsAt: instantSchema.optional(),
  durationMinutes: z.number().int().min(5, "must be at least 5 minutes").max(480, "must be at most 8 hours").optional(),
  room: z.string().trim().max(120).nullish(),
  attendeeIds: z.array(idSchema).max(20).optional(),
  notes: z.string().max(Limits.notesMax).nullish(),
  /** What came out of the fitting. */
  outcome: z.string().max(Limits.notesMax).nullish(),
  /** booked → done, or cancelled (sends a cancellation to the performer). */
  status: z.enum(fittingStatuses).optional(),
});
export type UpdateFittingInput = z.infer<typeof updateFittingInputSchema>;

const optText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullish()
    .transform((v) => (v ? v : null));

/** A garment added to stock at a fitting: the few facts known at the rail; the rest is filled in on Wardrobe. */
export const fittingNewGarmentSchema = z.object({
  name: nameSchema(Limits.nameMax),
  category: z.string().trim().toLowerCase().min(1, "is required").max(40),
  sizeLabel: optText(40),
  colour: optText(80),
  /** Built in the workroom unless said otherwise. */
  source: z.enum(garmentSources).default("built"),
  /** Re-use a printed label; otherwise the app makes a tag code. */
  tagCode: tagCodeSchema.optional(),
});

/** Link a change item at a fitting: a garment from stock, or a new one. Exactly one of the two. */
export const linkFittingItemInputSchema = z
  .object({
    garmentId: idSchema.optional(),
    newGarment: fittingNewGarmentSchema.optional(),
  })
  .refine((v) => Boolean(v.garmentId) !== Boolean(v.newGarment), {
    message: "choose a garment from stock or describe a new one",
    path: ["garmentId"],
  });
export type LinkFittingItemInput = z.infer<typeof linkFittingItemInputSchema>;

export const listFittingsQuerySchema = z.object({
  from: isoDateSchema.optional(),
  to: isoDateSchema.optional(),
  status: z.enum(fittingStatuses).optional(),
});
export type ListFittingsQuery = z.infer<typeof listFittingsQuerySchema>;

export interface FittingDto {
  id: string;
  performerId: string;
  performerName: string;
  /** Where the invitation goes: the performer's e-mail, else null (the contact is in agentContact). */
  performerEmail: string | null;
  changeId: string | null;
  changeLabel: string | null;
  startsAt: string;
  endsAt: string;
  durationMinutes: number;
  room: string | null;
  attendeeIds: string[];
  attendeeNames: string[];
  notes: string | null;
  outcome: string | null;
  status: FittingStatus;
  icsSequence: number;
  ticketCount: number;
}

/** Everything a tablet shows during a fitting. */
export interface FittingDetailDto extends FittingDto {
  items: Array<{
    changeItemId: string;
    label: string;
    garmentId: string | null;
    tagCode: string | null;
    garmentName: string | null;
    garmentStatus: string | null;
    /** Fit per point against the performer's current measurements (mm). */
    fit: Array<{ point: string; status: "fits" | "tight" | "loose"; by: number; sentence: string }>;
    openTicketIds: string[];
  }>;
  measurements: { takenOn: string; valuesMm: Record<string, number> } | null;
  /** Fit snags (same shape as the Snags screen) for the change's garments on this performer. */
  fitSnags: Snag[];
  tickets: AlterationTicketDto[];
}

// ---------- alteration tickets ----------

export const taskKinds = ["take_in", "let_out", "shorten", "lengthen", "re_hem", "repair", "distress", "dye", "press", "other"] as const;
export type TaskKind = (typeof taskKinds)[number];
export const taskKindLabels: Record<TaskKind, string> = {
  take_in: "Take in",
  let_out: "Let out",
  shorten: "Shorten",
  lengthen: "Lengthen",
  re_hem: "Re-hem",
  repair: "Repair",
  distress: "Distress",
  dye: "Dye",
  press: "Press / steam",
  other: "Other",
};
/** Tasks whose work can hurt someone (chemicals, blades, heat), shown with a caution. */
export const hazardousTaskKinds: readonly TaskKind[] = ["distress", "dye", "press"];

export const alterationTaskSchema = z
  .object({
    kind: z.enum(taskKinds, { message: "must be one of: " + taskKinds.join(", ") }),
    /** Amount in millimetres (the client converts from the production's unit). */
    amountMm: z.number().min(0).max(2000).nullish(),
    note: z.string().max(500).nullish(),
    /** Distress: the stage the garment is taken to (irreversible). */
    distressStage: z.number().int().min(1).max(10).nullish(),
  })
  .refine((t) => t.kind !== "distress" || t.distressStage != null, { message: "distress needs a stage", path: ["distressStage"] });
export type AlterationTask = z.infer<typeof alterationTaskSchema>;

export const ticketStatuses = ["waiting", "in_progress", "done", "checked"] as const;
export type TicketStatus = (typeof ticketStatuses)[number];

const hoursSchema = z.number().positive("must be more than 0").max(500);

export const createTicketInputSchema = z.object({
  garmentId: idSchema,
  fittingId: idSchema.nullish(),
  tasks: z.array(alterationTaskSchema).min(1, "add at least one task").max(20),
  /** Estimated hours for the whole ticket. */
  estimateHours: hoursSchema,
  /** Workroom member; empty lets the planner choose. */
  assigneeId: idSchema.nullish(),
  notes: z.string().max(Limits.notesMax).nullish(),
});
export type CreateTicketInput = z.infer<typeof createTicketInputSchema>;

export const updateTicketInputSchema = z.object({
  tasks: z.array(alterationTaskSchema).min(1, "add at least one task").max(20).optional(),
  estimateHours: hoursSchema.optional(),
  /** Hours still to do (null = the estimate). */
  remainingHours: z.number().min(0).max(500).nullish(),
  assigneeId: idSchema.nullish(),
  notes: z.string().max(Limits.notesMax).nullish(),
});
export type UpdateTicketInput = z.infer<typeof updateTicketInputSchema>;

export const ticketStatusInputSchema = z.object({
  status: z.enum(ticketStatuses, { message: "must be one of: " + ticketStatuses.join(", ") }),
});
export type TicketStatusInput = z.infer<typeof ticketStatusInputSchema>;

export const listTicketsQuerySchema = z.object({
  status: z.enum(ticketStatuses).optional(),
  garmentId: idSchema.optional(),
  fittingId: idSchema.optional(),
});
export type ListTicketsQuery = z.infer<typeof listTicketsQuerySchema>;

export interface AlterationTicketDto {
  id: string;
  garmentId: string;
  tagCode: string;
  garmentName: string;
  fittingId: string | null;
  tasks: AlterationTask[];
  estimateHours: number;
  remainingHours: number | null;
  assigneeId: string | null;
  assigneeName: string | null;
  status: TicketStatus;
  raisedOn: string;
  checkedAt: string | null;
  notes: string | null;
}

// ---------- capacity ----------

const dayHours = z.number().min(0, "must be 0 or more").max(24, "must be at most 24");
export const hoursPerWeekdaySchema = z.object(Object.fromEntries(WEEKDAYS.map((d) => [d, dayHours])) as Record<Weekday, typeof dayHours>);

export const upsertCapacityInputSchema = z.object({
  hoursPerWeekday: hoursPerWeekdaySchema,
  daysOff: z.array(isoDateSchema).max(366).default([]),
});
export type UpsertCapacityInput = z.infer<typeof upsertCapacityInputSchema>;

export const workroomSettingsInputSchema = z.object({
  /** Working days between finishing an alteration and the shoot day. */
  bufferWorkingDays: z.number().int().min(0).max(10).optional(),
  /** Hour (0–23) at which evening reminders go out. */
  reminderHour: z.number().int().min(0).max(23).optional(),
});
export type WorkroomSettingsInput = z.infer<typeof workroomSettingsInputSchema>;

export interface CapacityDto {
  userId: string;
  name: string;
  role: string;
  hoursPerWeekday: Record<Weekday, number>;
  daysOff: string[];
}

// ---------- plan ----------

export const planQuerySchema = z.object({
  /** First day of the plan (default: today in the server's time zone). */
  from: isoDateSchema.optional(),
});

export interface PlannedTicketDto extends AlterationTicketDto {
  /** First shoot day or performance (on or after the day the ticket was raised) that needs the garment. */
  neededOn: string | null;
  dueDate: string | null;
  plannedAssigneeId: string | null;
  plannedAssigneeName: string | null;
  blocks: Array<{ personId: string; date: string; hours: number }>;
  plannedFinish: string | null;
  lateness: number | null;
  late: boolean;
  planStatus: "done" | "planned" | "unscheduled";
  unplannedHours: number;
}

export interface WorkroomPlanDto {
  from: string;
  horizonDays: number;
  bufferWorkingDays: number;
  people: Array<{ id: string; name: string }>;
  shootDays: Array<{ id: string; date: string; dayNumber: number; kind: "shoot" | "performance" }>;
  tickets: PlannedTicketDto[];
  overbookedDays: Array<{ personId: string; date: string; capacityHours: number; plannedHours: number; lateTicketIds: string[] }>;
  snags: Snag[];
  summary: { lateCount: number; unscheduledCount: number; maxLateness: number | null; openCount: number };
}

/** Pickers for the workroom forms (performers, changes, garments, members). */
export interface WorkroomOptionsDto {
  performers: Array<{ id: string; name: string; email: string | null }>;
  changes: Array<{ id: string; label: string; performerId: string | null }>;
  garments: Array<{ id: string; tagCode: string; name: string; status: string }>;
  members: Array<{ id: string; name: string; role: string }>;
  settings: { bufferWorkingDays: number; reminderHour: number };
}

// ---------- e-mail jobs ----------

export const emailJobStatuses = ["pending", "sent", "retrying", "failed"] as const;
export type EmailJobStatus = (typeof emailJobStatuses)[number];
export const listEmailJobsQuerySchema = z.object({ status: z.enum(emailJobStatuses).optional() });

export interface EmailJobDto {
  id: string;
  kind: string;
  recipient: string;
  subject: string;
  status: EmailJobStatus;
  attempts: number;
  lastError: string | null;
  sentAt: string | null;
  createdAt: string;
}
