import { z } from "zod";
import { idSchema } from "./common.js";
import type { GarmentSource, GarmentStatus, WrapDisposition } from "./garments.js";
import type { PaperSize } from "./productions.js";

// ---------------------------------------------------------------------------------------------------------
// Report runs (long exports with progress)

export const reportRunKinds = ["continuity_books"] as const;
export type ReportRunKind = (typeof reportRunKinds)[number];
export const reportRunStatuses = ["queued", "running", "done", "failed"] as const;
export type ReportRunStatus = (typeof reportRunStatuses)[number];

export const reportRunParamsSchema = z.object({ runId: idSchema });

/** A long export and how far it has got. */
export interface ReportRunDto {
  id: string;
  kind: ReportRunKind;
  status: ReportRunStatus;
  /** Items finished (books written) of `total`. */
  done: number;
  total: number;
  /** Size of the finished file. */
  bytes: number | null;
  /** API path of the finished file (when done). */
  fileUrl: string | null;
  error: string | null;
  createdAt: string;
  finishedAt: string | null;
}

// ---------------------------------------------------------------------------------------------------------
// Continuity books

/** Which photo size a printed book uses: thumbnails (smallest file) or display-size images scaled for print. */
export const bookPhotoSizes = ["thumb", "display"] as const;
export type BookPhotoSize = (typeof bookPhotoSizes)[number];

/** `GET /reports/continuity/:characterId.pdf`. */
export const continuityBookQuerySchema = z.object({
  /** Only the scenes of this change (a book per change). */
  changeId: idSchema.optional(),
  photos: z.enum(bookPhotoSizes).default("thumb"),
});
export type ContinuityBookQuery = z.infer<typeof continuityBookQuerySchema>;

export const continuityBookParamsSchema = z.object({ characterId: idSchema });

/** `POST /reports/continuity/books`: every character's book in one ZIP. */
export const continuityBooksRunInputSchema = z.object({ photos: z.enum(bookPhotoSizes).default("thumb") });

/** One character on the continuity-books page. */
export interface ContinuityBookCharacterDto {
  id: string;
  name: string;
  /** Scenes the character plays in. */
  scenes: number;
  /** Continuity photos logged for the character. */
  photos: number;
  changes: Array<{ id: string; number: number; description: string | null; scenes: number }>;
}

export interface ContinuityBooksIndexDto {
  paperSize: PaperSize;
  characters: ContinuityBookCharacterDto[];
  /** The newest "all books" export, if any. */
  latestRun: ReportRunDto | null;
}

// ---------------------------------------------------------------------------------------------------------
// Tomorrow's rack list

/** `GET /reports/rack-list`: the next shoot day (or performance) after today unless a day is named. */
export const rackListQuerySchema = z.object({ shootDayId: idSchema.optional() });
export type RackListQuery = z.infer<typeof rackListQuerySchema>;

export type RackWarningLevel = "blocking" | "warning";

/** A reason a garment cannot simply be taken off the rack. */
export interface RackWarningDto {
  level: RackWarningLevel;
  message: string;
}

/** One garment (or one copy of a multiples group) for one change on the day. */
export interface RackGarmentDto {
  /** The change item's label ("jacket", "boots"). */
  label: string;
  garmentId: string | null;
  tagCode: string | null;
  name: string | null;
  category: string | null;
  rack: string | null;
  bin: string | null;
  /** Multiples: which copy (#n) the copy plan gives this day's scenes, of how many held. */
  copyNumber: number | null;
  copiesHeld: number | null;
  multiplesGroupName: string | null;
  status: GarmentStatus | null;
  /** Scene numbers this garment (copy) is worn in on the day. */
  sceneNumbers: string[];
  /** Highest distress stage required on the day. */
  distressStage: number;
  wet: boolean;
  stunt: boolean;
  blood: boolean;
  vfxShot: boolean;
  /** Wet or stunt: bring a spare copy. The spare named is the next copy in stock, if any. */
  bringSpare: boolean;
  spare: { tagCode: string; copyNumber: number | null } | null;
  warnings: RackWarningDto[];
  /** Client path that opens check-out for this garment (the QR code holds it as a full address). */
  checkOutPath: string | null;
}

export interface RackChangeDto {
  changeId: string | null;
  number: number | null;
  description: string | null;
  sceneNumbers: string[];
  garments: RackGarmentDto[];
}

export interface RackCharacterDto {
  characterId: string;
  name: string;
  /** 1-based: characters in the order they are first needed on the day. */
  callOrder: number;
  sceneNumbers: string[];
  changes: RackChangeDto[];
}

