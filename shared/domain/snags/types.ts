// Plain-data input and output types for the snag (conflict) engine.
// Everything here is JSON-shaped so the server can build a snapshot from the database
// and the client can run the same computation on cached data.

export type ProductionKind = "film" | "series" | "stage";
export type FitIntent = "fitted" | "regular" | "loose";
export type Construction = "woven" | "knit";
export type GarmentSource = "built" | "bought" | "rented";
export type GarmentStatus = "in_stock" | "fitting" | "workroom" | "on_set" | "cleaning" | "returned" | "lost";

export type SnagKind =
  | "fit"
  | "continuity"
  | "multiples"
  | "booking"
  | "rental"
  | "availability"
  | "quick_change"
  // A garment checked out to someone and not back by its due date.
  | "checkout_overdue"
  // Workroom schedule (shared/domain/workroom-snags.ts).
  | "workroom_late"
  | "workroom_overbooked";
export type SnagSeverity = "blocking" | "warning" | "note";

/** An ease range in millimetres; `max: null` means the sources give no upper limit. */
export interface EaseRange {
  min: number;
  max: number | null;
}

/** Per-production ease overrides: category → garment point → fit intent → range (mm). */
export type EaseOverrides = Record<string, Record<string, Partial<Record<FitIntent, EaseRange>>>>;

export interface ProductionInfo {
  id: string;
  kind: ProductionKind;
  /** Stage only: a quick change shorter than this many minutes is flagged. */
  quickChangeThresholdMin: number;
  easeOverrides?: EaseOverrides;
}

export interface SceneRec {
  id: string;
  number: string;
  storyDay: number;
  /** Position in story order (integer, unique per production). */
  storyOrder: number;
  /** Stage: running time of the scene in minutes. */
  runningMinutes?: number | null;
  /** Stage: position in the running order (falls back to storyOrder). */
  stageOrder?: number | null;
}

export interface ShootDayRec {
  id: string;
  /** YYYY-MM-DD */
  date: string;
  /** Scenes in shooting order. */
  sceneIds: string[];
}

export interface PerformanceRec {
  id: string;
  /** YYYY-MM-DD */
  date: string;
  /** HH:MM */
  startsAt: string;
}

export interface CharacterRec {
  id: string;
  name: string;
  performerId: string | null;
  doublePerformerIds: string[];
}

export interface PerformerRec {
  id: string;
  name: string;
  /** Body measurements in mm keyed by ISO 8559-1 names (chest_girth, arm_length, ...). May be empty. */
  measurements: Record<string, number>;
}

export interface ChangeRec {
  id: string;
  characterId: string;
  number: string | number;
}

export interface ChangeItemRec {
  id: string;
  changeId: string;
  garmentId: string | null;
  multiplesGroupId: string | null;
}

export interface AppearanceRec {
  id: string;
  sceneId: string;
  characterId: string;
  changeId: string;
  /** 0 = clean, rising, irreversible. */
  distressStage: number;
  wet: boolean;
  stunt: boolean;
  blood: boolean;
  vfxShot: boolean;
  /** The breakdown marks a costume change in this scene. */
  changeHere: boolean;
}

export interface GarmentRec {
  id: string;
  tagCode: string;
  name: string;
  category: string;
  fitIntent: FitIntent;
  construction: Construction;
  /** Knits: comfortable stretch ratio R (stretched length / relaxed length), e.g. 1.25. */
  stretchRatio?: number | null;
  /** Finished garment measurements in mm keyed by point (chest, waist, hip, sleeve, ...). */
  finished: Record<string, number>;
  source: GarmentSource;
  /** YYYY-MM-DD */
  rentalDueDate?: string | null;
  status: GarmentStatus;
  multiplesGroupId?: string | null;
  copyNumber?: number | null;
}

export interface MultiplesGroupRec {
  id: string;
  name: string;
  garmentIds: string[];
}

export interface ContinuityEntryRec {
  id: string;
  appearanceId?: string | null;
  sceneId?: string | null;
  characterId?: string | null;
  shootDayId: string;
  garmentIds: string[];
  distressStage?: number | null;
}

/** An open check-out: a garment with a member or performer, due back on a date. */
export interface CheckoutRec {
  id: string;
  garmentId: string;
  /** Who has it ("Nell Carrow"). */
  toName: string;
  /** Performer id when it went out to a performer (for the link to them). */
  toPerformerId?: string | null;
  /** YYYY-MM-DD */
  dueBackOn: string;
  /** YYYY-MM-DD, the day it went out. */
  checkedOutOn: string;
  shootDayId?: string | null;
  sceneId?: string | null;
}

