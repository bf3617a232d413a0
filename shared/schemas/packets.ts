import { z } from "zod";
import { idSchema } from "./common.js";
import { Limits } from "../constants.js";
import type { FabricSimulationValues } from "../domain/fabric-physics.js";
import type { CantileverRetest } from "../domain/cantilever.js";
import type { SeamStatus } from "../domain/panels/seams.js";
import type { PacketDiff } from "../domain/packet-diff.js";
import { DEFAULT_MESH_EDGE_MM, MESH_EDGE_RANGE_MM } from "../domain/panels/mesh.js";

/** The choices of a packet, each optional (for create and update bodies). */
const packetChoiceFields = {
  /** Garments of the change whose panels go in. */
  garmentIds: z.array(idSchema).max(100),
  /** Panels of those garments; an empty list means every panel of the chosen garments. */
  panelIds: z.array(idSchema).max(Limits.packetMaxPanels, { message: `a packet holds at most ${Limits.packetMaxPanels} panels` }),
  /** Reference photos (fittings, continuity, garment turnarounds). */
  photoIds: z.array(idSchema).max(500),
  /** Effects shots: appearances marked vfx_shot. */
  appearanceIds: z.array(idSchema).max(500),
  /** vfx members to publish to. */
  recipientUserIds: z.array(idSchema).max(50),
  /** Personal data: off unless chosen. */
  includeMeasurements: z.boolean(),
  notes: z.string().max(5000).nullable(),
  /** Target edge length of the simulation meshes, mm. */
  meshEdgeMm: z
    .number()
    .min(MESH_EDGE_RANGE_MM.min, { message: `must be at least ${MESH_EDGE_RANGE_MM.min} mm` })
    .max(MESH_EDGE_RANGE_MM.max, { message: `must be at most ${MESH_EDGE_RANGE_MM.max} mm` }),
};

/** What a packet holds, as chosen by the cutter or supervisor (defaults filled in). */
export const packetSelectionSchema = z.object({
  garmentIds: packetChoiceFields.garmentIds.default([]),
  panelIds: packetChoiceFields.panelIds.default([]),
  photoIds: packetChoiceFields.photoIds.default([]),
  appearanceIds: packetChoiceFields.appearanceIds.default([]),
  recipientUserIds: packetChoiceFields.recipientUserIds.default([]),
  includeMeasurements: packetChoiceFields.includeMeasurements.default(false),
  notes: packetChoiceFields.notes.default(null),
  meshEdgeMm: packetChoiceFields.meshEdgeMm.default(DEFAULT_MESH_EDGE_MM),
});
export type PacketSelection = z.infer<typeof packetSelectionSchema>;

/** Starts a draft for a change; omitted choices are copied from the newest version (or defaulted). */
export const createPacketInputSchema = z.object(packetChoiceFields).partial().extend({ changeId: idSchema });
export type CreatePacketInput = z.infer<typeof createPacketInputSchema>;

/** Changes some choices of a draft. */
export const updatePacketInputSchema = z.object(packetChoiceFields).partial();
export type UpdatePacketInput = z.infer<typeof updatePacketInputSchema>;

export const listPacketsQuerySchema = z.object({ changeId: idSchema.optional() });
export const packetOptionsQuerySchema = z.object({ changeId: idSchema });

// ---------------------------------------------------------------------------------------------
// The frozen snapshot of a published version (contents jsonb) and the wire types.

export interface PacketPanelSnapshot {
  id: string;
  garmentId: string;
  garmentName: string;
  name: string;
  outline: [number, number][];
  grainline: [[number, number], [number, number]] | null;
  notches: { point: [number, number]; edge: number }[];
  seamAllowanceMm: number;
  cutCount: number;
  mirrored: boolean;
  grainMode: "straight" | "bias" | "free";
  fabricId: string | null;
  areaMm2: number;
}

