import { clock } from "../../server/lib/clock.js";
import { afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import { parseISO, subBusinessDays, format } from "date-fns";
import ICAL from "ical.js";
import { createApp } from "../../server/app.js";
import { AlterationTicket, AuditEvent, OutboxMessage, WorkroomCapacity, WorkroomEmailJob } from "../../server/models/index.js";
import { raiseTicket, setTicketStatus } from "../../server/services/alterations.service.js";
import { buildPlan } from "../../server/services/workroom.service.js";
import { queueWorkroomEmail, sendEveningReminders, EMAIL_JOB } from "../../server/services/workroom-mail.service.js";
import { runJobNow } from "../../server/lib/jobs.js";
import { buildMember, buildProduction } from "../factories.js";
import { buildChangeOnDays, buildGarment, buildGroup, buildPerformer, garmentState } from "../factories.workroom.js";
import { resetDb, signedInAgent, waitForMail } from "../setup/http.js";
import type { Actor } from "../../server/middleware/require-auth.js";

const app = createApp();
const iso = (d: Date) => format(d, "yyyy-MM-dd");
// date-fns subBusinessDays (Mon–Fri) is the independent oracle for "N working days before".
const workingDaysBefore = (date: string, n: number) => iso(subBusinessDays(parseISO(date), n));
const take = { kind: "take_in" as const, amountMm: 20 };
const fullWeek = { mon: 8, tue: 8, wed: 8, thu: 8, fri: 8, sat: 0, sun: 0 };

async function setup(settings: object = { bufferWorkingDays: 1 }) {
  const production = await buildProduction({ settings });
  const { user } = await buildMember("cutter", { production });
  const actor: Actor = { user, productionId: production.id, role: "cutter" };
  return { production, user, actor };
}

beforeEach(async () => {
  await resetDb();
});
afterEach(() => {
  vi.restoreAllMocks();
  clock.reset();
});

/** Raises a ticket with the server's clock on the given day (tickets record the day they were raised). */
async function raiseOn(day: string, actor: Parameters<typeof raiseTicket>[0], input: Parameters<typeof raiseTicket>[1]) {
  clock.set(day, { frozen: true });
  return raiseTicket(actor, input);
}

describe("due dates from the shoot schedule (real rows)", () => {
  it("a garment needed on two shoot days is due the buffer before the earlier one", async () => {
    const { production, actor, user } = await setup({ bufferWorkingDays: 2 });
    await WorkroomCapacity.create({ productionId: production.id, userId: user.id, hoursPerWeekday: fullWeek, daysOff: [] });
    const garmentId = await buildGarment(production.id);
    await buildChangeOnDays(production.id, { garmentIds: [garmentId], dates: ["2030-09-12", "2030-09-09"] });
    await raiseOn("2030-09-02", actor, { garmentId, tasks: [take], estimateHours: 2 });

    const plan = await buildPlan(production.id, "2030-09-02");

    expect(plan.tickets[0].neededOn).toBe("2030-09-09");
    expect(plan.tickets[0].dueDate).toBe(workingDaysBefore("2030-09-09", 2)); // Thu 2030-09-05
    expect(plan.tickets[0]).toMatchObject({ late: false, plannedFinish: "2030-09-02" });
  });

  it("a ticket raised after its first shoot day is due before the next day that needs the garment", async () => {
    const { production, actor, user } = await setup({ bufferWorkingDays: 1 });
    await WorkroomCapacity.create({ productionId: production.id, userId: user.id, hoursPerWeekday: fullWeek, daysOff: [] });
    const garmentId = await buildGarment(production.id);
    await buildChangeOnDays(production.id, { garmentIds: [garmentId], dates: ["2030-09-09", "2030-09-16"] });
    await raiseOn("2030-09-10", actor, { garmentId, tasks: [take], estimateHours: 2 });

    const plan = await buildPlan(production.id, "2030-09-10");

    expect(plan.tickets[0].neededOn).toBe("2030-09-16");
    expect(plan.tickets[0].dueDate).toBe(workingDaysBefore("2030-09-16", 1)); // Fri 2030-09-13
  });

  it("a copy of a multiples group is needed wherever the change uses the group", async () => {
    const { production, actor } = await setup({ bufferWorkingDays: 0 });
    const groupId = await buildGroup(production.id);
    const copy2 = await buildGarment(production.id, { groupId, copyNumber: 2 });
    await buildChangeOnDays(production.id, { groupIds: [groupId], dates: ["2030-09-11"] });
    await raiseOn("2030-09-02", actor, { garmentId: copy2, tasks: [take], estimateHours: 1 });

    const plan = await buildPlan(production.id, "2030-09-02");

    expect(plan.tickets[0]).toMatchObject({ neededOn: "2030-09-11", dueDate: "2030-09-11" });
  });

  it("a garment no shoot day needs has no due date and is never late", async () => {
    const { production, actor } = await setup();
    const garmentId = await buildGarment(production.id);
    await raiseOn("2030-09-02", actor, { garmentId, tasks: [take], estimateHours: 1 });

    const plan = await buildPlan(production.id, "2030-09-02");

    expect(plan.tickets[0]).toMatchObject({ neededOn: null, dueDate: null, late: false });
  });
});

describe("GET /api/productions/:pid/workroom/plan", () => {
  it("plans by earliest due date across two people and explains the late ticket and the overbooked days", async () => {
    // Hand-worked (two people, 8 h Mon–Fri from Mon 2030-09-02, buffer 1 working day):
    //   T1 10 h and T2 10 h needed Wed → due Tue; T3 20 h needed Thu → due Wed.
    //   EDD order T1, T2, T3. T1 → first person (Mon 8 + Tue 2, done Tue). T2: the other person finishes Tue
    //   (Mon 8 + Tue 2) where the first would finish Wed → other person. T3: either person has Tue 6 + Wed 8 +
    //   Thu 6 → finishes Thu, one working day after its due date and on the day it is needed.
    const { production, actor, user } = await setup({ bufferWorkingDays: 1 });
    const { user: bo } = await buildMember("cutter", { production });
    await WorkroomCapacity.create({ productionId: production.id, userId: user.id, hoursPerWeekday: fullWeek, daysOff: [] });
    await WorkroomCapacity.create({ productionId: production.id, userId: bo.id, hoursPerWeekday: fullWeek, daysOff: [] });
    const g1 = await buildGarment(production.id, { tagCode: "T1" });
    const g2 = await buildGarment(production.id, { tagCode: "T2" });
    const g3 = await buildGarment(production.id, { tagCode: "T3" });
    await buildChangeOnDays(production.id, { garmentIds: [g1, g2], dates: ["2030-09-04"] });
    await buildChangeOnDays(production.id, { garmentIds: [g3], dates: ["2030-09-05"] });
    for (const [g, h] of [
      [g1, 10],
      [g2, 10],
      [g3, 20],
    ] as const)
      await raiseOn("2030-09-02", actor, { garmentId: g, tasks: [take], estimateHours: h });
    const supervisor = await buildMember("supervisor", { production });
    const agent = await signedInAgent(app, supervisor.user.email);

    const res = await agent.get(`/api/productions/${production.id}/workroom/plan?from=2030-09-02`);

    expect(res.status).toBe(200);
    const byTag = Object.fromEntries(res.body.data.tickets.map((t: { tagCode: string }) => [t.tagCode, t]));
    expect(byTag.T1).toMatchObject({ dueDate: "2030-09-03", plannedFinish: "2030-09-03", late: false });
    expect(byTag.T2).toMatchObject({ dueDate: "2030-09-03", plannedFinish: "2030-09-03", late: false });
    expect(byTag.T3).toMatchObject({ dueDate: "2030-09-04", plannedFinish: "2030-09-05", lateness: 1, late: true });
    expect(byTag.T1.plannedAssigneeId).not.toBe(byTag.T2.plannedAssigneeId);
    const late = res.body.data.snags.filter((s: { kind: string }) => s.kind === "workroom_late");
    expect(late).toHaveLength(1);
    expect(late[0]).toMatchObject({ key: `workroom_late:${byTag.T3.id}`, severity: "blocking" }); // finishes on the day it is needed
    expect(late[0].explanation).toContain("1 working day late");
    expect(res.body.data.snags.some((s: { kind: string }) => s.kind === "workroom_overbooked")).toBe(true);
    expect(
      res.body.data.overbookedDays.every((d: { plannedHours: number; capacityHours: number }) => d.plannedHours === d.capacityHours),
    ).toBe(true);
  });

  it("rejects a malformed from date", async () => {
    const { production, user } = await setup();
    const agent = await signedInAgent(app, user.email);

    const res = await agent.get(`/api/productions/${production.id}/workroom/plan?from=2030-02-30`);

    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty("from");
  });
});

describe("raising and checking a ticket (transactions)", () => {
  it("raising moves the garment to the workroom with a history row; checking moves it back", async () => {
    const { production, actor } = await setup();
    const garmentId = await buildGarment(production.id, { status: "on_set" });

    const ticket = await raiseTicket(actor, { garmentId, tasks: [take], estimateHours: 2 });
    expect(await garmentState(garmentId)).toEqual({ status: "workroom", events: 1 });
    await setTicketStatus(actor, ticket.id, "in_progress");
    await setTicketStatus(actor, ticket.id, "done");
    expect((await garmentState(garmentId)).status).toBe("workroom");
    const checked = await setTicketStatus(actor, ticket.id, "checked");

    expect(checked.status).toBe("checked");
    expect(await garmentState(garmentId)).toEqual({ status: "on_set", events: 2 });
  });

  it("a failure after the garment moved rolls back ticket and garment together", async () => {
    const { production, actor } = await setup();
    const garmentId = await buildGarment(production.id);
    vi.spyOn(AuditEvent, "create").mockRejectedValueOnce(new Error("disk full"));

    await expect(raiseTicket(actor, { garmentId, tasks: [take], estimateHours: 2 })).rejects.toThrow("disk full");

    expect(await garmentState(garmentId)).toEqual({ status: "in_stock", events: 0 });
    expect(await AlterationTicket.count()).toBe(0);
  });

  it("a failure while checking leaves the ticket done and the garment in the workroom", async () => {
    const { production, actor } = await setup();
    const garmentId = await buildGarment(production.id);
    const ticket = await raiseTicket(actor, { garmentId, tasks: [take], estimateHours: 2 });
    await setTicketStatus(actor, ticket.id, "done");
    vi.spyOn(AuditEvent, "create").mockRejectedValueOnce(new Error("disk full"));

    await expect(setTicketStatus(actor, ticket.id, "checked")).rejects.toThrow("disk full");

    expect((await AlterationTicket.findByPk(ticket.id))!.status).toBe("done");
    expect(await garmentState(garmentId)).toEqual({ status: "workroom", events: 1 });
  });

  it("the garment stays in the workroom while another ticket on it is open", async () => {
    const { production, actor } = await setup();
    const garmentId = await buildGarment(production.id);
    const a = await raiseTicket(actor, { garmentId, tasks: [take], estimateHours: 1 });
    const b = await raiseTicket(actor, { garmentId, tasks: [{ kind: "repair" }], estimateHours: 1 });
    await setTicketStatus(actor, a.id, "done");
    await setTicketStatus(actor, a.id, "checked");
    expect((await garmentState(garmentId)).status).toBe("workroom");
    await setTicketStatus(actor, b.id, "done");
    await setTicketStatus(actor, b.id, "checked");

    expect(await garmentState(garmentId)).toEqual({ status: "in_stock", events: 2 });
  });
});

describe("POST /api/productions/:pid/alterations — bad input writes nothing", () => {
  const cases: Array<[string, (garmentId: string) => object, string]> = [
    ["no tasks", (g) => ({ garmentId: g, tasks: [], estimateHours: 2 }), "tasks"],
    ["a negative estimate", (g) => ({ garmentId: g, tasks: [take], estimateHours: -1 }), "estimateHours"],
    ["distress without a stage", (g) => ({ garmentId: g, tasks: [{ kind: "distress" }], estimateHours: 1 }), "tasks.0.distressStage"],
    ["an unknown task", (g) => ({ garmentId: g, tasks: [{ kind: "embroider" }], estimateHours: 1 }), "tasks.0.kind"],
    [
      "a garment of another production",
      () => ({ garmentId: "00000000-0000-4000-8000-000000000000", tasks: [take], estimateHours: 1 }),
      "garmentId",
    ],
  ];
  for (const [name, body, field] of cases) {
    it(`400 naming ${field} for ${name}`, async () => {
      const { production, user } = await setup();
      const garmentId = await buildGarment(production.id);
      const agent = await signedInAgent(app, user.email);

      const res = await agent.post(`/api/productions/${production.id}/alterations`, body(garmentId));

      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe("validation_error");
      expect(res.body.error.fields).toHaveProperty([field]);
      expect(await AlterationTicket.count()).toBe(0);
      expect(await garmentState(garmentId)).toEqual({ status: "in_stock", events: 0 });
    });
  }

  it("409 for a lost garment and for skipping straight to checked", async () => {
    const { production, user } = await setup();
    const lost = await buildGarment(production.id, { status: "lost" });
    const ok = await buildGarment(production.id);
    const agent = await signedInAgent(app, user.email);

    const r1 = await agent.post(`/api/productions/${production.id}/alterations`, { garmentId: lost, tasks: [take], estimateHours: 1 });
    const created = await agent.post(`/api/productions/${production.id}/alterations`, { garmentId: ok, tasks: [take], estimateHours: 1 });
    const r2 = await agent.post(`/api/productions/${production.id}/alterations/${created.body.data.id}/status`, { status: "checked" });

    expect(r1.status).toBe(409);
    expect(created.status).toBe(201);
    expect(created.body.data).toMatchObject({ status: "waiting", estimateHours: 1, tagCode: expect.any(String) });
    expect(r2.status).toBe(409);
    expect(r2.body.error.fields).toHaveProperty("status");
  });
});

/** The first VEVENT of the calendar part of the newest message to `to`, parsed with ical.js. */
async function calendarOf(to: string, subjectPart: string) {
  const msg = await waitForMail((m) => m.recipients.includes(to) && m.subject.includes(subjectPart));
  const part = (msg as OutboxMessage).attachments.find((a) => a.contentType.startsWith("text/calendar"));
  expect(part?.content).toBeTruthy();
  const cal = new ICAL.Component(ICAL.parse(part!.content!));
  return { cal, event: new ICAL.Event(cal.getFirstSubcomponent("vevent")!) };
}

describe("fitting invitations (e-mail with an RFC 5545 part)", () => {
  it("booking, moving and cancelling send REQUEST, REQUEST with a higher SEQUENCE, and CANCEL", async () => {
    const { production, user } = await setup();
    const performerId = await buildPerformer(production.id, { name: "Ivy Example", email: "ivy@test.invalid" });
    const { changeId } = await buildChangeOnDays(production.id, { performerId, dates: ["2030-09-09"] });
    const agent = await signedInAgent(app, user.email);

    const created = await agent.post(`/api/productions/${production.id}/fittings`, {
      performerId,
      changeId,
      startsAt: "2030-09-03T09:30:00Z",
      durationMinutes: 45,
      room: "Fitting room 2",
      attendeeIds: [user.id],
    });
    expect(created.status).toBe(201);
    const invite = await calendarOf("ivy@test.invalid", "Costume fitting");

    // Independent check with ical.js: the invitation parses and carries what was booked.
    expect(invite.cal.getFirstPropertyValue("method")).toBe("REQUEST");
    expect(invite.event.uid).toBe(`fitting-${created.body.data.id}@seamscene`);
    expect(invite.event.sequence).toBe(0);
    expect(invite.event.startDate.toJSDate().toISOString()).toBe("2030-09-03T09:30:00.000Z");
    expect(invite.event.endDate.toJSDate().toISOString()).toBe("2030-09-03T10:15:00.000Z");
    expect(invite.event.location).toBe("Fitting room 2");

    const moved = await agent.patch(`/api/productions/${production.id}/fittings/${created.body.data.id}`, {
      startsAt: "2030-09-04T13:00:00Z",
    });
    expect(moved.status).toBe(200);
    const update = await calendarOf("ivy@test.invalid", "Fitting moved");
    expect(update.event.uid).toBe(invite.event.uid);
    expect(update.event.sequence).toBe(1);
    expect(update.event.startDate.toJSDate().toISOString()).toBe("2030-09-04T13:00:00.000Z");

    await agent.patch(`/api/productions/${production.id}/fittings/${created.body.data.id}`, { status: "cancelled" }).expect(200);
    const cancel = await calendarOf("ivy@test.invalid", "Fitting cancelled");
    expect(cancel.cal.getFirstPropertyValue("method")).toBe("CANCEL");
    expect(cancel.event.component.getFirstPropertyValue("status")).toBe("CANCELLED");
    expect(cancel.event.sequence).toBe(2);
    // The status is written just after the message is handed to SMTP, so wait for it.
    await expect.poll(() => WorkroomEmailJob.count({ where: { status: "sent" } })).toBe(3);
  });

  it("uses the address in the performer's contact when they have no e-mail", async () => {
    const { production, user } = await setup();
    const performerId = await buildPerformer(production.id, {
      email: null,
      agentContact: "Agent: Sal Example <sal.agent@test.invalid>, 01234",
    });
    const agent = await signedInAgent(app, user.email);

    await agent
      .post(`/api/productions/${production.id}/fittings`, { performerId, startsAt: "2030-09-03T09:30:00Z", durationMinutes: 30 })
      .expect(201);

    await calendarOf("sal.agent@test.invalid", "Costume fitting");
  });

  it("400 naming the field for a bad booking, and nothing is written", async () => {
    const { production, user } = await setup();
    const performerId = await buildPerformer(production.id);
    const agent = await signedInAgent(app, user.email);

    const r1 = await agent.post(`/api/productions/${production.id}/fittings`, { performerId, startsAt: "tomorrow", durationMinutes: 30 });
    const r2 = await agent.post(`/api/productions/${production.id}/fittings`, {
      performerId,
      startsAt: "2030-09-03T09:30:00Z",
      durationMinutes: 2,
    });
    const r3 = await agent.post(`/api/productions/${production.id}/fittings`, {
      performerId: "00000000-0000-4000-8000-000000000000",
      startsAt: "2030-09-03T09:30:00Z",
      durationMinutes: 30,
    });

    expect([r1.status, r2.status, r3.status]).toEqual([400, 400, 400]);
    expect(r1.body.error.fields).toHaveProperty("startsAt");
    expect(r2.body.error.fields).toHaveProperty("durationMinutes");
    expect(r3.body.error.fields).toHaveProperty("performerId");
    expect(await WorkroomEmailJob.count()).toBe(0);
  });
});

describe("failed sends are recorded and visible to supervisors", () => {
  it("a send that fails is marked retrying while retries remain, failed after the last, and listed", async () => {
    const { production } = await setup();
    const supervisor = await buildMember("supervisor", { production });
    const cutter = await buildMember("cutter", { production });
    // No recipients: nodemailer refuses to send, like a relay that rejects the message.
    const job = (await queueWorkroomEmail({
      productionId: production.id,
      kind: "evening_reminder",
      dedupeKey: "test:bad",
      mail: { to: [], subject: "x", text: "x", html: "x" },
    }))!;

    await expect(runJobNow(EMAIL_JOB, { emailJobId: job.id }, { retryCount: 1, retryLimit: 5 })).rejects.toThrow();
    expect((await job.reload()).status).toBe("retrying");
    await expect(runJobNow(EMAIL_JOB, { emailJobId: job.id }, { retryCount: 5, retryLimit: 5 })).rejects.toThrow();
    await job.reload();

    expect(job.status).toBe("failed");
    expect(job.attempts).toBe(3); // the inline attempt at queueing, then the two above
    expect(job.lastError).toMatch(/recipient/i);
    const list = await (
      await signedInAgent(app, supervisor.user.email)
    ).get(`/api/productions/${production.id}/workroom/email-jobs?status=failed`);
    expect(list.status).toBe(200);
    expect(list.body.data.map((j: { id: string }) => j.id)).toEqual([job.id]);
    expect((await (await signedInAgent(app, cutter.user.email)).get(`/api/productions/${production.id}/workroom/email-jobs`)).status).toBe(
      403,
    );
  });

  it("a retry that fails again (no queue, sent inline) answers with the row marked failed and its error", async () => {
    const { production } = await setup();
    const supervisor = await buildMember("supervisor", { production });
    const job = (await queueWorkroomEmail({
      productionId: production.id,
      kind: "evening_reminder",
      dedupeKey: "test:bad-again",
      mail: { to: [], subject: "x", text: "x", html: "x" },
    }))!;

    const res = await (
      await signedInAgent(app, supervisor.user.email)
    ).post(`/api/productions/${production.id}/workroom/email-jobs/${job.id}/retry`, {});

    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.data).toMatchObject({ id: job.id, status: "failed", attempts: 2 });
    expect(res.body.data.lastError).toMatch(/recipient/i);
  });
});

