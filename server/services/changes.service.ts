import { Op, QueryTypes, type Transaction } from "sequelize";
import type { ChangeApproval, ChangeDto, ChangeInput, ChangeItemInput, UpdateChangeInput } from "@shared/schemas/changes.js";
import { sequelize } from "../db.js";
import { Appearance, Change, ChangeItem, Character, Scene } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { presentChange } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import { deletePhotosOfOwners, removeUnreferencedFiles } from "./photos.service.js";
import type { Actor } from "../middleware/require-auth.js";

/** Checks that garment and multiples-group ids exist in the production (the Wardrobe feature owns those tables). */
async function checkItemTargets(actor: Actor, items: ChangeItemInput[], transaction: Transaction): Promise<void> {
  const check = async (table: string, column: "garmentId" | "multiplesGroupId") => {
    const ids = [...new Set(items.map((i) => i[column]).filter((x): x is string => Boolean(x)))];
    if (!ids.length) return;
    const rows = await sequelize.query<{ id: string }>(`SELECT id FROM ${table} WHERE production_id = :pid AND id IN (:ids)`, {
      replacements: { pid: actor.productionId, ids },
      type: QueryTypes.SELECT,
      transaction,
    });
    const found = new Set(rows.map((r) => r.id));
    const idx = items.findIndex((i) => i[column] && !found.has(i[column]!));
    if (idx >= 0)
      throw ValidationError(`items.${idx}.${column}: no such record in this production`, { [`items.${idx}.${column}`]: "does not exist" });
  };
  await check("garments", "garmentId");
  await check("multiples_groups", "multiplesGroupId");
}

async function replaceItems(actor: Actor, changeId: string, items: ChangeItemInput[], transaction: Transaction): Promise<void> {
  await checkItemTargets(actor, items, transaction);
  await ChangeItem.destroy({ where: { changeId }, transaction });
  await ChangeItem.bulkCreate(
    items.map((i, n) => ({
      productionId: actor.productionId,
      changeId,
      label: i.label,
      garmentId: i.garmentId,
      multiplesGroupId: i.multiplesGroupId,
      sortOrder: n + 1,
    })),
    { transaction },
  );
}

/** Changes with items and the scenes they are worn in, by character then number. */
export async function listChanges(actor: Actor, q: { characterId?: string; ids?: string[] }): Promise<ChangeDto[]> {
  const where: Record<string, unknown> = { productionId: actor.productionId };
  if (q.characterId) where.characterId = q.characterId;
  if (q.ids) where.id = { [Op.in]: q.ids };
  const changes = await Change.findAll({ where, include: [{ model: ChangeItem, as: "items" }], order: [["number", "ASC"]] });
  const chars = await Character.findAll({ where: { productionId: actor.productionId }, attributes: ["id", "name", "sortOrder"] });
  const charById = new Map(chars.map((c) => [c.id, c]));
  const apps = changes.length
    ? await Appearance.findAll({
        where: { changeId: { [Op.in]: changes.map((c) => c.id) } },
        attributes: ["changeId", "sceneId", "distressStage"],
      })
    : [];
  const scenes = apps.length
    ? await Scene.findAll({
        where: { id: { [Op.in]: [...new Set(apps.map((a) => a.sceneId))] } },
        attributes: ["id", "number", "storyDay", "storyOrder"],
      })
    : [];
  const sceneById = new Map(scenes.map((s) => [s.id, s]));
  const byChange = new Map<string, Array<ChangeDto["scenes"][number] & { order: number }>>();
  for (const a of apps) {
    const s = sceneById.get(a.sceneId);
    if (!s || !a.changeId) continue;
    byChange.set(a.changeId, [
      ...(byChange.get(a.changeId) ?? []),
      { sceneId: s.id, number: s.number, storyDay: s.storyDay, distressStage: a.distressStage, order: s.storyOrder },
    ]);
  }
  return changes
    .map((c) =>
      presentChange(
        c,
        charById.get(c.characterId)?.name ?? "",
        (byChange.get(c.id) ?? []).sort((a, b) => a.order - b.order).map(({ order: _o, ...r }) => r),
      ),
    )
    .sort(
      (a, b) =>
        (charById.get(a.characterId)?.sortOrder ?? 0) - (charById.get(b.characterId)?.sortOrder ?? 0) ||
        a.characterName.localeCompare(b.characterName) ||
        a.number - b.number,
    );
}

