// Breakdown CSV import and export. The preview and the import run the same checks; the import
// writes every scene and shoot day in one transaction, or nothing.
import { Op, type Transaction } from "sequelize";
import type { ImportPreviewDto, ImportResultDto } from "@shared/schemas/breakdown.js";
import { breakdownToCsv, parseBreakdownCsv, type CsvShootDay, type ParsedBreakdownCsv } from "@shared/domain/breakdown-csv.js";
import { sequelize } from "../db.js";
import { Scene, ShootDay, ShootDayScene } from "../models/index.js";
import { ValidationError } from "../errors.js";
import { num } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

async function counts(actor: Actor, parsed: ParsedBreakdownCsv, transaction?: Transaction) {
  const existingScenes = await Scene.findAll({ where: { productionId: actor.productionId, number: { [Op.in]: parsed.scenes.map((s) => s.number) } }, attributes: ["id", "number", "storyOrder"], transaction });
  const existingDays = await ShootDay.findAll({ where: { productionId: actor.productionId, dayNumber: { [Op.in]: parsed.shootDays.map((d) => d.dayNumber) } }, attributes: ["id", "dayNumber"], transaction });
  return {
    existingScenes,
    existingDays,
    scenes: { created: parsed.scenes.length - existingScenes.length, updated: existingScenes.length },
    shootDays: { created: parsed.shootDays.length - existingDays.length, updated: existingDays.length },
  };
}

/** Parses and checks a file without saving anything: what would change, and every bad row. */
export async function previewBreakdownImport(actor: Actor, csv: string): Promise<ImportPreviewDto> {
  const parsed = parseBreakdownCsv(csv);
  const c = await counts(actor, parsed);
  return { valid: parsed.errors.length === 0, rows: parsed.rows, scenes: c.scenes, shootDays: c.shootDays, errors: parsed.errors };
}

/** Imports scenes and shoot days; any bad row → 400 listing every problem, nothing saved. */
export async function importBreakdown(actor: Actor, csv: string, fileName?: string): Promise<ImportResultDto> {
  const parsed = parseBreakdownCsv(csv);
  if (parsed.errors.length) {
    const fields: Record<string, string> = {};
    for (const e of parsed.errors) {
      const key = `line ${e.line}, ${e.column}`;
      fields[key] = fields[key] ? `${fields[key]}; ${e.message}` : e.message;
    }
    throw ValidationError(`The file has ${parsed.errors.length} problem${parsed.errors.length > 1 ? "s" : ""}; nothing was imported. First: line ${parsed.errors[0]!.line}, ${parsed.errors[0]!.column}: ${parsed.errors[0]!.message}`, fields);
  }
  const pid = actor.productionId;
  return sequelize.transaction(async (transaction) => {
    const c = await counts(actor, parsed, transaction);
    const orderOf = new Map(c.existingScenes.map((s) => [s.number, s.storyOrder]));
    let next = (((await Scene.max("storyOrder", { where: { productionId: pid }, transaction })) as number | null) ?? 0) + 1;
    const sceneRows = parsed.scenes.map((s) => ({
      productionId: pid,
      number: s.number,
      setName: s.setName,
      intExt: s.intExt,
      timeOfDay: s.timeOfDay,
      storyDay: s.storyDay,
      // Given order wins; otherwise keep a known scene's place, or append in file order.
      storyOrder: s.storyOrder ?? orderOf.get(s.number) ?? next++,
      lengthEighths: s.lengthEighths,
      runningMinutes: s.runningMinutes,
      synopsis: s.synopsis,
    }));
    // One statement per table instead of one per row keeps a 2,000-row file in one short request.
    const saved = await Scene.bulkCreate(sceneRows, {
      transaction,
      conflictAttributes: ["productionId", "number"],
      updateOnDuplicate: ["setName", "intExt", "timeOfDay", "storyDay", "storyOrder", "lengthEighths", "runningMinutes", "synopsis", "updatedAt"],
      returning: ["id", "number"],
    });
    const sceneId = new Map(saved.map((s) => [s.number, s.id]));
    if (parsed.shootDays.length) {
      const days = await ShootDay.bulkCreate(
        parsed.shootDays.map((d: CsvShootDay) => ({ productionId: pid, dayNumber: d.dayNumber, date: d.date, kind: "shoot" as const, startsAt: null, notes: null })),
        { transaction, conflictAttributes: ["productionId", "dayNumber"], updateOnDuplicate: ["date", "updatedAt"], returning: ["id", "dayNumber"] },
      );
      const dayId = new Map(days.map((d) => [d.dayNumber, d.id]));
      await ShootDayScene.destroy({ where: { shootDayId: { [Op.in]: [...dayId.values()] } }, transaction });
      await ShootDayScene.bulkCreate(
        parsed.shootDays.flatMap((d) => d.scenes.map((s) => ({ productionId: pid, shootDayId: dayId.get(d.dayNumber)!, sceneId: sceneId.get(s.number)!, position: s.position }))),
        { transaction },
      );
    }
    const result = { rows: parsed.rows, scenes: c.scenes, shootDays: c.shootDays };
    await recordAudit({ productionId: pid, actorId: actor.user.id, action: "breakdown.import", entityType: "production", entityId: pid, after: { fileName: fileName ?? null, ...result } }, transaction);
    return result;
  });
}

/** The production's breakdown as CSV (same layout the import reads). */
export async function exportBreakdown(actor: Actor): Promise<string> {
  const pid = actor.productionId;
  const [scenes, days] = await Promise.all([
    Scene.findAll({ where: { productionId: pid } }),
    ShootDay.findAll({ where: { productionId: pid, kind: "shoot" }, include: [{ model: ShootDayScene, as: "dayScenes", include: [{ model: Scene, as: "scene", attributes: ["number"] }] }] }),
  ]);
  return breakdownToCsv(
    scenes.map((s) => ({ number: s.number, setName: s.setName, intExt: s.intExt, timeOfDay: s.timeOfDay, storyDay: s.storyDay, storyOrder: s.storyOrder, lengthEighths: s.lengthEighths, runningMinutes: num(s.runningMinutes), synopsis: s.synopsis })),
    days.map((d) => ({ dayNumber: d.dayNumber, date: d.date, scenes: (d.dayScenes ?? []).sort((a, b) => a.position - b.position).map((x) => ({ number: x.scene?.number ?? "", position: x.position })) })),
  );
}
