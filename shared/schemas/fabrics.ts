import { z } from "zod";
import { Limits } from "../constants.js";
import { isoDateSchema, nameSchema } from "./common.js";
import { isGreyScaleGrade } from "../domain/fabric-care-tests.js";
import { checkFabricReadings } from "../domain/fabric-plausibility.js";

export const fabricConstructions = ["woven", "knit"] as const;
export type FabricConstruction = (typeof fabricConstructions)[number];

/** One fibre and its share of the cloth, in percent. */
export const fibreShareSchema = z.object({
  fibre: nameSchema(60),
  percent: z.number().positive("must be greater than 0").max(100, "cannot be more than 100"),
});

/** Fibre content: shares must add to 100 % (to within 0.05 for rounded labels such as 33.3 / 33.3 / 33.4). */
export const fibreContentSchema = z
  .array(fibreShareSchema)
  .min(1, "give at least one fibre")
  .max(8)
  .refine((xs) => Math.abs(xs.reduce((s, x) => s + x.percent, 0) - 100) <= 0.05, {
    message: "fibre percentages must add up to 100",
  });

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max)
    .nullish()
    .transform((v) => (v ? v : null));
const positiveOrNull = (what: string, max: number) =>
  z
    .number({ message: `must be a number of ${what}` })
    .positive("must be greater than 0")
    .max(max)
    .nullish()
    .transform((v) => v ?? null);
const pctOrNull = z
  .number()
  .min(0, "cannot be negative")
  .max(1000)
  .nullish()
  .transform((v) => v ?? null);

const fabricFields = {
  name: nameSchema(Limits.nameMax),
  supplier: text(160),
  fibreContent: fibreContentSchema,
  construction: z.enum(fabricConstructions),
  /** Usable width, mm. */
  widthMm: positiveOrNull("millimetres", 10_000).pipe(z.number().int("must be whole millimetres").nullable()),
  /** Declared mass per area (supplier or label), g/m². */
  massPerAreaGsm: positiveOrNull("g/m²", 5000),
  thicknessMm: positiveOrNull("millimetres", 50),
  stretchWarpPct: pctOrNull,
  stretchWeftPct: pctOrNull,
  colour: text(80),
  careNotes: text(Limits.notesMax),
};

export const createFabricInputSchema = z.object(fabricFields);
export type CreateFabricInput = z.infer<typeof createFabricInputSchema>;
export const updateFabricInputSchema = z.object(fabricFields).partial();
export type UpdateFabricInput = z.infer<typeof updateFabricInputSchema>;

/** Care treatments a shrinkage test follows. */
export const fabricCareTreatments = ["washing", "dry_cleaning"] as const;
export type FabricCareTreatment = (typeof fabricCareTreatments)[number];
export const fabricCareTreatmentLabels: Record<FabricCareTreatment, string> = { washing: "Washing", dry_cleaning: "Dry-cleaning" };

/** Agents of the colour-fastness tests we record, each with its ISO 105 part (from memory). */
export const colourfastnessAgents = ["washing", "dry_cleaning", "rubbing_dry", "rubbing_wet", "water", "perspiration"] as const;
export type ColourfastnessAgent = (typeof colourfastnessAgents)[number];
export const colourfastnessAgentLabels: Record<ColourfastnessAgent, string> = {
  washing: "Washing (ISO 105-C06)",
  dry_cleaning: "Dry-cleaning (ISO 105-D01)",
  rubbing_dry: "Rubbing, dry (ISO 105-X12)",
  rubbing_wet: "Rubbing, wet (ISO 105-X12)",
  water: "Water (ISO 105-E01)",
  perspiration: "Perspiration (ISO 105-E04)",
};

/** A grey-scale grade 1–5 in half steps (4.5 is written "4-5"). */
const grade = z
  .number({ message: "must be a grey-scale grade from 1 to 5" })
  .refine(isGreyScaleGrade, { message: "must be a grey-scale grade from 1 to 5 in half steps (1, 1-2, 2, … 4-5, 5)" });

