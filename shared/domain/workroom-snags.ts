// Workroom snags: turn a plan (planTickets) into snags of the same shape the snag engine produces, so the
// Snags screen can list late alterations and overbooked workroom days beside the other conflicts.
import { formatDate, formatHours } from "../format";
import { finishSnag, sortSnags } from "./snags/engine";
import type { JsonValue, Snag, SnagDraft } from "./snags/types";
import type { PlanResult } from "./workroom";
import { formatLength, type LengthUnit } from "./units";

/** What the snag texts need to know about one ticket besides its plan. */
export interface WorkroomSnagTicket {
  id: string;
  garmentId: string;
  tagCode: string;
  garmentName: string;
  /** e.g. "take in 20 mm, shorten 30 mm". */
  taskSummary: string;
  /** First shoot day or performance that needs the garment (YYYY-MM-DD), or null. */
  neededOn: string | null;
  /** Ids of the shoot days on neededOn (for links). */
  neededShootDayIds: string[];
}

/** Input to workroomSnags. */
export interface WorkroomSnagInput {
  plan: PlanResult;
  tickets: readonly WorkroomSnagTicket[];
  people: readonly { id: string; name: string }[];
  bufferWorkingDays: number;
}

/** "Tue 1 Dec 2026" from YYYY-MM-DD (the app's one date format). */
export const longDate = formatDate;

const hoursText = formatHours;
const plural = (n: number, one: string, many = `${one}s`): string => `${n} ${n === 1 ? one : many}`;

/** A snag for one late (or unschedulable) ticket, or null when it is on time. */
export function lateTicketSnag(
  t: WorkroomSnagTicket,
  plan: PlanResult["tickets"][number],
  personName: string | null,
  bufferWorkingDays: number,
): SnagDraft | null {
  if (!plan.late || plan.dueDate === null) return null;
  const hours = plan.blocks.reduce((s, b) => s + b.hours, 0) + plan.unplannedHours;
  // Not ready on the day it is worn is blocking; finishing inside the buffer only costs pressing time.
  const missesShoot = plan.plannedFinish === null || (t.neededOn !== null && plan.plannedFinish >= t.neededOn);
  const who = personName ? ` with ${personName}` : "";
  const due =
    t.neededOn !== null && t.neededOn !== plan.dueDate
      ? `due ${longDate(plan.dueDate)} (${plural(bufferWorkingDays, "working day")} before it is needed on ${longDate(t.neededOn)})`
      : `due ${longDate(plan.dueDate)}${t.neededOn ? " (the day it is needed)" : ""}`;
  const outcome =
    plan.plannedFinish === null
      ? `${hoursText(plan.unplannedHours)} of it do not fit in anyone's hours in the planning window`
      : `the plan finishes it on ${longDate(plan.plannedFinish)}${who}, ${plural(plan.lateness ?? 1, "working day")} late`;
  const consequence = missesShoot
    ? t.neededOn
      ? ` It would not be ready for the shoot on ${longDate(t.neededOn)}.`
      : ""
    : " It would be ready on the day, without time for pressing and rack prep.";
  const evidence: { [k: string]: JsonValue } = {
    ticketId: t.id,
    dueDate: plan.dueDate,
    neededOn: t.neededOn,
    plannedFinish: plan.plannedFinish,
    lateness: plan.lateness,
    hours,
    unplannedHours: plan.unplannedHours,
    assigneeId: plan.assigneeId,
  };
  return {
    key: `workroom_late:${t.id}`,
    kind: "workroom_late",
    severity: missesShoot ? "blocking" : "warning",
    title: `${t.tagCode} ${t.garmentName}: alteration ${plan.plannedFinish === null ? "cannot be scheduled in time" : `late by ${plural(plan.lateness ?? 1, "working day")}`}`,
    explanation: `${t.tagCode} ${t.garmentName} (${t.taskSummary}; ${hoursText(hours)}) is ${due}, but ${outcome}.${consequence}`,
    subject: { garmentId: t.garmentId, shootDayIds: [...t.neededShootDayIds].sort() },
    evidence,
  };
}

