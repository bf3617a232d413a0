import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema } from "./common.js";
import { photoViews, type PhotoDto } from "./photos.js";

/** Multipart-friendly: numbers and lists may arrive as strings from a form. */
export const continuityEntryInputSchema = z.object({
  shootDayId: idSchema.nullish().or(z.literal("")).transform((v) => (v ? v : null)),
  sceneId: idSchema,
  characterId: idSchema,
  distressStage: z.preprocess((v) => (v === "" || v == null ? null : typeof v === "string" ? Number(v) : v), z.number().int().min(0).max(10).nullable()),
  /** What is not obvious from the photos ("collar open, left cuff rolled twice"). */
  notes: z.string().trim().max(Limits.notesMax).nullish().transform((v) => (v ? v : null)),
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
});

export const listContinuityQuerySchema = z.object({
  characterId: idSchema.optional(),
  sceneId: idSchema.optional(),
  shootDayId: idSchema.optional(),
});

export interface ContinuityEntryDto {
  id: string;
  shootDayId: string | null;
  sceneId: string;
  sceneNumber: string;
  storyDay: number | null;
  storyOrder: number;
  characterId: string;
  characterName: string;
  distressStage: number | null;
  notes: string | null;
  garmentIds: string[];
  loggedBy: string | null;
  createdAt: string;
  photos: PhotoDto[];
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
}
