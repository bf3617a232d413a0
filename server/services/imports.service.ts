// Breakdown CSV import and export. The preview and the import run the same checks and the same
// merge (shared/domain/breakdown-csv.ts); the import writes every scene and shoot day in one
// transaction, or nothing.
import { Op, type Transaction } from "sequelize";
import type { ImportPreviewDto, ImportResultDto } from "@shared/schemas/breakdown.js";
import {
  breakdownTemplateCsv,
  breakdownToCsv,
  parseBreakdownCsv,
  planBreakdownImport,
  type BreakdownImportPlan,
  type ParsedBreakdownCsv,
  type SceneValues,
  type StoredBreakdown,
} from "@shared/domain/breakdown-csv.js";
import { sequelize } from "../db.js";
import { Production, Scene, ShootDay, ShootDayScene } from "../models/index.js";
import { ValidationError } from "../errors.js";
import { num } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

const sceneValues = (s: Scene): SceneValues => ({
  setName: s.setName,
  intExt: s.intExt,
  timeOfDay: s.timeOfDay,
  storyDay: s.storyDay,
  storyOrder: s.storyOrder,
  lengthEighths: s.lengthEighths,
  runningMinutes: num(s.runningMinutes),
  synopsis: s.synopsis,
});

/** The stored scenes and days the file names (locked for update inside the import's transaction). */
async function loadStored(
  actor: Actor,
  parsed: ParsedBreakdownCsv,
  transaction?: Transaction,
): Promise<StoredBreakdown & { sceneIds: Map<string, string>; dayIds: Map<number, string> }> {
  const pid = actor.productionId;
  const numbers = [...new Set([...parsed.scenes.map((s) => s.number), ...parsed.shootDays.flatMap((d) => d.scenes.map((x) => x.number))])];
  const lock = transaction ? { transaction, lock: transaction.LOCK.UPDATE } : {};
  const scenes = numbers.length ? await Scene.findAll({ where: { productionId: pid, number: { [Op.in]: numbers } }, ...lock }) : [];
  const days = parsed.shootDays.length
    ? await ShootDay.findAll({ where: { productionId: pid, dayNumber: { [Op.in]: parsed.shootDays.map((d) => d.dayNumber) } }, ...lock })
    : [];
  const slots = days.length
    ? await ShootDayScene.findAll({
        where: { productionId: pid, shootDayId: { [Op.in]: days.map((d) => d.id) } },
        include: [{ model: Scene, as: "scene", attributes: ["id", "number"] }],
        order: [["position", "ASC"]],
        transaction,
      })
    : [];
  const maxOrder = (await Scene.max("storyOrder", { where: { productionId: pid }, transaction })) as number | null;
  return {
    scenes: new Map(scenes.map((s) => [s.number, sceneValues(s)])),
    days: new Map(
      days.map((d) => [
        d.dayNumber,
        { date: d.date, sceneNumbers: slots.filter((x) => x.shootDayId === d.id).map((x) => x.scene?.number ?? "") },
      ]),
    ),
    nextStoryOrder: (maxOrder ?? 0) + 1,
    // A day's other scenes stay on it, so their ids are needed too.
    sceneIds: new Map([...slots.map((x) => [x.scene?.number ?? "", x.sceneId] as const), ...scenes.map((s) => [s.number, s.id] as const)]),
    dayIds: new Map(days.map((d) => [d.dayNumber, d.id])),
  };
}

function allErrors(parsed: ParsedBreakdownCsv, plan: BreakdownImportPlan | null) {
  return [...parsed.errors, ...(plan?.errors ?? [])].sort((a, b) => a.line - b.line);
}

/** Parses and checks a file without saving anything: each row's old → new values, and every bad row. */
export async function previewBreakdownImport(actor: Actor, csv: string): Promise<ImportPreviewDto> {
  const parsed = parseBreakdownCsv(csv);
  const plan = parsed.errors.length ? null : planBreakdownImport(parsed, await loadStored(actor, parsed));
  const errors = allErrors(parsed, plan);
  const none = { created: 0, updated: 0, unchanged: 0 };
  return {
    valid: errors.length === 0,
    rows: parsed.rows,
    scenes: plan?.counts.scenes ?? none,
    shootDays: plan?.counts.shootDays ?? none,
    errors,
    changes: plan?.changes ?? [],
    days: plan?.days ?? [],
  };
}

function refuse(errors: ReturnType<typeof allErrors>): never {
  const fields: Record<string, string> = {};
  for (const e of errors) {
    const key = `line ${e.line}, ${e.column}`;
    fields[key] = fields[key] ? `${fields[key]}; ${e.message}` : e.message;
  }
  throw ValidationError(
    `The file has ${errors.length} problem${errors.length > 1 ? "s" : ""}; nothing was imported. First: line ${errors[0]!.line}, ${errors[0]!.column}: ${errors[0]!.message}`,
    fields,
  );
}

