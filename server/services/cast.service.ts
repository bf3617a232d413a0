import { Op, type Transaction } from "sequelize";
import type {
  CharacterDto,
  CharacterInput,
  CharacterScheduleDto,
  CharacterSceneDto,
  PerformerDto,
  PerformerInput,
  UpdateCharacterInput,
  UpdatePerformerInput,
} from "@shared/schemas/cast.js";
import { sequelize } from "../db.js";
import { Appearance, Change, Character, CharacterDouble, Performer, Scene, ShootDay, ShootDayScene } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { presentCharacter, presentPerformer } from "../presenters/breakdown.presenter.js";
import { recordAudit } from "./audit.service.js";
import { deletePhotosOfOwners, removeUnreferencedFiles } from "./photos.service.js";
import { stageGaps } from "./scenes.service.js";
import type { Actor } from "../middleware/require-auth.js";

const characterInclude = [
  { model: Performer, as: "performer", attributes: ["id", "name"] },
  { model: CharacterDouble, as: "doubles", include: [{ model: Performer, as: "performer", attributes: ["id", "name"] }] },
];

/** Performers by name with the characters they play or double. */
export async function listPerformers(actor: Actor): Promise<PerformerDto[]> {
  const pid = actor.productionId;
  const [performers, chars, doubles] = await Promise.all([
    Performer.findAll({ where: { productionId: pid }, order: [["name", "ASC"]] }),
    Character.findAll({ where: { productionId: pid }, attributes: ["id", "name", "performerId"] }),
    CharacterDouble.findAll({ where: { productionId: pid } }),
  ]);
  const charName = new Map(chars.map((c) => [c.id, c.name]));
  const roles = new Map<string, PerformerDto["roles"]>();
  const add = (pidr: string, r: PerformerDto["roles"][number]) => roles.set(pidr, [...(roles.get(pidr) ?? []), r]);
  for (const c of chars) if (c.performerId) add(c.performerId, { characterId: c.id, characterName: c.name, as: "performer" });
  for (const d of doubles) add(d.performerId, { characterId: d.characterId, characterName: charName.get(d.characterId) ?? "", as: d.kind });
  return performers.map((p) => presentPerformer(p, roles.get(p.id) ?? []));
}

/** One performer. */
export async function getPerformer(actor: Actor, id: string): Promise<PerformerDto> {
  const all = await listPerformers(actor);
  const p = all.find((x) => x.id === id);
  if (!p) throw NotFoundError("Performer not found.");
  return p;
}

/** Adds a performer (name, contact, notes). */
export async function createPerformer(actor: Actor, input: PerformerInput): Promise<PerformerDto> {
  const p = await sequelize.transaction(async (transaction) => {
    const p = await Performer.create({ ...input, productionId: actor.productionId }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "performer.create",
        entityType: "performer",
        entityId: p.id,
        after: { name: p.name },
      },
      transaction,
    );
    return p;
  });
  return presentPerformer(p, []);
}

/** Changes a performer's name, contact or notes. */
export async function updatePerformer(actor: Actor, id: string, input: UpdatePerformerInput): Promise<PerformerDto> {
  await sequelize.transaction(async (transaction) => {
    const p = await Performer.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!p) throw NotFoundError("Performer not found.");
    await p.update(input, { transaction });
    // Contact details are personal data: the audit records which fields changed, not their values.
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "performer.update",
        entityType: "performer",
        entityId: id,
        after: { fields: Object.keys(input) },
      },
      transaction,
    );
  });
  return getPerformer(actor, id);
}

/** Removes a performer and their photos. */
export async function deletePerformer(actor: Actor, id: string): Promise<void> {
  const hashes = await sequelize.transaction(async (transaction) => {
    const p = await Performer.findOne({ where: { id, productionId: actor.productionId }, transaction });
    if (!p) throw NotFoundError("Performer not found.");
    const h = await deletePhotosOfOwners(actor.productionId, "performer", [id], transaction);
    await p.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "performer.delete",
        entityType: "performer",
        entityId: id,
        before: { name: p.name },
      },
      transaction,
    );
    return h;
  });
  await removeUnreferencedFiles(hashes);
}

/** Characters in cast order. */
export async function listCharacters(actor: Actor): Promise<CharacterDto[]> {
  const rows = await Character.findAll({
    where: { productionId: actor.productionId },
    include: characterInclude,
    order: [
      ["sortOrder", "ASC"],
      ["name", "ASC"],
    ],
  });
  return rows.map(presentCharacter);
}

async function loadCharacter(actor: Actor, id: string, transaction?: Transaction): Promise<Character> {
  const c = await Character.findOne({ where: { id, productionId: actor.productionId }, include: characterInclude, transaction });
  if (!c) throw NotFoundError("Character not found.");
  return c;
}

async function checkPerformers(actor: Actor, ids: string[], field: string, transaction: Transaction): Promise<void> {
  const unique = [...new Set(ids)];
  if (!unique.length) return;
  const n = await Performer.count({ where: { productionId: actor.productionId, id: { [Op.in]: unique } }, transaction });
  if (n !== unique.length)
    throw ValidationError(`${field}: no such performer in this production`, { [field]: "names a performer that does not exist" });
}

async function setDoubles(
  actor: Actor,
  characterId: string,
  doubles: NonNullable<CharacterInput["doubles"]>,
  transaction: Transaction,
): Promise<void> {
  await checkPerformers(
    actor,
    doubles.map((d) => d.performerId),
    "doubles",
    transaction,
  );
  await CharacterDouble.destroy({ where: { characterId }, transaction });
  await CharacterDouble.bulkCreate(
    doubles.map((d) => ({ productionId: actor.productionId, characterId, performerId: d.performerId, kind: d.kind })),
    { transaction },
  );
}

