import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { MeasurementSet, User } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { CreateMeasurementSetInput, PerformerMeasurementsDto } from "@shared/schemas/measurements.js";
import { checkMeasurementSet, type MeasurementKey } from "@shared/domain/plausibility.js";
import { roundTo, unitToMm } from "@shared/domain/units.js";
import { shoeSize, sizeLines } from "@shared/domain/measurement-summary.js";
import { presentMeasurementSet } from "../presenters/measurements.presenter.js";

/** The performer (a Breakdown record, read directly) or 404. */
async function performerOrThrow(actor: Actor, performerId: string): Promise<{ id: string; name: string }> {
  const rows = await sequelize.query<{ id: string; name: string }>(
    `SELECT id, name FROM performers WHERE id = :id AND production_id = :pid`,
    {
      replacements: { id: performerId, pid: actor.productionId },
      type: QueryTypes.SELECT,
    },
  );
  if (!rows[0]) throw NotFoundError("Performer not found.");
  return rows[0];
}

/** A performer's measurement history (newest first) with sizes from the newest set. */
export async function getPerformerMeasurements(actor: Actor, performerId: string): Promise<PerformerMeasurementsDto> {
  const performer = await performerOrThrow(actor, performerId);
  const sets = await MeasurementSet.findAll({
    where: { performerId, productionId: actor.productionId },
    include: [{ model: User, as: "taker", attributes: ["id", "name"] }],
    order: [
      ["takenOn", "DESC"],
      ["createdAt", "DESC"],
    ],
  });
  const current = sets[0]?.valuesMm ?? {};
  const shoe = shoeSize(current);
  return {
    performer,
    sets: sets.map(presentMeasurementSet),
    sizes: sizeLines(current),
    mondopoint: shoe
      ? { label: shoe.label, lengthMm: shoe.lengthMm, ...(shoe.widthMm !== undefined ? { widthMm: shoe.widthMm } : {}) }
      : null,
  };
}

/**
 * Records a dated set: values converted from cm or inches to mm (exact factors), then checked against
 * plausible human ranges; any implausible value refuses the whole set with the reason per field.
 */
export async function createMeasurementSet(actor: Actor, performerId: string, input: CreateMeasurementSetInput): Promise<MeasurementSet> {
  await performerOrThrow(actor, performerId);
  const valuesMm: Partial<Record<MeasurementKey, number>> = {};
  for (const [key, v] of Object.entries(input.values) as [MeasurementKey, number][]) {
    // Six decimals of a mm remove float noise (15.3 in → 388.62 mm) without losing the exact conversion.
    valuesMm[key] = roundTo(unitToMm(v, input.unit), 6);
  }
  const problems = checkMeasurementSet(valuesMm);
  if (problems.length) {
    const fields: Record<string, string> = {};
    for (const p of problems) fields[`values.${p.key}`] ??= p.reason;
    throw ValidationError(`values.${problems[0]!.key}: ${problems[0]!.reason}`, fields);
  }
  const id = await sequelize.transaction(async (transaction) => {
    const m = await MeasurementSet.create(
      {
        productionId: actor.productionId,
        performerId,
        takenOn: input.takenOn,
        takenBy: actor.user.id,
        valuesMm,
        enteredUnit: input.unit,
        notes: input.notes,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "measurement.create",
        entityType: "measurement_set",
        entityId: m.id,
        after: { performerId, takenOn: input.takenOn, unit: input.unit },
      },
      transaction,
    );
    return m.id;
  });
  return (await MeasurementSet.findByPk(id, { include: [{ model: User, as: "taker", attributes: ["id", "name"] }] }))!;
}

/** Deletes a set recorded by mistake. */
export async function deleteMeasurementSet(actor: Actor, performerId: string, setId: string): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const m = await MeasurementSet.findOne({ where: { id: setId, performerId, productionId: actor.productionId }, transaction });
    if (!m) throw NotFoundError("Measurement set not found.");
    await m.destroy({ transaction });
    // The audit keeps the date and who took it, not the body values (personal data).
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "measurement.delete",
        entityType: "measurement_set",
        entityId: setId,
        before: { performerId, takenOn: m.takenOn },
      },
      transaction,
    );
  });
}
