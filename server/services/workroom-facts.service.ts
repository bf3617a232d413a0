/**
 * Reads (and the one garment-status write) the workroom needs from tables other features own:
 * performers, changes, garments, shoot days, measurements. Raw SQL with replacements, always inside the
 * caller's transaction when one is given, until those features' models are merged.
 */
import { randomUUID } from "node:crypto";
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../db.js";

const q = <T extends object>(sql: string, replacements: Record<string, unknown>, transaction?: Transaction) =>
  sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });

export interface GarmentRow {
  id: string;
  tag_code: string;
  name: string;
  category: string;
  fit_intent: "fitted" | "regular" | "loose";
  finished_measurements: Record<string, number>;
  source: "built" | "bought" | "rented";
  rental_due_on: string | null;
  status: string;
  multiples_group_id: string | null;
  copy_number: number | null;
  construction: "woven" | "knit" | null;
  stretch_weft_pct: string | null;
}

const GARMENT_COLUMNS = `g.id, g.tag_code, g.name, g.category, g.fit_intent, g.finished_measurements, g.source, g.rental_due_on::text AS rental_due_on,
  g.status, g.multiples_group_id, g.copy_number, f.construction, f.stretch_weft_pct`;

/** One garment of the production, optionally locked FOR UPDATE (garments row only). */
export async function findGarment(
  productionId: string,
  garmentId: string,
  transaction?: Transaction,
  lock = false,
): Promise<GarmentRow | null> {
  if (lock && transaction) {
    await q(
      `SELECT id FROM garments WHERE id = :garmentId AND production_id = :productionId FOR UPDATE`,
      { garmentId, productionId },
      transaction,
    );
  }
  const rows = await q<GarmentRow>(
    `SELECT ${GARMENT_COLUMNS} FROM garments g LEFT JOIN fabrics f ON f.id = g.fabric_id WHERE g.id = :garmentId AND g.production_id = :productionId`,
    { garmentId, productionId },
    transaction,
  );
  return rows[0] ?? null;
}

/** Garments by id (production-scoped). */
export async function findGarments(productionId: string, ids: string[], transaction?: Transaction): Promise<GarmentRow[]> {
  if (ids.length === 0) return [];
  return q<GarmentRow>(
    `SELECT ${GARMENT_COLUMNS} FROM garments g LEFT JOIN fabrics f ON f.id = g.fabric_id WHERE g.production_id = :productionId AND g.id IN (:ids)`,
    { productionId, ids },
    transaction,
  );
}

/** Moves a garment to a status and records the move in its history, inside the caller's transaction. */
export async function moveGarmentStatus(
  p: { productionId: string; garmentId: string; from: string; to: string; note: string; actorId: string | null },
  transaction: Transaction,
): Promise<void> {
  await sequelize.query(`UPDATE garments SET status = :to, updated_at = now() WHERE id = :garmentId AND production_id = :productionId`, {
    replacements: { to: p.to, garmentId: p.garmentId, productionId: p.productionId },
    transaction,
  });
  await sequelize.query(
    `INSERT INTO garment_status_events (id, production_id, garment_id, from_status, to_status, note, actor_id)
     VALUES (:id, :productionId, :garmentId, :from, :to, :note, :actorId)`,
    { replacements: { id: randomUUID(), ...p }, transaction },
  );
}

/**
 * Dates (and shoot day ids) on which each garment is needed: a shoot day whose scenes include an appearance
 * in a change with the garment (directly, or through the garment's multiples group), and on stage every
 * performance once the garment is in any appearance.
 */
export async function neededDatesByGarment(
  productionId: string,
  garmentIds: string[],
  transaction?: Transaction,
): Promise<Map<string, Array<{ date: string; shootDayId: string }>>> {
  const out = new Map<string, Array<{ date: string; shootDayId: string }>>();
  if (garmentIds.length === 0) return out;
  const rows = await q<{ garment_id: string; shoot_day_id: string; date: string }>(
    `WITH used AS (
       SELECT DISTINCT g.id AS garment_id, a.scene_id
       FROM garments g
       JOIN change_items ci ON ci.production_id = g.production_id
         AND (ci.garment_id = g.id OR (g.multiples_group_id IS NOT NULL AND ci.multiples_group_id = g.multiples_group_id))
       JOIN appearances a ON a.change_id = ci.change_id
       WHERE g.production_id = :productionId AND g.id IN (:garmentIds)
     )
     SELECT DISTINCT u.garment_id, sd.id AS shoot_day_id, sd.date::text AS date
     FROM used u JOIN shoot_day_scenes sds ON sds.scene_id = u.scene_id JOIN shoot_days sd ON sd.id = sds.shoot_day_id
     UNION
     SELECT DISTINCT u.garment_id, sd.id, sd.date::text
     FROM used u JOIN shoot_days sd ON sd.production_id = :productionId AND sd.kind = 'performance'
     ORDER BY 1, 3`,
    { productionId, garmentIds },
    transaction,
  );
  for (const r of rows) {
    const list = out.get(r.garment_id) ?? [];
    list.push({ date: r.date, shootDayId: r.shoot_day_id });
    out.set(r.garment_id, list);
  }
  return out;
}