export interface PacketSeamSnapshot {
  id: string;
  name: string;
  a: {
    panelId: string;
    from: number | { edge: number; t: number };
    to: number | { edge: number; t: number };
    direction: "forward" | "backward";
  };
  b: {
    panelId: string;
    from: number | { edge: number; t: number };
    to: number | { edge: number; t: number };
    direction: "forward" | "backward";
  };
  lengthAMm: number;
  lengthBMm: number;
  differenceMm: number;
  status: SeamStatus;
  eased: { minMm: number; maxMm: number } | null;
  toleranceMm: number;
}

export interface PacketFabricSnapshot {
  id: string;
  name: string;
  construction: "woven" | "knit";
  fabricClass: string;
  fibreContent: unknown;
  widthMm: number | null;
  simulation: FabricSimulationValues;
  tests: { id: string; kind: string; direction: string | null; testedOn: string }[];
  /** Virtual cantilever re-test of the exported values (absent in versions published before it existed). */
  retest?: CantileverRetest | null;
}

export interface PacketPhotoSnapshot {
  id: string;
  /** Path inside the ZIP. */
  fileName: string;
  view: string;
  caption: string | null;
  ownerType: string;
  ownerId: string;
  contentHash: string;
  /** Storage key of the file copied into the ZIP. */
  storageKey: string | null;
}

export interface PacketShotSnapshot {
  appearanceId: string;
  sceneId: string;
  sceneNumber: string;
  storyDay: number | null;
  distressStage: number;
  wet: boolean;
  blood: boolean;
  stunt: boolean;
  notes: string | null;
  /** Continuity photos of this scene that are in the packet (ZIP paths). */
  photoFiles: string[];
}

export interface PacketContents {
  schemaVersion: 1;
  production: { id: string; title: string; kind: string };
  character: { id: string; name: string };
  change: { id: string; number: number; description: string | null };
  garments: { id: string; name: string; category: string; tagCode: string; fabricId: string | null }[];
  panels: PacketPanelSnapshot[];
  seams: PacketSeamSnapshot[];
  fabrics: PacketFabricSnapshot[];
  photos: PacketPhotoSnapshot[];
  shots: PacketShotSnapshot[];
  measurements: { performerName: string; takenOn: string; valuesMm: Record<string, number> } | null;
  notes: string | null;
  /** Target edge length of the simulation meshes, mm (absent in versions published before meshes were added: those have none). */
  meshTargetEdgeMm?: number;
}

export interface PacketRecipientDto {
  userId: string;
  name: string;
  email: string;
  notifiedAt: string | null;
  downloadedAt: string | null;
  receivedAt: string | null;
}

/** A packet (draft or published version) as the list shows it. */
export interface PacketSummaryDto {
  id: string;
  changeId: string;
  changeNumber: number;
  characterId: string;
  characterName: string;
  version: number | null;
  status: "draft" | "published";
  includeMeasurements: boolean;
  publishedAt: string | null;
  publishedByName: string | null;
  zipSha256: string | null;
  zipBytes: number | null;
  counts: { panels: number; photos: number; shots: number; fabrics: number };
  recipients: PacketRecipientDto[];
  updatedAt: string;
}

/** One packet with its contents (frozen, or computed live for a draft) and the diff to the previous version. */
export interface PacketDetailDto extends PacketSummaryDto {
  selection: PacketSelection;
  contents: PacketContents;
  previousVersion: number | null;
  diff: PacketDiff | null;
  /** For a recipient: the newest earlier version they marked received, and what changed since it (null when none). */
  sinceReceived: { version: number; receivedAt: string; diff: PacketDiff } | null;
}

/** Choices offered by the packet builder for one change. */
export interface PacketOptionsDto {
  change: { id: string; number: number; description: string | null; characterId: string; characterName: string };
  garments: { id: string; name: string; category: string; panels: { id: string; name: string; cutCount: number }[] }[];
  photos: { id: string; ownerType: string; ownerId: string; view: string; caption: string | null; label: string }[];
  shots: { appearanceId: string; sceneNumber: string; distressStage: number; wet: boolean; blood: boolean; stunt: boolean }[];
  vfxMembers: { userId: string; name: string; email: string }[];
  hasMeasurements: boolean;
}
