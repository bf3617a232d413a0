// Continuity: what was actually worn, with photos. Capture is one request (fields + photos): the
// photo files are written first, then the entry, garment links and photo rows commit together;
// if anything fails, files no row refers to are removed.
import { Op, QueryTypes, type Transaction } from "sequelize";
import type { ContinuityEntryDto, ContinuityEntryInput, ContinuityTimelineDto } from "@shared/schemas/continuity.js";
import { sequelize } from "../db.js";
import { Appearance, Change, Character, ContinuityEntry, ContinuityEntryGarment, Scene, ShootDay } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { presentPhoto } from "../presenters/photos.presenter.js";
import { recordAudit } from "./audit.service.js";
import { deletePhotosOfOwners, linkPhoto, photosForOwners, releaseStoredImages, removeUnreferencedFiles, storeImage, type StoredImage, type UploadedFile } from "./photos.service.js";
import type { Actor } from "../middleware/require-auth.js";

async function checkGarments(productionId: string, ids: string[], transaction: Transaction): Promise<void> {
  const unique = [...new Set(ids)];
  if (!unique.length) return;
  const rows = await sequelize.query<{ id: string }>(`SELECT id FROM garments WHERE production_id = :pid AND id IN (:ids)`, { replacements: { pid: productionId, ids: unique }, type: QueryTypes.SELECT, transaction });
  if (rows.length !== unique.length) throw ValidationError("garmentIds: a garment does not exist in this production", { garmentIds: "names a garment that does not exist" });
}

async function presentEntries(productionId: string, entries: ContinuityEntry[]): Promise<ContinuityEntryDto[]> {
  if (!entries.length) return [];
  const [scenes, chars, photos, garments] = await Promise.all([
    Scene.findAll({ where: { id: { [Op.in]: [...new Set(entries.map((e) => e.sceneId))] } }, attributes: ["id", "number", "storyDay", "storyOrder"] }),
    Character.findAll({ where: { id: { [Op.in]: [...new Set(entries.map((e) => e.characterId))] } }, attributes: ["id", "name"] }),
    photosForOwners(productionId, "continuity_entry", entries.map((e) => e.id)),
    ContinuityEntryGarment.findAll({ where: { continuityEntryId: { [Op.in]: entries.map((e) => e.id) } } }),
  ]);
  const sceneById = new Map(scenes.map((s) => [s.id, s]));
  const charById = new Map(chars.map((c) => [c.id, c]));
  return entries.map((e) => {
    const s = sceneById.get(e.sceneId);
    return {
      id: e.id,
      shootDayId: e.shootDayId,
      sceneId: e.sceneId,
      sceneNumber: s?.number ?? "",
      storyDay: s?.storyDay ?? null,
      storyOrder: s?.storyOrder ?? 0,
      characterId: e.characterId,
      characterName: charById.get(e.characterId)?.name ?? "",
      distressStage: e.distressStage,
      notes: e.notes,
      garmentIds: garments.filter((g) => g.continuityEntryId === e.id).map((g) => g.garmentId),
      loggedBy: e.loggedBy,
      createdAt: e.createdAt.toISOString(),
      photos: photos.filter((p) => p.ownerId === e.id).map(presentPhoto),
    };
  });
}

/** Entries filtered by character, scene or shoot day, in story order then time logged. */
export async function listContinuity(actor: Actor, q: { characterId?: string; sceneId?: string; shootDayId?: string }): Promise<ContinuityEntryDto[]> {
  const where: Record<string, unknown> = { productionId: actor.productionId };
  for (const k of ["characterId", "sceneId", "shootDayId"] as const) if (q[k]) where[k] = q[k];
  const entries = await ContinuityEntry.findAll({ where, order: [["createdAt", "ASC"]] });
  const out = await presentEntries(actor.productionId, entries);
  return out.sort((a, b) => a.storyOrder - b.storyOrder || a.createdAt.localeCompare(b.createdAt));
}

/** One entry with photos. */
export async function getContinuityEntry(actor: Actor, id: string): Promise<ContinuityEntryDto> {
  const e = await ContinuityEntry.findOne({ where: { id, productionId: actor.productionId } });
  if (!e) throw NotFoundError("Continuity entry not found.");
  return (await presentEntries(actor.productionId, [e]))[0]!;
}

