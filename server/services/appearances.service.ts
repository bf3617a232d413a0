import type { Transaction } from "sequelize";
import type { AppearanceInput, UpdateAppearanceInput } from "@shared/schemas/breakdown.js";
import { sequelize } from "../db.js";
import { Appearance, Change, Character, Scene } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { presentAppearance } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

/** Appearances filtered by scene, character or change. */
export async function listAppearances(
  actor: Actor,
  q: { sceneId?: string; characterId?: string; changeId?: string },
): Promise<Appearance[]> {
  const where: Record<string, unknown> = { productionId: actor.productionId };
  for (const k of ["sceneId", "characterId", "changeId"] as const) if (q[k]) where[k] = q[k];
  return Appearance.findAll({ where, order: [["createdAt", "ASC"]] });
}

async function checkLinks(
  actor: Actor,
  v: { sceneId: string; characterId: string; changeId: string | null },
  transaction: Transaction,
): Promise<void> {
  const pid = actor.productionId;
  if (!(await Scene.count({ where: { id: v.sceneId, productionId: pid }, transaction })))
    throw ValidationError("sceneId: no such scene in this production", { sceneId: "does not exist" });
  if (!(await Character.count({ where: { id: v.characterId, productionId: pid }, transaction })))
    throw ValidationError("characterId: no such character in this production", { characterId: "does not exist" });
  if (v.changeId) {
    const ch = await Change.findOne({ where: { id: v.changeId, productionId: pid }, transaction });
    if (!ch) throw ValidationError("changeId: no such change in this production", { changeId: "does not exist" });
    if (ch.characterId !== v.characterId)
      throw ValidationError("changeId: the change belongs to another character", { changeId: "belongs to another character" });
  }
}

/** Puts a character in a scene wearing a change. */
export async function createAppearance(actor: Actor, input: AppearanceInput): Promise<Appearance> {
  return sequelize.transaction(async (transaction) => {
    await checkLinks(actor, input, transaction);
    const a = await Appearance.create({ ...input, productionId: actor.productionId }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "appearance.create",
        entityType: "appearance",
        entityId: a.id,
        after: presentAppearance(a),
      },
      transaction,
    );
    return a;
  });
}

/** Changes the change worn or the required state. */
export async function updateAppearance(actor: Actor, id: string, input: UpdateAppearanceInput): Promise<Appearance> {
  return sequelize.transaction(async (transaction) => {
    const a = await Appearance.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!a) throw NotFoundError("Appearance not found.");
    const before = presentAppearance(a);
    if (input.changeId !== undefined)
      await checkLinks(actor, { sceneId: a.sceneId, characterId: a.characterId, changeId: input.changeId }, transaction);
    await a.update(input, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "appearance.update",
        entityType: "appearance",
        entityId: id,
        before,
        after: presentAppearance(a),
      },
      transaction,
    );
    return a;
  });
}

/** Takes a character out of a scene. */
export async function deleteAppearance(actor: Actor, id: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const a = await Appearance.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!a) throw NotFoundError("Appearance not found.");
    await a.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "appearance.delete",
        entityType: "appearance",
        entityId: id,
        before: presentAppearance(a),
      },
      transaction,
    );
  });
}
