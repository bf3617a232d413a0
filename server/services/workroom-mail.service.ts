/**
 * Workroom e-mail through the job queue: fitting invitations (with an RFC 5545 part) and each person's evening
 * reminder. Every message is a row in workroom_email_jobs first (so supervisors see pending, retrying and failed
 * sends), then a queued job sends it; failed sends retry with backoff.
 */
import { Op, type Transaction } from "sequelize";
import { config } from "../config.js";
import { Fitting, Production, User, WorkroomEmailJob } from "../models/index.js";
import type { WorkroomEmailKind } from "../models/WorkroomEmailJob.js";
import { defineJob, enqueue } from "../lib/jobs.js";
import { sendMailOrThrow, type OutgoingMail } from "../lib/mailer.js";
import { logger } from "../lib/logger.js";
import { zonedParts } from "../lib/zoned-time.js";
import { NotFoundError, ConflictError } from "../errors.js";
import { workroomReminderEmail } from "../emails/workroom-reminder.email.js";
import { buildPlan, nextDay } from "./workroom.service.js";
import { clock, productionTimeZone } from "../lib/clock.js";
import { changeLabel, findChange, findPerformer } from "./workroom-facts.service.js";
import { longDate, taskSummary } from "@shared/domain/workroom-snags.js";
import { formatTime } from "@shared/format.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { EmailJobStatus } from "@shared/schemas/workroom.js";

export const EMAIL_JOB = "workroom-email";
export const REMINDER_JOB = "workroom-reminders";

/**
 * Records one e-mail and queues it after the caller's transaction commits (or at once without one).
 * The same dedupe key is never queued twice. Returns the row (existing or new).
 */
export async function queueWorkroomEmail(
  p: { productionId: string; kind: WorkroomEmailKind; dedupeKey: string; mail: OutgoingMail },
  transaction?: Transaction,
): Promise<WorkroomEmailJob | null> {
  const to = Array.isArray(p.mail.to) ? p.mail.to.join(", ") : p.mail.to;
  const [row, created] = await WorkroomEmailJob.findOrCreate({
    where: { productionId: p.productionId, dedupeKey: p.dedupeKey },
    defaults: {
      productionId: p.productionId,
      kind: p.kind,
      dedupeKey: p.dedupeKey,
      recipient: to,
      subject: p.mail.subject,
      payload: p.mail,
    },
    transaction,
  });
  if (!created) return row;
  // The row is the record either way: a send that fails inline has marked it failed (listed for supervisors).
  const send = () =>
    enqueue(EMAIL_JOB, { emailJobId: row.id }).catch((err) =>
      logger.error({ err, emailJobId: row.id }, "e-mail not queued or its inline send failed"),
    );
  if (transaction) transaction.afterCommit(() => void send());
  else await send();
  return row;
}

/** Job handler: sends one recorded e-mail; on failure records the error and rethrows so the queue retries. */
export async function sendWorkroomEmail(data: { emailJobId: string }, meta: { retryCount: number; retryLimit: number }): Promise<void> {
  const job = await WorkroomEmailJob.findByPk(data.emailJobId);
  if (!job || job.status === "sent") return;
  try {
    await sendMailOrThrow(job.payload, { kind: job.kind, productionId: job.productionId });
    await job.update({ status: "sent", attempts: job.attempts + 1, sentAt: new Date(), lastError: null });
  } catch (err) {
    const final = meta.retryCount >= meta.retryLimit;
    await job.update({
      status: final ? "failed" : "retrying",
      attempts: job.attempts + 1,
      lastError: err instanceof Error ? err.message.slice(0, 1000) : String(err),
    });
    throw err;
  }
}

defineJob<{ emailJobId: string }>(EMAIL_JOB, { retryLimit: 5, retryDelay: 30, retryBackoff: true }, sendWorkroomEmail);

/** Failed, retrying and pending sends (or one status), newest first, for supervisors. */
export async function listEmailJobs(actor: Actor, status?: EmailJobStatus): Promise<WorkroomEmailJob[]> {
  return WorkroomEmailJob.findAll({
    where: { productionId: actor.productionId, ...(status ? { status } : { status: { [Op.ne]: "sent" } }) },
    order: [["createdAt", "DESC"]],
    limit: 200,
  });
}

