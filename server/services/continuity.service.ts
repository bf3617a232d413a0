// Continuity: what was actually worn, with photos. Capture is one request (fields + photos): the
// photo files are written first, then the entry, garment links and photo rows commit together;
// if anything fails, files no row refers to are removed.
//
// Entries captured on a phone without a signal carry the phone's id for them (`clientId`): the
// production stores each once however often it arrives (a unique key; a repeat gets the stored
// entry back), and an entry whose scene, character or garment changed or went meanwhile is stored
// and marked for review rather than refused.
import { createHash } from "node:crypto";
import fs from "node:fs/promises";
import { Op, QueryTypes, UniqueConstraintError, type Transaction } from "sequelize";
import type {
  ContinuityEntryDto,
  ContinuityEntryInput,
  ContinuityTimelineDto,
  UpdateContinuityEntryInput,
} from "@shared/schemas/continuity.js";
import { reviewReasons, type ArrivalFacts } from "@shared/domain/offline-review.js";
import { sequelize } from "../db.js";
import { clock } from "../lib/clock.js";
import {
  Appearance,
  Change,
  Character,
  ContinuityEntry,
  ContinuityEntryGarment,
  Scene,
  ShootDay,
  ShootDayScene,
  User,
} from "../models/index.js";
import { HttpError, NotFoundError, ValidationError } from "../errors.js";
import { presentPhoto } from "../presenters/photos.presenter.js";
import { recordAudit } from "./audit.service.js";
import {
  deletePhotosOfOwners,
  linkPhoto,
  photosForOwners,
  releaseStoredImages,
  removeUnreferencedFiles,
  storeImage,
  type StoredImage,
  type UploadedFile,
} from "./photos.service.js";
import type { Actor } from "../middleware/require-auth.js";

async function checkGarments(productionId: string, ids: string[], transaction: Transaction): Promise<void> {
  const unique = [...new Set(ids)];
  if (!unique.length) return;
  const rows = await sequelize.query<{ id: string }>(`SELECT id FROM garments WHERE production_id = :pid AND id IN (:ids)`, {
    replacements: { pid: productionId, ids: unique },
    type: QueryTypes.SELECT,
    transaction,
  });
  if (rows.length !== unique.length)
    throw ValidationError("garmentIds: a garment does not exist in this production", { garmentIds: "names a garment that does not exist" });
}

const present = <T>(xs: Array<T | null>): T[] => [...new Set(xs.filter((x): x is T => x !== null))];

async function presentEntries(productionId: string, entries: ContinuityEntry[]): Promise<ContinuityEntryDto[]> {
  if (!entries.length) return [];
  const resolverIds = present(entries.map((e) => e.reviewResolvedBy));
  const [scenes, chars, photos, garments, resolvers] = await Promise.all([
    Scene.findAll({
      where: { id: { [Op.in]: present(entries.map((e) => e.sceneId)) } },
      attributes: ["id", "number", "storyDay", "storyOrder"],
    }),
    Character.findAll({ where: { id: { [Op.in]: present(entries.map((e) => e.characterId)) } }, attributes: ["id", "name"] }),
    photosForOwners(
      productionId,
      "continuity_entry",
      entries.map((e) => e.id),
    ),
    ContinuityEntryGarment.findAll({ where: { continuityEntryId: { [Op.in]: entries.map((e) => e.id) } } }),
    resolverIds.length ? User.findAll({ where: { id: { [Op.in]: resolverIds } }, attributes: ["id", "name"] }) : Promise.resolve([]),
  ]);
  const sceneById = new Map(scenes.map((s) => [s.id, s]));
  const charById = new Map(chars.map((c) => [c.id, c]));
  const userById = new Map(resolvers.map((u) => [u.id, u]));
  return entries.map((e) => {
    const s = e.sceneId ? sceneById.get(e.sceneId) : undefined;
    const reasons = e.reviewReasons ?? [];
    return {
      id: e.id,
      clientId: e.clientId,
      shootDayId: e.shootDayId,
      sceneId: e.sceneId,
      // A deleted scene is named by the number the phone showed.
      sceneNumber: s?.number ?? e.capturedAs?.sceneNumber ?? "",
      storyDay: s?.storyDay ?? null,
      storyOrder: s?.storyOrder ?? 0,
      characterId: e.characterId,
      characterName: (e.characterId ? charById.get(e.characterId)?.name : undefined) ?? e.capturedAs?.characterName ?? "",
      distressStage: e.distressStage,
      notes: e.notes,
      garmentIds: garments.filter((g) => g.continuityEntryId === e.id).map((g) => g.garmentId),
      loggedBy: e.loggedBy,
      createdAt: e.createdAt.toISOString(),
      photos: photos.filter((p) => p.ownerId === e.id).map(presentPhoto),
      capturedAs: e.capturedAs,
      review: {
        reasons,
        open: reasons.length > 0 && !e.reviewResolvedAt,
        resolvedAt: e.reviewResolvedAt?.toISOString() ?? null,
        resolvedByName: e.reviewResolvedBy ? (userById.get(e.reviewResolvedBy)?.name ?? null) : null,
      },
    };
  });
}