/** Adds a character with performer and doubles. */
export async function createCharacter(actor: Actor, input: CharacterInput): Promise<CharacterDto> {
  const id = await sequelize.transaction(async (transaction) => {
    if (input.performerId) await checkPerformers(actor, [input.performerId], "performerId", transaction);
    const sortOrder =
      input.sortOrder ??
      (((await Character.max("sortOrder", { where: { productionId: actor.productionId }, transaction })) as number | null) ?? 0) + 1;
    const c = await Character.create(
      { productionId: actor.productionId, name: input.name, performerId: input.performerId, notes: input.notes, sortOrder },
      { transaction },
    );
    if (input.doubles) await setDoubles(actor, c.id, input.doubles, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "character.create",
        entityType: "character",
        entityId: c.id,
        after: input,
      },
      transaction,
    );
    return c.id;
  });
  return presentCharacter(await loadCharacter(actor, id));
}

/** Changes a character; `doubles` replaces the list. */
export async function updateCharacter(actor: Actor, id: string, input: UpdateCharacterInput): Promise<CharacterDto> {
  await sequelize.transaction(async (transaction) => {
    const c = await Character.findOne({ where: { id, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE });
    if (!c) throw NotFoundError("Character not found.");
    if (input.performerId) await checkPerformers(actor, [input.performerId], "performerId", transaction);
    const { doubles, ...fields } = input;
    await c.update(fields, { transaction });
    if (doubles) await setDoubles(actor, id, doubles, transaction);
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "character.update",
        entityType: "character",
        entityId: id,
        after: input,
      },
      transaction,
    );
  });
  return presentCharacter(await loadCharacter(actor, id));
}

/** Deletes a character with its changes, appearances, continuity entries and photos. */
export async function deleteCharacter(actor: Actor, id: string): Promise<void> {
  const hashes = await sequelize.transaction(async (transaction) => {
    const c = await loadCharacter(actor, id, transaction);
    const [entries] = await sequelize.query(`SELECT id FROM continuity_entries WHERE character_id = :id`, {
      replacements: { id },
      transaction,
    });
    const changes = await Change.findAll({ where: { characterId: id }, attributes: ["id"], transaction });
    const h = [
      ...(await deletePhotosOfOwners(
        actor.productionId,
        "continuity_entry",
        (entries as Array<{ id: string }>).map((e) => e.id),
        transaction,
      )),
      ...(await deletePhotosOfOwners(actor.productionId, "character", [id], transaction)),
      ...(await deletePhotosOfOwners(
        actor.productionId,
        "change",
        changes.map((x) => x.id),
        transaction,
      )),
    ];
    await c.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "character.delete",
        entityType: "character",
        entityId: id,
        before: { name: c.name },
      },
      transaction,
    );
    return h;
  });
  await removeUnreferencedFiles(hashes);
}

/** A character's scenes in story order and in shoot order, with the change and state for each. */
export async function characterSchedule(actor: Actor, id: string): Promise<CharacterScheduleDto> {
  const c = await loadCharacter(actor, id);
  const apps = await Appearance.findAll({ where: { characterId: id, productionId: actor.productionId } });
  const sceneIds = apps.map((a) => a.sceneId);
  const [scenes, changes, slots] = await Promise.all([
    Scene.findAll({ where: { id: { [Op.in]: sceneIds } } }),
    Change.findAll({ where: { characterId: id } }),
    ShootDayScene.findAll({ where: { sceneId: { [Op.in]: sceneIds }, productionId: actor.productionId } }),
  ]);
  const days = slots.length ? await ShootDay.findAll({ where: { id: { [Op.in]: [...new Set(slots.map((s) => s.shootDayId))] } } }) : [];
  const sceneById = new Map(scenes.map((s) => [s.id, s]));
  const changeById = new Map(changes.map((x) => [x.id, x]));
  const dayById = new Map(days.map((d) => [d.id, d]));
  const gaps = await stageGaps(actor.productionId);
  const rows: CharacterSceneDto[] = apps.map((a) => {
    const s = sceneById.get(a.sceneId)!;
    const ch = a.changeId ? changeById.get(a.changeId) : undefined;
    return {
      appearanceId: a.id,
      sceneId: s.id,
      sceneNumber: s.number,
      storyDay: s.storyDay,
      storyOrder: s.storyOrder,
      setName: s.setName,
      change: ch ? { id: ch.id, number: ch.number } : null,
      distressStage: a.distressStage,
      wet: a.wet,
      stunt: a.stunt,
      blood: a.blood,
      vfxShot: a.vfxShot,
      changeHere: a.changeHere,
      minutesSincePreviousExit: gaps.get(a.id) ?? null,
    };
  });
  const storyOrder = [...rows].sort((a, b) => a.storyOrder - b.storyOrder);
  const byScene = new Map(rows.map((r) => [r.sceneId, r]));
  const shootOrder = slots
    .map((sl) => ({ ...byScene.get(sl.sceneId)!, shootDay: dayById.get(sl.shootDayId)!, position: sl.position }))
    .sort(
      (a, b) => a.shootDay.date.localeCompare(b.shootDay.date) || a.shootDay.dayNumber - b.shootDay.dayNumber || a.position - b.position,
    )
    .map((r) => ({ ...r, shootDay: { id: r.shootDay.id, dayNumber: r.shootDay.dayNumber, date: r.shootDay.date } }));
  return { character: presentCharacter(c), storyOrder, shootOrder };
}
