import { randomInt } from "node:crypto";
import { Op, QueryTypes, UniqueConstraintError, type Transaction, type WhereOptions } from "sequelize";
import { addCalendarDays } from "@shared/calendar-days.js";
import { writeCsvRecords, type CsvCell } from "@shared/csv.js";
import { sequelize } from "../db.js";
import { escapeLike } from "../lib/like.js";
import {
  Fabric,
  Garment,
  GarmentCheckout,
  GarmentStatusEvent,
  Membership,
  MultiplesGroup,
  Performer,
  Production,
  Scene,
  ShootDay,
  ShootDayScene,
  User,
} from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { todayForProduction } from "./productions.service.js";
import { clock } from "../lib/clock.js";
import type { Actor } from "../middleware/require-auth.js";
import { generateTagCode } from "@shared/domain/tag-codes.js";
import {
  checkedOutStatuses,
  garmentStatusLabels,
  type AddCopiesInput,
  type CheckoutInput,
  type CheckoutOptionsDto,
  type CreateGarmentInput,
  type GarmentChangeRefDto,
  type GarmentFilters,
  type GarmentStatus,
  type ListGarmentsQuery,
  type MoveGarmentsInput,
  type ScanGarmentInput,
  type UpdateGarmentInput,
} from "@shared/schemas/garments.js";
import { formatLength, type LengthUnit } from "@shared/domain/units.js";
import { formatDate } from "@shared/format.js";
import { scheduleLabels } from "@shared/domain/schedule-labels.js";
import { can, roleLabels, type Role } from "@shared/permissions.js";

/** What a check-out shows besides its own columns: the day, the scene and who handed it out. */
const checkoutIncludes = [
  { model: ShootDay, as: "shootDay", attributes: ["id", "date", "kind", "dayNumber"] },
  { model: Scene, as: "scene", attributes: ["id", "number"] },
  { model: User, as: "checkedOutByUser", attributes: ["id", "name"] },
];

const listIncludes = [
  { model: Fabric, as: "fabric", attributes: ["id", "name"] },
  { model: MultiplesGroup, as: "multiplesGroup", attributes: ["id", "name"] },
];

const includeNames = [
  ...listIncludes,
  { model: GarmentCheckout, as: "openCheckout", required: false, where: { returnedAt: null }, include: checkoutIncludes },
];

/** Rack and bin as one location string for the history ("C3 / 12"), or null. */
export function locationLabel(rack: string | null | undefined, bin: string | null | undefined): string | null {
  const parts = [rack, bin].filter((x): x is string => Boolean(x));
  return parts.length ? parts.join(" / ") : null;
}

/** Where-clause for the shared list / export / label filters. */
/** The day "due within" counts from: the filter's own, else today in the production's zone (only looked up when needed). */
async function dueFrom(actor: Actor, f: GarmentFilters): Promise<string | null> {
  return f.dueWithinDays === undefined ? null : (f.asOf ?? (await todayForProduction(actor.productionId)));
}

/** The day "past due" is judged on: today in the production's zone (only looked up when needed). */
async function pastDueDay(actor: Actor, f: GarmentFilters): Promise<string | null> {
  return f.out === "past_due" ? todayForProduction(actor.productionId) : null;
}