/** Everything the snag rules read, as plain data. */
export interface ProductionSnapshot {
  production: ProductionInfo;
  scenes: SceneRec[];
  /** Film/series. */
  shootDays: ShootDayRec[];
  /** Stage: each performance plays the running order. */
  performances?: PerformanceRec[];
  characters: CharacterRec[];
  performers: PerformerRec[];
  changes: ChangeRec[];
  changeItems: ChangeItemRec[];
  appearances: AppearanceRec[];
  garments: GarmentRec[];
  multiplesGroups: MultiplesGroupRec[];
  continuityEntries: ContinuityEntryRec[];
  /** Open check-outs (garments with someone); absent means none. */
  checkouts?: CheckoutRec[];
}

export interface SnagOptions {
  /** YYYY-MM-DD; garment status is judged against this date. */
  today: string;
}

export type JsonValue = string | number | boolean | null | JsonValue[] | { [key: string]: JsonValue };

export interface SnagSubject {
  characterId?: string;
  garmentId?: string;
  groupId?: string;
  sceneIds?: string[];
  shootDayIds?: string[];
  appearanceIds?: string[];
}

/** Which copy of a multiples group to use where (copy is 1-based, #1..#n). */
export interface CopyAssignment {
  copy: number;
  /** The group's garment for this copy, or null when the group holds too few copies. */
  garmentId: string | null;
  appearanceIds: string[];
  sceneIds: string[];
  shootDayIds: string[];
}

/** One of several facts with one cause, shown together on one card. */
export interface SnagFact {
  kind: SnagKind;
  severity: SnagSeverity;
  title: string;
  explanation: string;
}

export interface Snag {
  /** Stable: built from kind and subject ids, so a dismissal can be matched after recompute. */
  key: string;
  kind: SnagKind;
  severity: SnagSeverity;
  title: string;
  /** Plain words with the numbers that prove the conflict. */
  explanation: string;
  subject: SnagSubject;
  evidence: { [key: string]: JsonValue };
  /** FNV-1a hash of the canonical evidence: a dismissal lapses when this changes. */
  evidenceHash: string;
  assignment?: CopyAssignment[];
  /** When snags with one cause were merged into this one: each fact as its own rule stated it. */
  facts?: SnagFact[];
}

/** A snag before its evidence hash is added (rules build these; the engine finishes them). */
export type SnagDraft = Omit<Snag, "evidenceHash">;

/** One scheduled run of scenes: a shoot day (film/series) or the running order (stage). */
export interface ScheduleRun {
  /** Shoot day id, or "running-order" on stage. */
  id: string;
  isShootDay: boolean;
  /** Calendar dates this run happens on (one shoot day, or every performance date). */
  dates: string[];
  sceneIds: string[];
}

/** Lookups built once per recompute so every rule runs in near-linear time. */
export interface SnapshotIndex {
  snapshot: ProductionSnapshot;
  isStage: boolean;
  scenesById: Map<string, SceneRec>;
  charactersById: Map<string, CharacterRec>;
  performersById: Map<string, PerformerRec>;
  changesById: Map<string, ChangeRec>;
  garmentsById: Map<string, GarmentRec>;
  groupsById: Map<string, MultiplesGroupRec>;
  appearancesById: Map<string, AppearanceRec>;
  /** Items of a change, sorted by id. */
  itemsByChange: Map<string, ChangeItemRec[]>;
  /** Appearances in a scene, sorted by (characterId, id). */
  appearancesByScene: Map<string, AppearanceRec[]>;
  /** First appearance (by id) of a character in a scene, keyed `${sceneId}|${characterId}`. */
  appearanceBySceneCharacter: Map<string, AppearanceRec>;
  /** Copies of a group in copy order (copyNumber, then id). */
  groupCopies: Map<string, string[]>;
  runs: ScheduleRun[];
  /** Continuity entries resolved to their appearance (entries that resolve to none are dropped). */
  resolvedEntries: { entry: ContinuityEntryRec; appearance: AppearanceRec }[];
  /** Appearance ids that have at least one continuity entry. */
  appearancesWithEntries: Set<string>;
}