/** Runs of consecutive overbooked working days per person (days with no capacity do not break a run). */
export function overbookedRuns(plan: PlanResult): Array<{ personId: string; days: PlanResult["personDays"] }> {
  const runs: Array<{ personId: string; days: PlanResult["personDays"] }> = [];
  let current: { personId: string; days: PlanResult["personDays"] } | null = null;
  for (const d of plan.personDays) {
    if (current && current.personId !== d.personId) current = null;
    if (d.overbooked) {
      if (!current) {
        current = { personId: d.personId, days: [] };
        runs.push(current);
      }
      current.days.push(d);
    } else if (d.capacityHours > 0) {
      current = null;
    }
  }
  return runs;
}

/** One snag per run of overbooked days of one person. */
export function overbookedSnag(
  run: { personId: string; days: PlanResult["personDays"] },
  personName: string,
  ticketsById: ReadonlyMap<string, WorkroomSnagTicket>,
): SnagDraft {
  const first = run.days[0].date;
  const last = run.days[run.days.length - 1].date;
  const capacity = run.days.reduce((s, d) => s + d.capacityHours, 0);
  const planned = run.days.reduce((s, d) => s + d.plannedHours, 0);
  const lateIds = Array.from(new Set(run.days.flatMap((d) => d.lateTicketIds))).sort();
  const lateNames = lateIds.map((id) => {
    const t = ticketsById.get(id);
    return t ? `${t.tagCode} ${t.garmentName}` : id;
  });
  const span = first === last ? `on ${longDate(first)}` : `from ${longDate(first)} to ${longDate(last)}`;
  const evidence: { [k: string]: JsonValue } = {
    personId: run.personId,
    dates: run.days.map((d) => d.date),
    capacityHours: capacity,
    plannedHours: planned,
    lateTicketIds: lateIds,
  };
  return {
    key: `workroom_overbooked:${run.personId}:${first}`,
    kind: "workroom_overbooked",
    severity: "warning",
    title: `${personName} is overbooked ${span}`,
    explanation:
      `${personName} has ${hoursText(planned)} of ${hoursText(capacity)} booked ${span} (${plural(run.days.length, "working day")}), ` +
      `and ${plural(lateIds.length, "alteration")} due by then still finish${lateIds.length === 1 ? "es" : ""} late: ${lateNames.join(", ")}. ` +
      `Move work to someone with free hours, add hours, or revisit an estimate.`,
    subject: {},
    evidence,
  };
}

/** Late-ticket and overbooked-day snags of one plan, sorted like the engine's (blocking first, then by key). */
export function workroomSnags(input: WorkroomSnagInput): Snag[] {
  const ticketsById = new Map(input.tickets.map((t) => [t.id, t]));
  const names = new Map(input.people.map((p) => [p.id, p.name]));
  const drafts: SnagDraft[] = [];
  for (const p of input.plan.tickets) {
    const t = ticketsById.get(p.id);
    if (!t) continue;
    const d = lateTicketSnag(t, p, p.assigneeId ? (names.get(p.assigneeId) ?? null) : null, input.bufferWorkingDays);
    if (d) drafts.push(d);
  }
  for (const run of overbookedRuns(input.plan)) drafts.push(overbookedSnag(run, names.get(run.personId) ?? run.personId, ticketsById));
  return sortSnags(drafts.map(finishSnag));
}

const TASK_WORDS: Record<string, string> = {
  take_in: "take in",
  let_out: "let out",
  shorten: "shorten",
  lengthen: "lengthen",
  re_hem: "re-hem",
  repair: "repair",
  distress: "distress",
  dye: "dye",
  press: "press",
  other: "other",
};

/** Short text of a ticket's tasks in the production's unit, e.g. "take in 2.0 cm, distress to stage 2". */
export function taskSummary(
  tasks: readonly { kind: string; amountMm?: number | null; distressStage?: number | null; note?: string | null }[],
  unit: LengthUnit,
): string {
  if (tasks.length === 0) return "no tasks";
  return tasks
    .map((t) => {
      const word = TASK_WORDS[t.kind] ?? t.kind;
      if (t.kind === "distress" && t.distressStage != null) return `${word} to stage ${t.distressStage}`;
      if (t.amountMm != null && t.amountMm > 0) return `${word} ${formatLength(t.amountMm, unit)}`;
      return word;
    })
    .join(", ");
}