function whereFor(actor: Actor, f: GarmentFilters, dueFromDay: string | null, today: string | null = null): WhereOptions {
  const and: WhereOptions[] = [{ productionId: actor.productionId }];
  if (f.q) {
    const like = `%${escapeLike(f.q)}%`;
    and.push({
      [Op.or]: [
        { name: { [Op.iLike]: like } },
        { tagCode: { [Op.iLike]: like } },
        { colour: { [Op.iLike]: like } },
        { vendor: { [Op.iLike]: like } },
      ],
    });
  }
  if (f.category) and.push({ category: f.category });
  if (f.status.length) and.push({ status: { [Op.in]: f.status } });
  if (f.source) and.push({ source: f.source });
  // The whole rack name, any case; `%` and `_` in it are letters, not wildcards.
  if (f.rack) and.push({ locationRack: { [Op.iLike]: escapeLike(f.rack) } });
  if (f.fabricId) and.push({ fabricId: f.fabricId });
  if (f.multiplesGroupId) and.push({ multiplesGroupId: f.multiplesGroupId });
  if (f.ids.length) and.push({ id: { [Op.in]: f.ids } });
  if (f.out) {
    // Garments with an open check-out; past due when it was due back before today.
    const pastDue = f.out === "past_due" ? ` AND co.due_back_on < ${sequelize.escape(today ?? "9999-12-31")}` : "";
    and.push({
      id: {
        [Op.in]: sequelize.literal(
          `(SELECT co.garment_id FROM garment_checkouts co WHERE co.production_id = ${sequelize.escape(actor.productionId)} AND co.returned_at IS NULL${pastDue})`,
        ),
      },
    });
  }
  if (f.dueWithinDays !== undefined) {
    const until = addCalendarDays(dueFromDay ?? f.asOf!, f.dueWithinDays);
    and.push({ source: "rented", rentalDueOn: { [Op.ne]: null, [Op.lte]: until }, status: { [Op.notIn]: ["returned", "lost"] } });
  }
  if (f.characterId) {
    // Change items are the link between a character and garments: a copy directly, or a whole group.
    const cid = sequelize.escape(f.characterId);
    and.push({
      [Op.or]: [
        {
          id: {
            [Op.in]: sequelize.literal(
              `(SELECT ci.garment_id FROM change_items ci JOIN changes c ON c.id = ci.change_id WHERE c.character_id = ${cid} AND ci.garment_id IS NOT NULL)`,
            ),
          },
        },
        {
          multiplesGroupId: {
            [Op.in]: sequelize.literal(
              `(SELECT ci.multiples_group_id FROM change_items ci JOIN changes c ON c.id = ci.change_id WHERE c.character_id = ${cid} AND ci.multiples_group_id IS NOT NULL)`,
            ),
          },
        },
      ],
    });
  }
  return { [Op.and]: and };
}

/** A garment as lists read it: plain columns plus fabric and group names, no model instance. */
export type GarmentListRow = Omit<Garment["_attributes"], "fabric" | "multiplesGroup" | "openCheckout"> & {
  fabric: { id: string | null; name: string | null } | null;
  multiplesGroup: { id: string | null; name: string | null } | null;
  openCheckout: GarmentCheckout | null;
};

/**
 * One page of garments matching the filters, with the total. Plain rows (building model instances was
 * most of a list request's time); the page and the count run side by side on two connections.
 */
export async function listGarments(actor: Actor, q: ListGarmentsQuery): Promise<{ rows: GarmentListRow[]; count: number }> {
  const dir = q.dir.toUpperCase() as "ASC" | "DESC";
  const where = whereFor(actor, q, await dueFrom(actor, q), await pastDueDay(actor, q));
  const [rows, count] = await Promise.all([
    Garment.findAll({
      where,
      include: listIncludes,
      // Ties by tag code in the same direction, so one index serves the page either way round.
      order: [
        [q.sort, dir],
        ["tagCode", dir],
      ],
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
      raw: true,
      nest: true,
    }) as unknown as Promise<GarmentListRow[]>,
    Garment.count({ where }),
  ]);
  // Who has each garment: the page's open check-outs in one more query (a nested include would not
  // survive plain rows, which give an absent check-out as an object of nulls).
  const open = rows.length
    ? await GarmentCheckout.findAll({ where: { garmentId: rows.map((r) => r.id), returnedAt: null }, include: checkoutIncludes })
    : [];
  const byGarment = new Map(open.map((c) => [c.garmentId, c]));
  return { rows: rows.map((r) => ({ ...r, openCheckout: byGarment.get(r.id) ?? null })), count };
}

/** Every garment matching the filters, by tag code (exports and label sheets). */
export async function findGarments(actor: Actor, f: GarmentFilters, limit = 5000): Promise<Garment[]> {
  return Garment.findAll({
    where: whereFor(actor, f, await dueFrom(actor, f), await pastDueDay(actor, f)),
    include: includeNames,
    order: [["tagCode", "ASC"]],
    limit,
  });
}

async function loadGarment(actor: Actor, id: string, transaction?: Transaction, lock = false): Promise<Garment> {
  const g = await Garment.findOne({
    where: { id, productionId: actor.productionId },
    transaction,
    ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}),
  });
  if (!g) throw NotFoundError("Garment not found.");
  return g;
}

