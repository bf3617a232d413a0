/**
 * Workroom capacity, settings and the plan: due dates from the shoot schedule, tickets planned into people's
 * hours by earliest due date, late and overbooked snags. The plan is computed on every read, so any change to
 * tickets, capacity or the schedule is reflected at once (a full plan takes milliseconds; see npm run bench).
 */
import { Op } from "sequelize";
import { addDays, differenceInCalendarDays, format, parseISO } from "date-fns";
import { sequelize } from "../db.js";
import { AlterationTicket, Membership, Production, User, WorkroomCapacity } from "../models/index.js";
import { dueDateFor, MONDAY_TO_FRIDAY, planTickets, WEEKDAYS, type Weekday, type WorkroomPersonInput } from "@shared/domain/workroom.js";
import { taskSummary, workroomSnags } from "@shared/domain/workroom-snags.js";
import type {
  CapacityDto,
  PlannedTicketDto,
  UpsertCapacityInput,
  WorkroomOptionsDto,
  WorkroomPlanDto,
  WorkroomSettingsInput,
} from "@shared/schemas/workroom.js";
import { NotFoundError, ValidationError } from "../errors.js";
import { recordAudit } from "./audit.service.js";
import {
  changeLabel,
  findGarments,
  listChanges,
  listGarments,
  listPerformers,
  listShootDays,
  neededDatesByGarment,
} from "./workroom-facts.service.js";
import { todayForProduction } from "./productions.service.js";
import { presentTicket } from "../presenters/workroom.presenter.js";
import type { Actor } from "../middleware/require-auth.js";

/** Roles that can be workroom members (planned into, assigned tickets). */
export const WORKROOM_ROLES = ["supervisor", "designer", "cutter"] as const;

/** The production's workroom settings with defaults (1 working day buffer, reminders at 18:00). */
export async function workroomSettings(
  productionId: string,
): Promise<{ bufferWorkingDays: number; reminderHour: number; title: string; units: "cm" | "in"; kind: "film" | "series" | "stage" }> {
  const p = await Production.findByPk(productionId);
  if (!p) throw NotFoundError("Production not found.");
  return {
    bufferWorkingDays: p.settings.bufferWorkingDays ?? 1,
    reminderHour: p.settings.reminderHour ?? 18,
    title: p.title,
    units: p.units,
    kind: p.kind,
  };
}

/** Updates the buffer and reminder hour (the rest of the settings stay). */
export async function updateWorkroomSettings(actor: Actor, input: WorkroomSettingsInput) {
  return sequelize.transaction(async (transaction) => {
    const p = await Production.findByPk(actor.productionId, { transaction, lock: transaction.LOCK.UPDATE });
    if (!p) throw NotFoundError("Production not found.");
    const before = { bufferWorkingDays: p.settings.bufferWorkingDays, reminderHour: p.settings.reminderHour };
    const settings = { ...p.settings, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) };
    await p.update({ settings }, { transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "workroom.settings",
        entityType: "production",
        entityId: p.id,
        before,
        after: input,
      },
      transaction,
    );
    return { bufferWorkingDays: settings.bufferWorkingDays ?? 1, reminderHour: settings.reminderHour ?? 18 };
  });
}

const toDateString = (d: string | Date): string => (typeof d === "string" ? d : format(d, "yyyy-MM-dd"));

/** Capacity of every workroom member (members without a row show zero hours). */
export async function listCapacity(actor: Actor): Promise<CapacityDto[]> {
  const members = await Membership.findAll({
    where: { productionId: actor.productionId, role: { [Op.in]: [...WORKROOM_ROLES] } },
    include: [{ model: User, as: "user" }],
  });
  const rows = await WorkroomCapacity.findAll({ where: { productionId: actor.productionId } });
  const byUser = new Map(rows.map((r) => [r.userId, r]));
  const zero = Object.fromEntries(WEEKDAYS.map((d) => [d, 0])) as Record<Weekday, number>;
  return members
    .map((m) => {
      const r = byUser.get(m.userId);
      return {
        userId: m.userId,
        name: m.user?.name ?? "",
        role: m.role,
        hoursPerWeekday: r ? { ...zero, ...r.hoursPerWeekday } : zero,
        daysOff: r ? r.daysOff.map(toDateString).sort() : [],
      };
    })
    .sort((a, b) => a.name.localeCompare(b.name));
}

