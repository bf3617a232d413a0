// Reads of records other features own (characters, changes, garments, fabrics and their tests,
// appearances, scenes, photos, continuity entries, measurement sets) with plain SQL over the core
// tables, so the doubles feature depends on their columns, not on their models.
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import type { FabricClass, FabricTest } from "@shared/domain/fabric-physics.js";

const q = <T extends object>(sql: string, replacements: Record<string, unknown>, transaction?: Transaction) =>
  sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });

export interface ChangeRow {
  id: string;
  number: number;
  description: string | null;
  characterId: string;
  characterName: string;
  performerId: string | null;
  performerName: string | null;
}

/** One change of the production with its character and performer, or undefined. */
export async function findChange(productionId: string, changeId: string, transaction?: Transaction): Promise<ChangeRow | undefined> {
  const [row] = await q<ChangeRow>(
    `SELECT c.id, c.number, c.description, ch.id AS "characterId", ch.name AS "characterName",
            p.id AS "performerId", p.name AS "performerName"
       FROM changes c JOIN characters ch ON ch.id = c.character_id
       LEFT JOIN performers p ON p.id = ch.performer_id
      WHERE c.id = :changeId AND c.production_id = :productionId`,
    { productionId, changeId },
    transaction,
  );
  return row;
}

export interface GarmentRow {
  id: string;
  name: string;
  category: string;
  tagCode: string;
  fabricId: string | null;
  fabricName: string | null;
}

/** One garment of the production, or undefined. */
export async function findGarment(productionId: string, garmentId: string, transaction?: Transaction): Promise<GarmentRow | undefined> {
  const [row] = await q<GarmentRow>(
    `SELECT g.id, g.name, g.category, g.tag_code AS "tagCode", g.fabric_id AS "fabricId", f.name AS "fabricName"
       FROM garments g LEFT JOIN fabrics f ON f.id = g.fabric_id
      WHERE g.id = :garmentId AND g.production_id = :productionId`,
    { productionId, garmentId },
    transaction,
  );
  return row;
}

/**
 * Garments worn in a change: change items that point at a garment, and for items that point at a
 * multiples group, the group's first copy (the copies share one pattern).
 */
export async function garmentsOfChange(productionId: string, changeId: string, transaction?: Transaction): Promise<GarmentRow[]> {
  return q<GarmentRow>(
    `SELECT DISTINCT ON (g.id) g.id, g.name, g.category, g.tag_code AS "tagCode", g.fabric_id AS "fabricId", f.name AS "fabricName", ci.sort_order
       FROM change_items ci
       JOIN garments g ON g.id = COALESCE(ci.garment_id,
            (SELECT g2.id FROM garments g2 WHERE g2.multiples_group_id = ci.multiples_group_id ORDER BY g2.copy_number NULLS LAST, g2.tag_code LIMIT 1))
       LEFT JOIN fabrics f ON f.id = g.fabric_id
      WHERE ci.change_id = :changeId AND ci.production_id = :productionId
      ORDER BY g.id`,
    { productionId, changeId },
    transaction,
  ).then((rows) =>
    rows.sort(
      (a, b) =>
        ((a as { sort_order?: number }).sort_order ?? 0) - ((b as { sort_order?: number }).sort_order ?? 0) || a.name.localeCompare(b.name),
    ),
  );
}

/** Every change of the production (by character, then number). */
export async function listChanges(productionId: string): Promise<ChangeRow[]> {
  return q<ChangeRow>(
    `SELECT c.id, c.number, c.description, ch.id AS "characterId", ch.name AS "characterName",
            p.id AS "performerId", p.name AS "performerName"
       FROM changes c JOIN characters ch ON ch.id = c.character_id
       LEFT JOIN performers p ON p.id = ch.performer_id
      WHERE c.production_id = :productionId
      ORDER BY ch.sort_order, ch.name, c.number`,
    { productionId },
  );
}

export interface FabricRow {
  id: string;
  name: string;
  construction: "woven" | "knit";
  widthMm: number | null;
  massPerAreaGsm: number | null;
  thicknessMm: number | null;
  fibreContent: unknown;
}