/** Queues a failed send again (supervisor action). */
export async function retryEmailJob(actor: Actor, id: string): Promise<WorkroomEmailJob> {
  const job = await WorkroomEmailJob.findOne({ where: { id, productionId: actor.productionId } });
  if (!job) throw NotFoundError("E-mail not found.");
  if (job.status === "sent") throw ConflictError("That e-mail was already sent.");
  await job.update({ status: "pending" });
  await recordAudit({
    productionId: actor.productionId,
    actorId: actor.user.id,
    action: "workroom.email_retry",
    entityType: "workroom_email_job",
    entityId: job.id,
  });
  try {
    await enqueue(EMAIL_JOB, { emailJobId: job.id });
  } catch (err) {
    // Without a queue the send runs now: a failed send is on the row (status "failed", lastError), which the
    // supervisor sees in the answer; any other failure is a fault of the request.
    if ((await job.reload()).status !== "failed") throw err;
  }
  return (await job.reload()) ?? job;
}

/** A performer's invitation address: their e-mail, else the first address in their contact. */
export function invitationAddress(p: { email: string | null; agent_contact: string | null }): string | null {
  if (p.email) return p.email;
  const m = p.agent_contact?.match(/[^\s<>,;:"]+@[^\s<>,;:"]+\.[^\s<>,;:"]+/);
  return m ? m[0] : null;
}

/**
 * Evening reminders: for each production whose reminder hour is now (or the given production when forced),
 * each person gets tomorrow's fittings they attend and the alterations planned for them that are due tomorrow.
 * Idempotent per person and day. Returns the number of reminders queued.
 */
export async function sendEveningReminders(opts: { now?: Date; productionId?: string; force?: boolean } = {}): Promise<number> {
  const now = opts.now ?? clock.now();
  const productions = await Production.findAll({ where: opts.productionId ? { id: opts.productionId } : {} });
  let queued = 0;
  for (const production of productions) {
    // Each production's evening is in its own time zone.
    const zone = productionTimeZone(production);
    const { hour, date: today } = zonedParts(now, zone);
    const tomorrow = nextDay(today);
    if (!opts.force && (production.settings.reminderHour ?? 18) !== hour) continue;
    const perUser = new Map<
      string,
      { fittings: Parameters<typeof workroomReminderEmail>[0]["fittings"]; tickets: Parameters<typeof workroomReminderEmail>[0]["tickets"] }
    >();
    const entry = (userId: string) => {
      let e = perUser.get(userId);
      if (!e) perUser.set(userId, (e = { fittings: [], tickets: [] }));
      return e;
    };
    // A window a day wider on each side, then exact dates in the department's zone.
    const fittings = await Fitting.findAll({
      where: {
        productionId: production.id,
        status: "booked",
        startsAt: { [Op.between]: [new Date(`${today}T00:00:00Z`), new Date(`${nextDay(tomorrow)}T23:59:59Z`)] },
      },
      order: [["startsAt", "ASC"]],
    });
    for (const f of fittings) {
      if (zonedParts(f.startsAt, zone).date !== tomorrow) continue;
      const performer = await findPerformer(production.id, f.performerId);
      const change = f.changeId ? await findChange(production.id, f.changeId) : null;
      const item = {
        time: formatTime(f.startsAt, zone),
        performer: performer?.name ?? "performer",
        change: change ? changeLabel(change) : null,
        room: f.room,
      };
      for (const uid of f.attendeeIds) entry(uid).fittings.push(item);
    }
    const plan = await buildPlan(production.id, today);
    for (const t of plan.tickets) {
      if (t.dueDate !== tomorrow || t.planStatus === "done" || !t.plannedAssigneeId) continue;
      entry(t.plannedAssigneeId).tickets.push({
        tag: t.tagCode,
        garment: t.garmentName,
        tasks: taskSummary(t.tasks, production.units),
        remainingHours: t.remainingHours ?? t.estimateHours,
        late: t.late,
      });
    }
    if (perUser.size === 0) continue;
    const users = await User.findAll({ where: { id: [...perUser.keys()], isActive: true } });
    for (const user of users) {
      const e = perUser.get(user.id)!;
      const mail = workroomReminderEmail({
        to: user.email,
        name: user.name,
        productionTitle: production.title,
        dateLabel: longDate(tomorrow),
        timeZone: zone,
        fittings: e.fittings,
        tickets: e.tickets,
        url: `${config.APP_URL}/p/${production.id}/workroom`,
      });
      const row = await queueWorkroomEmail({
        productionId: production.id,
        kind: "evening_reminder",
        dedupeKey: `reminder:${tomorrow}:${user.id}`,
        mail,
      });
      if (row) queued++;
    }
  }
  return queued;
}

// Hourly tick; each production's own reminder hour decides whether it sends.
defineJob(REMINDER_JOB, { retryLimit: 2, retryDelay: 60, cron: "0 * * * *" }, async () => {
  await sendEveningReminders();
});
