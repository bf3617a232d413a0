import { Op, type Transaction } from "sequelize";
import type { MoveSceneInput, ShootDayDto, ShootDayInput, UpdateShootDayInput } from "@shared/schemas/breakdown.js";
import { compareSceneNumbers } from "@shared/domain/breakdown.js";
import { sequelize } from "../db.js";
import { Scene, ShootDay, ShootDayScene } from "../models/index.js";
import { ConflictError, NotFoundError, ValidationError } from "../errors.js";
import { presentShootDay } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

async function scenesFor(productionId: string, days: ShootDay[], transaction?: Transaction): Promise<Map<string, ShootDayDto["scenes"]>> {
  const out = new Map<string, ShootDayDto["scenes"]>();
  if (!days.length) return out;
  const slots = await ShootDayScene.findAll({
    where: { productionId, shootDayId: { [Op.in]: days.map((d) => d.id) } },
    include: [{ model: Scene, as: "scene", attributes: ["id", "number", "setName", "storyDay"] }],
    order: [["position", "ASC"]],
    transaction,
  });
  for (const s of slots) {
    const list = out.get(s.shootDayId) ?? [];
    list.push({
      id: s.sceneId,
      number: s.scene?.number ?? "",
      position: s.position,
      setName: s.scene?.setName ?? null,
      storyDay: s.scene?.storyDay ?? null,
    });
    out.set(s.shootDayId, list);
  }
  // A performance plays the whole show in running order (= story order).
  if (days.some((d) => d.kind === "performance")) {
    const all = await Scene.findAll({
      where: { productionId },
      attributes: ["id", "number", "setName", "storyDay", "storyOrder"],
      transaction,
    });
    all.sort((a, b) => a.storyOrder - b.storyOrder || compareSceneNumbers(a.number, b.number));
    const running = all.map((s, i) => ({ id: s.id, number: s.number, position: i + 1, setName: s.setName, storyDay: s.storyDay }));
    for (const d of days) if (d.kind === "performance") out.set(d.id, running);
  }
  return out;
}

/** Shoot days and performances in date order, each with its scenes. */
export async function listShootDays(
  actor: Actor,
  q: { page: number; pageSize: number; kind?: "shoot" | "performance"; from?: string },
): Promise<{ rows: ShootDayDto[]; total: number }> {
  const where: Record<string, unknown> = { productionId: actor.productionId };
  if (q.kind) where.kind = q.kind;
  if (q.from) where.date = { [Op.gte]: q.from };
  const { rows, count } = await ShootDay.findAndCountAll({
    where,
    order: [
      ["date", "ASC"],
      ["startsAt", "ASC"],
      ["dayNumber", "ASC"],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  const scenes = await scenesFor(actor.productionId, rows);
  return { rows: rows.map((d) => presentShootDay(d, scenes.get(d.id) ?? [])), total: count };
}

/** One shoot day with its scenes. */
export async function getShootDay(actor: Actor, id: string): Promise<ShootDayDto> {
  const d = await ShootDay.findOne({ where: { id, productionId: actor.productionId } });
  if (!d) throw NotFoundError("Shoot day not found.");
  return presentShootDay(d, (await scenesFor(actor.productionId, [d])).get(d.id) ?? []);
}

async function setDayScenes(actor: Actor, day: ShootDay, sceneIds: string[], transaction: Transaction): Promise<void> {
  if (new Set(sceneIds).size !== sceneIds.length)
    throw ValidationError("sceneIds: a scene is listed twice", { sceneIds: "lists a scene twice" });
  if (sceneIds.length) {
    const found = await Scene.count({ where: { productionId: actor.productionId, id: { [Op.in]: sceneIds } }, transaction });
    if (found !== sceneIds.length)
      throw ValidationError("sceneIds: a scene does not exist in this production", { sceneIds: "names a scene that does not exist" });
  }
  await ShootDayScene.destroy({ where: { shootDayId: day.id }, transaction });
  await ShootDayScene.bulkCreate(
    sceneIds.map((sceneId, i) => ({ productionId: actor.productionId, shootDayId: day.id, sceneId, position: i + 1 })),
    { transaction },
  );
}

/** A day number is the department's name for the day ("Day 12"): two days never share one. */
async function assertDayNumberFree(actor: Actor, dayNumber: number, exceptId: string | null, transaction: Transaction): Promise<void> {
  const other = await ShootDay.findOne({
    where: { productionId: actor.productionId, dayNumber },
    attributes: ["id", "date", "kind"],
    transaction,
  });
  if (other && other.id !== exceptId) {
    const what = other.kind === "performance" ? "Performance" : "Day";
    throw ConflictError(`dayNumber: ${what} ${dayNumber} already exists (${other.date}); choose another number.`, {
      dayNumber: `${what} ${dayNumber} already exists (${other.date})`,
    });
  }
}

/** Adds a shoot day (with ordered scenes) or a performance. */
export async function createShootDay(actor: Actor, input: ShootDayInput): Promise<ShootDayDto> {
  const day = await sequelize.transaction(async (transaction) => {
    const { sceneIds, ...fields } = input;
    await assertDayNumberFree(actor, fields.dayNumber, null, transaction);
    const d = await ShootDay.create({ ...fields, productionId: actor.productionId }, { transaction });
    if (sceneIds && d.kind === "shoot") await setDayScenes(actor, d, sceneIds, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "shoot_day.create",
        entityType: "shoot_day",
        entityId: d.id,
        after: { ...fields, sceneIds },
      },
      transaction,
    );
    return d;
  });
  return getShootDay(actor, day.id);
}

/** Changes a shoot day; `sceneIds` replaces its scene order. */
export async function updateShootDay(actor: Actor, id: string, input: UpdateShootDayInput): Promise<ShootDayDto> {
  await sequelize.transaction(async (transaction) => {
    const d = await ShootDay.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!d) throw NotFoundError("Shoot day not found.");
    const { sceneIds, ...fields } = input;
    const before = { dayNumber: d.dayNumber, date: d.date, kind: d.kind, startsAt: d.startsAt };
    if (fields.dayNumber !== undefined && fields.dayNumber !== d.dayNumber)
      await assertDayNumberFree(actor, fields.dayNumber, d.id, transaction);
    await d.update(fields, { transaction });
    if (sceneIds && d.kind === "shoot") await setDayScenes(actor, d, sceneIds, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "shoot_day.update",
        entityType: "shoot_day",
        entityId: id,
        before,
        after: input,
      },
      transaction,
    );
  });
  return getShootDay(actor, id);
}

