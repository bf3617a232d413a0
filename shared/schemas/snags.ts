import { z } from "zod";
import { idSchema } from "./common.js";
import type { CopyAssignment, JsonValue, SnagFact, SnagKind, SnagSeverity, SnagSubject } from "../domain/snags/types.js";

export const snagKinds = [
  "fit",
  "continuity",
  "multiples",
  "booking",
  "rental",
  "availability",
  "quick_change",
  "checkout_overdue",
  "workroom_late",
  "workroom_overbooked",
] as const satisfies readonly SnagKind[];
export const snagSeverities = ["blocking", "warning", "note"] as const satisfies readonly SnagSeverity[];

/** Plain labels for the kinds, shown in filters and group headings. */
export const snagKindLabels: Record<SnagKind, string> = {
  fit: "Fit",
  continuity: "Continuity",
  multiples: "Multiples",
  booking: "Double booking",
  rental: "Rental",
  availability: "Availability",
  quick_change: "Quick change",
  checkout_overdue: "Out past due",
  workroom_late: "Workroom late",
  workroom_overbooked: "Workroom overbooked",
};

/** Query-string booleans: "true"/"1" are true, anything else (or absent) false. */
const queryFlag = z
  .union([z.boolean(), z.string()])
  .optional()
  .transform((v) => v === true || v === "true" || v === "1");

/** `GET /snags` filters; every field optional. */
export const listSnagsQuerySchema = z.object({
  /** Only snags of this severity. */
  severity: z.enum(snagSeverities).optional(),
  /** Only snags of this kind. */
  kind: z.enum(snagKinds).optional(),
  /** Only snags that concern this character (directly or through a garment the character wears). */
  characterId: idSchema.optional(),
  /** Only snags that touch this shoot day; `next` means the next shoot day (or performance) from today. */
  shootDayId: z.union([idSchema, z.literal("next")]).optional(),
  /** Also list snags that are dismissed (they carry their dismissal). */
  includeDismissed: queryFlag,
});
export type ListSnagsQuery = z.infer<typeof listSnagsQuerySchema>;

export const snagDismissalLimits = { reasonMin: 3, reasonMax: 500, keyMax: 300 } as const;

/** `POST /snags/dismissals`. */
export const dismissSnagInputSchema = z.object({
  /** The snag's stable key, as listed. */
  snagKey: z.string({ message: "is required" }).trim().min(1, "is required").max(snagDismissalLimits.keyMax),
  /** Why the department accepts this snag (shown to everyone). */
  reason: z
    .string({ message: "is required" })
    .trim()
    .min(snagDismissalLimits.reasonMin, `must be at least ${snagDismissalLimits.reasonMin} characters`)
    .max(snagDismissalLimits.reasonMax, `must be at most ${snagDismissalLimits.reasonMax} characters`),
});
export type DismissSnagInput = z.infer<typeof dismissSnagInputSchema>;

export const snagDismissalParamsSchema = z.object({ dismissalId: idSchema });
export const multiplesPlanParamsSchema = z.object({ groupId: idSchema });

/** A link to the record that fixes a snag (client path). */
export interface SnagLinkDto {
  label: string;
  href: string;
}

/** Who dismissed a snag, why and when. */
export interface SnagDismissalDto {
  id: string;
  snagKey: string;
  reason: string;
  dismissedByName: string | null;
  dismissedAt: string;
}

/** One snag, with the names of what it concerns and links to fix it. */
export interface SnagDto {
  key: string;
  kind: SnagKind;
  severity: SnagSeverity;
  title: string;
  explanation: string;
  evidence: { [key: string]: JsonValue };
  evidenceHash: string;
  subject: SnagSubject;
  characters: { id: string; name: string }[];
  garments: { id: string; tagCode: string; name: string }[];
  scenes: { id: string; number: string }[];
  shootDays: { id: string; date: string }[];
  group: { id: string; name: string } | null;
  /** First link is the record to fix. */
  links: SnagLinkDto[];
  /** Set while a dismissal matches the current evidence. */
  dismissal: SnagDismissalDto | null;
  /** A dismissal made against older evidence: the snag shows again. */
  lapsedDismissal: SnagDismissalDto | null;
  assignment?: CopyAssignment[];
  /** Present when snags with one cause were merged: each fact, as its rule stated it. */
  facts?: SnagFact[];
}

export type SnagCounts = { total: number; dismissed: number; lapsed: number } & {
  bySeverity: Record<SnagSeverity, number>;
  byKind: Record<SnagKind, number>;
};

/** `GET /snags` answer. */
export interface SnagListDto {
  /** The date snags were judged against (YYYY-MM-DD). */
  today: string;
  /** The next shoot day (or performance) on or after today, if any. */
  nextShootDay: { id: string; date: string; kind: "shoot" | "performance" } | null;
  snags: SnagDto[];
  /** Counts of the open snags after the character/shoot-day filters, before severity/kind filters. */
  counts: SnagCounts;
  /** Dismissals whose snag came back with changed evidence. */
  lapsedDismissals: SnagDismissalDto[];
  /** Filter choices: characters and shoot days of the production. */
  characters: { id: string; name: string }[];
  shootDays: { id: string; date: string }[];
}

/** One use in a multiples plan: which copy goes into which scene. */
export interface MultiplesUseDto {
  copy: number;
  garment: { id: string; tagCode: string; name: string } | null;
  sceneId: string;
  sceneNumber: string;
  shootDayId: string | null;
  date: string | null;
  characterId: string;
  characterName: string;
  stage: number;
  /** Wet or stunt: the copy is out of use for the rest of the day. */
  outForDay: boolean;
  /** Part of the longest strictly falling run of stages (the proof of the count). */
  inLongestFalling: boolean;
}

/** `GET /snags/multiples/:groupId`: the copy plan of one group. */
export interface MultiplesPlanDto {
  groupId: string;
  groupName: string;
  copiesHeld: number;
  copiesNeeded: number;
  copies: { copy: number; garment: { id: string; tagCode: string; name: string } | null; sceneNumbers: string[]; uses: number }[];
  uses: MultiplesUseDto[];
}