/** One pair of marks, before and after (mm); the mark distance is usually 350 mm or 500 mm. */
const markPair = z.object({
  beforeMm: z.number({ message: "must be a number of millimetres" }).positive("must be greater than 0").max(2000, "must be under 2000 mm"),
  afterMm: z.number({ message: "must be a number of millimetres" }).positive("must be greater than 0").max(2000, "must be under 2000 mm"),
});
const markPairs = z.array(markPair).min(1, "give at least one pair of marks").max(3, "give at most three pairs of marks");

const pos = (unit: string, max: number) =>
  z
    .number({ message: `must be a number of ${unit}` })
    .positive("must be greater than 0")
    .max(max);
const direction = z.enum(["warp", "weft"]);

/** The shape of each test kind's readings (hard limits; plausibility is checked below). */
const readingsByKind = z.discriminatedUnion("kind", [
  /** ASTM D3776 option C: a cut specimen weighed. */
  z.object({ kind: z.literal("mass"), massG: pos("grams", 5000), lengthMm: pos("millimetres", 5000), widthMm: pos("millimetres", 5000) }),
  /** ASTM D1388 option A: overhang at which the strip touches the 41.5° incline. */
  z.object({
    kind: z.literal("cantilever"),
    direction,
    overhangMm: pos("millimetres", 1000),
    angleDeg: z.number().gt(0).lt(90).default(41.5),
  }),
  /** Strip tensile (ISO 13934-1 / ASTM D5035 style): load at an extension. */
  z.object({
    kind: z.literal("strip"),
    direction,
    loadN: pos("newtons", 100_000),
    stripWidthMm: pos("millimetres", 1000),
    gaugeLengthMm: pos("millimetres", 2000),
    extensionMm: pos("millimetres", 2000),
  }),
  z.object({ kind: z.literal("thickness"), thicknessMm: pos("millimetres", 50) }),
  /**
   * Shrinkage: marks measured before and after washing (ISO 6330 procedures) or dry-cleaning (ISO 3175),
   * specimen prepared and marked as in ISO 3759, change computed as in ISO 5077. One to three pairs of
   * marks in each direction.
   */
  z.object({
    kind: z.literal("shrinkage"),
    treatment: z.enum(fabricCareTreatments, { message: "must be washing or dry-cleaning" }),
    /** The procedure as run, e.g. "ISO 6330 4N, line dry" or "ISO 3175-2 normal". */
    procedure: z
      .string()
      .trim()
      .max(120)
      .nullish()
      .transform((v) => v || null),
    /** How many wash or clean cycles before measuring (1 unless the department repeats it). */
    cycles: z.number().int("must be a whole number of cycles").min(1, "must be at least 1").max(50).default(1),
    length: markPairs,
    width: markPairs,
  }),
  /** Colour fastness to one agent, read on the grey scales (ISO 105-A02 change in colour, ISO 105-A03 staining). */
  z.object({
    kind: z.literal("colourfastness"),
    agent: z.enum(colourfastnessAgents, { message: "is not a colour-fastness test we record" }),
    procedure: z
      .string()
      .trim()
      .max(120)
      .nullish()
      .transform((v) => v || null),
    /** Change in colour of the specimen, grey-scale grade 1–5 in half steps. */
    changeGrade: grade,
    /** Staining of the adjacent fabric; none for rubbing dry tests of change only. */
    stainingGrade: grade.nullish().transform((v) => v ?? null),
    /** The adjacent fabric whose staining was read (e.g. "multifibre, wool strip"). */
    adjacent: z
      .string()
      .trim()
      .max(120)
      .nullish()
      .transform((v) => v || null),
  }),
  /** Flame-retardancy treatment of the cloth (stage and set work); the certificate is a photo on the test. */
  z.object({
    kind: z.literal("flame_retardancy"),
    /** Product or process, and who applied it. */
    treatment: z.string().trim().min(1, "is required").max(160),
    treatedOn: isoDateSchema,
    /** The standard or code the certificate names (e.g. a venue's or a national test). */
    standard: z
      .string()
      .trim()
      .max(120)
      .nullish()
      .transform((v) => v || null),
    certificateRef: z
      .string()
      .trim()
      .max(120)
      .nullish()
      .transform((v) => v || null),
    /** When the treatment must be checked or renewed (many wash out). */
    renewBy: isoDateSchema.nullish().transform((v) => v ?? null),
  }),
]);