/** Logs what a character wore in a scene, with photos (views in file order). */
export async function createContinuityEntry(actor: Actor, input: ContinuityEntryInput, files: UploadedFile[]): Promise<ContinuityEntryDto> {
  if (input.views.length > files.length) throw ValidationError("views: more views than photos", { views: "has more entries than photos" });
  const pid = actor.productionId;
  // Cheap checks before spending time on images.
  if (!(await Scene.count({ where: { id: input.sceneId, productionId: pid } }))) throw ValidationError("sceneId: no such scene in this production", { sceneId: "does not exist" });
  if (!(await Character.count({ where: { id: input.characterId, productionId: pid } }))) throw ValidationError("characterId: no such character in this production", { characterId: "does not exist" });
  if (input.shootDayId && !(await ShootDay.count({ where: { id: input.shootDayId, productionId: pid } }))) throw ValidationError("shootDayId: no such shoot day in this production", { shootDayId: "does not exist" });

  const stored: StoredImage[] = [];
  try {
    for (const f of files) stored.push(await storeImage(f));
    const id = await sequelize.transaction(async (transaction) => {
      await checkGarments(pid, input.garmentIds, transaction);
      const e = await ContinuityEntry.create({ productionId: pid, shootDayId: input.shootDayId, sceneId: input.sceneId, characterId: input.characterId, distressStage: input.distressStage, notes: input.notes, loggedBy: actor.user.id }, { transaction });
      await ContinuityEntryGarment.bulkCreate([...new Set(input.garmentIds)].map((garmentId) => ({ productionId: pid, continuityEntryId: e.id, garmentId })), { transaction });
      for (let i = 0; i < stored.length; i++) {
        await linkPhoto(actor, stored[i]!, { ownerType: "continuity_entry", ownerId: e.id, view: input.views[i] ?? "other", caption: null, originalName: files[i]!.originalname }, transaction);
      }
      await recordAudit({ productionId: pid, actorId: actor.user.id, action: "continuity.log", entityType: "continuity_entry", entityId: e.id, after: { sceneId: input.sceneId, characterId: input.characterId, photos: stored.length } }, transaction);
      return e.id;
    });
    await releaseStoredImages(stored);
    return getContinuityEntry(actor, id);
  } catch (err) {
    await releaseStoredImages(stored);
    await removeUnreferencedFiles(stored.map((s) => s.contentHash));
    throw err;
  }
}

/** Corrects notes, distress stage or garments of an entry. */
export async function updateContinuityEntry(actor: Actor, id: string, input: { distressStage?: number | null; notes?: string | null; garmentIds?: string[] }): Promise<ContinuityEntryDto> {
  await sequelize.transaction(async (transaction) => {
    const e = await ContinuityEntry.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!e) throw NotFoundError("Continuity entry not found.");
    const before = { distressStage: e.distressStage, notes: e.notes };
    await e.update({ ...(input.distressStage !== undefined ? { distressStage: input.distressStage } : {}), ...(input.notes !== undefined ? { notes: input.notes ?? null } : {}) }, { transaction });
    if (input.garmentIds) {
      await checkGarments(actor.productionId, input.garmentIds, transaction);
      await ContinuityEntryGarment.destroy({ where: { continuityEntryId: id }, transaction });
      await ContinuityEntryGarment.bulkCreate([...new Set(input.garmentIds)].map((garmentId) => ({ productionId: actor.productionId, continuityEntryId: id, garmentId })), { transaction });
    }
    await recordAudit({ productionId: actor.productionId, actorId: actor.user.id, action: "continuity.update", entityType: "continuity_entry", entityId: id, before, after: input }, transaction);
  });
  return getContinuityEntry(actor, id);
}

/** Deletes an entry, its photo rows, then files nothing else shows. */
export async function deleteContinuityEntry(actor: Actor, id: string): Promise<void> {
  const hashes = await sequelize.transaction(async (transaction) => {
    const e = await ContinuityEntry.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!e) throw NotFoundError("Continuity entry not found.");
    const h = await deletePhotosOfOwners(actor.productionId, "continuity_entry", [id], transaction);
    await e.destroy({ transaction });
    await recordAudit({ productionId: actor.productionId, actorId: actor.user.id, action: "continuity.delete", entityType: "continuity_entry", entityId: id, before: { sceneId: e.sceneId, characterId: e.characterId, notes: e.notes } }, transaction);
    return h;
  });
  await removeUnreferencedFiles(hashes);
}

/** A character's timeline: every scene they play in story order, with change, state and entries. */
export async function continuityTimeline(actor: Actor, characterId: string): Promise<ContinuityTimelineDto> {
  const c = await Character.findOne({ where: { id: characterId, productionId: actor.productionId } });
  if (!c) throw NotFoundError("Character not found.");
  const apps = await Appearance.findAll({ where: { characterId, productionId: actor.productionId } });
  const entries = await listContinuity(actor, { characterId });
  const sceneIds = [...new Set([...apps.map((a) => a.sceneId), ...entries.map((e) => e.sceneId)])];
  const scenes = await Scene.findAll({ where: { id: { [Op.in]: sceneIds } } });
  const changeIds = apps.map((a) => a.changeId).filter((x): x is string => Boolean(x));
  const changes = changeIds.length ? await Change.findAll({ where: { id: { [Op.in]: changeIds } } }) : [];
  const changeById = new Map(changes.map((x) => [x.id, x]));
  const appByScene = new Map(apps.map((a) => [a.sceneId, a]));
  return {
    character: { id: c.id, name: c.name },
    scenes: scenes
      .sort((a, b) => a.storyOrder - b.storyOrder)
      .map((s) => {
        const a = appByScene.get(s.id);
        const ch = a?.changeId ? changeById.get(a.changeId) : undefined;
        return {
          sceneId: s.id,
          number: s.number,
          storyDay: s.storyDay,
          storyOrder: s.storyOrder,
          change: ch ? { id: ch.id, number: ch.number } : null,
          distressStage: a?.distressStage ?? 0,
          entries: entries.filter((e) => e.sceneId === s.id),
        };
      }),
  };
}