/** Fabrics of the production (all, or the given ids). */
export async function listFabrics(productionId: string, ids?: string[], transaction?: Transaction): Promise<FabricRow[]> {
  if (ids && ids.length === 0) return [];
  const rows = await q<FabricRow>(
    `SELECT id, name, construction, width_mm AS "widthMm", mass_per_area_gsm AS "massPerAreaGsm",
            thickness_mm AS "thicknessMm", fibre_content AS "fibreContent"
       FROM fabrics WHERE production_id = :productionId ${ids ? "AND id IN (:ids)" : ""} ORDER BY name`,
    { productionId, ids },
    transaction,
  );
  return rows.map((r) => ({
    ...r,
    widthMm: r.widthMm === null ? null : Number(r.widthMm),
    massPerAreaGsm: r.massPerAreaGsm === null ? null : Number(r.massPerAreaGsm),
    thicknessMm: r.thicknessMm === null ? null : Number(r.thicknessMm),
  }));
}

export interface FabricTestRow {
  id: string;
  fabricId: string;
  kind: string;
  direction: string | null;
  readings: Record<string, unknown>;
  testedOn: string;
}

/** Recorded tests of the given fabrics, oldest first. */
export async function listFabricTests(productionId: string, fabricIds: string[], transaction?: Transaction): Promise<FabricTestRow[]> {
  if (fabricIds.length === 0) return [];
  return q<FabricTestRow>(
    `SELECT id, fabric_id AS "fabricId", kind, direction, readings, tested_on AS "testedOn"
       FROM fabric_tests WHERE production_id = :productionId AND fabric_id IN (:fabricIds) ORDER BY tested_on, created_at`,
    { productionId, fabricIds },
    transaction,
  );
}

const numIn = (r: Record<string, unknown>, ...keys: string[]): number | undefined => {
  for (const k of keys) {
    const v = r[k];
    if (typeof v === "number" && Number.isFinite(v)) return v;
    if (typeof v === "string" && v.trim() !== "" && Number.isFinite(Number(v))) return Number(v);
  }
  return undefined;
};

/**
 * Turns one fabric_tests row into the shared FabricTest shapes (one row may hold several specimens).
 * Readings are taken by the names the shared fabric-physics module uses; rows that lack a needed
 * reading are skipped (and fall back to "assumed").
 */
export function fabricTestsFromRow(row: FabricTestRow): FabricTest[] {
  const specimens = Array.isArray(row.readings?.specimens) ? (row.readings.specimens as Record<string, unknown>[]) : [row.readings ?? {}];
  const dir = row.direction === "warp" || row.direction === "weft" ? row.direction : null;
  const out: FabricTest[] = [];
  for (const r of specimens) {
    switch (row.kind) {
      case "mass": {
        const massG = numIn(r, "massG");
        const lengthMm = numIn(r, "lengthMm");
        const widthMm = numIn(r, "widthMm");
        if (massG && lengthMm && widthMm) out.push({ id: row.id, kind: "mass", massG, lengthMm, widthMm });
        break;
      }
      case "cantilever": {
        const overhangs = Array.isArray(r.overhangsMm) ? (r.overhangsMm as unknown[]).map(Number) : [numIn(r, "overhangMm")];
        const angleDeg = numIn(r, "angleDeg");
        for (const overhangMm of overhangs) {
          if (dir && overhangMm && overhangMm > 0)
            out.push({ id: row.id, kind: "bending", direction: dir, overhangMm, ...(angleDeg ? { angleDeg } : {}) });
        }
        break;
      }
      case "strip": {
        const loadN = numIn(r, "loadN");
        const stripWidthMm = numIn(r, "stripWidthMm", "widthMm");
        const gaugeLengthMm = numIn(r, "gaugeLengthMm");
        const extensionMm = numIn(r, "extensionMm");
        if (dir && loadN && stripWidthMm && gaugeLengthMm && extensionMm) {
          out.push({ id: row.id, kind: "stretch", direction: dir, loadN, stripWidthMm, gaugeLengthMm, extensionMm });
        }
        break;
      }
      case "thickness": {
        const thicknessMm = numIn(r, "thicknessMm");
        if (thicknessMm) out.push({ id: row.id, kind: "thickness", thicknessMm });
        break;
      }
      case "shear": {
        const shearRigidity = numIn(r, "shearRigidity", "kesG");
        if (shearRigidity) out.push({ id: row.id, kind: "kes_shear", shearRigidity });
        break;
      }
      case "friction": {
        const slideAngleDeg = numIn(r, "slideAngleDeg");
        if (slideAngleDeg !== undefined) out.push({ id: row.id, kind: "friction", slideAngleDeg });
        break;
      }
    }
  }
  return out;
}

