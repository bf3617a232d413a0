import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema } from "./common.js";
import { photoViews, type PhotoDto } from "./photos.js";

/**
 * What the phone showed when an entry was captured (often without a signal): the server compares it
 * with the records when the entry arrives and marks the entry for review where they differ.
 */
export const capturedAsSchema = z.object({
  sceneNumber: z.string().trim().max(20).nullish(),
  characterName: z.string().trim().max(200).nullish(),
  shootDayNumber: z.number().int().min(1).max(10_000).nullish(),
  /** The change the breakdown gave the character in this scene (null: none set). */
  changeId: idSchema.nullish(),
  changeNumber: z.number().int().min(0).max(10_000).nullish(),
  /** The distress stage the scene asked for. */
  requiredDistress: z.number().int().min(0).max(10).nullish(),
  /** The garment copies ticked, with their tag codes (kept to name a copy deleted meanwhile). */
  garments: z
    .array(z.object({ id: idSchema, tagCode: z.string().trim().max(40) }))
    .max(40)
    .optional(),
});
export type CapturedAs = z.infer<typeof capturedAsSchema>;

/** A JSON object sent as one multipart field. */
const jsonField = <T extends z.ZodType>(schema: T) =>
  z.preprocess((v, ctx) => {
    if (v == null || v === "") return undefined;
    if (typeof v !== "string") return v;
    try {
      return JSON.parse(v) as unknown;
    } catch {
      ctx.addIssue({ code: "custom", message: "must be JSON" });
      return z.NEVER;
    }
  }, schema.optional());

/** Multipart-friendly: numbers and lists may arrive as strings from a form. */
export const continuityEntryInputSchema = z.object({
  /**
   * The id the capturing device gave the entry: however often it is sent, the production stores it
   * once and answers every repeat with that entry. With it, an entry whose scene, character or
   * garment went meanwhile is stored and marked for review instead of refused.
   */
  clientId: idSchema.optional(),
  capturedAs: jsonField(capturedAsSchema),
  shootDayId: idSchema
    .nullish()
    .or(z.literal(""))
    .transform((v) => (v ? v : null)),
  sceneId: idSchema,
  characterId: idSchema,
  distressStage: z.preprocess(
    (v) => (v === "" || v == null ? null : typeof v === "string" ? Number(v) : v),
    z.number().int().min(0).max(10).nullable(),
  ),
  /** What is not obvious from the photos ("collar open, left cuff rolled twice"). */
  notes: z
    .string()
    .trim()
    .max(Limits.notesMax)
    .nullish()
    .transform((v) => (v ? v : null)),
  /** Garment copies worn. */
  garmentIds: z.preprocess((v) => (v == null || v === "" ? [] : Array.isArray(v) ? v : [v]), z.array(idSchema).max(40)),
  /** The view of each attached photo, in file order. */
  views: z.preprocess((v) => (v == null || v === "" ? [] : Array.isArray(v) ? v : [v]), z.array(z.enum(photoViews)).max(12)),
});
export type ContinuityEntryInput = z.infer<typeof continuityEntryInputSchema>;

export const updateContinuityEntryInputSchema = z.object({
  distressStage: z.number().int().min(0).max(10).nullable().optional(),
  notes: z.string().trim().max(Limits.notesMax).nullish(),
  garmentIds: z.array(idSchema).max(40).optional(),
  /** Files an entry under a scene (an entry whose scene was deleted while it waited on a phone). */
  sceneId: idSchema.optional(),
  /** Files an entry under a character (one whose character was deleted meanwhile). */
  characterId: idSchema.optional(),
  /** Someone looked at the review marks and settled them. */
  reviewed: z.literal(true).optional(),
});
export type UpdateContinuityEntryInput = z.infer<typeof updateContinuityEntryInputSchema>;

export const listContinuityQuerySchema = z.object({
  characterId: idSchema.optional(),
  sceneId: idSchema.optional(),
  shootDayId: idSchema.optional(),
  /** `open`: only entries with review marks nobody settled yet. */
  review: z.enum(["open"]).optional(),
});

/** Why an entry that waited on a phone needs a look (see shared/domain/offline-review.ts). */
export const reviewCodes = [
  "scene_deleted",
  "scene_renumbered",
  "shoot_day_deleted",
  "scene_left_day",
  "character_deleted",
  "character_left_scene",
  "change_differs",
  "state_differs",
  "garment_deleted",
] as const;
export type ReviewCode = (typeof reviewCodes)[number];
export interface ReviewReason {
  code: ReviewCode;
  /** Plain words with the names and numbers: "Scene 12 was deleted before this entry arrived." */
  message: string;
}

export interface ContinuityEntryDto {
  id: string;
  /** The capturing device's id for the entry (null when logged without one). */
  clientId: string | null;
  shootDayId: string | null;
  /** Null when the scene was deleted before the entry arrived (see `review`). */
  sceneId: string | null;
  /** The scene's number, or the number the phone showed when the scene is gone. */
  sceneNumber: string;
  storyDay: number | null;
  storyOrder: number;
  /** Null when the character was deleted before the entry arrived. */
  characterId: string | null;
  characterName: string;
  distressStage: number | null;
  notes: string | null;
  garmentIds: string[];
  loggedBy: string | null;
  createdAt: string;
  photos: PhotoDto[];
  /** What the phone showed at capture, when the entry came through the offline queue. */
  capturedAs: CapturedAs | null;
  review: {
    /** Empty when the records matched what the phone showed. */
    reasons: ReviewReason[];
    /** True while there are reasons nobody settled yet. */
    open: boolean;
    resolvedAt: string | null;
    resolvedByName: string | null;
  };
}

/** A character's timeline: every scene in story order, with the entries logged for it. */
export interface ContinuityTimelineDto {
  character: { id: string; name: string };
  scenes: Array<{
    sceneId: string;
    number: string;
    storyDay: number | null;
    storyOrder: number;
    change: { id: string; number: number } | null;
    distressStage: number;
    entries: ContinuityEntryDto[];
  }>;
  /** The character's entries whose scene was deleted before they arrived (marked for review). */
  unplaced: ContinuityEntryDto[];
}
