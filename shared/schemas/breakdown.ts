import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema, isoDateSchema, paginationQuerySchema, optionalNameSchema } from "./common.js";

export const intExtValues = ["INT", "EXT", "INT/EXT"] as const;
export type IntExt = (typeof intExtValues)[number];

/** Scene numbers: digits with an optional letter suffix for inserted scenes (`42`, `42A`, `42AB`). */
export const sceneNumberSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[0-9]{1,4}[A-Z]{0,3}$/, "must be digits with an optional letter suffix, like 42 or 42A");

const optText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullish()
    .transform((v) => (v ? v : null));

/** Fields of a scene; length is in eighths of a page (film) or running minutes (stage). */
export const sceneInputSchema = z.object({
  number: sceneNumberSchema,
  /** Set or location name. */
  setName: optionalNameSchema(200),
  intExt: z
    .enum(intExtValues)
    .nullish()
    .transform((v) => v ?? null),
  /** DAY, NIGHT, DAWN, DUSK, CONTINUOUS… */
  timeOfDay: optText(20),
  /** Story day (1-based) the scene plays in. */
  storyDay: z
    .number()
    .int()
    .min(1)
    .max(999)
    .nullish()
    .transform((v) => v ?? null),
  /** Position in the story; on stage this is the running order. Appended at the end when omitted. */
  storyOrder: z.number().int().min(0).max(1_000_000).optional(),
  /** Film: page length in eighths (1 3/8 pages = 11). */
  lengthEighths: z
    .number()
    .int()
    .min(0)
    .max(8 * 200)
    .nullish()
    .transform((v) => v ?? null),
  /** Stage: running time in minutes. */
  runningMinutes: z
    .number()
    .min(0)
    .max(600)
    .nullish()
    .transform((v) => v ?? null),
  synopsis: optText(Limits.notesMax),
});
export type SceneInput = z.infer<typeof sceneInputSchema>;
export const updateSceneInputSchema = sceneInputSchema.partial();
export type UpdateSceneInput = z.infer<typeof updateSceneInputSchema>;

/** Scene list filters; the breakdown table loads every scene at once (virtualised on the client). */
export const listScenesQuerySchema = paginationQuerySchema.extend({
  pageSize: z.coerce.number().int().min(1).max(5000).default(Limits.pageSizeDefault),
  storyDay: z.coerce.number().int().optional(),
  shootDayId: idSchema.optional(),
  characterId: idSchema.optional(),
  setName: z.string().trim().max(200).optional(),
});
export type ListScenesQuery = z.infer<typeof listScenesQuerySchema>;

export interface SceneDto {
  id: string;
  number: string;
  setName: string | null;
  intExt: IntExt | null;
  timeOfDay: string | null;
  storyDay: number | null;
  storyOrder: number;
  lengthEighths: number | null;
  runningMinutes: number | null;
  synopsis: string | null;
}

/** A scene row of the breakdown table: the scene plus where it is shot and who is in it. */
export interface SceneRowDto extends SceneDto {
  shootDays: Array<{ id: string; dayNumber: number; date: string }>;
  characters: Array<{ id: string; name: string; changeNumber: number | null }>;
}

export const shootDayKinds = ["shoot", "performance"] as const;

/** A shoot day (film) or a performance (stage: curtain time, running order = story order). */
export const shootDayInputSchema = z.object({
  dayNumber: z.number().int().min(1).max(10_000),
  date: isoDateSchema,
  kind: z.enum(shootDayKinds).default("shoot"),
  /** Curtain or call time, HH:MM. */
  startsAt: z
    .string()
    .regex(/^([01][0-9]|2[0-3]):[0-5][0-9]$/, "must be a time as HH:MM")
    .nullish()
    .transform((v) => v ?? null),
  notes: optText(Limits.notesMax),
  /** Scene ids in shooting order (film); ignored for performances. */
  sceneIds: z.array(idSchema).max(200).optional(),
});
export type ShootDayInput = z.infer<typeof shootDayInputSchema>;
export const updateShootDayInputSchema = shootDayInputSchema.partial();
export type UpdateShootDayInput = z.infer<typeof updateShootDayInputSchema>;

/** Move one scene from a shoot day to another in one step (both days renumber their positions). */
export const moveSceneInputSchema = z.object({
  sceneId: idSchema,
  /** The day the scene goes to. */
  toShootDayId: idSchema,
  /** 1-based place on the new day; last when omitted. */
  position: z.number().int().min(1).max(500).optional(),
});
export type MoveSceneInput = z.infer<typeof moveSceneInputSchema>;