/** A garment with names, status history, the changes that use it and its group's copies. */
export async function getGarmentDetail(actor: Actor, id: string) {
  const garment = await Garment.findOne({ where: { id, productionId: actor.productionId }, include: includeNames });
  if (!garment) throw NotFoundError("Garment not found.");
  const history = await GarmentStatusEvent.findAll({
    where: { garmentId: id, productionId: actor.productionId },
    include: [{ model: User, as: "actor", attributes: ["id", "name"] }],
    order: [
      ["createdAt", "DESC"],
      ["id", "ASC"],
    ],
  });
  // Changes belong to the breakdown; read them directly rather than through its models.
  const changes = await sequelize.query<{
    change_id: string;
    number: number;
    character_id: string;
    character_name: string;
    label: string;
    via_group: boolean;
  }>(
    `SELECT c.id AS change_id, c.number, ch.id AS character_id, ch.name AS character_name, ci.label, (ci.garment_id IS NULL) AS via_group
       FROM change_items ci
       JOIN changes c ON c.id = ci.change_id
       JOIN characters ch ON ch.id = c.character_id
      WHERE ci.production_id = :pid AND (ci.garment_id = :gid OR (CAST(:groupId AS uuid) IS NOT NULL AND ci.multiples_group_id = CAST(:groupId AS uuid)))
      ORDER BY ch.name, c.number`,
    { replacements: { pid: actor.productionId, gid: id, groupId: garment.multiplesGroupId }, type: QueryTypes.SELECT },
  );
  const checkouts = await GarmentCheckout.findAll({
    where: { garmentId: id, productionId: actor.productionId },
    include: checkoutIncludes,
    order: [
      ["checkedOutAt", "DESC"],
      ["id", "ASC"],
    ],
    limit: 100,
  });
  const groupCopies = garment.multiplesGroupId
    ? await Garment.findAll({
        where: { multiplesGroupId: garment.multiplesGroupId, productionId: actor.productionId },
        attributes: ["id", "tagCode", "copyNumber", "status", "distressStage"],
        order: [["copyNumber", "ASC"]],
      })
    : [];
  const changeRefs: GarmentChangeRefDto[] = changes.map((r) => ({
    changeId: r.change_id,
    changeNumber: r.number,
    characterId: r.character_id,
    characterName: r.character_name,
    label: r.label,
    viaGroup: r.via_group,
  }));
  return { garment, history, checkouts, changes: changeRefs, groupCopies };
}

/** Fresh tag codes not yet used in the production. */
async function freshTagCodes(productionId: string, n: number, transaction: Transaction): Promise<string[]> {
  const rows = await Garment.findAll({ where: { productionId }, attributes: ["tagCode"], transaction });
  const used = new Set(rows.map((r) => r.tagCode));
  const out: string[] = [];
  while (out.length < n) {
    const code = generateTagCode(randomInt);
    if (used.has(code)) continue;
    used.add(code);
    out.push(code);
  }
  return out;
}

async function assertTagCodeFree(productionId: string, tagCode: string, exceptId: string | null, transaction: Transaction) {
  const clash = await Garment.findOne({
    where: { productionId, tagCode, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) },
    attributes: ["id", "name"],
    transaction,
  });
  if (clash) throw ValidationError(`tagCode: ${tagCode} is already on "${clash.name}"`, { tagCode: `is already used by "${clash.name}"` });
}

async function assertFabricInProduction(productionId: string, fabricId: string | null | undefined, transaction: Transaction) {
  if (!fabricId) return;
  const f = await Fabric.findOne({ where: { id: fabricId, productionId }, attributes: ["id"], transaction });
  if (!f) throw ValidationError("fabricId: no such fabric in this production", { fabricId: "no such fabric in this production" });
}

// A duplicate that slipped past the check (two requests at once) is still a bad tag code for the user.
export function mapTagRace(err: unknown): never {
  if (
    err instanceof UniqueConstraintError &&
    err.errors.some((e) => e.path === "tag_code" || e.path === "tagCode" || /tag_code/.test(e.message))
  ) {
    throw ValidationError("tagCode: is already used by another garment", { tagCode: "is already used by another garment" });
  }
  throw err;
}

/** Creates one garment, or N copies (#1..#N) in a new multiples group, each with a first history row. */
export async function createGarments(actor: Actor, input: CreateGarmentInput): Promise<Garment[]> {
  const ids = await sequelize.transaction((transaction) => createGarmentsIn(actor, input, transaction)).catch(mapTagRace);
  return Garment.findAll({ where: { id: ids }, include: includeNames, order: [["copyNumber", "ASC"]] });
}

/**
 * The same inside a caller's transaction (a fitting adds a garment and links it in one step).
 * A tag-code race surfaces as a unique-constraint error; callers map it with `mapTagRace`.
 * @returns the new garments' ids
 */
