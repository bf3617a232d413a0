import type { AlterationTicket, Fitting, WorkroomEmailJob } from "../models/index.js";
import type { AlterationTicketDto, EmailJobDto, FittingDto } from "@shared/schemas/workroom.js";

/** A ticket for the wire (garment tag and name come from the caller's lookup). */
export function presentTicket(
  t: AlterationTicket & { assignee?: { name: string } | null },
  garment?: { tagCode: string; name: string },
): AlterationTicketDto {
  return {
    id: t.id,
    garmentId: t.garmentId,
    tagCode: garment?.tagCode ?? "",
    garmentName: garment?.name ?? "",
    fittingId: t.fittingId,
    tasks: t.tasks,
    estimateHours: t.estimateHours,
    remainingHours: t.remainingHours,
    assigneeId: t.assigneeId,
    assigneeName: t.assignee?.name ?? null,
    status: t.status,
    raisedOn: t.raisedOn,
    checkedAt: t.checkedAt ? t.checkedAt.toISOString() : null,
    notes: t.notes,
  };
}

/** A fitting for the wire; names come from the caller's lookups. */
export function presentFitting(
  f: Fitting,
  extra: { performerName: string; performerEmail: string | null; changeLabel: string | null; attendeeNames: string[]; ticketCount: number },
): FittingDto {
  return {
    id: f.id,
    performerId: f.performerId,
    performerName: extra.performerName,
    performerEmail: extra.performerEmail,
    changeId: f.changeId,
    changeLabel: extra.changeLabel,
    startsAt: f.startsAt.toISOString(),
    endsAt: new Date(f.startsAt.getTime() + f.durationMinutes * 60_000).toISOString(),
    durationMinutes: f.durationMinutes,
    room: f.room,
    attendeeIds: f.attendeeIds,
    attendeeNames: extra.attendeeNames,
    notes: f.notes,
    outcome: f.outcome,
    status: f.status,
    icsSequence: f.icsSequence,
    ticketCount: extra.ticketCount,
  };
}

/** A queued workroom e-mail and its delivery state (the rendered body stays on the server). */
export function presentEmailJob(j: WorkroomEmailJob): EmailJobDto {
  return {
    id: j.id,
    kind: j.kind,
    recipient: j.recipient,
    subject: j.subject,
    status: j.status,
    attempts: j.attempts,
    lastError: j.lastError,
    sentAt: j.sentAt ? j.sentAt.toISOString() : null,
    createdAt: j.createdAt.toISOString(),
  };
}