/** Shoot days and performances of the production, by date. */
export async function listShootDays(
  productionId: string,
): Promise<Array<{ id: string; date: string; dayNumber: number; kind: "shoot" | "performance" }>> {
  const rows = await q<{ id: string; date: string; day_number: number; kind: "shoot" | "performance" }>(
    `SELECT id, date::text AS date, day_number, kind FROM shoot_days WHERE production_id = :productionId ORDER BY date, day_number`,
    { productionId },
  );
  return rows.map((r) => ({ id: r.id, date: r.date, dayNumber: r.day_number, kind: r.kind }));
}

export interface PerformerRow {
  id: string;
  name: string;
  email: string | null;
  agent_contact: string | null;
}

/** A performer of the production. */
export async function findPerformer(productionId: string, performerId: string, transaction?: Transaction): Promise<PerformerRow | null> {
  const rows = await q<PerformerRow>(
    `SELECT id, name, email::text AS email, agent_contact FROM performers WHERE id = :performerId AND production_id = :productionId`,
    { performerId, productionId },
    transaction,
  );
  return rows[0] ?? null;
}

/** Performers of the production, by name. */
export async function listPerformers(productionId: string): Promise<PerformerRow[]> {
  return q<PerformerRow>(
    `SELECT id, name, email::text AS email, agent_contact FROM performers WHERE production_id = :productionId ORDER BY name`,
    { productionId },
  );
}

export interface ChangeRow {
  id: string;
  number: number;
  description: string | null;
  character_name: string;
  performer_id: string | null;
}

const CHANGE_SQL = `SELECT c.id, c.number, c.description, ch.name AS character_name, ch.performer_id
  FROM changes c JOIN characters ch ON ch.id = c.character_id WHERE c.production_id = :productionId`;

/** A change of the production with its character. */
export async function findChange(productionId: string, changeId: string, transaction?: Transaction): Promise<ChangeRow | null> {
  const rows = await q<ChangeRow>(`${CHANGE_SQL} AND c.id = :changeId`, { productionId, changeId }, transaction);
  return rows[0] ?? null;
}

/** Every change of the production, by character and number. */
export async function listChanges(productionId: string): Promise<ChangeRow[]> {
  return q<ChangeRow>(`${CHANGE_SQL} ORDER BY ch.name, c.number`, { productionId });
}

/** "Elias Marr — change 2" (with the description when there is one). */
export function changeLabel(c: Pick<ChangeRow, "character_name" | "number" | "description">): string {
  return `${c.character_name} — change ${c.number}${c.description ? `: ${c.description}` : ""}`;
}

/** Garments of the production, by tag code. */
export async function listGarments(productionId: string): Promise<Array<{ id: string; tag_code: string; name: string; status: string }>> {
  return q(`SELECT id, tag_code, name, status FROM garments WHERE production_id = :productionId ORDER BY tag_code`, { productionId });
}

/** The change's items with their garments (a multiples group item lists each copy). */
export async function changeItemsWithGarments(
  productionId: string,
  changeId: string,
): Promise<Array<{ change_item_id: string; label: string; garment_id: string | null }>> {
  return q(
    `SELECT ci.id AS change_item_id, ci.label || CASE WHEN g2.id IS NOT NULL THEN ' (copy #' || COALESCE(g2.copy_number::text, '?') || ')' ELSE '' END AS label,
            COALESCE(ci.garment_id, g2.id) AS garment_id
     FROM change_items ci
     LEFT JOIN garments g2 ON ci.garment_id IS NULL AND ci.multiples_group_id IS NOT NULL AND g2.multiples_group_id = ci.multiples_group_id
     WHERE ci.production_id = :productionId AND ci.change_id = :changeId
     ORDER BY ci.sort_order, ci.label, g2.copy_number`,
    { productionId, changeId },
  );
}

/** The character a performer plays (first by sort order), for fit snags. */
export async function characterOfPerformer(productionId: string, performerId: string): Promise<string | null> {
  const rows = await q<{ id: string }>(
    `SELECT id FROM characters WHERE production_id = :productionId AND performer_id = :performerId ORDER BY sort_order, name LIMIT 1`,
    { productionId, performerId },
  );
  return rows[0]?.id ?? null;
}