export async function createGarmentsIn(actor: Actor, input: CreateGarmentInput, transaction: Transaction): Promise<string[]> {
  const { copies, groupName, tagCode, status, ...fields } = input;
  await assertFabricInProduction(actor.productionId, fields.fabricId, transaction);
  if (tagCode) await assertTagCodeFree(actor.productionId, tagCode, null, transaction);
  const codes = tagCode ? [tagCode] : await freshTagCodes(actor.productionId, copies, transaction);
  let groupId: string | null = null;
  if (copies > 1) {
    const group = await MultiplesGroup.create(
      { productionId: actor.productionId, name: groupName || fields.name, notes: null },
      { transaction },
    );
    groupId = group.id;
  }
  const created: Garment[] = [];
  for (let i = 0; i < copies; i++) {
    const g = await Garment.create(
      {
        ...fields,
        productionId: actor.productionId,
        tagCode: codes[i]!,
        status,
        multiplesGroupId: groupId,
        copyNumber: groupId ? i + 1 : null,
      },
      { transaction },
    );
    await GarmentStatusEvent.create(
      {
        productionId: actor.productionId,
        garmentId: g.id,
        fromStatus: null,
        toStatus: status,
        fromLocation: null,
        toLocation: locationLabel(g.locationRack, g.locationBin),
        note: "Added to stock",
        actorId: actor.user.id,
      },
      { transaction },
    );
    created.push(g);
  }
  await recordAudit(
    {
      productionId: actor.productionId,
      actorId: actor.user.id,
      action: "garment.create",
      entityType: "garment",
      entityId: created[0]!.id,
      after: { tagCodes: codes, name: fields.name, copies, multiplesGroupId: groupId },
    },
    transaction,
  );
  return created.map((g) => g.id);
}

/** Edits a garment's description (not its status: moves keep the history). */
export async function updateGarment(actor: Actor, id: string, input: UpdateGarmentInput): Promise<Garment> {
  await sequelize
    .transaction(async (transaction) => {
      const g = await loadGarment(actor, id, transaction, true);
      if (input.fabricId !== undefined) await assertFabricInProduction(actor.productionId, input.fabricId, transaction);
      if (input.tagCode && input.tagCode !== g.tagCode) await assertTagCodeFree(actor.productionId, input.tagCode, g.id, transaction);
      const before = g.toJSON();
      await g.update(input, { transaction });
      const changed = Object.fromEntries(Object.keys(input).map((k) => [k, (before as Record<string, unknown>)[k]]));
      await recordAudit(
        {
          productionId: actor.productionId,
          actorId: actor.user.id,
          action: "garment.update",
          entityType: "garment",
          entityId: g.id,
          before: changed,
          after: input,
        },
        transaction,
      );
    })
    .catch(mapTagRace);
  return (await Garment.findByPk(id, { include: includeNames }))!;
}

/** Makes `count` more copies of a garment; a garment not yet in a group becomes #1 of a new one. */
export async function addCopies(actor: Actor, id: string, input: AddCopiesInput): Promise<Garment[]> {
  const ids = await sequelize.transaction(async (transaction) => {
    const g = await loadGarment(actor, id, transaction, true);
    let groupId = g.multiplesGroupId;
    if (!groupId) {
      const group = await MultiplesGroup.create(
        { productionId: actor.productionId, name: input.groupName || g.name, notes: null },
        { transaction },
      );
      groupId = group.id;
      await g.update({ multiplesGroupId: groupId, copyNumber: 1 }, { transaction });
    } else {
      // Lock the group's rows so two people adding copies at once do not both take #n+1.
      await MultiplesGroup.findByPk(groupId, { transaction, lock: transaction.LOCK.UPDATE });
    }
    const maxCopy = ((await Garment.max("copyNumber", { where: { multiplesGroupId: groupId }, transaction })) as number | null) ?? 1;
    const codes = await freshTagCodes(actor.productionId, input.count, transaction);
    const made: string[] = [];
    for (let i = 0; i < input.count; i++) {
      const copy = await Garment.create(
        {
          productionId: actor.productionId,
          tagCode: codes[i]!,
          name: g.name,
          category: g.category,
          sizeLabel: g.sizeLabel,
          fitIntent: g.fitIntent,
          finishedMeasurements: g.finishedMeasurements,
          fabricId: g.fabricId,
          colour: g.colour,
          source: g.source,
          vendor: g.vendor,
          costCents: g.costCents,
          rentalDueOn: g.rentalDueOn,
          rentalCostPerWeekCents: g.rentalCostPerWeekCents,
          wrapDisposition: g.wrapDisposition,
          locationRack: g.locationRack,
          locationBin: g.locationBin,
          status: "in_stock",
          distressStage: 0,
          multiplesGroupId: groupId,
          copyNumber: maxCopy + i + 1,
          notes: null,
        },
        { transaction },
      );
      await GarmentStatusEvent.create(
        {
          productionId: actor.productionId,
          garmentId: copy.id,
          fromStatus: null,
          toStatus: "in_stock",
          fromLocation: null,
          toLocation: locationLabel(copy.locationRack, copy.locationBin),
          note: `Copy of ${g.tagCode}`,
          actorId: actor.user.id,
        },
        { transaction },
      );
      // The original's history says what was made from it, one row per copy, so its page shows the copies' story too.
      const here = locationLabel(g.locationRack, g.locationBin);
      await GarmentStatusEvent.create(
        {
          productionId: actor.productionId,
          garmentId: g.id,
          fromStatus: g.status,
          toStatus: g.status,
          fromLocation: here,
          toLocation: here,
          note: `Copy #${copy.copyNumber} made: ${copy.tagCode}`,
          actorId: actor.user.id,
        },
        { transaction },
      );
      made.push(copy.id);
    }
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "garment.copies",
        entityType: "garment",
        entityId: g.id,
        after: { multiplesGroupId: groupId, tagCodes: codes },
      },
      transaction,
    );
    return [g.id, ...made];
  });
  return Garment.findAll({ where: { id: ids }, include: includeNames, order: [["copyNumber", "ASC"]] });
}

