import { randomInt } from "node:crypto";
import { Op, QueryTypes, UniqueConstraintError, type Transaction, type WhereOptions } from "sequelize";
import { writeCsvRecords, type CsvCell } from "@shared/csv.js";
import { sequelize } from "../db.js";
import { escapeLike } from "../lib/like.js";
import { Fabric, Garment, GarmentStatusEvent, MultiplesGroup, User } from "../models/index.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { todayForProduction } from "./productions.service.js";
import type { Actor } from "../middleware/require-auth.js";
import { generateTagCode } from "@shared/domain/tag-codes.js";
import {
  garmentStatusLabels,
  type AddCopiesInput,
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

const includeNames = [
  { model: Fabric, as: "fabric", attributes: ["id", "name"] },
  { model: MultiplesGroup, as: "multiplesGroup", attributes: ["id", "name"] },
];

function addDays(isoDay: string, days: number): string {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

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

function whereFor(actor: Actor, f: GarmentFilters, dueFromDay: string | null): WhereOptions {
  const and: WhereOptions[] = [{ productionId: actor.productionId }];
  if (f.q) {
    const like = `%${escapeLike(f.q)}%`;
    and.push({ [Op.or]: [{ name: { [Op.iLike]: like } }, { tagCode: { [Op.iLike]: like } }, { colour: { [Op.iLike]: like } }, { vendor: { [Op.iLike]: like } }] });
  }
  if (f.category) and.push({ category: f.category });
  if (f.status.length) and.push({ status: { [Op.in]: f.status } });
  if (f.source) and.push({ source: f.source });
  // The whole rack name, any case; `%` and `_` in it are letters, not wildcards.
  if (f.rack) and.push({ locationRack: { [Op.iLike]: escapeLike(f.rack) } });
  if (f.fabricId) and.push({ fabricId: f.fabricId });
  if (f.multiplesGroupId) and.push({ multiplesGroupId: f.multiplesGroupId });
  if (f.ids.length) and.push({ id: { [Op.in]: f.ids } });
  if (f.dueWithinDays !== undefined) {
    const until = addDays(dueFromDay ?? f.asOf!, f.dueWithinDays);
    and.push({ source: "rented", rentalDueOn: { [Op.ne]: null, [Op.lte]: until }, status: { [Op.notIn]: ["returned", "lost"] } });
  }
  if (f.characterId) {
    // Change items are the link between a character and garments: a copy directly, or a whole group.
    const cid = sequelize.escape(f.characterId);
    and.push({
      [Op.or]: [
        { id: { [Op.in]: sequelize.literal(`(SELECT ci.garment_id FROM change_items ci JOIN changes c ON c.id = ci.change_id WHERE c.character_id = ${cid} AND ci.garment_id IS NOT NULL)`) } },
        { multiplesGroupId: { [Op.in]: sequelize.literal(`(SELECT ci.multiples_group_id FROM change_items ci JOIN changes c ON c.id = ci.change_id WHERE c.character_id = ${cid} AND ci.multiples_group_id IS NOT NULL)`) } },
      ],
    });
  }
  return { [Op.and]: and };
}

/** A garment as lists read it: plain columns plus fabric and group names, no model instance. */
export type GarmentListRow = Omit<Garment["_attributes"], "fabric" | "multiplesGroup"> & {
  fabric: { id: string | null; name: string | null } | null;
  multiplesGroup: { id: string | null; name: string | null } | null;
};

/**
 * One page of garments matching the filters, with the total. Plain rows (building model instances was
 * most of a list request's time); the page and the count run side by side on two connections.
 */
export async function listGarments(actor: Actor, q: ListGarmentsQuery): Promise<{ rows: GarmentListRow[]; count: number }> {
  const dir = q.dir.toUpperCase() as "ASC" | "DESC";
  const where = whereFor(actor, q, await dueFrom(actor, q));
  const [rows, count] = await Promise.all([
    Garment.findAll({
      where,
      include: includeNames,
      // Ties by tag code in the same direction, so one index serves the page either way round.
      order: [[q.sort, dir], ["tagCode", dir]],
      limit: q.pageSize,
      offset: (q.page - 1) * q.pageSize,
      raw: true,
      nest: true,
    }) as unknown as Promise<GarmentListRow[]>,
    Garment.count({ where }),
  ]);
  return { rows, count };
}

/** Every garment matching the filters, by tag code (exports and label sheets). */
export async function findGarments(actor: Actor, f: GarmentFilters, limit = 5000): Promise<Garment[]> {
  return Garment.findAll({ where: whereFor(actor, f, await dueFrom(actor, f)), include: includeNames, order: [["tagCode", "ASC"]], limit });
}

async function loadGarment(actor: Actor, id: string, transaction?: Transaction, lock = false): Promise<Garment> {
  const g = await Garment.findOne({ where: { id, productionId: actor.productionId }, transaction, ...(lock && transaction ? { lock: transaction.LOCK.UPDATE } : {}) });
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
    order: [["createdAt", "DESC"], ["id", "ASC"]],
  });
  // Changes belong to the breakdown; read them directly rather than through its models.
  const changes = await sequelize.query<{ change_id: string; number: number; character_id: string; character_name: string; label: string; via_group: boolean }>(
    `SELECT c.id AS change_id, c.number, ch.id AS character_id, ch.name AS character_name, ci.label, (ci.garment_id IS NULL) AS via_group
       FROM change_items ci
       JOIN changes c ON c.id = ci.change_id
       JOIN characters ch ON ch.id = c.character_id
      WHERE ci.production_id = :pid AND (ci.garment_id = :gid OR (CAST(:groupId AS uuid) IS NOT NULL AND ci.multiples_group_id = CAST(:groupId AS uuid)))
      ORDER BY ch.name, c.number`,
    { replacements: { pid: actor.productionId, gid: id, groupId: garment.multiplesGroupId }, type: QueryTypes.SELECT },
  );
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
  return { garment, history, changes: changeRefs, groupCopies };
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
  const clash = await Garment.findOne({ where: { productionId, tagCode, ...(exceptId ? { id: { [Op.ne]: exceptId } } : {}) }, attributes: ["id", "name"], transaction });
  if (clash) throw ValidationError(`tagCode: ${tagCode} is already on "${clash.name}"`, { tagCode: `is already used by "${clash.name}"` });
}

