// Fit check: ease = finished garment measurement − body measurement, per point, compared with
// the ease range for the garment's category and fit intent.
import type { EaseOverrides, EaseRange, FitIntent, GarmentRec, JsonValue, SnagDraft, SnapshotIndex } from "./types";

const INCH_MM = 25.4; // exact (1959 international yard)

/** Own-property lookup, so user-supplied names like "constructor" never hit Object.prototype. */
function own<T>(obj: Record<string, T> | undefined, key: string): T | undefined {
  return obj && Object.prototype.hasOwnProperty.call(obj, key) ? obj[key] : undefined;
}

/** Ranges quoted in inches in the handbooks, stored in mm. */
function inches(min: number, max: number | null): EaseRange {
  return { min: min * INCH_MM, max: max === null ? null : max * INCH_MM };
}

type PointKind = "girth" | "length";

interface PointDef {
  /** Body measurement keys (ISO 8559-1 names), first present wins. */
  bodyKeys: string[];
  kind: PointKind;
  label: string;
}

/** Garment points the fit check understands, mapped to body measurements. */
export const FIT_POINTS: Record<string, PointDef> = {
  chest: { bodyKeys: ["chest_girth", "bust_girth"], kind: "girth", label: "chest" },
  bust: { bodyKeys: ["bust_girth", "chest_girth"], kind: "girth", label: "bust" },
  waist: { bodyKeys: ["waist_girth"], kind: "girth", label: "waist" },
  hip: { bodyKeys: ["hip_girth"], kind: "girth", label: "hip" },
  neck: { bodyKeys: ["neck_girth"], kind: "girth", label: "neck" },
  upper_arm: { bodyKeys: ["upper_arm_girth"], kind: "girth", label: "upper arm" },
  thigh: { bodyKeys: ["thigh_girth"], kind: "girth", label: "thigh" },
  wrist: { bodyKeys: ["wrist_girth"], kind: "girth", label: "wrist" },
  head: { bodyKeys: ["head_girth"], kind: "girth", label: "head" },
  sleeve: { bodyKeys: ["arm_length"], kind: "length", label: "sleeve" },
  inside_leg: { bodyKeys: ["inside_leg_length"], kind: "length", label: "inside leg" },
  back_length: { bodyKeys: ["back_waist_length"], kind: "length", label: "back length" },
  shoulder: { bodyKeys: ["shoulder_width"], kind: "length", label: "shoulder" },
  across_back: { bodyKeys: ["across_back_width"], kind: "length", label: "across back" },
};

/** Other names a garment's finished measurements may use for a point. */
const POINT_ALIASES: Record<string, string> = {
  chest_girth: "chest",
  bust_girth: "bust",
  waist_girth: "waist",
  hip_girth: "hip",
  hips: "hip",
  seat: "hip",
  neck_girth: "neck",
  collar: "neck",
  sleeve_length: "sleeve",
  arm_length: "sleeve",
  inseam: "inside_leg",
  inside_leg_length: "inside_leg",
  back_waist_length: "back_length",
  shoulder_width: "shoulder",
  across_back_width: "across_back",
  upper_arm_girth: "upper_arm",
  bicep: "upper_arm",
  thigh_girth: "thigh",
  wrist_girth: "wrist",
  cuff: "wrist",
  head_girth: "head",
};

// Normalised names are memoised: the same few strings recur thousands of times per recompute.
const pointMemo = new Map<string, string>();
const categoryMemo = new Map<string, string>();

/** Normalise a garment point name to one of FIT_POINTS (or return it unchanged). */
export function normalisePoint(point: string): string {
  let out = pointMemo.get(point);
  if (out === undefined) {
    const p = point
      .trim()
      .toLowerCase()
      .replace(/[\s-]+/g, "_");
    out = own(POINT_ALIASES, p) ?? p;
    if (pointMemo.size < 10_000) pointMemo.set(point, out);
  }
  return out;
}

const CATEGORY_ALIASES: Record<string, string> = {
  trouser: "trousers",
  pants: "trousers",
  breeches: "trousers",
  vest: "waistcoat",
  knit: "knit_top",
  knit_top: "knit_top",
  t_shirt: "knit_top",
  tshirt: "knit_top",
  jersey_top: "knit_top",
  gown: "dress",
  overcoat: "coat",
};

/** Normalise a garment category ("Knit top", "pants") to a table key ("knit_top", "trousers"). */
export function normaliseCategory(category: string): string {
  let out = categoryMemo.get(category);
  if (out === undefined) {
    const c = category
      .trim()
      .toLowerCase()
      .replace(/[\s-]+/g, "_");
    out = own(CATEGORY_ALIASES, c) ?? c;
    if (categoryMemo.size < 10_000) categoryMemo.set(category, out);
  }
  return out;
}