/** Result of moving one garment. */
export interface MoveResult {
  garment: Garment;
  event: GarmentStatusEvent | null;
}

/** A check-out checked against the production: the person's name, the day and scene, the due date. */
export interface ResolvedCheckout {
  toKind: "member" | "performer";
  toUserId: string | null;
  toPerformerId: string | null;
  toName: string;
  shootDayId: string | null;
  sceneId: string | null;
  dueBackOn: string;
  /** "for shoot day 2026-12-04, scene 42" (or performance), for the history note. */
  forText: string;
}

const isCheckedOutStatus = (s: GarmentStatus) => (checkedOutStatuses as readonly GarmentStatus[]).includes(s);

/**
 * Checks a check-out request against the production: the member or performer, the day, the scene
 * (on that day), and a due date not before today. Throws 400 naming the field.
 */
export async function resolveCheckout(
  actor: Actor,
  status: GarmentStatus,
  c: CheckoutInput,
  transaction?: Transaction,
): Promise<ResolvedCheckout> {
  const pid = actor.productionId;
  if (!isCheckedOutStatus(status)) {
    throw ValidationError(
      `checkout: a garment is checked out only when it goes ${checkedOutStatuses.map((s) => garmentStatusLabels[s]).join(" or ")}`,
      {
        status: `must be ${checkedOutStatuses.map((s) => garmentStatusLabels[s]).join(" or ")} to check out to someone`,
      },
    );
  }
  let toName: string;
  if (c.toUserId) {
    const m = await Membership.findOne({
      where: { productionId: pid, userId: c.toUserId },
      include: [{ model: User, as: "user", attributes: ["id", "name"] }],
      transaction,
    });
    if (!m?.user || !can(m.role, "garment.read"))
      throw ValidationError("checkout.toUserId: is not a member of this production", {
        "checkout.toUserId": "is not a member of this production",
      });
    toName = m.user.name;
  } else {
    const p = await Performer.findOne({ where: { id: c.toPerformerId!, productionId: pid }, attributes: ["id", "name"], transaction });
    if (!p)
      throw ValidationError("checkout.toPerformerId: is not a performer of this production", {
        "checkout.toPerformerId": "is not a performer of this production",
      });
    toName = p.name;
  }
  const production = await Production.findByPk(pid, { attributes: ["id", "kind"], transaction });
  const words = scheduleLabels(production?.kind ?? "film");
  let day: ShootDay | null = null;
  if (c.shootDayId) {
    day = await ShootDay.findOne({
      where: { id: c.shootDayId, productionId: pid },
      attributes: ["id", "date", "kind", "dayNumber"],
      transaction,
    });
    if (!day)
      throw ValidationError(`checkout.shootDayId: no such ${words.day} in this production`, {
        "checkout.shootDayId": `no such ${words.day} in this production`,
      });
  }
  let scene: Scene | null = null;
  if (c.sceneId) {
    scene = await Scene.findOne({ where: { id: c.sceneId, productionId: pid }, attributes: ["id", "number"], transaction });
    if (!scene)
      throw ValidationError("checkout.sceneId: no such scene in this production", {
        "checkout.sceneId": "no such scene in this production",
      });
    // A stage performance plays the whole running order, so any scene belongs to it.
    if (day && day.kind !== "performance") {
      const onDay = await ShootDayScene.findOne({ where: { shootDayId: day.id, sceneId: scene.id }, attributes: ["id"], transaction });
      if (!onDay)
        throw ValidationError(`checkout.sceneId: scene ${scene.number} is not on ${words.on(day.date)}`, {
          "checkout.sceneId": `scene ${scene.number} is not on ${words.on(day.date)}`,
        });
    }
  }
  const today = await todayForProduction(pid, transaction);
  const dueBackOn = c.dueBackOn ?? (day && day.date >= today ? day.date : today);
  if (dueBackOn < today)
    throw ValidationError(`checkout.dueBackOn: cannot be before today (${today})`, {
      "checkout.dueBackOn": `cannot be before today (${today})`,
    });
  const forParts = [day ? words.on(day.date) : null, scene ? `scene ${scene.number}` : null].filter(Boolean);
  return {
    toKind: c.toUserId ? "member" : "performer",
    toUserId: c.toUserId ?? null,
    toPerformerId: c.toPerformerId ?? null,
    toName,
    shootDayId: day?.id ?? null,
    sceneId: scene?.id ?? null,
    dueBackOn,
    forText: forParts.length ? ` for ${forParts.join(", ")}` : "",
  };
}

