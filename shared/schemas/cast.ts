import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema, nameSchema } from "./common.js";

const optText = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullish()
    .transform((v) => (v ? v : null));

/** A performer: a real person (name, contact, notes). Measurements live with the Wardrobe feature. */
export const performerInputSchema = z.object({
  name: nameSchema(Limits.nameMax),
  email: z
    .email({ message: "must be an e-mail address" })
    .nullish()
    .or(z.literal(""))
    .transform((v) => (v ? v : null)),
  phone: optText(40),
  /** Agent or other contact, free text. */
  agentContact: optText(300),
  notes: optText(Limits.notesMax),
});
export type PerformerInput = z.infer<typeof performerInputSchema>;
export const updatePerformerInputSchema = performerInputSchema.partial();
export type UpdatePerformerInput = z.infer<typeof updatePerformerInputSchema>;

export interface PerformerDto {
  id: string;
  name: string;
  email: string | null;
  phone: string | null;
  agentContact: string | null;
  notes: string | null;
  /** Characters this performer plays or doubles. */
  roles: Array<{ characterId: string; characterName: string; as: "performer" | "stunt" | "photo" | "understudy" }>;
}

export const doubleKinds = ["stunt", "photo", "understudy"] as const;
export type DoubleKind = (typeof doubleKinds)[number];

export const characterInputSchema = z.object({
  name: nameSchema(Limits.nameMax),
  performerId: idSchema.nullish().transform((v) => v ?? null),
  sortOrder: z.number().int().min(0).max(100_000).optional(),
  notes: optText(Limits.notesMax),
  /** Doubles (stunt, photo) and, on stage, understudies; replaces the list when given. */
  doubles: z
    .array(z.object({ performerId: idSchema, kind: z.enum(doubleKinds) }))
    .max(20)
    .optional(),
});
export type CharacterInput = z.infer<typeof characterInputSchema>;
export const updateCharacterInputSchema = characterInputSchema.partial();
export type UpdateCharacterInput = z.infer<typeof updateCharacterInputSchema>;

export interface CharacterDto {
  id: string;
  name: string;
  sortOrder: number;
  notes: string | null;
  performer: { id: string; name: string } | null;
  doubles: Array<{ id: string; kind: DoubleKind; performer: { id: string; name: string } }>;
}

/** A character page: scenes in story order and in shoot order, with the change worn. */
export interface CharacterScheduleDto {
  character: CharacterDto;
  storyOrder: CharacterSceneDto[];
  shootOrder: Array<CharacterSceneDto & { shootDay: { id: string; dayNumber: number; date: string }; position: number }>;
}

export interface CharacterSceneDto {
  appearanceId: string;
  sceneId: string;
  sceneNumber: string;
  storyDay: number | null;
  storyOrder: number;
  setName: string | null;
  change: { id: string; number: number } | null;
  distressStage: number;
  wet: boolean;
  stunt: boolean;
  blood: boolean;
  vfxShot: boolean;
  changeHere: boolean;
  minutesSincePreviousExit: number | null;
}