/** Entries filtered by character, scene or shoot day (or open review marks), in story order then time logged. */
export async function listContinuity(
  actor: Actor,
  q: { characterId?: string; sceneId?: string; shootDayId?: string; review?: "open" },
): Promise<ContinuityEntryDto[]> {
  const where: Record<string | symbol, unknown> = { productionId: actor.productionId };
  for (const k of ["characterId", "sceneId", "shootDayId"] as const) if (q[k]) where[k] = q[k];
  if (q.review === "open")
    where[Op.and] = [sequelize.literal(`"ContinuityEntry"."review_reasons" <> '[]'::jsonb`), { reviewResolvedAt: null }];
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

/** SHA-256 of each uploaded file, in order (the same hash the photo store files them under). */
async function fileHashes(files: UploadedFile[]): Promise<string[]> {
  return Promise.all(
    files.map(async (f) =>
      createHash("sha256")
        .update(await fs.readFile(f.path))
        .digest("hex"),
    ),
  );
}

/** The fingerprint of a sent entry: its fields and its photos' content, in order. */
function requestHash(input: ContinuityEntryInput, photoHashes: string[]): string {
  const canonical = JSON.stringify([
    input.shootDayId,
    input.sceneId,
    input.characterId,
    input.distressStage,
    input.notes,
    [...new Set(input.garmentIds)].sort(),
    input.views,
    photoHashes,
    input.capturedAs ?? null,
  ]);
  return createHash("sha256").update(canonical).digest("hex");
}

/** The answer to a repeat: the stored entry, if the repeat sent the same entry. */
async function replay(actor: Actor, prior: ContinuityEntry, hash: string): Promise<{ entry: ContinuityEntryDto; replayed: true }> {
  if (prior.requestHash && prior.requestHash !== hash) {
    throw new HttpError(422, "client_id_reused", "clientId: this id was already used for a different entry; nothing was stored.", {
      clientId: "was already used for a different entry",
    });
  }
  return { entry: (await presentEntries(actor.productionId, [prior]))[0]!, replayed: true };
}

const findByClientId = (productionId: string, clientId: string) => ContinuityEntry.findOne({ where: { productionId, clientId } });

/**
 * The records an arriving entry names, as they are now; each row read is share-locked so it cannot
 * be deleted before the entry commits.
 */
async function arrivalFacts(pid: string, input: ContinuityEntryInput, transaction: Transaction): Promise<ArrivalFacts> {
  const lock = transaction.LOCK.SHARE;
  const [scene, character] = await Promise.all([
    Scene.findOne({ where: { id: input.sceneId, productionId: pid }, attributes: ["id", "number"], transaction, lock }),
    Character.findOne({ where: { id: input.characterId, productionId: pid }, attributes: ["id", "name"], transaction, lock }),
  ]);
  let appearance: ArrivalFacts["appearance"] = null;
  if (scene && character) {
    const a = await Appearance.findOne({ where: { productionId: pid, sceneId: scene.id, characterId: character.id }, transaction });
    if (a) {
      const change = a.changeId ? await Change.findOne({ where: { id: a.changeId }, attributes: ["number"], transaction }) : null;
      appearance = { changeId: a.changeId, changeNumber: change?.number ?? null, distressStage: a.distressStage };
    }
  }
  let shootDay: ArrivalFacts["shootDay"] = null;
  if (input.shootDayId) {
    const d = await ShootDay.findOne({ where: { id: input.shootDayId, productionId: pid }, transaction, lock });
    if (d) {
      // A performance plays the whole show; a shoot day its listed scenes.
      const sceneIds =
        d.kind === "performance"
          ? scene
            ? [scene.id]
            : []
          : (await ShootDayScene.findAll({ where: { shootDayId: d.id }, attributes: ["sceneId"], transaction })).map((x) => x.sceneId);
      shootDay = { dayNumber: d.dayNumber, kind: d.kind, sceneIds };
    }
  }
  const unique = [...new Set(input.garmentIds)];
  const garmentIdsFound = unique.length
    ? (
        await sequelize.query<{ id: string }>(`SELECT id FROM garments WHERE production_id = :pid AND id IN (:ids) FOR SHARE`, {
          replacements: { pid, ids: unique },
          type: QueryTypes.SELECT,
          transaction,
        })
      ).map((r) => r.id)
    : [];
  return {
    scene: scene ? { number: scene.number } : null,
    character: character ? { name: character.name } : null,
    appearance,
    shootDay,
    garmentIdsFound,
  };
}

/** True when the error is the production's unique key on the device's entry id. */
function isClientIdClash(err: unknown): boolean {
  return (
    err instanceof UniqueConstraintError &&
    (err.parent as { constraint?: string } | undefined)?.constraint === "continuity_entries_client_id_key"
  );
}

/**
 * Logs what a character wore in a scene, with photos (views in file order). With a `clientId` the
 * entry is stored once per production: a repeat (or a second copy sent at the same moment) gets the
 * stored entry with `replayed: true`; records that went or changed meanwhile mark it for review.
 */
export async function createContinuityEntry(
  actor: Actor,
  input: ContinuityEntryInput,
  files: UploadedFile[],
): Promise<{ entry: ContinuityEntryDto; replayed: boolean }> {
  if (input.views.length > files.length) throw ValidationError("views: more views than photos", { views: "has more entries than photos" });
  const pid = actor.productionId;
  const queued = Boolean(input.clientId);
  let hash = "";
  if (input.clientId) {
    hash = requestHash(input, await fileHashes(files));
    const prior = await findByClientId(pid, input.clientId);
    if (prior) return replay(actor, prior, hash);
  } else {
    // Cheap checks before spending time on images.
    if (!(await Scene.count({ where: { id: input.sceneId, productionId: pid } })))
      throw ValidationError("sceneId: no such scene in this production", { sceneId: "does not exist" });
    if (!(await Character.count({ where: { id: input.characterId, productionId: pid } })))
      throw ValidationError("characterId: no such character in this production", { characterId: "does not exist" });
    if (input.shootDayId && !(await ShootDay.count({ where: { id: input.shootDayId, productionId: pid } })))
      throw ValidationError("shootDayId: no such shoot day in this production", { shootDayId: "does not exist" });
  }

  const stored: StoredImage[] = [];
  try {
    for (const f of files) stored.push(await storeImage(f));
    const id = await sequelize.transaction(async (transaction) => {
      let refs = {
        sceneId: input.sceneId as string | null,
        characterId: input.characterId as string | null,
        shootDayId: input.shootDayId,
        garmentIds: [...new Set(input.garmentIds)],
      };
      let reasons: ReturnType<typeof reviewReasons> = [];
      if (queued) {
        const facts = await arrivalFacts(pid, input, transaction);
        reasons = reviewReasons(
          { sceneId: input.sceneId, characterId: input.characterId, shootDayId: input.shootDayId, garmentIds: input.garmentIds },
          input.capturedAs,
          facts,
        );
        refs = {
          sceneId: facts.scene ? input.sceneId : null,
          characterId: facts.character ? input.characterId : null,
          shootDayId: facts.shootDay ? input.shootDayId : null,
          garmentIds: refs.garmentIds.filter((g) => facts.garmentIdsFound.includes(g)),
        };
      } else {
        await checkGarments(pid, input.garmentIds, transaction);
      }
      const e = await ContinuityEntry.create(
        {
          productionId: pid,
          shootDayId: refs.shootDayId,
          sceneId: refs.sceneId,
          characterId: refs.characterId,
          distressStage: input.distressStage,
          notes: input.notes,
          loggedBy: actor.user.id,
          clientId: input.clientId ?? null,
          requestHash: input.clientId ? hash : null,
          capturedAs: input.capturedAs ?? null,
          reviewReasons: reasons,
          reviewResolvedAt: null,
          reviewResolvedBy: null,
        },
        { transaction },
      );
      await ContinuityEntryGarment.bulkCreate(
        refs.garmentIds.map((garmentId) => ({ productionId: pid, continuityEntryId: e.id, garmentId })),
        { transaction },
      );
      for (let i = 0; i < stored.length; i++) {
        await linkPhoto(
          actor,
          stored[i]!,
          {
            ownerType: "continuity_entry",
            ownerId: e.id,
            view: input.views[i] ?? "other",
            caption: null,
            originalName: files[i]!.originalname,
          },
          transaction,
        );
      }
      await recordAudit(
        {
          productionId: pid,
          actorId: actor.user.id,
          action: "continuity.log",
          entityType: "continuity_entry",
          entityId: e.id,
          after: {
            sceneId: refs.sceneId,
            characterId: refs.characterId,
            photos: stored.length,
            ...(input.clientId ? { clientId: input.clientId } : {}),
            ...(reasons.length ? { review: reasons.map((r) => r.code) } : {}),
          },
        },
        transaction,
      );
      return e.id;
    });
    await releaseStoredImages(stored);
    return { entry: await getContinuityEntry(actor, id), replayed: false };
  } catch (err) {
    await releaseStoredImages(stored);
    await removeUnreferencedFiles(stored.map((s) => s.contentHash));
    // The same entry sent twice at once: the second waits on the key, then answers as a repeat.
    if (input.clientId && isClientIdClash(err)) {
      const prior = await findByClientId(pid, input.clientId);
      if (prior) return replay(actor, prior, hash);
    }
    throw err;
  }
}

/**
 * Corrects notes, distress stage or garments of an entry; files it under a scene or character (one
 * whose own went while it waited on a phone); `reviewed` settles its review marks.
 */
export async function updateContinuityEntry(actor: Actor, id: string, input: UpdateContinuityEntryInput): Promise<ContinuityEntryDto> {
  await sequelize.transaction(async (transaction) => {
    const e = await ContinuityEntry.findOne({
      where: { id, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (!e) throw NotFoundError("Continuity entry not found.");
    const before = { distressStage: e.distressStage, notes: e.notes, sceneId: e.sceneId, characterId: e.characterId };
    if (input.sceneId && !(await Scene.count({ where: { id: input.sceneId, productionId: actor.productionId }, transaction })))
      throw ValidationError("sceneId: no such scene in this production", { sceneId: "does not exist" });
    if (input.characterId && !(await Character.count({ where: { id: input.characterId, productionId: actor.productionId }, transaction })))
      throw ValidationError("characterId: no such character in this production", { characterId: "does not exist" });
    await e.update(
      {
        ...(input.distressStage !== undefined ? { distressStage: input.distressStage } : {}),
        ...(input.notes !== undefined ? { notes: input.notes ?? null } : {}),
        ...(input.sceneId ? { sceneId: input.sceneId } : {}),
        ...(input.characterId ? { characterId: input.characterId } : {}),
        ...(input.reviewed && !e.reviewResolvedAt ? { reviewResolvedAt: clock.now(), reviewResolvedBy: actor.user.id } : {}),
      },
      { transaction },
    );
    if (input.garmentIds) {
      await checkGarments(actor.productionId, input.garmentIds, transaction);
      await ContinuityEntryGarment.destroy({ where: { continuityEntryId: id }, transaction });
      await ContinuityEntryGarment.bulkCreate(
        [...new Set(input.garmentIds)].map((garmentId) => ({ productionId: actor.productionId, continuityEntryId: id, garmentId })),
        { transaction },
      );
    }
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "continuity.update",
        entityType: "continuity_entry",
        entityId: id,
        before,
        after: input,
      },
      transaction,
    );
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
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "continuity.delete",
        entityType: "continuity_entry",
        entityId: id,
        before: { sceneId: e.sceneId, characterId: e.characterId, notes: e.notes },
      },
      transaction,
    );
    return h;
  });
  await removeUnreferencedFiles(hashes);
}

/** A character's timeline: every scene they play in story order, with change, state and entries. */
export async function continuityTimeline(actor: Actor, characterId: string): Promise<ContinuityTimelineDto> {
  const c = await Character.findOne({ where: { id: characterId, productionId: actor.productionId } });
  if (!c) throw NotFoundError("Character not found.");
  const apps = await Appearance.findAll({ where: { characterId, productionId: actor.productionId } });
  const all = await listContinuity(actor, { characterId });
  const entries = all.filter((e) => e.sceneId !== null);
  const sceneIds = [...new Set([...apps.map((a) => a.sceneId), ...entries.map((e) => e.sceneId!)])];
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
    unplaced: all.filter((e) => e.sceneId === null),
  };
}
