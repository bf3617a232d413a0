/**
 * Alteration tickets. Raising a ticket moves its garment to the workroom and checking the last open ticket
 * moves it back, each in the same transaction as the ticket change (all or nothing).
 */
import { Op, type Transaction } from "sequelize";
import { sequelize } from "../db.js";
import { AlterationTicket, Fitting, Membership, User } from "../models/index.js";
import type {
  AlterationTicketDto,
  CreateTicketInput,
  ListTicketsQuery,
  TicketStatus,
  UpdateTicketInput,
} from "@shared/schemas/workroom.js";
import { can } from "@shared/permissions.js";
import { ConflictError, ForbiddenError, NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import { findGarment, findGarments, moveGarmentStatus } from "./workroom-facts.service.js";
import { WORKROOM_ROLES } from "./workroom.service.js";
import { todayForProduction } from "./productions.service.js";
import { clock } from "../lib/clock.js";
import { presentTicket } from "../presenters/workroom.presenter.js";
import type { Actor } from "../middleware/require-auth.js";

/** Garment statuses a ticket cannot be raised on (the garment is not in the building). */
const UNAVAILABLE = ["returned", "lost"];

/** Allowed status moves; `checked` is final. */
const TRANSITIONS: Record<TicketStatus, TicketStatus[]> = {
  waiting: ["in_progress", "done"],
  in_progress: ["waiting", "done"],
  done: ["in_progress", "checked"],
  checked: [],
};

async function assertWorkroomMember(productionId: string, userId: string, transaction: Transaction): Promise<void> {
  const m = await Membership.findOne({ where: { productionId, userId }, transaction });
  if (!m || !(WORKROOM_ROLES as readonly string[]).includes(m.role)) {
    throw ValidationError("assigneeId: must be a workroom member of this production", {
      assigneeId: "must be a workroom member of this production",
    });
  }
}

/** Tickets with their garments' tag and name, for the wire. */
export async function presentTickets(productionId: string, tickets: AlterationTicket[]): Promise<AlterationTicketDto[]> {
  const garments = new Map(
    (await findGarments(productionId, [...new Set(tickets.map((t) => t.garmentId))])).map((g) => [
      g.id,
      { tagCode: g.tag_code, name: g.name },
    ]),
  );
  return tickets.map((t) => presentTicket(t, garments.get(t.garmentId)));
}

/** Tickets of the production, open first, then by the day raised. */
export async function listTickets(actor: Actor, q: ListTicketsQuery): Promise<AlterationTicket[]> {
  return AlterationTicket.findAll({
    where: {
      productionId: actor.productionId,
      ...(q.status ? { status: q.status } : {}),
      ...(q.garmentId ? { garmentId: q.garmentId } : {}),
      ...(q.fittingId ? { fittingId: q.fittingId } : {}),
    },
    include: [{ model: User, as: "assignee" }],
    order: [
      [sequelize.literal(`CASE "AlterationTicket"."status" WHEN 'checked' THEN 1 ELSE 0 END`), "ASC"],
      ["raisedOn", "ASC"],
      ["createdAt", "ASC"],
    ],
  });
}

async function loadTicket(actor: Actor, id: string, transaction?: Transaction): Promise<AlterationTicket> {
  const t = await AlterationTicket.findOne({
    where: { id, productionId: actor.productionId },
    transaction,
    lock: transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!t) throw NotFoundError("Alteration ticket not found.");
  return t;
}

/** One ticket. */
export async function getTicket(actor: Actor, id: string): Promise<AlterationTicket> {
  const t = await AlterationTicket.findOne({ where: { id, productionId: actor.productionId }, include: [{ model: User, as: "assignee" }] });
  if (!t) throw NotFoundError("Alteration ticket not found.");
  return t;
}

/** Raises a ticket on a garment; the garment moves to the workroom in the same transaction. */
export async function raiseTicket(actor: Actor, input: CreateTicketInput): Promise<AlterationTicket> {
  const id = await sequelize.transaction(async (transaction) => {
    const today = await todayForProduction(actor.productionId, transaction);
    const garment = await findGarment(actor.productionId, input.garmentId, transaction, true);
    if (!garment)
      throw ValidationError("garmentId: no such garment in this production", { garmentId: "no such garment in this production" });
    if (UNAVAILABLE.includes(garment.status))
      throw ConflictError(`${garment.tag_code} is ${garment.status}; it cannot go to the workroom.`, { garmentId: `is ${garment.status}` });
    if (input.fittingId) {
      const fitting = await Fitting.findOne({ where: { id: input.fittingId, productionId: actor.productionId }, transaction });
      if (!fitting)
        throw ValidationError("fittingId: no such fitting in this production", { fittingId: "no such fitting in this production" });
    }
    if (input.assigneeId) await assertWorkroomMember(actor.productionId, input.assigneeId, transaction);
    if (garment.status !== "workroom") {
      await moveGarmentStatus(
        {
          productionId: actor.productionId,
          garmentId: garment.id,
          from: garment.status,
          to: "workroom",
          note: "alteration ticket raised",
          actorId: actor.user.id,
        },
        transaction,
      );
    }
    const t = await AlterationTicket.create(
      {
        productionId: actor.productionId,
        garmentId: garment.id,
        fittingId: input.fittingId ?? null,
        tasks: input.tasks,
        estimateHours: input.estimateHours,
        remainingHours: null,
        assigneeId: input.assigneeId ?? null,
        raisedOn: today,
        raisedBy: actor.user.id,
        garmentStatusBefore: garment.status,
        notes: input.notes ?? null,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "alteration.raise",
        entityType: "alteration_ticket",
        entityId: t.id,
        after: {
          garmentId: garment.id,
          tasks: input.tasks,
          estimateHours: input.estimateHours,
          garmentStatus: { from: garment.status, to: "workroom" },
        },
      },
      transaction,
    );
    return t.id;
  });
  return getTicket(actor, id);
}

/** Edits tasks, estimate, remaining hours, assignee or notes (estimates need alteration.estimate). */
export async function updateTicket(actor: Actor, id: string, input: UpdateTicketInput): Promise<AlterationTicket> {
  if ((input.estimateHours !== undefined || input.remainingHours !== undefined) && !can(actor.role, "alteration.estimate"))
    throw ForbiddenError("Your role may not change estimates.");
  await sequelize.transaction(async (transaction) => {
    const t = await loadTicket(actor, id, transaction);
    if (t.status === "checked") throw ConflictError("A checked ticket is closed; raise a new one for more work.");
    if (input.assigneeId) await assertWorkroomMember(actor.productionId, input.assigneeId, transaction);
    const patch: Partial<AlterationTicket> = {};
    if (input.tasks !== undefined) patch.tasks = input.tasks;
    if (input.estimateHours !== undefined) patch.estimateHours = input.estimateHours;
    if (input.remainingHours !== undefined) patch.remainingHours = input.remainingHours;
    if (input.assigneeId !== undefined) patch.assigneeId = input.assigneeId;
    if (input.notes !== undefined) patch.notes = input.notes;
    const before = Object.fromEntries(Object.keys(patch).map((k) => [k, t.get(k as keyof AlterationTicket)]));
    await t.update(patch, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "alteration.update",
        entityType: "alteration_ticket",
        entityId: t.id,
        before,
        after: patch,
      },
      transaction,
    );
  });
  return getTicket(actor, id);
}

/**
 * Moves a ticket along waiting → in progress → done → checked. Checking the garment's last open ticket moves
 * the garment back to the status it had before the workroom, in the same transaction.
 */
export async function setTicketStatus(actor: Actor, id: string, status: TicketStatus): Promise<AlterationTicket> {
  await sequelize.transaction(async (transaction) => {
    const t = await loadTicket(actor, id, transaction);
    if (t.status === status) return;
    const fromStatus: TicketStatus = t.status;
    if (!TRANSITIONS[fromStatus].includes(status))
      throw ConflictError(`A ${t.status.replace("_", " ")} ticket cannot become ${status.replace("_", " ")}.`, {
        status: `cannot go from ${t.status} to ${status}`,
      });
    const garment = await findGarment(actor.productionId, t.garmentId, transaction, true);
    if (!garment) throw NotFoundError("The ticket's garment no longer exists.");
    const patch: Partial<AlterationTicket> = { status };
    if (status === "done") {
      patch.doneAt = clock.now();
      patch.remainingHours = 0;
    } else if (t.status === "done") {
      patch.doneAt = null;
      patch.remainingHours = null;
    }
    let garmentMove: { from: string; to: string } | null = null;
    if (status === "checked") {
      patch.checkedAt = clock.now();
      patch.checkedBy = actor.user.id;
      const others = await AlterationTicket.findAll({
        where: { garmentId: t.garmentId, productionId: actor.productionId, id: { [Op.ne]: t.id } },
        order: [["createdAt", "ASC"]],
        transaction,
      });
      const stillOpen = others.some((o) => o.status !== "checked");
      if (!stillOpen && garment.status === "workroom") {
        // Back to where it was before the first ticket sent it to the workroom.
        const back =
          [t, ...others]
            .sort((a, b) => a.createdAt.getTime() - b.createdAt.getTime())
            .map((x) => x.garmentStatusBefore)
            .find((s) => s && s !== "workroom") ?? "in_stock";
        garmentMove = { from: garment.status, to: back };
      }
    }
    await t.update(patch, { transaction });
    if (garmentMove) {
      await moveGarmentStatus(
        { productionId: actor.productionId, garmentId: garment.id, ...garmentMove, note: "alterations checked", actorId: actor.user.id },
        transaction,
      );
    }
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "alteration.status",
        entityType: "alteration_ticket",
        entityId: t.id,
        before: { status: fromStatus },
        after: { status, garmentStatus: garmentMove },
      },
      transaction,
    );
  });
  return getTicket(actor, id);
}
