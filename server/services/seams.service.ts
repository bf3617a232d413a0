import { Op, type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import { Panel, Production, Seam } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { garmentsInScope } from "./panels.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { CreateSeamInput, SeamDto, UpdateSeamInput } from "@shared/schemas/doubles.js";
import { checkSeam, DEFAULT_SEAM_TOLERANCE_MM } from "@shared/domain/panels/seams.js";
import type { RunEnd } from "@shared/domain/panels/geometry.js";

/** The production's plain-seam tolerance (settings.seamToleranceMm), 3 mm by default. */
export async function productionSeamTolerance(productionId: string, transaction?: Transaction): Promise<number> {
  const p = await Production.findByPk(productionId, { transaction });
  const v = (p?.settings as { seamToleranceMm?: unknown } | undefined)?.seamToleranceMm;
  return typeof v === "number" && v >= 0 ? v : DEFAULT_SEAM_TOLERANCE_MM;
}

/** Checks a stored seam against its panels and shapes it for the wire. */
export function presentSeam(s: Seam, a: Panel, b: Panel, defaultTolerance: number): SeamDto {
  const effectiveToleranceMm = s.toleranceMm ?? defaultTolerance;
  const eased = s.eased && s.easeMinMm !== null && s.easeMaxMm !== null ? { minMm: s.easeMinMm, maxMm: s.easeMaxMm } : null;
  const check = checkSeam({
    a: { outline: a.outline, from: s.aFrom as RunEnd, to: s.aTo as RunEnd, direction: s.aDirection },
    b: { outline: b.outline, from: s.bFrom as RunEnd, to: s.bTo as RunEnd, direction: s.bDirection },
    toleranceMm: effectiveToleranceMm,
    eased,
  });
  return {
    id: s.id,
    name: s.name,
    a: { panelId: a.id, panelName: a.name, garmentId: a.garmentId, from: s.aFrom, to: s.aTo, direction: s.aDirection },
    b: { panelId: b.id, panelName: b.name, garmentId: b.garmentId, from: s.bFrom, to: s.bTo, direction: s.bDirection },
    toleranceMm: s.toleranceMm,
    effectiveToleranceMm,
    eased,
    ...check,
  };
}

/** Seams touching the panels of a garment or a change, checked. */
export async function listSeams(actor: Actor, scope: { garmentId?: string; changeId?: string }): Promise<SeamDto[]> {
  const garments = await garmentsInScope(actor, scope);
  const panels = await Panel.findAll({ where: { productionId: actor.productionId, garmentId: { [Op.in]: garments.map((g) => g.id) } } });
  const ids = panels.map((p) => p.id);
  if (ids.length === 0) return [];
  const seams = await Seam.findAll({
    where: { productionId: actor.productionId, [Op.or]: [{ panelAId: { [Op.in]: ids } }, { panelBId: { [Op.in]: ids } }] },
    include: [
      { model: Panel, as: "panelA" },
      { model: Panel, as: "panelB" },
    ],
    order: [["createdAt", "ASC"]],
  });
  const tol = await productionSeamTolerance(actor.productionId);
  return seams.map((s) => presentSeam(s, s.panelA!, s.panelB!, tol));
}

function checkEnd(end: RunEnd, n: number, field: string): void {
  const idx = typeof end === "number" ? end : end.edge;
  if (idx >= n)
    throw ValidationError(`${field}: the panel has ${n} points (0–${n - 1})`, { [field]: `the panel has ${n} points (0–${n - 1})` });
}

async function panelFor(actor: Actor, panelId: string, field: string, transaction: Transaction): Promise<Panel> {
  const p = await Panel.findOne({ where: { id: panelId, productionId: actor.productionId }, transaction });
  if (!p) throw ValidationError(`${field}: no such panel in this production`, { [field]: "no such panel in this production" });
  return p;
}

function fieldsFrom(input: CreateSeamInput) {
  return {
    name: input.name,
    panelAId: input.a.panelId,
    aFrom: input.a.from,
    aTo: input.a.to,
    aDirection: input.a.direction,
    panelBId: input.b.panelId,
    bFrom: input.b.from,
    bTo: input.b.to,
    bDirection: input.b.direction,
    toleranceMm: input.toleranceMm,
    eased: Boolean(input.eased),
    easeMinMm: input.eased?.minMm ?? null,
    easeMaxMm: input.eased?.maxMm ?? null,
  };
}

async function validateSides(actor: Actor, input: CreateSeamInput, transaction: Transaction): Promise<[Panel, Panel]> {
  const a = await panelFor(actor, input.a.panelId, "a.panelId", transaction);
  const b = await panelFor(actor, input.b.panelId, "b.panelId", transaction);
  checkEnd(input.a.from, a.outline.length, "a.from");
  checkEnd(input.a.to, a.outline.length, "a.to");
  checkEnd(input.b.from, b.outline.length, "b.from");
  checkEnd(input.b.to, b.outline.length, "b.to");
  return [a, b];
}

/** Creates a seam between two panel runs and returns it checked. */
export async function createSeam(actor: Actor, input: CreateSeamInput): Promise<SeamDto> {
  return sequelize.transaction(async (transaction) => {
    const [a, b] = await validateSides(actor, input, transaction);
    const seam = await Seam.create({ productionId: actor.productionId, ...fieldsFrom(input) }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "seam.create",
        entityType: "seam",
        entityId: seam.id,
        after: { name: seam.name },
      },
      transaction,
    );
    return presentSeam(seam, a, b, await productionSeamTolerance(actor.productionId, transaction));
  });
}

/** Updates a seam (any fields) and returns it checked. */
export async function updateSeam(actor: Actor, seamId: string, input: UpdateSeamInput): Promise<SeamDto> {
  return sequelize.transaction(async (transaction) => {
    const seam = await Seam.findOne({
      where: { id: seamId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!seam) throw NotFoundError("Seam not found.");
    const merged: CreateSeamInput = {
      name: input.name ?? seam.name,
      a: input.a ?? { panelId: seam.panelAId, from: seam.aFrom, to: seam.aTo, direction: seam.aDirection },
      b: input.b ?? { panelId: seam.panelBId, from: seam.bFrom, to: seam.bTo, direction: seam.bDirection },
      toleranceMm: input.toleranceMm !== undefined ? input.toleranceMm : seam.toleranceMm,
      eased:
        input.eased !== undefined
          ? input.eased
          : seam.eased && seam.easeMinMm !== null && seam.easeMaxMm !== null
            ? { minMm: seam.easeMinMm, maxMm: seam.easeMaxMm }
            : null,
    };
    const [a, b] = await validateSides(actor, merged, transaction);
    await seam.update(fieldsFrom(merged), { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "seam.update",
        entityType: "seam",
        entityId: seam.id,
        after: input,
      },
      transaction,
    );
    return presentSeam(seam, a, b, await productionSeamTolerance(actor.productionId, transaction));
  });
}

/** Deletes a seam. */
export async function deleteSeam(actor: Actor, seamId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const seam = await Seam.findOne({
      where: { id: seamId, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!seam) throw NotFoundError("Seam not found.");
    await seam.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "seam.delete",
        entityType: "seam",
        entityId: seam.id,
        before: { name: seam.name },
      },
      transaction,
    );
  });
}