type MoveInput = Omit<MoveGarmentsInput, "garmentIds" | "checkout"> & { checkout?: ResolvedCheckout | null };

async function moveOne(actor: Actor, g: Garment, input: MoveInput, transaction: Transaction): Promise<MoveResult> {
  const rack = input.locationRack === undefined ? g.locationRack : input.locationRack || null;
  const bin = input.locationBin === undefined ? g.locationBin : input.locationBin || null;
  const fromLocation = locationLabel(g.locationRack, g.locationBin);
  const toLocation = locationLabel(rack, bin);
  const open = await GarmentCheckout.findOne({ where: { garmentId: g.id, returnedAt: null }, transaction, lock: transaction.LOCK.UPDATE });
  const now = clock.now();
  const notes: string[] = [];
  // Back in: a move to a status that is not "with someone" closes the open check-out.
  if (open && (input.checkout || !isCheckedOutStatus(input.status))) {
    await open.update({ returnedAt: now, returnedBy: actor.user.id }, { transaction });
    notes.push(input.checkout ? `Handed over from ${open.toName}` : `Back from ${open.toName}`);
  }
  if (input.checkout) {
    const c = input.checkout;
    await GarmentCheckout.create(
      {
        productionId: actor.productionId,
        garmentId: g.id,
        toKind: c.toKind,
        toUserId: c.toUserId,
        toPerformerId: c.toPerformerId,
        toName: c.toName,
        shootDayId: c.shootDayId,
        sceneId: c.sceneId,
        dueBackOn: c.dueBackOn,
        note: input.note || null,
        checkedOutAt: now,
        checkedOutBy: actor.user.id,
        returnedAt: null,
        returnedBy: null,
      },
      { transaction },
    );
    notes.push(`Checked out to ${c.toName}${c.forText}, due back ${formatDate(c.dueBackOn)}`);
  }
  if (g.status === input.status && fromLocation === toLocation && notes.length === 0) return { garment: g, event: null };
  if (input.note) notes.push(input.note);
  const event = await GarmentStatusEvent.create(
    {
      productionId: actor.productionId,
      garmentId: g.id,
      fromStatus: g.status,
      toStatus: input.status,
      fromLocation,
      toLocation,
      note: notes.join(" · ") || null,
      actorId: actor.user.id,
    },
    { transaction },
  );
  await g.update({ status: input.status, locationRack: rack, locationBin: bin }, { transaction });
  return { garment: g, event };
}

/**
 * Moves garments to a status (and location) in one transaction: one history row per garment that
 * actually changes; an unknown id rolls the whole move back.
 */
