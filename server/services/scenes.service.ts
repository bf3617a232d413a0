import { Op, QueryTypes, type Transaction } from "sequelize";
import type { ListScenesQuery, SceneDetailDto, SceneInput, SceneRowDto, UpdateSceneInput } from "@shared/schemas/breakdown.js";
import { compareSceneNumbers, minutesSincePreviousExit } from "@shared/domain/breakdown.js";
import { sequelize } from "../db.js";
import { Appearance, Change, Character, ContinuityEntry, Production, Scene, ShootDay, ShootDayScene } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { num, presentAppearance, presentScene } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import { deletePhotosOfOwners, removeUnreferencedFiles } from "./photos.service.js";
import type { Actor } from "../middleware/require-auth.js";

/** A scene of the actor's production, or 404. */
export async function findScene(actor: Actor, id: string, transaction?: Transaction): Promise<Scene> {
  const s = await Scene.findOne({ where: { id, productionId: actor.productionId }, transaction });
  if (!s) throw NotFoundError("Scene not found.");
  return s;
}

/**
 * Scenes in story order with their shoot days and characters (the breakdown table's rows), and the
 * total: one statement, so one round trip however long the page.
 */
export async function listScenes(actor: Actor, q: ListScenesQuery): Promise<{ rows: SceneRowDto[]; total: number }> {
  const conditions = ["s.production_id = :pid"];
  if (q.storyDay !== undefined) conditions.push("s.story_day = :storyDay");
  if (q.setName) conditions.push("s.set_name = :setName");
  if (q.shootDayId) conditions.push("s.id IN (SELECT scene_id FROM shoot_day_scenes WHERE shoot_day_id = :shootDayId)");
  if (q.characterId) conditions.push("s.id IN (SELECT scene_id FROM appearances WHERE character_id = :characterId)");
  const where = conditions.join(" AND ");
  const rows = await sequelize.query<SceneListRow>(
    `SELECT (SELECT count(*) FROM scenes s WHERE ${where})::int AS total, p.*,
            COALESCE((SELECT json_agg(json_build_object('id', sd.id, 'dayNumber', sd.day_number, 'date', sd.date) ORDER BY sd.day_number)
                        FROM shoot_day_scenes sds JOIN shoot_days sd ON sd.id = sds.shoot_day_id WHERE sds.scene_id = p.id), '[]') AS shoot_days,
            COALESCE((SELECT json_agg(json_build_object('id', c.id, 'name', c.name, 'changeNumber', ch.number) ORDER BY c.sort_order, c.name)
                        FROM appearances a JOIN characters c ON c.id = a.character_id LEFT JOIN changes ch ON ch.id = a.change_id
                       WHERE a.scene_id = p.id), '[]') AS characters
       FROM (SELECT 1) AS one
       LEFT JOIN LATERAL (
         SELECT s.id, s.number, s.set_name, s.int_ext, s.time_of_day, s.story_day, s.story_order, s.length_eighths, s.running_minutes, s.synopsis
           FROM scenes s WHERE ${where} ORDER BY s.story_order, s.number LIMIT :limit OFFSET :offset
       ) p ON true
      ORDER BY p.story_order, p.number`,
    {
      replacements: {
        pid: actor.productionId,
        storyDay: q.storyDay,
        setName: q.setName,
        shootDayId: q.shootDayId,
        characterId: q.characterId,
        limit: q.pageSize,
        offset: (q.page - 1) * q.pageSize,
      },
      type: QueryTypes.SELECT,
    },
  );
  const total = rows[0]?.total ?? 0;
  return {
    total,
    rows: rows
      .filter((r) => r.id !== null)
      .map((r) => ({
        id: r.id!,
        number: r.number,
        setName: r.set_name,
        intExt: r.int_ext as SceneRowDto["intExt"],
        timeOfDay: r.time_of_day,
        storyDay: r.story_day,
        storyOrder: r.story_order,
        lengthEighths: r.length_eighths,
        runningMinutes: num(r.running_minutes),
        synopsis: r.synopsis,
        shootDays: r.shoot_days,
        characters: r.characters,
      })),
  };
}

/** One row of the scene list query (a page past the end gives one row of nulls carrying the total). */
interface SceneListRow {
  total: number;
  id: string | null;
  number: string;
  set_name: string | null;
  int_ext: string | null;
  time_of_day: string | null;
  story_day: number | null;
  story_order: number;
  length_eighths: number | null;
  running_minutes: string | null;
  synopsis: string | null;
  shoot_days: SceneRowDto["shootDays"];
  characters: SceneRowDto["characters"];
}

