import { z } from "zod";
import { idSchema, nameSchema } from "./common.js";
import { validatePolygon, type Point } from "../domain/panels/geometry.js";
import type { SeamStatus } from "../domain/panels/seams.js";
import type { FabricSimulationValues } from "../domain/fabric-physics.js";
import type { CantileverRetest } from "../domain/cantilever.js";
import type { Placement } from "../domain/panels/nesting.js";
import { Limits } from "../constants.js";
import { DXF_UNITS, type DxfUnit } from "../domain/panels/dxf-units.js";

/** Largest coordinate accepted, mm (a 10 m piece is already far beyond any garment). */
const COORD_MAX = 10_000;

/** A point [x, y] in millimetres, y up. */
export const pointSchema = z.tuple([
  z.number().finite().min(-COORD_MAX).max(COORD_MAX),
  z.number().finite().min(-COORD_MAX).max(COORD_MAX),
]);

/** A closed outline: at least 3 points, no self-intersection, not repeated at the end. */
export const outlineSchema = z
  .array(pointSchema)
  .min(3, { message: "needs at least 3 points" })
  .max(Limits.panelMaxVertices, {
    message: `has more than ${Limits.panelMaxVertices.toLocaleString("en-GB")} points (the most a piece may have)`,
  })
  .superRefine((pts, ctx) => {
    const check = validatePolygon(pts as Point[]);
    if (!check.valid) ctx.addIssue({ code: "custom", message: check.issues.map((i) => i.message).join("; ") });
  });

/** Grainline: two distinct points; the arrow runs from the first to the second. */
export const grainlineSchema = z
  .tuple([pointSchema, pointSchema])
  .refine(([a, b]) => a[0] !== b[0] || a[1] !== b[1], { message: "the two grainline points must differ" });

/** A notch: a point on the outline and the edge (vertex i → i+1) it sits on. */
export const notchSchema = z.object({ point: pointSchema, edge: z.number().int().min(0) });

export const grainModes = ["straight", "bias", "free"] as const;

/** Fields of a panel a cutter edits (no defaults, so a partial update leaves the others alone). */
const panelFields = {
  /** Piece name, e.g. "Front". */
  name: nameSchema(120),
  /** Sew line, mm, y up. */
  outline: outlineSchema,
  grainline: grainlineSchema.nullable(),
  notches: z.array(notchSchema).max(200),
  /** Seam allowance outside the sew line, mm. */
  seamAllowanceMm: z.number().min(0).max(100),
  /** Copies cut. */
  cutCount: z.number().int().min(1).max(99),
  /** Copies cut as mirrored pairs. */
  mirrored: z.boolean(),
  /** Rotation freedom on the fabric. */
  grainMode: z.enum(grainModes),
  /** Fabric the piece is cut from; null takes the garment's fabric. */
  fabricId: idSchema.nullable(),
};

/** A new panel's fields, with defaults. */
export const panelFieldsSchema = z.object({
  ...panelFields,
  grainline: panelFields.grainline.default(null),
  notches: panelFields.notches.default([]),
  seamAllowanceMm: panelFields.seamAllowanceMm.default(10),
  cutCount: panelFields.cutCount.default(1),
  mirrored: panelFields.mirrored.default(false),
  grainMode: panelFields.grainMode.default("straight"),
  fabricId: panelFields.fabricId.default(null),
});

/** Notches must name an edge of the outline. */
function notchesOnOutline<T extends { outline?: unknown; notches?: Array<{ edge: number }> }>(v: T, ctx: z.RefinementCtx) {
  const n = Array.isArray(v.outline) ? v.outline.length : undefined;
  if (n === undefined || !v.notches) return;
  v.notches.forEach((notch, i) => {
    if (notch.edge >= n)
      ctx.addIssue({ code: "custom", path: ["notches", i, "edge"], message: `edge ${notch.edge} does not exist (outline has ${n} edges)` });
  });
}

export const createPanelInputSchema = panelFieldsSchema.extend({ garmentId: idSchema }).superRefine(notchesOnOutline);
export type CreatePanelInput = z.infer<typeof createPanelInputSchema>;

export const updatePanelInputSchema = z.object(panelFields).partial().superRefine(notchesOnOutline);
export type UpdatePanelInput = z.infer<typeof updatePanelInputSchema>;

export const listPanelsQuerySchema = z.object({ garmentId: idSchema.optional(), changeId: idSchema.optional() });

const dxfUnits = Object.keys(DXF_UNITS) as [DxfUnit, ...DxfUnit[]];

/** Multipart fields sent with a DXF file for the preview. */
export const dxfPreviewFieldsSchema = z.object({
  /** Drawing units to use instead of the file's own (for files that do not say); empty = the file's. */
  units: z
    .union([z.enum(dxfUnits), z.literal("")])
    .optional()
    .transform((v) => v || undefined),
  /** Seam allowance for pieces without a separate cut and sew line in the file, mm. */
  seamAllowanceMm: z.coerce.number().min(0).max(100).default(10),
});
export type DxfPreviewFields = z.infer<typeof dxfPreviewFieldsSchema>;

/** Multipart fields sent with a DXF file to import it. */
export const dxfImportFieldsSchema = dxfPreviewFieldsSchema.extend({
  garmentId: idSchema,
  fabricId: z
    .union([idSchema, z.literal("")])
    .optional()
    .transform((v) => v || null),
});
export type DxfImportFields = z.infer<typeof dxfImportFieldsSchema>;

