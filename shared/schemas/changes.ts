import { z } from "zod";
import { Limits } from "../constants.js";
import { idSchema, nameSchema } from "./common.js";

export const changeApprovals = ["draft", "proposed", "approved"] as const;
export type ChangeApproval = (typeof changeApprovals)[number];

/** One piece of a change; points at one garment or one multiples group, or neither yet. */
export const changeItemInputSchema = z
  .object({
    label: nameSchema(120),
    garmentId: idSchema.nullish().transform((v) => v ?? null),
    multiplesGroupId: idSchema.nullish().transform((v) => v ?? null),
  })
  .refine((v) => !(v.garmentId && v.multiplesGroupId), {
    message: "point at a garment or a multiples group, not both",
    path: ["multiplesGroupId"],
  });
export type ChangeItemInput = z.infer<typeof changeItemInputSchema>;

const storyDay = z
  .number()
  .int()
  .min(1)
  .max(999)
  .nullish()
  .transform((v) => v ?? null);

export const changeInputSchema = z
  .object({
    characterId: idSchema,
    /** Numbered per character; the next free number when omitted. */
    number: z.number().int().min(1).max(999).optional(),
    description: z
      .string()
      .trim()
      .max(Limits.notesMax)
      .nullish()
      .transform((v) => (v ? v : null)),
    storyDayFrom: storyDay,
    storyDayTo: storyDay,
    /** Replaces the item list when given, in this order. */
    items: z.array(changeItemInputSchema).max(40).optional(),
  })
  .refine((v) => v.storyDayFrom == null || v.storyDayTo == null || v.storyDayTo >= v.storyDayFrom, {
    message: "must not be before the first story day",
    path: ["storyDayTo"],
  });
export type ChangeInput = z.infer<typeof changeInputSchema>;

export const updateChangeInputSchema = z
  .object({
    number: z.number().int().min(1).max(999).optional(),
    description: z.string().trim().max(Limits.notesMax).nullish(),
    storyDayFrom: storyDay.optional(),
    storyDayTo: storyDay.optional(),
    items: z.array(changeItemInputSchema).max(40).optional(),
  })
  .refine((v) => v.storyDayFrom == null || v.storyDayTo == null || v.storyDayTo >= v.storyDayFrom, {
    message: "must not be before the first story day",
    path: ["storyDayTo"],
  });
export type UpdateChangeInput = z.infer<typeof updateChangeInputSchema>;

export const changeApprovalInputSchema = z.object({ approval: z.enum(changeApprovals) });

export const listChangesQuerySchema = z.object({ characterId: idSchema.optional() });

export interface ChangeDto {
  id: string;
  characterId: string;
  characterName: string;
  number: number;
  description: string | null;
  storyDayFrom: number | null;
  storyDayTo: number | null;
  approval: ChangeApproval;
  approvedAt: string | null;
  items: Array<{ id: string; label: string; garmentId: string | null; multiplesGroupId: string | null; sortOrder: number }>;
  /** Scenes this change is worn in, in story order. */
  scenes: Array<{ sceneId: string; number: string; storyDay: number | null; distressStage: number }>;
}