export const listShootDaysQuerySchema = paginationQuerySchema.extend({
  pageSize: z.coerce.number().int().min(1).max(2000).default(Limits.pageSizeDefault),
  kind: z.enum(shootDayKinds).optional(),
  from: isoDateSchema.optional(),
});

export interface ShootDayDto {
  id: string;
  dayNumber: number;
  date: string;
  kind: "shoot" | "performance";
  startsAt: string | null;
  notes: string | null;
  /** Scenes in the day's order (film); for a performance, the show's running order. */
  scenes: Array<{ id: string; number: string; position: number; setName: string | null; storyDay: number | null }>;
}

export const appearanceFlags = ["wet", "stunt", "blood", "vfxShot"] as const;

/** Which change a character wears in a scene and the state the scene needs. */
export const appearanceInputSchema = z.object({
  sceneId: idSchema,
  characterId: idSchema,
  changeId: idSchema.nullish().transform((v) => v ?? null),
  /** 0 = clean; higher stages are more distressed and cannot go back. */
  distressStage: z.number().int().min(0).max(10).default(0),
  wet: z.boolean().default(false),
  stunt: z.boolean().default(false),
  blood: z.boolean().default(false),
  vfxShot: z.boolean().default(false),
  /** The character changes clothes during this scene. */
  changeHere: z.boolean().default(false),
  notes: optText(Limits.notesMax),
});
export type AppearanceInput = z.infer<typeof appearanceInputSchema>;
export const updateAppearanceInputSchema = appearanceInputSchema.omit({ sceneId: true, characterId: true }).partial();
export type UpdateAppearanceInput = z.infer<typeof updateAppearanceInputSchema>;

export const listAppearancesQuerySchema = z.object({
  sceneId: idSchema.optional(),
  characterId: idSchema.optional(),
  changeId: idSchema.optional(),
});

export interface AppearanceDto {
  id: string;
  sceneId: string;
  characterId: string;
  changeId: string | null;
  distressStage: number;
  wet: boolean;
  stunt: boolean;
  blood: boolean;
  vfxShot: boolean;
  changeHere: boolean;
  notes: string | null;
}

/** A scene page: the scene, its shoot days and each character with the change worn. */
export interface SceneDetailDto extends SceneDto {
  shootDays: Array<{ id: string; dayNumber: number; date: string; kind: "shoot" | "performance" }>;
  appearances: Array<
    AppearanceDto & {
      characterName: string;
      change: { id: string; number: number; description: string | null } | null;
      /** Stage: minutes of running time since this character's previous exit (null: first entrance). */
      minutesSincePreviousExit: number | null;
    }
  >;
}

/** One line of an import preview's error list. */
export interface ImportRowError {
  /** Line in the file (the header is line 1). */
  line: number;
  column: string;
  message: string;
}

export const breakdownImportInputSchema = z.object({
  /** The CSV text as read from the file. */
  csv: z.string().min(1, "is empty").max(4_000_000, "is too large"),
  fileName: z.string().max(255).optional(),
});

/** One field of one row in the import preview: the stored value and the file's (as written in CSV). */
export interface ImportFieldChange {
  /** A CSV column, or "shoot day N" for the row's place on that day ("position 3"). */
  column: string;
  old: string;
  new: string;
}

/** One data row of the file: what it does to its scene. */
export interface ImportRowChange {
  line: number;
  scene: string;
  status: "new" | "changed" | "unchanged";
  /** Only the fields whose value changes. */
  fields: ImportFieldChange[];
}

/** One shoot day named in the file: date and scene order before and after. */
export interface ImportDayChange {
  dayNumber: number;
  status: "new" | "changed" | "unchanged";
  date: { old: string; new: string };
  scenes: { old: string[]; new: string[] };
}

/** Counts of an import: records made, changed, and named in the file but left as they were. */
export interface ImportCounts {
  created: number;
  updated: number;
  unchanged: number;
}

export interface ImportPreviewDto {
  valid: boolean;
  rows: number;
  scenes: ImportCounts;
  shootDays: ImportCounts;
  errors: ImportRowError[];
  /** Per data row, each field's old → new value (nothing is written by a preview). */
  changes: ImportRowChange[];
  days: ImportDayChange[];
}

export interface ImportResultDto {
  rows: number;
  scenes: ImportCounts;
  shootDays: ImportCounts;
}