/** A run end: a vertex index or a position along an edge (0 ≤ t ≤ 1). */
export const runEndSchema = z.union([z.number().int().min(0), z.object({ edge: z.number().int().min(0), t: z.number().min(0).max(1) })]);

/** One side of a seam: a run along a panel's sew line. */
export const seamSideSchema = z.object({
  panelId: idSchema,
  from: runEndSchema,
  to: runEndSchema,
  direction: z.enum(["forward", "backward"]).default("forward"),
});

/** Allowed ease, side A minus side B, mm. */
export const easeRangeSchema = z
  .object({ minMm: z.number().min(-500).max(500), maxMm: z.number().min(-500).max(500) })
  .refine((e) => e.minMm <= e.maxMm, { message: "minimum must not exceed maximum", path: ["maxMm"] });

const seamFields = {
  name: nameSchema(120),
  a: seamSideSchema,
  b: seamSideSchema,
  /** Plain-seam tolerance, mm; null uses the production's setting (3 mm by default). */
  toleranceMm: z.number().min(0).max(100).nullable(),
  /** Set for eased seams (e.g. a sleeve cap): A − B must fall in the range. */
  eased: easeRangeSchema.nullable(),
};
export const createSeamInputSchema = z.object({
  ...seamFields,
  toleranceMm: seamFields.toleranceMm.default(null),
  eased: seamFields.eased.default(null),
});
export type CreateSeamInput = z.infer<typeof createSeamInputSchema>;
export const updateSeamInputSchema = z.object(seamFields).partial();
export type UpdateSeamInput = z.infer<typeof updateSeamInputSchema>;

/** What to lay out: one garment or a whole change, in multiples (copies of the costume). */
export const markerInputSchema = z.object({
  scope: z.enum(["garment", "change"]),
  scopeId: idSchema,
  multiples: z.number().int().min(1).max(20).default(1),
});
export type MarkerInput = z.infer<typeof markerInputSchema>;
export const markerQuerySchema = z.object({
  scope: z.enum(["garment", "change"]),
  scopeId: idSchema,
  multiples: z.coerce.number().int().min(1).max(20).default(1),
});

export const physicsQuerySchema = z.object({ changeId: idSchema.optional(), garmentId: idSchema.optional() });

// ---------------------------------------------------------------------------------------------
// Wire types

export interface PanelDto {
  id: string;
  garmentId: string;
  name: string;
  outline: [number, number][];
  grainline: [[number, number], [number, number]] | null;
  notches: { point: [number, number]; edge: number }[];
  seamAllowanceMm: number;
  cutCount: number;
  mirrored: boolean;
  grainMode: (typeof grainModes)[number];
  fabricId: string | null;
  /** The fabric actually used: the panel's own, else the garment's. */
  effectiveFabricId: string | null;
  source: "drawn" | "dxf";
  sortOrder: number;
  /** Sew-line area, mm² (shoelace). */
  areaMm2: number;
  /** Cut-line area, mm²; null when the cut line cannot be drawn from this outline. */
  cutAreaMm2: number | null;
  perimeterMm: number;
  updatedAt: string;
}

export interface SeamSideDto {
  panelId: string;
  panelName: string;
  garmentId: string;
  from: z.infer<typeof runEndSchema>;
  to: z.infer<typeof runEndSchema>;
  direction: "forward" | "backward";
}

export interface SeamDto {
  id: string;
  name: string;
  a: SeamSideDto;
  b: SeamSideDto;
  /** The tolerance as stored (null = production default). */
  toleranceMm: number | null;
  /** The tolerance applied. */
  effectiveToleranceMm: number;
  eased: { minMm: number; maxMm: number } | null;
  lengthA: number;
  lengthB: number;
  differenceMm: number;
  status: SeamStatus;
  message: string;
}

/** A garment of a change, as the doubles screen lists it. */
export interface DoublesGarmentDto {
  id: string;
  name: string;
  category: string;
  tagCode: string;
  fabricId: string | null;
  fabricName: string | null;
  panelCount: number;
}

/** A character's change with its garments. */
export interface DoublesChangeDto {
  id: string;
  number: number;
  description: string | null;
  characterId: string;
  characterName: string;
  garments: DoublesGarmentDto[];
}

/** A fabric option for panel forms. */
export interface DoublesFabricOptionDto {
  id: string;
  name: string;
  construction: "woven" | "knit";
  widthMm: number | null;
}

/** The yardage for one fabric of a marker. */
export interface MarkerFabricResultDto {
  fabricId: string | null;
  fabricName: string;
  usableWidthMm: number;
  markerLengthMm: number;
  lowerBoundMm: number;
  efficiency: number;
  pieceAreaMm2: number;
  copies: number;
  placements: Placement[];
  unplaced: { pieceId: string; copy: number; reason: string }[];
}

export interface MarkerDto {
  id: string;
  scope: "garment" | "change";
  scopeId: string;
  multiples: number;
  fabrics: MarkerFabricResultDto[];
  createdAt: string;
  /** False when the panels changed since the marker was laid. */
  current: boolean;
}

/** Simulation values of one fabric, for the physics table and fabrics.json. */
export interface FabricPhysicsDto {
  fabricId: string;
  name: string;
  construction: "woven" | "knit";
  fabricClass: string;
  fibreContent: unknown;
  widthMm: number | null;
  values: FabricSimulationValues;
  /** Test id → kind, direction and date, so "measured" can name its test. */
  tests: { id: string; kind: string; direction: string | null; testedOn: string }[];
  /** The exported bending values put back through the cantilever test; null without a cantilever test. */
  retest: CantileverRetest | null;
}