export async function moveGarments(actor: Actor, input: MoveGarmentsInput): Promise<MoveResult[]> {
  const unique = [...new Set(input.garmentIds)];
  const results = await sequelize.transaction(async (transaction) => {
    const rows = await Garment.findAll({
      where: { id: unique, productionId: actor.productionId },
      transaction,
      lock: transaction.LOCK.UPDATE,
      order: [["id", "ASC"]],
    });
    if (rows.length !== unique.length)
      throw NotFoundError(`${unique.length - rows.length} of the chosen garments were not found; nothing was moved.`);
    const checkout = input.checkout ? await resolveCheckout(actor, input.status, input.checkout, transaction) : null;
    const out: MoveResult[] = [];
    for (const g of rows) out.push(await moveOne(actor, g, { ...input, checkout }, transaction));
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: checkout ? "garment.checkout" : "garment.move",
        entityType: "garment",
        entityId: unique.length === 1 ? unique[0] : null,
        after: {
          garmentIds: unique,
          status: input.status,
          moved: out.filter((r) => r.event).length,
          ...(checkout ? { to: checkout.toName, dueBackOn: checkout.dueBackOn } : {}),
        },
      },
      transaction,
    );
    return out;
  });
  return reloadResults(results);
}

async function reloadResults(results: MoveResult[]): Promise<MoveResult[]> {
  const fresh = await Garment.findAll({ where: { id: results.map((r) => r.garment.id) }, include: includeNames });
  const byId = new Map(fresh.map((g) => [g.id, g]));
  const eventIds = results.map((r) => r.event?.id).filter((x): x is string => Boolean(x));
  const events = await GarmentStatusEvent.findAll({
    where: { id: eventIds },
    include: [{ model: User, as: "actor", attributes: ["id", "name"] }],
  });
  const evById = new Map(events.map((e) => [e.id, e]));
  return results.map((r) => ({ garment: byId.get(r.garment.id)!, event: r.event ? evById.get(r.event.id)! : null }));
}

/** Check in / out by tag code: find the garment and move it. */
export async function scanGarment(actor: Actor, input: ScanGarmentInput): Promise<MoveResult> {
  const g = await Garment.findOne({ where: { productionId: actor.productionId, tagCode: input.tagCode }, attributes: ["id"] });
  if (!g) throw NotFoundError(`No garment in this production has tag ${input.tagCode}.`);
  const { tagCode: _t, ...move } = input;
  const [r] = await moveGarments(actor, { ...move, garmentIds: [g.id] });
  return r!;
}