interface TableEntry {
  ranges: Record<FitIntent, EaseRange>;
  source: string;
}

const CWU = "CWU costume text ch. 16 \u201cEase in Clothing\u201d";
const MCCUNN = "McCunn, How to Make Sewing Patterns (fitting ease)";
const CHARTS_M = "US home-sewing pattern charts, loose band at bust (from memory)";
const CP = "common practice, no source";

const same = (r: EaseRange): Record<FitIntent, EaseRange> => ({ fitted: r, regular: r, loose: r });

// Bust/chest of bodice-type tops: fitted = CWU bodice bust 1½–2 in; regular = McCunn bust
// fitting ease 2–4 in; loose = pattern-chart band 5–8 in (from memory).
const BODICE_BUST: TableEntry = {
  ranges: { fitted: inches(1.5, 2), regular: inches(2, 4), loose: inches(5, 8) },
  source: `${CWU} (fitted); ${MCCUNN} (regular); ${CHARTS_M} (loose)`,
};
// Shirts: CWU fitted shirts 1½–2½ in, classic shirts up to 3 in.
const SHIRT_CHEST: TableEntry = {
  ranges: { fitted: inches(1.5, 2.5), regular: inches(1.5, 3), loose: inches(5, 8) },
  source: `${CWU} (fitted, classic shirts); ${CHARTS_M} (loose)`,
};
// Waist of bodices/dresses: CWU dresses ¾–1 in; McCunn waist 1–2 in; a loose cut has no upper limit.
const BODICE_WAIST: TableEntry = {
  ranges: { fitted: inches(0.75, 1), regular: inches(1, 2), loose: inches(1, null) },
  source: `${CWU} (fitted); ${MCCUNN} (regular, loose minimum)`,
};
// Waistbands (skirts/trousers) sit at the waist whatever the cut: CWU ½–¾ in for every intent.
const BAND_WAIST: TableEntry = { ranges: same(inches(0.5, 0.75)), source: `${CWU} (skirts/trousers)` };
// Hips, all garments: CWU 2–2¾ in; McCunn gives 2 in as a minimum only, so no upper limit beyond fitted.
const HIP: TableEntry = {
  ranges: { fitted: inches(2, 2.75), regular: inches(2, null), loose: inches(2, null) },
  source: `${CWU} (fitted); ${MCCUNN} (minimum)`,
};
// Lengths and widths: no handbook value found; these are trade rules of thumb.
const SLEEVE: TableEntry = { ranges: same({ min: -13, max: 25 }), source: CP };
const INSIDE_LEG: TableEntry = { ranges: same({ min: -25, max: 25 }), source: CP };
const BACK_LENGTH: TableEntry = { ranges: same({ min: -13, max: 13 }), source: CP };
const SHOULDER: TableEntry = { ranges: same({ min: 0, max: 15 }), source: CP };
// A shirt collar is cut about ½ in over the neck girth.
const SHIRT_NECK: TableEntry = { ranges: same({ min: 10, max: 20 }), source: CP };

/** Default ease table: category → point → ranges per intent, with sources. */
export const EASE_TABLE: Record<string, Record<string, TableEntry>> = {
  bodice: { bust: BODICE_BUST, chest: BODICE_BUST, waist: BODICE_WAIST, sleeve: SLEEVE, back_length: BACK_LENGTH },
  dress: { bust: BODICE_BUST, chest: BODICE_BUST, waist: BODICE_WAIST, hip: HIP, sleeve: SLEEVE, back_length: BACK_LENGTH },
  blouse: { bust: BODICE_BUST, chest: BODICE_BUST, waist: BODICE_WAIST, sleeve: SLEEVE },
  knit_top: { bust: BODICE_BUST, chest: BODICE_BUST, waist: BODICE_WAIST, sleeve: SLEEVE },
  shirt: { chest: SHIRT_CHEST, bust: SHIRT_CHEST, neck: SHIRT_NECK, sleeve: SLEEVE },
  // Outer layers use the bodice values; productions that want more room override them.
  jacket: { chest: BODICE_BUST, bust: BODICE_BUST, waist: BODICE_WAIST, hip: HIP, sleeve: SLEEVE, shoulder: SHOULDER },
  coat: { chest: BODICE_BUST, bust: BODICE_BUST, waist: BODICE_WAIST, hip: HIP, sleeve: SLEEVE, shoulder: SHOULDER },
  waistcoat: { chest: BODICE_BUST, bust: BODICE_BUST, waist: BODICE_WAIST },
  trousers: { waist: BAND_WAIST, hip: HIP, inside_leg: INSIDE_LEG },
  skirt: { waist: BAND_WAIST, hip: HIP },
};