/**
 * Raw readings per test kind; all lengths mm, masses g, loads N. Each reading must also be plausible
 * (shared/domain/fabric-plausibility.ts), with the reason under the field.
 */
export const fabricTestReadingsSchema = readingsByKind.superRefine((r, ctx) => {
  for (const p of checkFabricReadings(r)) ctx.addIssue({ code: "custom", path: [p.field], message: p.reason });
});
export type FabricTestReadings = z.infer<typeof fabricTestReadingsSchema>;
export type FabricTestKind = FabricTestReadings["kind"];

export const createFabricTestInputSchema = z.object({
  testedOn: isoDateSchema,
  readings: fabricTestReadingsSchema,
  notes: text(2000),
});

/** Kinds of fabric test, in the order the form offers them. */
export const fabricTestKinds = [
  "mass",
  "cantilever",
  "strip",
  "thickness",
  "shrinkage",
  "colourfastness",
  "flame_retardancy",
] as const satisfies readonly FabricTestKind[];
export type CreateFabricTestInput = z.infer<typeof createFabricTestInputSchema>;
/** What a client sends (defaults and blank-to-null transforms still to apply). */
export type CreateFabricTestRequest = z.input<typeof createFabricTestInputSchema>;

/** Values computed from the readings, all SI (plus the familiar units used on screen). */
export interface FabricTestDerived {
  /** mass: g/m² and oz/yd² (ASTM D3776). */
  massPerAreaGsm?: number;
  massPerAreaOzYd2?: number;
  massPerAreaKgM2?: number;
  /** cantilever: bending length c (mm) and flexural rigidity G (N·m and µN·m), ASTM D1388. */
  bendingLengthMm?: number;
  flexuralRigidityNm?: number;
  flexuralRigidityMicroNm?: number;
  /** Which mass per area the rigidity used: pooled mass tests, the fabric record, or none. */
  massBasis?: "tested" | "declared";
  massPerAreaUsedGsm?: number;
  /** strip: tensile stiffness per width k = (F/b)/ε in N/m. */
  strain?: number;
  forcePerWidthNPerM?: number;
  tensileStiffnessNPerM?: number;
  /** thickness in m. */
  thicknessM?: number;
  /** shrinkage: mean dimensional change (per cent, negative = shrinkage) and cut factors. */
  lengthChangePct?: number;
  widthChangePct?: number;
  lengthCutFactor?: number;
  widthCutFactor?: number;
  /** colour fastness: grades as written ("4-5"). */
  changeLabel?: string;
  /** ΔE*ab of the change-in-colour grade's chip pair (ISO 105-A02 §2.4) and its tolerance. */
  changeDeltaE?: number;
  changeDeltaETolerance?: number;
  stainingLabel?: string | null;
}

export interface FabricTestDto {
  id: string;
  fabricId: string;
  kind: FabricTestKind;
  direction: "warp" | "weft" | null;
  readings: FabricTestReadings;
  derived: FabricTestDerived;
  testedOn: string;
  testedBy: string | null;
  testedByName: string | null;
  notes: string | null;
}

export interface FabricDto {
  id: string;
  name: string;
  supplier: string | null;
  fibreContent: Array<{ fibre: string; percent: number }>;
  construction: FabricConstruction;
  widthMm: number | null;
  massPerAreaGsm: number | null;
  massPerAreaOzYd2: number | null;
  thicknessMm: number | null;
  stretchWarpPct: number | null;
  stretchWeftPct: number | null;
  colour: string | null;
  careNotes: string | null;
  testCount: number;
  garmentCount: number;
}

/** One simulation value with where it came from. */
export interface SimValueDto {
  value: number;
  unit: string;
  basis: "measured" | "assumed";
  note?: string;
}

export interface FabricDetailDto extends FabricDto {
  tests: FabricTestDto[];
  /** SI values for a cloth simulator (measured where tested, class defaults otherwise). */
  simulation: {
    fabricClass: string;
    massPerArea: SimValueDto;
    bendingStiffness: { warp: SimValueDto; weft: SimValueDto };
    stretchStiffness: { warp: SimValueDto; weft: SimValueDto };
    thickness: SimValueDto;
  };
}