export interface RackDayDto {
  id: string;
  date: string;
  kind: "shoot" | "performance";
  dayNumber: number;
  startsAt: string | null;
  notes: string | null;
}

export interface RackListDto {
  /** Today in the production's time zone (the server's clock). */
  today: string;
  productionKind: "film" | "series" | "stage";
  /** The day the list is for; null when nothing is scheduled after today. */
  day: RackDayDto | null;
  /** Days after today, to choose another. */
  upcoming: Array<Pick<RackDayDto, "id" | "date" | "kind" | "dayNumber">>;
  characters: RackCharacterDto[];
  counts: { characters: number; garments: number; warnings: number; blocking: number };
}

// ---------------------------------------------------------------------------------------------------------
// Returns and wrap

/** A rented garment on the returns list. */
export interface RentalLineDto {
  garmentId: string;
  tagCode: string;
  name: string;
  category: string;
  vendor: string | null;
  status: GarmentStatus;
  location: string | null;
  dueOn: string | null;
  /** Days past the due date (positive = overdue), null without a due date. */
  daysOverdue: number | null;
  overdue: boolean;
  weeklyCents: number | null;
  weeks: number;
  /** Flat fee plus weekly rate × weeks. */
  hireCents: number;
}

export interface VendorReturnsDto {
  vendor: string;
  lines: RentalLineDto[];
  overdue: number;
  hireCents: number;
}

export interface LostLineDto {
  garmentId: string;
  tagCode: string;
  name: string;
  source: GarmentSource;
  vendor: string | null;
  /** When it was marked lost (the status history), as YYYY-MM-DD. */
  lostOn: string | null;
  /** What it cost (purchase, making, or the hire house's charge). */
  costCents: number | null;
}

export interface OutLineDto {
  garmentId: string;
  tagCode: string;
  name: string;
  status: GarmentStatus;
  /** Since when (the status history), YYYY-MM-DD. */
  since: string | null;
  /** Who moved it out. */
  movedBy: string | null;
  /** Who has it now, when check-out records a person (empty until then). */
  holder: string | null;
  /** When it is due back from that person, when recorded. */
  dueBack: string | null;
}

export type WrapAction = "return" | WrapDisposition | "undecided";

export interface WrapLineDto {
  garmentId: string;
  tagCode: string;
  name: string;
  category: string;
  source: GarmentSource;
  vendor: string | null;
  status: GarmentStatus;
  action: WrapAction;
  dueOn: string | null;
  costCents: number | null;
}

export interface ReturnsDto {
  today: string;
  currency: string;
  rentals: VendorReturnsDto[];
  lost: LostLineDto[];
  out: OutLineDto[];
  wrap: WrapLineDto[];
  wrapCounts: Record<WrapAction, number>;
}

/** Sections of the returns report a CSV can hold (one table each). */
export const returnsSections = ["rentals", "lost", "out", "wrap"] as const;
export type ReturnsSection = (typeof returnsSections)[number];
export const returnsCsvQuerySchema = z.object({ section: z.enum(returnsSections).default("rentals") });

// ---------------------------------------------------------------------------------------------------------
// Budget

export const budgetGroupings = ["category", "character", "change", "source"] as const;
export type BudgetGrouping = (typeof budgetGroupings)[number];
export const budgetGroupingLabels: Record<BudgetGrouping, string> = {
  category: "Category",
  character: "Character",
  change: "Change",
  source: "Source",
};

export interface BudgetRowDto {
  key: string;
  label: string;
  cents: number;
  /** Garments counted (a garment shared by n characters or changes counts 1/n in each). */
  garments: number;
}

export interface BudgetGarmentDto {
  garmentId: string;
  tagCode: string;
  name: string;
  category: string;
  source: GarmentSource;
  vendor: string | null;
  status: GarmentStatus;
  /** Purchase price, making cost, or a flat hire fee. */
  costCents: number;
  weeklyCents: number;
  weeks: number;
  /** costCents + weeklyCents × weeks. */
  totalCents: number;
}

export interface BudgetDto {
  currency: string;
  /** The hire period rentals are counted over (the production's dates or its shoot days). */
  hireFrom: string | null;
  hireTo: string | null;
  totalCents: number;
  groupings: Record<BudgetGrouping, BudgetRowDto[]>;
  /** Rental cost per week over the shoot: the weekly rates of everything on hire that week. */
  rentalWeeks: Array<{ week: number; starts: string; cents: number; garments: number }>;
  garments: BudgetGarmentDto[];
}

export const budgetCsvQuerySchema = z.object({ by: z.enum([...budgetGroupings, "garment", "week"] as const).default("garment") });