/** Deletes a shoot day (its continuity entries keep their scene; the day link is cleared). */
export async function deleteShootDay(actor: Actor, id: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const d = await ShootDay.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!d) throw NotFoundError("Shoot day not found.");
    await d.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "shoot_day.delete",
        entityType: "shoot_day",
        entityId: id,
        before: { dayNumber: d.dayNumber, date: d.date },
      },
      transaction,
    );
  });
}

/**
 * Moves a scene from one shoot day to another in one transaction: it leaves the first day (whose
 * later scenes move up) and goes to the given place on the second (last when none is given).
 * @returns both days as they are now
 */
export async function moveSceneToDay(actor: Actor, fromId: string, input: MoveSceneInput): Promise<{ from: ShootDayDto; to: ShootDayDto }> {
  if (fromId === input.toShootDayId)
    throw ValidationError("toShootDayId: the scene is already on this day; drag it to reorder instead", {
      toShootDayId: "is the day the scene is on",
    });
  await sequelize.transaction(async (transaction) => {
    const days = await ShootDay.findAll({
      where: { productionId: actor.productionId, id: { [Op.in]: [fromId, input.toShootDayId] } },
      order: [["id", "ASC"]],
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    const from = days.find((d) => d.id === fromId);
    const to = days.find((d) => d.id === input.toShootDayId);
    if (!from) throw NotFoundError("Shoot day not found.");
    if (!to) throw ValidationError("toShootDayId: no such shoot day in this production", { toShootDayId: "does not exist" });
    if (to.kind !== "shoot" || from.kind !== "shoot")
      throw ValidationError("toShootDayId: a performance plays the whole show; scenes move only between shoot days", {
        toShootDayId: "is a performance",
      });
    const order = async (d: ShootDay) =>
      (await ShootDayScene.findAll({ where: { shootDayId: d.id }, order: [["position", "ASC"]], transaction })).map((x) => x.sceneId);
    const fromScenes = await order(from);
    const toScenes = await order(to);
    if (!fromScenes.includes(input.sceneId))
      throw ValidationError(`sceneId: the scene is not on day ${from.dayNumber}`, { sceneId: `is not on day ${from.dayNumber}` });
    if (toScenes.includes(input.sceneId))
      throw ConflictError(`sceneId: the scene is already on day ${to.dayNumber}`, { sceneId: `is already on day ${to.dayNumber}` });
    const at = Math.min((input.position ?? toScenes.length + 1) - 1, toScenes.length);
    toScenes.splice(at, 0, input.sceneId);
    await setDayScenes(
      actor,
      from,
      fromScenes.filter((id) => id !== input.sceneId),
      transaction,
    );
    await setDayScenes(actor, to, toScenes, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "shoot_day.move_scene",
        entityType: "shoot_day",
        entityId: to.id,
        before: { shootDayId: from.id, dayNumber: from.dayNumber },
        after: { shootDayId: to.id, dayNumber: to.dayNumber, sceneId: input.sceneId, position: at + 1 },
      },
      transaction,
    );
  });
  return { from: await getShootDay(actor, fromId), to: await getShootDay(actor, input.toShootDayId) };
}