export interface EaseLookup {
  range: EaseRange;
  source: string;
}

/** The ease range for a category/point/intent: production override first, then the table. */
export function easeRangeFor(category: string, point: string, intent: FitIntent, overrides?: EaseOverrides): EaseLookup | null {
  const cat = normaliseCategory(category);
  const pt = normalisePoint(point);
  const o = own(own(own(overrides, cat), pt), intent);
  if (o) return { range: { min: o.min, max: o.max }, source: "production override" };
  const entry = own(own(EASE_TABLE, cat), pt);
  return entry ? { range: entry.ranges[intent], source: entry.source } : null;
}

export type PointStatus = "fits" | "tight" | "loose";

const EPS_MM = 1e-3;

export interface PointFit {
  point: string;
  bodyKey: string;
  finished: number;
  body: number;
  ease: number;
  min: number;
  max: number | null;
  /** Knit girths: stretch ratio that lowered the minimum, else null. */
  stretchRatio: number | null;
  status: PointStatus;
  /** How far outside the range (mm, ≥ 0). */
  by: number;
  source: string;
}

/** Per-point fit of one garment on one body (points without a body value or range are skipped). */
export function checkFit(
  garment: Pick<GarmentRec, "category" | "fitIntent" | "construction" | "stretchRatio" | "finished">,
  measurements: Record<string, number>,
  overrides?: EaseOverrides,
): PointFit[] {
  const out: PointFit[] = [];
  const points = Object.keys(garment.finished).sort();
  const seen = new Set<string>();
  for (const raw of points) {
    const point = normalisePoint(raw);
    const def = own(FIT_POINTS, point);
    const finished = garment.finished[raw];
    if (!def || seen.has(point) || typeof finished !== "number" || !Number.isFinite(finished)) continue;
    const bodyKey = def.bodyKeys.find((k) => {
      const v = own(measurements, k);
      return typeof v === "number" && Number.isFinite(v) && v > 0;
    });
    if (!bodyKey) continue;
    const lookup = easeRangeFor(garment.category, point, garment.fitIntent, overrides);
    if (!lookup) continue;
    seen.add(point);
    const body = measurements[bodyKey];
    const ease = finished - body;
    let min = lookup.range.min;
    let stretchRatio: number | null = null;
    const r = garment.stretchRatio ?? null;
    // Knits may be cut below the body within their stretch: finished ≥ body / R, i.e.
    // ease ≥ −body·(1 − 1/R) (mislope.com rule, common practice). Girths only: lengths
    // are not cut negative (patternschool.online, common practice).
    if (garment.construction === "knit" && def.kind === "girth" && r !== null && r > 1) {
      min = Math.min(min, -body * (1 - 1 / r));
      stretchRatio = r;
    }
    const max = lookup.range.max;
    let status: PointStatus = "fits";
    let by = 0;
    // A micrometre of slack so inch-derived limits (19.05 mm) are not missed by float rounding.
    if (ease < min - EPS_MM) {
      status = "tight";
      by = min - ease;
    } else if (max !== null && ease > max + EPS_MM) {
      status = "loose";
      by = ease - max;
    }
    out.push({ point, bodyKey, finished, body, ease, min, max, stretchRatio, status, by, source: lookup.source });
  }
  return out;
}

const mm = (v: number): string => `${Math.round(v)} mm`;
const mmNum = (v: number): string => `${Math.round(v)}`;