describe("evening reminders", () => {
  /** A 30-minute fitting at 11:00 London time on Wed 4 Sep 2030, attended by one person. */
  async function fittingAt11(productionId: string, performerId: string, attendeeId: string, room: string) {
    const { Fitting } = await import("../../server/models/index.js");
    await Fitting.create({
      productionId,
      performerId,
      changeId: null,
      startsAt: new Date("2030-09-04T10:00:00Z"),
      durationMinutes: 30,
      room,
      attendeeIds: [attendeeId],
      notes: null,
      icsUid: `${room}@x`,
      createdBy: null,
    });
  }

  it("each person gets tomorrow's fittings they attend and the tickets planned for them that are due tomorrow", async () => {
    const { production, actor, user } = await setup({ bufferWorkingDays: 1, reminderHour: 18 });
    await WorkroomCapacity.create({ productionId: production.id, userId: user.id, hoursPerWeekday: fullWeek, daysOff: [] });
    const performerId = await buildPerformer(production.id, { name: "Wynn Example" });
    const garmentId = await buildGarment(production.id, { tagCode: "R-1", name: "Reefer coat" });
    await buildChangeOnDays(production.id, { garmentIds: [garmentId], dates: ["2030-09-05"] }); // Thu → due Wed
    await raiseOn("2030-09-02", actor, { garmentId, tasks: [take], estimateHours: 3, assigneeId: user.id });
    await fittingAt11(production.id, performerId, user.id, "Room 1");

    // Tue 3 Sep 2030, 18:00 in the department's zone (Europe/London is UTC+1 in September).
    const queued = await sendEveningReminders({ now: new Date("2030-09-03T17:05:00Z"), productionId: production.id });
    const again = await sendEveningReminders({ now: new Date("2030-09-03T17:35:00Z"), productionId: production.id });

    expect(queued).toBe(1);
    expect(again).toBe(1); // the same reminder row, not a second e-mail
    const mail = await waitForMail((m) => m.recipients.includes(user.email) && m.subject.startsWith("Tomorrow in the workroom"));
    expect(mail.textBody).toContain("11:00 Wynn Example");
    expect(mail.textBody).toContain("R-1 Reefer coat");
    expect(await WorkroomEmailJob.count({ where: { kind: "evening_reminder" } })).toBe(1);
  });

  it("sends each reminder once when two servers run the evening job at the same moment", async () => {
    const { production, user } = await setup({ reminderHour: 18 });
    const performerId = await buildPerformer(production.id, { name: "Wynn Example" });
    await fittingAt11(production.id, performerId, user.id, "Room 2");

    // Each server's scheduler fires at 18:05 in the department's zone; the job queue and the reminder
    // rows are shared through the one database, so the race is decided there.
    const now = new Date("2030-09-03T17:05:00Z");
    await Promise.all([
      sendEveningReminders({ now, productionId: production.id }),
      sendEveningReminders({ now, productionId: production.id }),
    ]);

    await waitForMail((m) => m.recipients.includes(user.email) && m.subject.startsWith("Tomorrow in the workroom"));
    expect(await WorkroomEmailJob.count({ where: { kind: "evening_reminder" } })).toBe(1);
    const mails = await OutboxMessage.findAll();
    expect(mails.filter((m) => m.recipients.includes(user.email) && m.subject.startsWith("Tomorrow in the workroom"))).toHaveLength(1);
  });

  it("sends nothing outside the production's reminder hour", async () => {
    const { production } = await setup({ reminderHour: 18 });

    expect(await sendEveningReminders({ now: new Date("2030-09-03T09:00:00Z"), productionId: production.id })).toBe(0);
  });
});