async function assertFabricInProduction(productionId: string, fabricId: string | null | undefined, transaction: Transaction) {
  if (!fabricId) return;
  const f = await Fabric.findOne({ where: { id: fabricId, productionId }, attributes: ["id"], transaction });
  if (!f) throw ValidationError("fabricId: no such fabric in this production", { fabricId: "no such fabric in this production" });
}

// A duplicate that slipped past the check (two requests at once) is still a bad tag code for the user.
export function mapTagRace(err: unknown): never {
  if (err instanceof UniqueConstraintError && err.errors.some((e) => e.path === "tag_code" || e.path === "tagCode" || /tag_code/.test(e.message))) {
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
    const group = await MultiplesGroup.create({ productionId: actor.productionId, name: groupName || fields.name, notes: null }, { transaction });
    groupId = group.id;
  }
  const created: Garment[] = [];
  for (let i = 0; i < copies; i++) {
    const g = await Garment.create(
      { ...fields, productionId: actor.productionId, tagCode: codes[i]!, status, multiplesGroupId: groupId, copyNumber: groupId ? i + 1 : null },
      { transaction },
    );
    await GarmentStatusEvent.create(
      { productionId: actor.productionId, garmentId: g.id, fromStatus: null, toStatus: status, fromLocation: null, toLocation: locationLabel(g.locationRack, g.locationBin), note: "Added to stock", actorId: actor.user.id },
      { transaction },
    );
    created.push(g);
  }
  await recordAudit(
    { productionId: actor.productionId, actorId: actor.user.id, action: "garment.create", entityType: "garment", entityId: created[0]!.id, after: { tagCodes: codes, name: fields.name, copies, multiplesGroupId: groupId } },
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
      await recordAudit({ productionId: actor.productionId, actorId: actor.user.id, action: "garment.update", entityType: "garment", entityId: g.id, before: changed, after: input }, transaction);
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
      const group = await MultiplesGroup.create({ productionId: actor.productionId, name: input.groupName || g.name, notes: null }, { transaction });
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
          productionId: actor.productionId, tagCode: codes[i]!, name: g.name, category: g.category, sizeLabel: g.sizeLabel, fitIntent: g.fitIntent,
          finishedMeasurements: g.finishedMeasurements, fabricId: g.fabricId, colour: g.colour, source: g.source, vendor: g.vendor, costCents: g.costCents,
          rentalDueOn: g.rentalDueOn, rentalCostPerWeekCents: g.rentalCostPerWeekCents, wrapDisposition: g.wrapDisposition, locationRack: g.locationRack, locationBin: g.locationBin, status: "in_stock", distressStage: 0,
          multiplesGroupId: groupId, copyNumber: maxCopy + i + 1, notes: null,
        },
        { transaction },
      );
      await GarmentStatusEvent.create(
        { productionId: actor.productionId, garmentId: copy.id, fromStatus: null, toStatus: "in_stock", fromLocation: null, toLocation: locationLabel(copy.locationRack, copy.locationBin), note: `Copy of ${g.tagCode}`, actorId: actor.user.id },
        { transaction },
      );
      made.push(copy.id);
    }
    await recordAudit({ productionId: actor.productionId, actorId: actor.user.id, action: "garment.copies", entityType: "garment", entityId: g.id, after: { multiplesGroupId: groupId, tagCodes: codes } }, transaction);
    return [g.id, ...made];
  });
  return Garment.findAll({ where: { id: ids }, include: includeNames, order: [["copyNumber", "ASC"]] });
}