function capital(s: string): string {
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** One plain sentence for a point, e.g. "Chest ease is 12 mm; a fitted jacket needs 38–51 mm: tight by 26 mm." */
export function describePointFit(p: PointFit, intent: FitIntent, category: string): string {
  const label = FIT_POINTS[p.point]?.label ?? p.point;
  const what = `a ${intent} ${normaliseCategory(category).replace(/_/g, " ")}`;
  const range =
    p.max === null
      ? `needs at least ${mm(p.min)}`
      : p.min < 0
        ? `allows ${mm(p.min)} to ${mm(p.max)}`
        : `needs ${mmNum(p.min)}\u2013${mmNum(p.max)} mm`;
  const stretch = p.stretchRatio !== null ? ` (knit, stretch ratio ${p.stretchRatio})` : "";
  const verdict = p.status === "fits" ? "fits" : `${p.status} by ${mm(p.by)}`;
  return `${capital(label)} ease is ${mm(p.ease)}; ${what}${stretch} ${range}: ${verdict}.`;
}

/** Facts for one fit snag: a garment checked on one performer. */
export interface FitFacts {
  garment: GarmentRec;
  performerId: string;
  performerName: string;
  characterId: string;
  /** True when the performer is a double (stunt/photo) of the character. */
  asDouble: boolean;
  points: PointFit[];
}

const round1 = (v: number): number => Math.round(v * 10) / 10;

/** Build the fit snag for a garment on a performer, or null when every point fits. */
export function fitSnagFromFacts(f: FitFacts): SnagDraft | null {
  const off = f.points.filter((p) => p.status !== "fits");
  if (off.length === 0) return null;
  const tight = off.some((p) => p.status === "tight");
  const g = f.garment;
  const names = off.map((p) => `${p.status} at ${FIT_POINTS[p.point]?.label ?? p.point}`).join(", ");
  const evidence: { [k: string]: JsonValue } = {
    category: normaliseCategory(g.category),
    fitIntent: g.fitIntent,
    construction: g.construction,
    stretchRatio: g.stretchRatio ?? null,
    points: off.map((p) => ({
      point: p.point,
      bodyKey: p.bodyKey,
      finished: p.finished,
      body: p.body,
      ease: round1(p.ease),
      min: round1(p.min),
      max: p.max === null ? null : round1(p.max),
      status: p.status,
      by: round1(p.by),
    })),
  };
  return {
    key: `fit:${g.id}:${f.performerId}`,
    kind: "fit",
    // Tight needs an alteration before the garment can be worn; loose is a note.
    severity: tight ? "warning" : "note",
    title: `${g.tagCode} ${g.name} on ${f.performerName}${f.asDouble ? " (double)" : ""}: ${names}`,
    explanation:
      off.map((p) => describePointFit(p, g.fitIntent, g.category)).join(" ") +
      (f.asDouble && tight ? " A stunt costume must leave room for movement and padding; check it with the stunt coordinator." : ""),
    subject: { characterId: f.characterId, garmentId: g.id },
    evidence,
  };
}

/** Garments of a change: direct items plus every copy of each multiples group it draws on. */
function garmentsOfChange(ix: SnapshotIndex, changeId: string, into: Set<string>): void {
  for (const item of ix.itemsByChange.get(changeId) ?? []) {
    if (item.garmentId) into.add(item.garmentId);
    if (item.multiplesGroupId) for (const g of ix.groupCopies.get(item.multiplesGroupId) ?? []) into.add(g);
  }
}

/** Fit snags: each garment a character's changes use, on the character's performer; and the
 * garments of stunt appearances on the character's doubles. One snag per (garment, performer). */
export function fitSnags(ix: SnapshotIndex): SnagDraft[] {
  // (garmentId|performerId) → facts owner; smallest character id wins so the subject is stable.
  const pairs = new Map<string, { garmentId: string; performerId: string; characterId: string; asDouble: boolean }>();
  const add = (garmentId: string, performerId: string, characterId: string, asDouble: boolean) => {
    const k = `${garmentId}|${performerId}`;
    const cur = pairs.get(k);
    if (!cur || characterId < cur.characterId || (characterId === cur.characterId && cur.asDouble && !asDouble)) {
      pairs.set(k, { garmentId, performerId, characterId, asDouble });
    }
  };
  for (const change of ix.snapshot.changes) {
    const ch = ix.charactersById.get(change.characterId);
    if (!ch?.performerId) continue;
    const gs = new Set<string>();
    garmentsOfChange(ix, change.id, gs);
    for (const g of gs) add(g, ch.performerId, ch.id, false);
  }
  for (const app of ix.snapshot.appearances) {
    if (!app.stunt) continue;
    const ch = ix.charactersById.get(app.characterId);
    if (!ch || ch.doublePerformerIds.length === 0) continue;
    const gs = new Set<string>();
    garmentsOfChange(ix, app.changeId, gs);
    for (const g of gs) for (const d of ch.doublePerformerIds) add(g, d, ch.id, true);
  }
  const out: SnagDraft[] = [];
  for (const p of pairs.values()) {
    const garment = ix.garmentsById.get(p.garmentId);
    const performer = ix.performersById.get(p.performerId);
    if (!garment || !performer) continue;
    const points = checkFit(garment, performer.measurements ?? {}, ix.snapshot.production.easeOverrides);
    const snag = fitSnagFromFacts({
      garment,
      performerId: performer.id,
      performerName: performer.name,
      characterId: p.characterId,
      asDouble: p.asDouble,
      points,
    });
    if (snag) out.push(snag);
  }
  return out;
}