/** Sets one member's weekly hours and days off. */
export async function upsertCapacity(actor: Actor, userId: string, input: UpsertCapacityInput): Promise<CapacityDto> {
  await sequelize.transaction(async (transaction) => {
    const m = await Membership.findOne({ where: { productionId: actor.productionId, userId }, transaction });
    if (!m) throw NotFoundError("That person is not a member of this production.");
    if (!(WORKROOM_ROLES as readonly string[]).includes(m.role))
      throw ValidationError("userId: only supervisors, designers and cutters work in the workroom", { userId: "is not a workroom role" });
    const existing = await WorkroomCapacity.findOne({
      where: { productionId: actor.productionId, userId },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    const daysOff = Array.from(new Set(input.daysOff)).sort();
    const before = existing ? { hoursPerWeekday: existing.hoursPerWeekday, daysOff: existing.daysOff.map(toDateString) } : null;
    if (existing) await existing.update({ hoursPerWeekday: input.hoursPerWeekday, daysOff }, { transaction });
    else
      await WorkroomCapacity.create(
        { productionId: actor.productionId, userId, hoursPerWeekday: input.hoursPerWeekday, daysOff },
        { transaction },
      );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "workroom.capacity",
        entityType: "workroom_capacity",
        entityId: null,
        before,
        after: { userId, ...input, daysOff },
      },
      transaction,
    );
  });
  const all = await listCapacity(actor);
  return all.find((c) => c.userId === userId)!;
}

/** Pickers for the workroom forms. */
export async function workroomOptions(actor: Actor): Promise<WorkroomOptionsDto> {
  const [performers, changes, garments, members, settings] = await Promise.all([
    listPerformers(actor.productionId),
    listChanges(actor.productionId),
    listGarments(actor.productionId),
    Membership.findAll({
      where: { productionId: actor.productionId, role: { [Op.in]: [...WORKROOM_ROLES] } },
      include: [{ model: User, as: "user" }],
    }),
    workroomSettings(actor.productionId),
  ]);
  return {
    performers: performers.map((p) => ({ id: p.id, name: p.name, email: p.email })),
    changes: changes.map((c) => ({ id: c.id, label: changeLabel(c), performerId: c.performer_id })),
    garments: garments.map((g) => ({ id: g.id, tagCode: g.tag_code, name: g.name, status: g.status })),
    members: members.map((m) => ({ id: m.userId, name: m.user?.name ?? "", role: m.role })).sort((a, b) => a.name.localeCompare(b.name)),
    settings: { bufferWorkingDays: settings.bufferWorkingDays, reminderHour: settings.reminderHour },
  };
}

/**
 * Due date of a ticket from real rows: the first needed date on or after the day it was raised (a garment
 * needed on two days counts from the earlier; a ticket raised after its first shoot day counts from the next),
 * minus the production's buffer in working days.
 */
export function ticketDue(needed: Array<{ date: string; shootDayId: string }>, raisedOn: string, bufferWorkingDays: number) {
  const upcoming = needed.filter((n) => n.date >= raisedOn);
  const neededOn = upcoming.length ? upcoming.reduce((a, b) => (b.date < a.date ? b : a)).date : null;
  return {
    neededOn,
    neededShootDayIds: upcoming.filter((n) => n.date === neededOn).map((n) => n.shootDayId),
    dueDate: dueDateFor(
      needed.map((n) => n.date),
      bufferWorkingDays,
      MONDAY_TO_FRIDAY,
      raisedOn,
    ),
  };
}