describe("one cause, one snag card", () => {
  it("a late alteration of a garment in the workroom on the day it is needed is one snag with both facts; its Fix link opens the ticket", async () => {
    // Ann has 8 h a day; a 20 h job needed on Tue 2030-09-03 (due Mon with a 1-day buffer) cannot be ready:
    // it is late, and on Tuesday the garment is still in the workroom.
    const { production, actor, user } = await setup({ bufferWorkingDays: 1 });
    await WorkroomCapacity.create({ productionId: production.id, userId: user.id, hoursPerWeekday: fullWeek, daysOff: [] });
    const garmentId = await buildGarment(production.id, { tagCode: "W1", status: "workroom" });
    await buildChangeOnDays(production.id, { garmentIds: [garmentId], dates: ["2030-09-03"] });
    const ticket = await raiseOn("2030-09-02", actor, { garmentId, tasks: [take], estimateHours: 20 });
    const supervisor = await buildMember("supervisor", { production });
    const agent = await signedInAgent(app, supervisor.user.email);
    clock.set("2030-09-03", { frozen: true });

    const res = await agent.get(`/api/productions/${production.id}/snags`);

    expect(res.status).toBe(200);
    const aboutW1 = res.body.data.snags.filter((s: { garments: Array<{ tagCode: string }> }) => s.garments.some((g) => g.tagCode === "W1"));
    expect(aboutW1.map((s: { kind: string }) => s.kind)).toEqual(["workroom_late"]);
    const [card] = aboutW1;
    expect(card.severity).toBe("blocking");
    expect(card.facts.map((f: { kind: string }) => f.kind)).toEqual(["workroom_late", "availability"]);
    expect(card.links[0]).toEqual({
      label: "Alteration ticket for W1",
      href: `/p/${production.id}/workroom?tab=tickets&ticket=${ticket.id}`,
    });
  });
});