/** One change. */
export async function getChange(actor: Actor, id: string): Promise<ChangeDto> {
  const [c] = await listChanges(actor, { ids: [id] });
  if (!c) throw NotFoundError("Change not found.");
  return c;
}

/** Adds a change (next number for the character when not given) with its items. */
export async function createChange(actor: Actor, input: ChangeInput): Promise<ChangeDto> {
  const id = await sequelize.transaction(async (transaction) => {
    const ch = await Character.findOne({
      where: { id: input.characterId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!ch) throw ValidationError("characterId: no such character in this production", { characterId: "does not exist" });
    const number =
      input.number ?? (((await Change.max("number", { where: { characterId: ch.id }, transaction })) as number | null) ?? 0) + 1;
    const c = await Change.create(
      {
        productionId: actor.productionId,
        characterId: ch.id,
        number,
        description: input.description,
        storyDayFrom: input.storyDayFrom,
        storyDayTo: input.storyDayTo,
        approvedBy: null,
        approvedAt: null,
      },
      { transaction },
    );
    if (input.items) await replaceItems(actor, c.id, input.items, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "change.create",
        entityType: "change",
        entityId: c.id,
        after: input,
      },
      transaction,
    );
    return c.id;
  });
  return getChange(actor, id);
}

/** Changes a change's fields; `items` replaces the list. Editing an approved change sends it back to draft. */
export async function updateChange(actor: Actor, id: string, input: UpdateChangeInput): Promise<ChangeDto> {
  await sequelize.transaction(async (transaction) => {
    const c = await Change.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!c) throw NotFoundError("Change not found.");
    const { items, ...fields } = input;
    const from = fields.storyDayFrom !== undefined ? fields.storyDayFrom : c.storyDayFrom;
    const to = fields.storyDayTo !== undefined ? fields.storyDayTo : c.storyDayTo;
    if (from != null && to != null && to < from)
      throw ValidationError("storyDayTo: must not be before the first story day", { storyDayTo: "must not be before the first story day" });
    const before = {
      number: c.number,
      description: c.description,
      storyDayFrom: c.storyDayFrom,
      storyDayTo: c.storyDayTo,
      approval: c.approval,
    };
    // An approval covers what was approved; a later edit needs a new look.
    const reset = c.approval === "approved" ? { approval: "draft" as const, approvedBy: null, approvedAt: null } : {};
    await c.update(
      { ...fields, description: fields.description === undefined ? c.description : (fields.description ?? null), ...reset },
      { transaction },
    );
    if (items) await replaceItems(actor, id, items, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "change.update",
        entityType: "change",
        entityId: id,
        before,
        after: input,
      },
      transaction,
    );
  });
  return getChange(actor, id);
}

/** Moves a change through draft → proposed → approved (or back). */
export async function setChangeApproval(actor: Actor, id: string, approval: ChangeApproval): Promise<ChangeDto> {
  await sequelize.transaction(async (transaction) => {
    const c = await Change.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!c) throw NotFoundError("Change not found.");
    const before = c.approval;
    await c.update(
      approval === "approved"
        ? { approval, approvedBy: actor.user.id, approvedAt: new Date() }
        : { approval, approvedBy: null, approvedAt: null },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "change.approval",
        entityType: "change",
        entityId: id,
        before: { approval: before },
        after: { approval },
      },
      transaction,
    );
  });
  return getChange(actor, id);
}

/** Deletes a change (appearances keep the scene with no change set) and its photos. */
export async function deleteChange(actor: Actor, id: string): Promise<void> {
  const hashes = await sequelize.transaction(async (transaction) => {
    const c = await Change.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!c) throw NotFoundError("Change not found.");
    const h = await deletePhotosOfOwners(actor.productionId, "change", [id], transaction);
    await c.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "change.delete",
        entityType: "change",
        entityId: id,
        before: { number: c.number, characterId: c.characterId },
      },
      transaction,
    );
    return h;
  });
  await removeUnreferencedFiles(hashes);
}