/** Result of moving one garment. */
export interface MoveResult {
  garment: Garment;
  event: GarmentStatusEvent | null;
}

async function moveOne(actor: Actor, g: Garment, input: Omit<MoveGarmentsInput, "garmentIds">, transaction: Transaction): Promise<MoveResult> {
  const rack = input.locationRack === undefined ? g.locationRack : input.locationRack || null;
  const bin = input.locationBin === undefined ? g.locationBin : input.locationBin || null;
  const fromLocation = locationLabel(g.locationRack, g.locationBin);
  const toLocation = locationLabel(rack, bin);
  if (g.status === input.status && fromLocation === toLocation) return { garment: g, event: null };
  const event = await GarmentStatusEvent.create(
    { productionId: actor.productionId, garmentId: g.id, fromStatus: g.status, toStatus: input.status, fromLocation, toLocation, note: input.note || null, actorId: actor.user.id },
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
    const rows = await Garment.findAll({ where: { id: unique, productionId: actor.productionId }, transaction, lock: transaction.LOCK.UPDATE, order: [["id", "ASC"]] });
    if (rows.length !== unique.length) throw NotFoundError(`${unique.length - rows.length} of the chosen garments were not found; nothing was moved.`);
    const out: MoveResult[] = [];
    for (const g of rows) out.push(await moveOne(actor, g, input, transaction));
    await recordAudit(
      { productionId: actor.productionId, actorId: actor.user.id, action: "garment.move", entityType: "garment", entityId: unique.length === 1 ? unique[0] : null, after: { garmentIds: unique, status: input.status, moved: out.filter((r) => r.event).length } },
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
  const events = await GarmentStatusEvent.findAll({ where: { id: eventIds }, include: [{ model: User, as: "actor", attributes: ["id", "name"] }] });
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
    ...(["tag_code", "name", "category", "size_label", "fit_intent", "status", "rack", "bin", "source", "vendor", "cost", "rental_due_on", "fabric", "colour", "distress_stage", "multiples_group", "copy_number"] as const),
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
export async function garmentFilterOptions(actor: Actor): Promise<{ categories: string[]; racks: string[]; characters: Array<{ id: string; name: string }> }> {
  const rep = { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT } as const;
  const cats = await sequelize.query<{ v: string }>(`SELECT DISTINCT category AS v FROM garments WHERE production_id = :pid ORDER BY 1`, rep);
  const racks = await sequelize.query<{ v: string }>(`SELECT DISTINCT location_rack AS v FROM garments WHERE production_id = :pid AND location_rack IS NOT NULL ORDER BY 1`, rep);
  // Characters belong to the breakdown; read id and name only.
  const characters = await sequelize.query<{ id: string; name: string }>(`SELECT id, name FROM characters WHERE production_id = :pid ORDER BY sort_order, name`, rep);
  return { categories: cats.map((r) => r.v), racks: racks.map((r) => r.v), characters };
}