/** The filtered garments as CSV (lengths in the production's unit, with mm columns kept for re-import). */
export async function garmentsCsv(actor: Actor, f: GarmentFilters, unit: LengthUnit): Promise<string> {
  const rows = await findGarments(actor, f);
  const points = ["chest", "bust", "waist", "hip", "back_length", "sleeve", "inside_leg", "neck", "shoulder"] as const;
  const columns = [
    ...([
      "tag_code",
      "name",
      "category",
      "size_label",
      "fit_intent",
      "status",
      "rack",
      "bin",
      "source",
      "vendor",
      "cost",
      "rental_due_on",
      "fabric",
      "colour",
      "distress_stage",
      "multiples_group",
      "copy_number",
    ] as const),
    ...points.flatMap((p) => [`${p}_mm`, `${p}_${unit}`]),
  ];
  const data = rows.map((g) => {
    const base: Record<string, CsvCell> = {
      tag_code: g.tagCode,
      name: g.name,
      category: g.category,
      size_label: g.sizeLabel ?? "",
      fit_intent: g.fitIntent,
      status: garmentStatusLabels[g.status as GarmentStatus],
      rack: g.locationRack ?? "",
      bin: g.locationBin ?? "",
      source: g.source,
      vendor: g.vendor ?? "",
      cost: g.costCents === null ? "" : (g.costCents / 100).toFixed(2),
      rental_due_on: g.rentalDueOn ?? "",
      fabric: g.fabric?.name ?? "",
      colour: g.colour ?? "",
      distress_stage: g.distressStage,
      multiples_group: g.multiplesGroup?.name ?? "",
      copy_number: g.copyNumber ?? "",
    };
    for (const p of points) {
      const mm = g.finishedMeasurements?.[p];
      base[`${p}_mm`] = mm ?? "";
      base[`${p}_${unit}`] = mm === undefined ? "" : formatLength(mm, unit, "decimal").replace(/[" cm]/g, "");
    }
    return base;
  });
  // The one CSV writer: formula-looking cells are made inert so a spreadsheet does not run them.
  return writeCsvRecords(columns, data);
}

/** Statuses as shown to people (for messages). */
export function statusLabel(s: GarmentStatus): string {
  return garmentStatusLabels[s];
}

/** Values the wardrobe filters offer: categories and racks in use, and the production's characters. */
export async function garmentFilterOptions(
  actor: Actor,
): Promise<{ categories: string[]; racks: string[]; characters: Array<{ id: string; name: string }> }> {
  const rep = { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT } as const;
  const cats = await sequelize.query<{ v: string }>(
    `SELECT DISTINCT category AS v FROM garments WHERE production_id = :pid ORDER BY 1`,
    rep,
  );
  const racks = await sequelize.query<{ v: string }>(
    `SELECT DISTINCT location_rack AS v FROM garments WHERE production_id = :pid AND location_rack IS NOT NULL ORDER BY 1`,
    rep,
  );
  // Characters belong to the breakdown; read id and name only.
  const characters = await sequelize.query<{ id: string; name: string }>(
    `SELECT id, name FROM characters WHERE production_id = :pid ORDER BY sort_order, name`,
    rep,
  );
  return { categories: cats.map((r) => r.v), racks: racks.map((r) => r.v), characters };
}

/** Open check-outs of the production (who has what), soonest due first, with their garments. */
export async function listOpenCheckouts(actor: Actor): Promise<GarmentCheckout[]> {
  return GarmentCheckout.findAll({
    where: { productionId: actor.productionId, returnedAt: null },
    include: [...checkoutIncludes, { model: Garment, as: "garment", attributes: ["id", "tagCode", "name", "status"] }],
    order: [
      ["dueBackOn", "ASC"],
      ["checkedOutAt", "ASC"],
      ["id", "ASC"],
    ],
  });
}

/** Whom a garment can go out to, and the days (from today on) with their scenes, for the check-out form. */
export async function checkoutOptions(actor: Actor): Promise<CheckoutOptionsDto> {
  const today = await todayForProduction(actor.productionId);
  const rep = { replacements: { pid: actor.productionId, today }, type: QueryTypes.SELECT } as const;
  const [members, performers, days, dayScenes] = await Promise.all([
    sequelize.query<{ user_id: string; name: string; role: string }>(
      `SELECT m.user_id, u.name, m.role FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.production_id = :pid AND u.is_active ORDER BY u.name`,
      rep,
    ),
    // Performers with the characters they play or double, so "Ada Pell (Maud)" is recognisable on set.
    sequelize.query<{ id: string; name: string; characters: string[] | null }>(
      `SELECT p.id, p.name,
              ARRAY(SELECT c.name FROM characters c WHERE c.performer_id = p.id
                    UNION SELECT c.name FROM character_doubles d JOIN characters c ON c.id = d.character_id WHERE d.performer_id = p.id
                    ORDER BY 1) AS characters
         FROM performers p WHERE p.production_id = :pid ORDER BY p.name`,
      rep,
    ),
    sequelize.query<{ id: string; date: string; kind: "shoot" | "performance"; day_number: number }>(
      `SELECT id, to_char(date, 'YYYY-MM-DD') AS date, kind, day_number FROM shoot_days WHERE production_id = :pid AND date >= :today ORDER BY date, day_number LIMIT 30`,
      rep,
    ),
    sequelize.query<{ shoot_day_id: string; id: string; number: string }>(
      `SELECT sds.shoot_day_id, s.id, s.number FROM shoot_day_scenes sds JOIN scenes s ON s.id = sds.scene_id JOIN shoot_days d ON d.id = sds.shoot_day_id
        WHERE sds.production_id = :pid AND d.date >= :today ORDER BY sds.shoot_day_id, sds.position, s.id`,
      rep,
    ),
  ]);
  // A performance plays the whole running order: offer every scene, in story order.
  const needsRunningOrder = days.some((d) => d.kind === "performance");
  const runningOrder = needsRunningOrder
    ? await sequelize.query<{ id: string; number: string }>(
        `SELECT id, number FROM scenes WHERE production_id = :pid ORDER BY story_order, id`,
        rep,
      )
    : [];
  const scenesOf = new Map<string, Array<{ id: string; number: string }>>();
  for (const r of dayScenes)
    (scenesOf.get(r.shoot_day_id) ?? scenesOf.set(r.shoot_day_id, []).get(r.shoot_day_id)!).push({ id: r.id, number: r.number });
  return {
    today,
    // Only people who handle garments (the permission table decides who that is) can take one out.
    members: members
      .filter((m) => can(m.role as Role, "garment.read"))
      .map((m) => ({ userId: m.user_id, name: m.name, role: roleLabels[m.role as Role] ?? m.role })),
    performers: performers.map((p) => ({ id: p.id, name: p.name, characters: p.characters ?? [] })),
    days: days.map((d) => ({
      id: d.id,
      date: d.date,
      kind: d.kind,
      dayNumber: d.day_number,
      scenes: d.kind === "performance" ? runningOrder : (scenesOf.get(d.id) ?? []),
    })),
  };
}
