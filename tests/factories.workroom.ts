/**
 * Builders for the rows the workroom reads from other features' tables (performers, changes, garments,
 * shoot days). Raw SQL until those features' models are merged; each builder creates missing parents.
 */
import { randomUUID } from "node:crypto";
import { sequelize } from "../server/db.js";

async function insert(table: string, row: Record<string, unknown>): Promise<string> {
  const id = (row.id as string | undefined) ?? randomUUID();
  const cols = Object.keys(row).filter((k) => k !== "id");
  const json = (v: unknown) => (v !== null && typeof v === "object" && !Array.isArray(v) ? JSON.stringify(v) : v);
  await sequelize.query(`INSERT INTO ${table} (id, ${cols.join(", ")}) VALUES (:id, ${cols.map((c) => `:${c}`).join(", ")})`, {
    replacements: { id, ...Object.fromEntries(cols.map((c) => [c, json(row[c])])) },
  });
  return id;
}

/** A performer (with an e-mail unless null is given). */
export function buildPerformer(productionId: string, o: { name?: string; email?: string | null; agentContact?: string | null } = {}) {
  return insert("performers", {
    production_id: productionId,
    name: o.name ?? "Test Performer",
    email: o.email === undefined ? `performer-${randomUUID().slice(0, 6)}@test.invalid` : o.email,
    agent_contact: o.agentContact ?? null,
  });
}

/** A fabric (woven, untested stretch unless given). */
export function buildFabric(
  productionId: string,
  o: { name?: string; construction?: "woven" | "knit"; stretchWarpPct?: number | null; stretchWeftPct?: number | null } = {},
) {
  return insert("fabrics", {
    production_id: productionId,
    name: o.name ?? "Test fabric",
    construction: o.construction ?? "woven",
    stretch_warp_pct: o.stretchWarpPct ?? null,
    stretch_weft_pct: o.stretchWeftPct ?? null,
  });
}

/** A garment (status in_stock, regular fit, no fabric unless given). */
export function buildGarment(
  productionId: string,
  o: {
    tagCode?: string;
    name?: string;
    status?: string;
    category?: string;
    finished?: Record<string, number>;
    groupId?: string | null;
    copyNumber?: number | null;
    fitIntent?: "fitted" | "regular" | "loose";
    fabricId?: string | null;
  } = {},
) {
  return insert("garments", {
    fit_intent: o.fitIntent ?? "regular",
    fabric_id: o.fabricId ?? null,
    production_id: productionId,
    tag_code: o.tagCode ?? `G-${randomUUID().slice(0, 6)}`,
    name: o.name ?? "Test jacket",
    category: o.category ?? "jacket",
    source: "built",
    status: o.status ?? "in_stock",
    finished_measurements: o.finished ?? {},
    multiples_group_id: o.groupId ?? null,
    copy_number: o.copyNumber ?? null,
  });
}

/** A multiples group. */
export function buildGroup(productionId: string, name = "Test group") {
  return insert("multiples_groups", { production_id: productionId, name });
}

/**
 * A character played by a performer, with one change whose items point at the given garments or groups,
 * appearing in one scene on each given shoot date (shoot days are created or reused by date).
 */
export async function buildChangeOnDays(
  productionId: string,
  o: { performerId?: string; garmentIds?: string[]; groupIds?: string[]; dates: string[]; characterName?: string },
): Promise<{ performerId: string; characterId: string; changeId: string; shootDayIds: string[] }> {
  const performerId = o.performerId ?? (await buildPerformer(productionId));
  const characterId = await insert("characters", {
    production_id: productionId,
    name: o.characterName ?? `Character ${randomUUID().slice(0, 6)}`,
    performer_id: performerId,
  });
  const changeId = await insert("changes", {
    production_id: productionId,
    character_id: characterId,
    number: 1,
    description: "test change",
  });
  let order = 0;
  for (const g of o.garmentIds ?? [])
    await insert("change_items", { production_id: productionId, change_id: changeId, label: "item", garment_id: g, sort_order: order++ });
  for (const g of o.groupIds ?? [])
    await insert("change_items", {
      production_id: productionId,
      change_id: changeId,
      label: "group item",
      multiples_group_id: g,
      sort_order: order++,
    });
  const shootDayIds: string[] = [];
  for (const date of o.dates) {
    const [existing] = (
      await sequelize.query(`SELECT id FROM shoot_days WHERE production_id = :productionId AND date = :date`, {
        replacements: { productionId, date },
      })
    )[0] as Array<{ id: string }>;
    const [{ n }] = (
      await sequelize.query(`SELECT COALESCE(MAX(day_number), 0) + 1 AS n FROM shoot_days WHERE production_id = :productionId`, {
        replacements: { productionId },
      })
    )[0] as Array<{ n: number }>;
    const shootDayId = existing?.id ?? (await insert("shoot_days", { production_id: productionId, day_number: n, date, kind: "shoot" }));
    const [{ s }] = (
      await sequelize.query(`SELECT COALESCE(MAX(story_order), 0) + 1 AS s FROM scenes WHERE production_id = :productionId`, {
        replacements: { productionId },
      })
    )[0] as Array<{ s: number }>;
    const sceneId = await insert("scenes", { production_id: productionId, number: `S${s}-${randomUUID().slice(0, 4)}`, story_order: s });
    await insert("shoot_day_scenes", { production_id: productionId, shoot_day_id: shootDayId, scene_id: sceneId, position: 1 });
    await insert("appearances", { production_id: productionId, scene_id: sceneId, character_id: characterId, change_id: changeId });
    shootDayIds.push(shootDayId);
  }
  return { performerId, characterId, changeId, shootDayIds };
}

/** Current status of a garment and how many status events it has. */
export async function garmentState(garmentId: string): Promise<{ status: string; events: number }> {
  const [[row]] = (await sequelize.query(
    `SELECT status, (SELECT COUNT(*)::int FROM garment_status_events e WHERE e.garment_id = g.id) AS events FROM garments g WHERE id = :garmentId`,
    { replacements: { garmentId } },
  )) as [Array<{ status: string; events: number }>, unknown];
  return row;
}

/** A measurement set for a performer (values in mm, ISO 8559-1 names). */
export function buildMeasurementSet(productionId: string, performerId: string, valuesMm: Record<string, number>, takenOn = "2030-08-20") {
  return insert("measurement_sets", { production_id: productionId, performer_id: performerId, taken_on: takenOn, values_mm: valuesMm });
}
