/**
 * Fittings: booking, rescheduling and cancelling (each sends the performer an e-mail with an RFC 5545
 * invitation through the job queue), and what a tablet shows during a fitting.
 */
import { Op } from "sequelize";
import { randomUUID } from "node:crypto";
import { sequelize } from "../db.js";
import { config } from "../config.js";
import { productionTimeZone } from "../lib/clock.js";
import { AlterationTicket, ChangeItem, Fitting, Garment, Membership, Production, User } from "../models/index.js";
import type {
  CreateFittingInput,
  FittingDetailDto,
  FittingDto,
  LinkFittingItemInput,
  ListFittingsQuery,
  UpdateFittingInput,
} from "@shared/schemas/workroom.js";
import { createGarmentInputSchema } from "@shared/schemas/garments.js";
import { createGarmentsIn, mapTagRace } from "./garments.service.js";
import { can } from "@shared/permissions.js";
import { checkFit, describePointFit, fitSnagFromFacts } from "@shared/domain/snags/fit.js";
import { finishSnag } from "@shared/domain/snags/engine.js";
import type { Snag } from "@shared/domain/snags/types.js";
import { ConflictError, NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { changeItemsWithGarments, changeLabel, characterOfPerformer, findChange, findPerformer } from "./workroom-facts.service.js";
import { loadFittingFacts } from "./fit-facts.js";
import { fittingEmail, type FittingMailKind } from "../emails/fitting.email.js";
import { invitationAddress, queueWorkroomEmail } from "./workroom-mail.service.js";
import { presentFitting } from "../presenters/workroom.presenter.js";
import { presentTickets } from "./alterations.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { Transaction } from "sequelize";

/**
 * The fitting's organizer: the member who booked it, so the performer's reply (and their calendar's RSVP)
 * reaches a person. RFC 5545 keeps one ORGANIZER for all sequences, so updates and cancellations name the
 * same member; a fitting with no recorded booker falls back to the member acting now.
 */
async function organizerOf(actor: Actor, f: Fitting, transaction: Transaction): Promise<{ name: string; email: string }> {
  const booker = f.createdBy ? await User.findByPk(f.createdBy, { transaction }) : null;
  const who = booker ?? actor.user;
  return { name: who.name, email: who.email };
}

async function assertAttendees(productionId: string, ids: string[], transaction: Transaction): Promise<void> {
  if (ids.length === 0) return;
  const n = await Membership.count({ where: { productionId, userId: { [Op.in]: ids } }, transaction });
  if (n !== new Set(ids).size)
    throw ValidationError("attendeeIds: every attendee must be a member of this production", {
      attendeeIds: "every attendee must be a member of this production",
    });
}

/** Fittings (not cancelled unless asked), by start. */
export async function listFittings(actor: Actor, q: ListFittingsQuery): Promise<FittingDto[]> {
  const where: Record<string | symbol, unknown> = { productionId: actor.productionId };
  if (q.status) where.status = q.status;
  const range: Record<symbol, Date> = {};
  if (q.from) range[Op.gte] = new Date(`${q.from}T00:00:00Z`);
  if (q.to) range[Op.lt] = new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000);
  if (q.from || q.to) where.startsAt = range;
  const rows = await Fitting.findAll({ where, order: [["startsAt", "ASC"]] });
  return presentFittings(actor.productionId, rows);
}

async function presentFittings(productionId: string, rows: Fitting[]): Promise<FittingDto[]> {
  const userIds = [...new Set(rows.flatMap((f) => f.attendeeIds))];
  const users = new Map((await User.findAll({ where: { id: userIds } })).map((u) => [u.id, u.name]));
  const counts = new Map<string, number>();
  if (rows.length) {
    const tickets = await AlterationTicket.findAll({
      where: { productionId, fittingId: rows.map((r) => r.id) },
      attributes: ["fittingId"],
    });
    for (const t of tickets) counts.set(t.fittingId!, (counts.get(t.fittingId!) ?? 0) + 1);
  }
  const out: FittingDto[] = [];
  for (const f of rows) {
    const performer = await findPerformer(productionId, f.performerId);
    const change = f.changeId ? await findChange(productionId, f.changeId) : null;
    out.push(
      presentFitting(f, {
        performerName: performer?.name ?? "",
        performerEmail: performer ? invitationAddress(performer) : null,
        changeLabel: change ? changeLabel(change) : null,
        attendeeNames: f.attendeeIds.map((id) => users.get(id) ?? "former member"),
        ticketCount: counts.get(f.id) ?? 0,
      }),
    );
  }
  return out;
}