/**
 * Fabric class for defaults, from construction and mass per area: light below 150 g/m², heavy above
 * 350 g/m² (retailer guidance; common practice, no source), medium otherwise.
 */
export function fabricClassOf(construction: "woven" | "knit", gsm: number | null): FabricClass {
  const band = gsm === null ? "medium" : gsm < 150 ? "light" : gsm > 350 ? "heavy" : "medium";
  return `${construction}_${band}` as FabricClass;
}

export interface ShotRow {
  appearanceId: string;
  sceneId: string;
  sceneNumber: string;
  storyDay: number | null;
  storyOrder: number;
  distressStage: number;
  wet: boolean;
  blood: boolean;
  stunt: boolean;
  notes: string | null;
}

/** Appearances of the change marked as effects shots, in story order. */
export async function listVfxShots(productionId: string, changeId: string, transaction?: Transaction): Promise<ShotRow[]> {
  return q<ShotRow>(
    `SELECT a.id AS "appearanceId", s.id AS "sceneId", s.number AS "sceneNumber", s.story_day AS "storyDay",
            s.story_order AS "storyOrder", a.distress_stage AS "distressStage", a.wet, a.blood, a.stunt, a.notes
       FROM appearances a JOIN scenes s ON s.id = a.scene_id
      WHERE a.production_id = :productionId AND a.change_id = :changeId AND a.vfx_shot
      ORDER BY s.story_order`,
    { productionId, changeId },
    transaction,
  );
}

export interface PhotoRow {
  id: string;
  ownerType: string;
  ownerId: string;
  view: string;
  caption: string | null;
  contentHash: string;
  originalName: string | null;
  variants: Record<string, unknown>;
  /** For continuity photos: the scene the entry logs. */
  sceneId: string | null;
  sceneNumber: string | null;
}

/**
 * Reference photos for a change: photos of its garments, of the character's continuity entries,
 * of the character, performer and change, and of fittings for the change when that table exists.
 */
export async function listPhotoCandidates(
  productionId: string,
  change: ChangeRow,
  garmentIds: string[],
  transaction?: Transaction,
): Promise<PhotoRow[]> {
  const owners = [change.id, change.characterId, ...(change.performerId ? [change.performerId] : []), ...garmentIds];
  // Fittings belong to the workroom feature; link their photos only when that table has a change_id.
  const [fit] = await q<{ ok: boolean }>(
    `SELECT EXISTS (SELECT 1 FROM information_schema.columns WHERE table_schema = 'public' AND table_name = 'fittings' AND column_name = 'change_id') AS ok`,
    {},
    transaction,
  );
  const fittingOwners = fit?.ok
    ? (await q<{ id: string }>(`SELECT id FROM fittings WHERE change_id = :changeId`, { changeId: change.id }, transaction)).map(
        (r) => r.id,
      )
    : [];
  return q<PhotoRow>(
    `SELECT p.id, p.owner_type AS "ownerType", p.owner_id AS "ownerId", p.view, p.caption, p.content_hash AS "contentHash",
            p.original_name AS "originalName", p.variants, ce.scene_id AS "sceneId", s.number AS "sceneNumber"
       FROM photos p
       LEFT JOIN continuity_entries ce ON p.owner_id = ce.id AND ce.character_id = :characterId
       LEFT JOIN scenes s ON s.id = ce.scene_id
      WHERE p.production_id = :productionId
        AND (p.owner_id IN (:owners) OR ce.id IS NOT NULL)
      ORDER BY p.owner_type, s.story_order NULLS LAST, p.created_at`,
    { productionId, owners: [...owners, ...fittingOwners], characterId: change.characterId },
    transaction,
  );
}

/** The performer's newest measurement set, or undefined. */
export async function latestMeasurementSet(productionId: string, performerId: string, transaction?: Transaction) {
  const [row] = await q<{ takenOn: string; valuesMm: Record<string, number> }>(
    `SELECT taken_on AS "takenOn", values_mm AS "valuesMm" FROM measurement_sets
      WHERE production_id = :productionId AND performer_id = :performerId ORDER BY taken_on DESC, created_at DESC LIMIT 1`,
    { productionId, performerId },
    transaction,
  );
  return row;
}