/**
 * Imports scenes and shoot days, merged into what is stored (an absent column or empty cell keeps
 * the value, `(clear)` empties it); any bad row → 400 listing every problem, nothing saved.
 */
export async function importBreakdown(actor: Actor, csv: string, fileName?: string): Promise<ImportResultDto> {
  const parsed = parseBreakdownCsv(csv);
  if (parsed.errors.length) refuse(parsed.errors);
  const pid = actor.productionId;
  return sequelize.transaction(async (transaction) => {
    const stored = await loadStored(actor, parsed, transaction);
    const plan = planBreakdownImport(parsed, stored);
    if (plan.errors.length) refuse(plan.errors);
    const sceneId = new Map(stored.sceneIds);
    if (plan.sceneWrites.length) {
      // One statement per table instead of one per row keeps a 2,000-row file in one short request.
      const saved = await Scene.bulkCreate(
        plan.sceneWrites.map((w) => ({ productionId: pid, number: w.number, ...w.values })),
        {
          transaction,
          conflictAttributes: ["productionId", "number"],
          updateOnDuplicate: [
            "setName",
            "intExt",
            "timeOfDay",
            "storyDay",
            "storyOrder",
            "lengthEighths",
            "runningMinutes",
            "synopsis",
            "updatedAt",
          ],
          returning: ["id", "number"],
        },
      );
      for (const s of saved) sceneId.set(s.number, s.id);
    }
    if (plan.dayWrites.length) {
      const days = await ShootDay.bulkCreate(
        plan.dayWrites.map((d) => ({
          productionId: pid,
          dayNumber: d.dayNumber,
          date: d.date,
          kind: "shoot" as const,
          startsAt: null,
          notes: null,
        })),
        {
          transaction,
          conflictAttributes: ["productionId", "dayNumber"],
          updateOnDuplicate: ["date", "updatedAt"],
          returning: ["id", "dayNumber"],
        },
      );
      const dayId = new Map(days.map((d) => [d.dayNumber, d.id]));
      const reorder = plan.dayWrites.filter((d) => d.scenesChanged);
      if (reorder.length) {
        await ShootDayScene.destroy({ where: { shootDayId: { [Op.in]: reorder.map((d) => dayId.get(d.dayNumber)!) } }, transaction });
        await ShootDayScene.bulkCreate(
          reorder.flatMap((d) =>
            d.sceneNumbers.map((n, i) => ({
              productionId: pid,
              shootDayId: dayId.get(d.dayNumber)!,
              sceneId: sceneId.get(n)!,
              position: i + 1,
            })),
          ),
          { transaction },
        );
      }
    }
    const result = { rows: parsed.rows, scenes: plan.counts.scenes, shootDays: plan.counts.shootDays };
    await recordAudit(
      {
        productionId: pid,
        actorId: actor.user.id,
        action: "breakdown.import",
        entityType: "production",
        entityId: pid,
        after: { fileName: fileName ?? null, ...result },
      },
      transaction,
    );
    return result;
  });
}

/** A CSV to fill in: each column's accepted values, the clear token and one example row. */
export async function breakdownTemplate(actor: Actor): Promise<string> {
  const production = await Production.findByPk(actor.productionId, { attributes: ["kind"] });
  return breakdownTemplateCsv(production?.kind ?? "film");
}

/** The production's breakdown as CSV (same layout the import reads). */
export async function exportBreakdown(actor: Actor): Promise<string> {
  const pid = actor.productionId;
  const [scenes, days] = await Promise.all([
    Scene.findAll({ where: { productionId: pid } }),
    ShootDay.findAll({
      where: { productionId: pid, kind: "shoot" },
      include: [{ model: ShootDayScene, as: "dayScenes", include: [{ model: Scene, as: "scene", attributes: ["number"] }] }],
    }),
  ]);
  return breakdownToCsv(
    scenes.map((s) => ({
      number: s.number,
      setName: s.setName,
      intExt: s.intExt,
      timeOfDay: s.timeOfDay,
      storyDay: s.storyDay,
      storyOrder: s.storyOrder,
      lengthEighths: s.lengthEighths,
      runningMinutes: num(s.runningMinutes),
      synopsis: s.synopsis,
    })),
    days.map((d) => ({
      dayNumber: d.dayNumber,
      date: d.date,
      scenes: (d.dayScenes ?? [])
        .sort((a, b) => a.position - b.position)
        .map((x) => ({ number: x.scene?.number ?? "", position: x.position })),
    })),
  );
}
