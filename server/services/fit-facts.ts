/**
 * Stored rows → the facts the fit rule reads, in one place: a garment's finished measurements with its
 * fabric's stretch, a performer's newest measurement set, and the production's own ease ranges. The
 * Snags screen (`loadSnapshot` in snags.service), the fitting view (`loadFittingFacts`) and the tests'
 * fixtures all come through these statements and mappers, so a garment gets one verdict everywhere.
 *
 * Raw SQL rather than models because it is faster here: the snapshot reads every garment and measurement
 * set of a production on each recompute, and plain rows skip building a Sequelize instance for each; the
 * fabric join and "newest set per performer" are one statement each instead of an include per row.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import type { EaseOverrides, GarmentRec } from "@shared/domain/snags/types.js";

/** One garment row with its fabric's construction and stretch (both directions), as GARMENT_FACTS_SQL reads it. */
export interface GarmentFactsRow {
  id: string;
  tag_code: string;
  name: string;
  category: string;
  fit_intent: string;
  finished_measurements: unknown;
  source: string;
  rental_due_on: string | null;
  status: string;
  multiples_group_id: string | null;
  copy_number: number | string | null;
  construction: string | null;
  stretch_warp_pct: number | string | null;
  stretch_weft_pct: number | string | null;
}

/** Garments of the production (`:pid`) with their fabric; callers may add `AND g.id IN (:ids)`. */
export const GARMENT_FACTS_SQL = `SELECT g.id, g.tag_code, g.name, g.category, g.fit_intent, g.finished_measurements, g.source,
    to_char(g.rental_due_on, 'YYYY-MM-DD') AS rental_due_on, g.status, g.multiples_group_id, g.copy_number,
    f.construction, f.stretch_warp_pct, f.stretch_weft_pct
  FROM garments g LEFT JOIN fabrics f ON f.id = g.fabric_id WHERE g.production_id = :pid`;

/** Each performer's newest measurement set in the production (`:pid`); callers may add a performer filter. */
export function currentMeasurementsSql(performerFilter = ""): string {
  return `SELECT DISTINCT ON (performer_id) performer_id, to_char(taken_on, 'YYYY-MM-DD') AS taken_on, values_mm
    FROM measurement_sets WHERE production_id = :pid ${performerFilter}
    ORDER BY performer_id, taken_on DESC, created_at DESC`;
}

/** One row of currentMeasurementsSql. */
export interface MeasurementSetRow {
  performer_id: string;
  taken_on: string;
  values_mm: unknown;
}

const num = (v: unknown): number | null => {
  if (v === null || v === undefined || v === "") return null;
  const n = typeof v === "number" ? v : Number(v);
  return Number.isFinite(n) ? n : null;
};

/** Keeps only the finite numeric members of a JSON object (measurements in mm). */
export function measurementValuesOf(v: unknown): Record<string, number> {
  const out: Record<string, number> = {};
  if (v && typeof v === "object" && !Array.isArray(v)) {
    for (const [k, x] of Object.entries(v as Record<string, unknown>)) {
      const n = num(x);
      if (n !== null) out[k] = n;
    }
  }
  return out;
}

/**
 * A garment row → the fit rule's garment record. A knit's stretch ratio is 1 + stretch % / 100 of the
 * crosswise (weft, course) direction, which goes round the body, or the lengthwise (warp) one when only
 * that was tested; a missing or zero stretch gives no ratio, so the knit is judged like a woven.
 */
export function garmentRecOf(g: GarmentFactsRow): GarmentRec {
  const knit = g.construction === "knit";
  const pct = num(g.stretch_weft_pct) ?? num(g.stretch_warp_pct);
  return {
    id: g.id,
    tagCode: g.tag_code,
    name: g.name,
    category: g.category,
    fitIntent: g.fit_intent as GarmentRec["fitIntent"],
    construction: knit ? "knit" : "woven",
    stretchRatio: knit && pct !== null && pct > 0 ? 1 + pct / 100 : null,
    finished: measurementValuesOf(g.finished_measurements),
    source: g.source as GarmentRec["source"],
    rentalDueDate: g.rental_due_on ?? null,
    status: g.status as GarmentRec["status"],
    multiplesGroupId: g.multiples_group_id ?? null,
    copyNumber: num(g.copy_number),
  };
}

/** Loose shape check for `settings.easeOverrides` (category → point → intent → {min, max}). */
function isEaseOverrides(v: unknown): v is EaseOverrides {
  if (!v || typeof v !== "object" || Array.isArray(v)) return false;
  for (const points of Object.values(v as Record<string, unknown>)) {
    if (!points || typeof points !== "object") return false;
    for (const intents of Object.values(points as Record<string, unknown>)) {
      if (!intents || typeof intents !== "object") return false;
      for (const r of Object.values(intents as Record<string, unknown>)) {
        const range = r as { min?: unknown; max?: unknown };
        if (!range || typeof range.min !== "number" || !(range.max === null || typeof range.max === "number")) return false;
      }
    }
  }
  return true;
}

/** The production's own ease ranges from its settings, or undefined (the handbook table applies). */
export function easeOverridesOf(settings: unknown): EaseOverrides | undefined {
  const v = settings && typeof settings === "object" ? (settings as { easeOverrides?: unknown }).easeOverrides : undefined;
  return isEaseOverrides(v) ? v : undefined;
}

/** What the fitting view needs to judge a change's garments on one performer. */
export interface FittingFacts {
  /** The production's ease ranges (undefined: the handbook table). */
  easeOverrides: EaseOverrides | undefined;
  /** The performer's newest measurement set, or null when none was taken. */
  measurements: { takenOn: string; valuesMm: Record<string, number> } | null;
  /** The garments asked for, by id (ids of other productions are absent). */
  garments: Map<string, GarmentRec>;
}

/** Loads the fit facts for one performer and some garments, through the same statements as the snag snapshot. */
export async function loadFittingFacts(
  productionId: string,
  performerId: string,
  garmentIds: string[],
  transaction?: Transaction,
): Promise<FittingFacts> {
  const q = <T extends object>(sql: string, replacements: Record<string, unknown>) =>
    sequelize.query<T>(sql, { replacements: { pid: productionId, ...replacements }, type: QueryTypes.SELECT, transaction });
  const [productions, sets, garments] = await Promise.all([
    q<{ settings: unknown }>(`SELECT settings FROM productions WHERE id = :pid`, {}),
    q<MeasurementSetRow>(currentMeasurementsSql("AND performer_id = :performerId"), { performerId }),
    garmentIds.length ? q<GarmentFactsRow>(`${GARMENT_FACTS_SQL} AND g.id IN (:ids)`, { ids: garmentIds }) : Promise.resolve([]),
  ]);
  const set = sets[0];
  return {
    easeOverrides: easeOverridesOf(productions[0]?.settings),
    measurements: set ? { takenOn: set.taken_on, valuesMm: measurementValuesOf(set.values_mm) } : null,
    garments: new Map(garments.map((g) => [g.id, garmentRecOf(g)])),
  };
}