async function loadFitting(actor: Actor, id: string, transaction?: Transaction): Promise<Fitting> {
  const f = await Fitting.findOne({
    where: { id, productionId: actor.productionId },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!f) throw NotFoundError("Fitting not found.");
  return f;
}

/** One fitting for the list. */
export async function getFitting(actor: Actor, id: string): Promise<FittingDto> {
  return (await presentFittings(actor.productionId, [await loadFitting(actor, id)]))[0];
}

/**
 * Everything a tablet shows during a fitting: the change's items with each garment's fit on the performer,
 * the performer's current measurements (only for roles that may read measurements), fit snags and tickets.
 */
export async function getFittingDetail(actor: Actor, id: string): Promise<FittingDetailDto> {
  const f = await loadFitting(actor, id);
  const [base] = await presentFittings(actor.productionId, [f]);
  const mayMeasure = can(actor.role, "measurement.read");
  const items = f.changeId ? await changeItemsWithGarments(actor.productionId, f.changeId) : [];
  // The same fit facts as the Snags screen (production ease ranges, knit stretch), so both give one verdict.
  const facts = await loadFittingFacts(
    actor.productionId,
    f.performerId,
    items.flatMap((i) => (i.garment_id ? [i.garment_id] : [])),
  );
  const measurements = mayMeasure ? facts.measurements : null;
  const garments = facts.garments;
  const openTickets = await AlterationTicket.findAll({
    where: { productionId: actor.productionId, garmentId: [...garments.keys()], status: { [Op.ne]: "checked" } },
  });
  const fromFitting = await AlterationTicket.findAll({
    where: { productionId: actor.productionId, fittingId: f.id },
    include: [{ model: User, as: "assignee" }],
    order: [["createdAt", "ASC"]],
  });
  const performer = await findPerformer(actor.productionId, f.performerId);
  const characterId = (await characterOfPerformer(actor.productionId, f.performerId)) ?? "";
  const fitSnags: Snag[] = [];
  const outItems: FittingDetailDto["items"] = items.map((i) => {
    const g = i.garment_id ? garments.get(i.garment_id) : undefined;
    let fit: FittingDetailDto["items"][number]["fit"] = [];
    if (g && measurements) {
      const points = checkFit(g, measurements.valuesMm, facts.easeOverrides);
      fit = points.map((p) => ({
        point: p.point,
        status: p.status,
        by: Math.round(p.by),
        sentence: describePointFit(p, g.fitIntent, g.category),
      }));
      const draft = fitSnagFromFacts({
        garment: g,
        performerId: f.performerId,
        performerName: performer?.name ?? "",
        characterId,
        asDouble: false,
        points,
      });
      if (draft) fitSnags.push(finishSnag(draft));
    }
    return {
      changeItemId: i.change_item_id,
      label: i.label,
      garmentId: g?.id ?? null,
      tagCode: g?.tagCode ?? null,
      garmentName: g?.name ?? null,
      garmentStatus: g?.status ?? null,
      fit,
      openTicketIds: g ? openTickets.filter((t) => t.garmentId === g.id).map((t) => t.id) : [],
    };
  });
  return { ...base, items: outItems, measurements, fitSnags, tickets: await presentTickets(actor.productionId, fromFitting) };
}

/** Queues the performer's invitation, update or cancellation after commit (skipped without an address). */
async function queueFittingMail(actor: Actor, f: Fitting, kind: FittingMailKind, transaction: Transaction): Promise<void> {
  const performer = await findPerformer(actor.productionId, f.performerId, transaction);
  const to = performer ? invitationAddress(performer) : null;
  if (!performer || !to) return;
  const production = await Production.findByPk(actor.productionId, { transaction });
  const change = f.changeId ? await findChange(actor.productionId, f.changeId, transaction) : null;
  const mail = fittingEmail({
    kind,
    uid: f.icsUid,
    sequence: f.icsSequence,
    productionTitle: production?.title ?? "",
    performer: { name: performer.name, email: to },
    changeLabel: change ? changeLabel(change) : null,
    startsAt: f.startsAt,
    durationMinutes: f.durationMinutes,
    room: f.room,
    organizer: await organizerOf(actor, f, transaction),
    timeZone: production ? productionTimeZone(production) : config.TIME_ZONE,
  });
  await queueWorkroomEmail(
    {
      productionId: actor.productionId,
      kind: kind === "invite" ? "fitting_invite" : kind === "update" ? "fitting_update" : "fitting_cancel",
      dedupeKey: `fitting:${f.id}:${f.icsSequence}:${kind}`,
      mail,
    },
    transaction,
  );
}

/** Books a fitting and invites the performer. */
export async function createFitting(actor: Actor, input: CreateFittingInput): Promise<FittingDto> {
  const id = await sequelize.transaction(async (transaction) => {
    const performer = await findPerformer(actor.productionId, input.performerId, transaction);
    if (!performer)
      throw ValidationError("performerId: no such performer in this production", { performerId: "no such performer in this production" });
    if (input.changeId && !(await findChange(actor.productionId, input.changeId, transaction))) {
      throw ValidationError("changeId: no such change in this production", { changeId: "no such change in this production" });
    }
    await assertAttendees(actor.productionId, input.attendeeIds, transaction);
    const fid = randomUUID();
    const f = await Fitting.create(
      {
        id: fid,
        productionId: actor.productionId,
        performerId: input.performerId,
        changeId: input.changeId ?? null,
        startsAt: new Date(input.startsAt),
        durationMinutes: input.durationMinutes,
        room: input.room || null,
        attendeeIds: [...new Set(input.attendeeIds)],
        notes: input.notes ?? null,
        icsUid: `fitting-${fid}@seamscene`,
        createdBy: actor.user.id,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "fitting.book",
        entityType: "fitting",
        entityId: f.id,
        after: input,
      },
      transaction,
    );
    await queueFittingMail(actor, f, "invite", transaction);
    return f.id;
  });
  return getFitting(actor, id);
}

/**
 * Edits a fitting. Moving a booked fitting (time, length, room) raises its calendar sequence and sends an
 * update; cancelling raises it and sends a cancellation. A cancelled fitting cannot be edited.
 */
export async function updateFitting(actor: Actor, id: string, input: UpdateFittingInput): Promise<FittingDto> {
  await sequelize.transaction(async (transaction) => {
    const f = await loadFitting(actor, id, transaction);
    if (f.status === "cancelled") throw ConflictError("This fitting is cancelled; book a new one.");
    if (input.attendeeIds) await assertAttendees(actor.productionId, input.attendeeIds, transaction);
    const before = { startsAt: f.startsAt.toISOString(), durationMinutes: f.durationMinutes, room: f.room, status: f.status };
    const startsAt = input.startsAt ? new Date(input.startsAt) : f.startsAt;
    const moved =
      startsAt.getTime() !== f.startsAt.getTime() ||
      (input.durationMinutes !== undefined && input.durationMinutes !== f.durationMinutes) ||
      (input.room !== undefined && (input.room || null) !== f.room);
    const cancelling = input.status === "cancelled";
    const wasBooked = f.status === "booked";
    await f.update(
      {
        startsAt,
        ...(input.durationMinutes !== undefined ? { durationMinutes: input.durationMinutes } : {}),
        ...(input.room !== undefined ? { room: input.room || null } : {}),
        ...(input.attendeeIds !== undefined ? { attendeeIds: [...new Set(input.attendeeIds)] } : {}),
        ...(input.notes !== undefined ? { notes: input.notes } : {}),
        ...(input.outcome !== undefined ? { outcome: input.outcome } : {}),
        ...(input.status !== undefined ? { status: input.status } : {}),
        ...((moved && wasBooked) || cancelling ? { icsSequence: f.icsSequence + 1 } : {}),
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: cancelling ? "fitting.cancel" : "fitting.update",
        entityType: "fitting",
        entityId: f.id,
        before,
        after: input,
      },
      transaction,
    );
    if (cancelling) await queueFittingMail(actor, f, "cancel", transaction);
    else if (moved && wasBooked && f.status === "booked") await queueFittingMail(actor, f, "update", transaction);
  });
  return getFitting(actor, id);
}

/**
 * At a fitting: links a change item that has no garment yet to a garment from stock, or adds the
 * garment to stock there and links it, in one transaction. The change's approval stands: which
 * physical piece an item is does not change the design.
 * @returns the fitting as the tablet shows it now
 */
export async function linkFittingItem(
  actor: Actor,
  fittingId: string,
  changeItemId: string,
  input: LinkFittingItemInput,
): Promise<FittingDetailDto> {
  await sequelize
    .transaction(async (transaction) => {
      const f = await loadFitting(actor, fittingId, transaction);
      if (f.status === "cancelled") throw ConflictError("This fitting is cancelled; book a new one.");
      const item = f.changeId
        ? await ChangeItem.findOne({
            where: { id: changeItemId, productionId: actor.productionId, changeId: f.changeId },
            transaction,
            lock: transaction.LOCK.UPDATE,
          })
        : null;
      if (!item) throw NotFoundError("That item is not part of this fitting's change.");
      if (item.garmentId || item.multiplesGroupId)
        throw ConflictError(`"${item.label}" already has a garment; change it on the Changes screen.`, {
          changeItemId: "already has a garment",
        });
      let garmentId: string;
      if (input.garmentId) {
        const g = await Garment.findOne({
          where: { id: input.garmentId, productionId: actor.productionId },
          attributes: ["id"],
          transaction,
        });
        if (!g) throw ValidationError("garmentId: no such garment in this production", { garmentId: "no such garment in this production" });
        garmentId = g.id;
      } else {
        const [id] = await createGarmentsIn(actor, createGarmentInputSchema.parse({ ...input.newGarment, copies: 1 }), transaction);
        garmentId = id!;
      }
      await item.update({ garmentId }, { transaction });
      await recordAudit(
        {
          productionId: actor.productionId,
          actorId: actor.user.id,
          action: "change_item.link_garment",
          entityType: "change_item",
          entityId: item.id,
          before: { garmentId: null },
          after: { garmentId, fittingId: f.id, created: Boolean(input.newGarment) },
        },
        transaction,
      );
    })
    .catch(mapTagRace);
  return getFittingDetail(actor, fittingId);
}