/** Plans every open ticket of the production from `from` (default today) and explains what will be late. */
export async function buildPlan(productionId: string, fromDay?: string): Promise<WorkroomPlanDto> {
  const from = fromDay ?? (await todayForProduction(productionId));
  const settings = await workroomSettings(productionId);
  const [tickets, capacity, shootDays] = await Promise.all([
    AlterationTicket.findAll({
      where: { productionId, status: { [Op.ne]: "checked" } },
      include: [{ model: User, as: "assignee" }],
      order: [
        ["raisedOn", "ASC"],
        ["id", "ASC"],
      ],
    }),
    WorkroomCapacity.findAll({
      where: { productionId },
      include: [
        {
          model: User,
          as: "user",
          required: true,
          include: [{ model: Membership, as: "memberships", where: { productionId }, required: true }],
        },
      ],
    }),
    listShootDays(productionId),
  ]);
  const garments = new Map((await findGarments(productionId, [...new Set(tickets.map((t) => t.garmentId))])).map((g) => [g.id, g]));
  const needed = await neededDatesByGarment(productionId, [...garments.keys()]);

  const people: WorkroomPersonInput[] = capacity.map((c) => ({
    id: c.userId,
    name: c.user?.name ?? "",
    hoursPerWeekday: { ...(Object.fromEntries(WEEKDAYS.map((d) => [d, 0])) as Record<Weekday, number>), ...c.hoursPerWeekday },
    daysOff: c.daysOff.map(toDateString),
  }));
  // Someone assigned a ticket without capacity still appears, with no hours, so the ticket shows as unschedulable.
  for (const t of tickets) {
    if (t.assigneeId && !people.some((p) => p.id === t.assigneeId)) {
      people.push({
        id: t.assigneeId,
        name: t.assignee?.name ?? "",
        hoursPerWeekday: Object.fromEntries(WEEKDAYS.map((d) => [d, 0])) as Record<Weekday, number>,
        daysOff: [],
      });
    }
  }
  people.sort((a, b) => a.name.localeCompare(b.name) || (a.id < b.id ? -1 : 1));

  // Shoot days before the plan's date have happened: what matters now is the next day the garment is needed.
  const dues = new Map(
    tickets.map((t) => [t.id, ticketDue(needed.get(t.garmentId) ?? [], t.raisedOn > from ? t.raisedOn : from, settings.bufferWorkingDays)]),
  );
  const lastDate = [...shootDays.map((s) => s.date), ...[...dues.values()].map((d) => d.dueDate ?? from)].reduce(
    (a, b) => (b > a ? b : a),
    from,
  );
  const horizonDays = Math.min(366, Math.max(42, differenceInCalendarDays(parseISO(lastDate), parseISO(from)) + 21));

  const plan = planTickets({
    today: from,
    horizonDays,
    people,
    tickets: tickets.map((t) => ({
      id: t.id,
      estimateHours: t.estimateHours,
      remainingHours: t.status === "done" ? 0 : (t.remainingHours ?? t.estimateHours),
      dueDate: dues.get(t.id)!.dueDate,
      assigneeId: t.assigneeId,
      raisedOn: t.raisedOn,
    })),
  });
  const names = new Map(people.map((p) => [p.id, p.name]));
  const snagTickets = tickets.map((t) => {
    const g = garments.get(t.garmentId);
    const d = dues.get(t.id)!;
    return {
      id: t.id,
      garmentId: t.garmentId,
      tagCode: g?.tag_code ?? "?",
      garmentName: g?.name ?? "garment",
      taskSummary: taskSummary(t.tasks, settings.units),
      neededOn: d.neededOn,
      neededShootDayIds: d.neededShootDayIds,
    };
  });
  const snags = workroomSnags({
    plan,
    tickets: snagTickets,
    people,
    bufferWorkingDays: settings.bufferWorkingDays,
    scheduleKind: settings.kind,
  });

  const planned: PlannedTicketDto[] = tickets.map((t, i) => {
    const p = plan.tickets[i];
    const g = garments.get(t.garmentId);
    return {
      ...presentTicket(t, g ? { tagCode: g.tag_code, name: g.name } : undefined),
      neededOn: dues.get(t.id)!.neededOn,
      dueDate: p.dueDate,
      plannedAssigneeId: p.assigneeId,
      plannedAssigneeName: p.assigneeId ? (names.get(p.assigneeId) ?? null) : null,
      blocks: p.blocks,
      plannedFinish: p.plannedFinish,
      lateness: p.lateness,
      late: p.late,
      planStatus: p.status,
      unplannedHours: p.unplannedHours,
    };
  });
  return {
    from,
    horizonDays,
    bufferWorkingDays: settings.bufferWorkingDays,
    people: people.map((p) => ({ id: p.id, name: p.name })),
    shootDays,
    tickets: planned,
    overbookedDays: plan.overbookedDays.map((d) => ({
      personId: d.personId,
      date: d.date,
      capacityHours: d.capacityHours,
      plannedHours: d.plannedHours,
      lateTicketIds: d.lateTicketIds,
    })),
    snags,
    summary: {
      lateCount: plan.summary.lateCount,
      unscheduledCount: plan.summary.unscheduledCount,
      maxLateness: plan.summary.maxLateness,
      openCount: tickets.filter((t) => t.status !== "done").length,
    },
  };
}

/** The day after a YYYY-MM-DD date. */
export function nextDay(date: string): string {
  return format(addDays(parseISO(date), 1), "yyyy-MM-dd");
}