/** Running-time gaps for every appearance of a stage production (empty for film). */
export async function stageGaps(productionId: string, transaction?: Transaction): Promise<Map<string, number | null>> {
  const production = await Production.findByPk(productionId, { transaction });
  if (production?.kind !== "stage") return new Map();
  const scenes = await Scene.findAll({
    where: { productionId },
    attributes: ["id", "number", "storyOrder", "runningMinutes"],
    transaction,
  });
  scenes.sort((a, b) => a.storyOrder - b.storyOrder || compareSceneNumbers(a.number, b.number));
  const apps = await Appearance.findAll({ where: { productionId }, attributes: ["id", "sceneId", "characterId"], transaction });
  return minutesSincePreviousExit(
    scenes.map((s) => ({ id: s.id, runningMinutes: num(s.runningMinutes) })),
    apps.map((a) => ({ id: a.id, sceneId: a.sceneId, characterId: a.characterId })),
  );
}

/** A scene page: the scene, its shoot days, and every character with the change worn. */
export async function getSceneDetail(actor: Actor, id: string): Promise<SceneDetailDto> {
  const scene = await findScene(actor, id);
  const slots = await ShootDayScene.findAll({ where: { sceneId: id, productionId: actor.productionId } });
  const days = slots.length
    ? await ShootDay.findAll({ where: { id: { [Op.in]: slots.map((s) => s.shootDayId) } }, order: [["dayNumber", "ASC"]] })
    : [];
  const apps = await Appearance.findAll({ where: { sceneId: id, productionId: actor.productionId } });
  const chars = await Character.findAll({ where: { productionId: actor.productionId, id: { [Op.in]: apps.map((a) => a.characterId) } } });
  const changeIds = apps.map((a) => a.changeId).filter((x): x is string => Boolean(x));
  const changes = changeIds.length ? await Change.findAll({ where: { id: { [Op.in]: changeIds } } }) : [];
  const charById = new Map(chars.map((c) => [c.id, c]));
  const changeById = new Map(changes.map((c) => [c.id, c]));
  const gaps = await stageGaps(actor.productionId);
  const appearances = apps
    .map((a) => {
      const ch = a.changeId ? changeById.get(a.changeId) : undefined;
      return {
        ...presentAppearance(a),
        characterName: charById.get(a.characterId)?.name ?? "",
        change: ch ? { id: ch.id, number: ch.number, description: ch.description } : null,
        minutesSincePreviousExit: gaps.get(a.id) ?? null,
        sortOrder: charById.get(a.characterId)?.sortOrder ?? 0,
      };
    })
    .sort((a, b) => a.sortOrder - b.sortOrder || a.characterName.localeCompare(b.characterName))
    .map(({ sortOrder: _s, ...rest }) => rest);
  return {
    ...presentScene(scene),
    shootDays: days.map((d) => ({ id: d.id, dayNumber: d.dayNumber, date: d.date, kind: d.kind })),
    appearances,
  };
}

/** Adds a scene; without a story order it goes after the last one. */
export async function createScene(actor: Actor, input: SceneInput): Promise<Scene> {
  return sequelize.transaction(async (transaction) => {
    const storyOrder =
      input.storyOrder ??
      (((await Scene.max("storyOrder", { where: { productionId: actor.productionId }, transaction })) as number | null) ?? 0) + 1;
    const scene = await Scene.create({ ...input, storyOrder, productionId: actor.productionId }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "scene.create",
        entityType: "scene",
        entityId: scene.id,
        after: presentScene(scene),
      },
      transaction,
    );
    return scene;
  });
}

/** Changes a scene's fields. */
export async function updateScene(actor: Actor, id: string, input: UpdateSceneInput): Promise<Scene> {
  return sequelize.transaction(async (transaction) => {
    const scene = await Scene.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!scene) throw NotFoundError("Scene not found.");
    const before = presentScene(scene);
    await scene.update(input, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "scene.update",
        entityType: "scene",
        entityId: id,
        before,
        after: presentScene(scene),
      },
      transaction,
    );
    return scene;
  });
}

/** Deletes a scene with its appearances, continuity entries and their photos (files after commit). */
export async function deleteScene(actor: Actor, id: string): Promise<void> {
  const hashes = await sequelize.transaction(async (transaction) => {
    const scene = await findScene(actor, id, transaction);
    const entries = await ContinuityEntry.findAll({
      where: { sceneId: id, productionId: actor.productionId },
      attributes: ["id"],
      transaction,
    });
    const h1 = await deletePhotosOfOwners(
      actor.productionId,
      "continuity_entry",
      entries.map((e) => e.id),
      transaction,
    );
    const h2 = await deletePhotosOfOwners(actor.productionId, "scene", [id], transaction);
    await scene.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "scene.delete",
        entityType: "scene",
        entityId: id,
        before: presentScene(scene),
      },
      transaction,
    );
    return [...h1, ...h2];
  });
  await removeUnreferencedFiles(hashes);
}
