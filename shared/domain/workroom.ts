// Workroom schedule (product.md, Computations 5): derive alteration due dates from the shoot schedule,
// then plan tickets into people's hours by earliest due date (Jackson's rule) and flag late work and
// overbooked days. Pure: dates are YYYY-MM-DD strings, arithmetic goes through date-fns.
import { addDays, differenceInCalendarDays, format, getISODay, isValid, parseISO, subDays } from "date-fns";

/** Weekday keys used for weekly hours and working calendars. */
export type Weekday = "mon" | "tue" | "wed" | "thu" | "fri" | "sat" | "sun";

/** ISO 8601 weekday order: index 0 is Monday (ISO day 1). */
export const WEEKDAYS: readonly Weekday[] = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"];

/** Which days the workroom counts as working days (for buffers and lateness). */
export interface WorkingCalendar {
  /** Weekdays the workroom works. */
  workingWeekdays: readonly Weekday[];
  /** Dates the whole workroom is closed (public holidays, wrap days), YYYY-MM-DD. */
  closedDates?: readonly string[];
}

/** Monday to Friday, no closed dates: the default workroom calendar. */
export const MONDAY_TO_FRIDAY: WorkingCalendar = { workingWeekdays: ["mon", "tue", "wed", "thu", "fri"] };

/** One alteration ticket as the planner sees it. */
export interface WorkroomTicketInput {
  /** Stable id; also breaks due-date ties so the plan is deterministic. */
  id: string;
  /** Estimated hours for the whole ticket. */
  estimateHours: number;
  /** Hours still to do; defaults to the estimate. 0 means the ticket is done. */
  remainingHours?: number;
  /** Derived due date (see dueDateFor); null means no shoot day needs the garment any more. */
  dueDate: string | null;
  /** Person the ticket is pinned to; null or absent lets the planner choose. */
  assigneeId?: string | null;
  /** Date the ticket was raised; no work is planned before it. */
  raisedOn?: string;
}

/** One workroom member's weekly hours and days off. */
export interface WorkroomPersonInput {
  id: string;
  name: string;
  /** Hours available on each weekday. */
  hoursPerWeekday: Record<Weekday, number>;
  /** Dates with no hours at all, YYYY-MM-DD. */
  daysOff: readonly string[];
}

/** Input to planTickets. */
export interface PlanInput {
  /** First day that may hold work, YYYY-MM-DD. */
  today: string;
  /** Number of days (today included) the plan covers. */
  horizonDays: number;
  tickets: readonly WorkroomTicketInput[];
  people: readonly WorkroomPersonInput[];
  /** Calendar for counting lateness in working days; defaults to MONDAY_TO_FRIDAY. */
  calendar?: WorkingCalendar;
}

/** Hours of one ticket planned for one person on one day. */
export interface WorkBlock {
  personId: string;
  date: string;
  hours: number;
}

/** Planner result for one ticket. */
export interface TicketPlan {
  id: string;
  /** Person doing the work (the pinned one, or the planner's choice); null when nobody has hours. */
  assigneeId: string | null;
  pinned: boolean;
  dueDate: string | null;
  /** done: nothing remaining; planned: all hours fit in the horizon; unscheduled: some hours did not fit. */
  status: "done" | "planned" | "unscheduled";
  blocks: WorkBlock[];
  /** Day the last block ends; null when done or not fully planned. */
  plannedFinish: string | null;
  /** Hours that did not fit before the horizon ended. */
  unplannedHours: number;
  /** Working days from due date to finish (negative = early); null without a due date or finish. */
  lateness: number | null;
  /** True when the work finishes (or would finish, past the horizon) after the due date. */
  late: boolean;
}

/** Capacity and load of one person on one day. */
export interface PersonDay {
  personId: string;
  date: string;
  capacityHours: number;
  plannedHours: number;
  freeHours: number;
  /** True when this day is full and work with a due date on or after it still ends up late. */
  overbooked: boolean;
  /** Late tickets whose window (start to due date) covers this day. */
  lateTicketIds: string[];
}

/** Full planner output. */
export interface PlanResult {
  /** One entry per input ticket, in input order. */
  tickets: TicketPlan[];
  /** Ticket ids in the order they were planned (earliest due date first). */
  order: string[];
  /** Every person-day of the horizon, people in input order, dates ascending. */
  personDays: PersonDay[];
  /** The overbooked subset of personDays. */
  overbookedDays: PersonDay[];
  summary: {
    /** Largest lateness among planned tickets with a due date; null if there are none. */
    maxLateness: number | null;
    lateCount: number;
    unscheduledCount: number;
  };
}

const DATE_RE = /^\d{4}-\d{2}-\d{2}$/;

function parseDay(value: string, what: string): Date {
  const parsed = parseISO(value);
  // The round trip rejects dates like 2030-02-30 that some parsers roll over.
  if (!DATE_RE.test(value) || !isValid(parsed) || format(parsed, "yyyy-MM-dd") !== value) {
    throw new RangeError(`${what}: expected a YYYY-MM-DD date, got "${value}"`);
  }
  return parsed;
}

function fmt(d: Date): string {
  return format(d, "yyyy-MM-dd");
}

function weekdayOf(d: Date): Weekday {
  return WEEKDAYS[getISODay(d) - 1];
}

function isWorkingDate(d: Date, cal: WorkingCalendar, closed: ReadonlySet<string>): boolean {
  return cal.workingWeekdays.includes(weekdayOf(d)) && !closed.has(fmt(d));
}

/**
 * Due date of an alteration: the earliest needed date still to come, minus a buffer in working days.
 * @param neededDates shoot days or performances that need the garment (any order, repeats allowed)
 * @param bufferWorkingDays working days the finished garment should sit before it is needed (0 = due on the day)
 * @param workingCalendar which days count as working days
 * @param today when given, needed dates before it are ignored (a ticket raised after its first shoot day)
 * @returns YYYY-MM-DD, or null when no needed date is left ("not needed")
 */
export function dueDateFor(
  neededDates: readonly string[],
  bufferWorkingDays: number,
  workingCalendar: WorkingCalendar = MONDAY_TO_FRIDAY,
  today?: string,
): string | null {
  if (!Number.isInteger(bufferWorkingDays) || bufferWorkingDays < 0) {
    throw new RangeError(`bufferWorkingDays must be a whole number ≥ 0, got ${bufferWorkingDays}`);
  }
  if (bufferWorkingDays > 0 && workingCalendar.workingWeekdays.length === 0) {
    throw new RangeError("workingCalendar has no working weekdays");
  }
  const from = today === undefined ? null : parseDay(today, "today");
  let first: Date | null = null;
  for (const value of neededDates) {
    const d = parseDay(value, "neededDates");
    if (from && differenceInCalendarDays(d, from) < 0) continue;
    if (first === null || d < first) first = d;
  }
  if (first === null) return null;
  const closed = new Set(workingCalendar.closedDates ?? []);
  let due = first;
  for (let left = bufferWorkingDays; left > 0;) {
    due = subDays(due, 1);
    if (isWorkingDate(due, workingCalendar, closed)) left--;
  }
  return fmt(due);
}

/**
 * Maximum lateness L_max = max(C_j − d_j) of jobs run back to back from time 0 in the given order
 * (one machine, no idle time). Returns -Infinity for no jobs.
 * @param order a permutation of job indices
 */
export function lmaxSingleMachine(jobs: readonly { p: number; d: number }[], order: readonly number[]): number {
  if (order.length !== jobs.length || new Set(order).size !== jobs.length || order.some((i) => !(i in jobs))) {
    throw new RangeError("order must be a permutation of the job indices");
  }
  let completion = 0;
  let lmax = -Infinity;
  for (const i of order) {
    completion += jobs[i].p;
    lmax = Math.max(lmax, completion - jobs[i].d);
  }
  return lmax;
}

interface TicketState {
  input: WorkroomTicketInput;
  remaining: number; // minutes
  dueIdx: number | null; // days from today; may be negative or past the horizon
  startIdx: number;
  pinnedIdx: number | null;
}

interface Probe {
  finishIdx: number;
  /** Minutes already in use on the finish day after this ticket, to prefer the less loaded person. */
  usedOnFinishDay: number;
}

// Work in whole minutes so repeated splitting never accumulates floating-point drift.
const toMinutes = (hours: number): number => Math.round(hours * 60);
const toHours = (minutes: number): number => minutes / 60;

/**
 * Plan open tickets into people's free hours by earliest due date (Jackson's rule, ties by id).
 * A pinned ticket goes to its person; any other goes to whoever finishes it first. Work is split into
 * day blocks, never on days off, zero-hour weekdays, before today or before the ticket was raised, and
 * never beyond a day's capacity: a ticket that cannot fit before its due date is planned late instead, and
 * its person's days from its start to its due date are flagged overbooked.
 */
export function planTickets(input: PlanInput): PlanResult {
  const { horizonDays } = input;
  if (!Number.isInteger(horizonDays) || horizonDays < 0) {
    throw new RangeError(`horizonDays must be a whole number ≥ 0, got ${horizonDays}`);
  }
  const today = parseDay(input.today, "today");
  const calendar = input.calendar ?? MONDAY_TO_FRIDAY;
  // Many tickets share a due date; parsing and validating each distinct string once keeps date-fns off the hot path.
  const indexCache = new Map<string, number>();
  const dayIndex = (value: string, what: string): number => {
    let idx = indexCache.get(value);
    if (idx === undefined) {
      idx = differenceInCalendarDays(parseDay(value, what), today);
      indexCache.set(value, idx);
    }
    return idx;
  };

  // Calendar work is done once on day indices so the per-ticket loops never touch Date objects.
  const dates: string[] = [];
  for (let i = 0; i < horizonDays; i++) dates.push(fmt(addDays(today, i)));
  const weekday0 = getISODay(today) - 1;
  const weekdayAt = (i: number): Weekday => WEEKDAYS[(((weekday0 + i) % 7) + 7) % 7];
  const workingWeekdays = new Set(calendar.workingWeekdays);
  const closedIdx = new Set((calendar.closedDates ?? []).map((d) => dayIndex(d, "calendar.closedDates")));
  const isWorkingIdx = (i: number): boolean => workingWeekdays.has(weekdayAt(i)) && !closedIdx.has(i);

  const people = input.people;
  const personIdx = new Map<string, number>();
  const capacity: Int32Array[] = [];
  const free: Int32Array[] = [];
  people.forEach((person, p) => {
    if (personIdx.has(person.id)) throw new RangeError(`duplicate person id "${person.id}"`);
    personIdx.set(person.id, p);
    const off = new Set(person.daysOff.map((d) => dayIndex(d, `daysOff of ${person.id}`)));
    const cap = new Int32Array(horizonDays);
    for (let i = 0; i < horizonDays; i++) {
      const hours = person.hoursPerWeekday[weekdayAt(i)];
      if (!Number.isFinite(hours) || hours < 0 || hours > 24) {
        throw new RangeError(`hoursPerWeekday.${weekdayAt(i)} of ${person.id} must be within 0–24`);
      }
      cap[i] = off.has(i) ? 0 : toMinutes(hours);
    }
    capacity.push(cap);
    free.push(Int32Array.from(cap));
  });
  // Per-person pointer to the first day that still has free minutes; days before it are never rescanned.
  const nextFree = people.map((_, p) => {
    let i = 0;
    while (i < horizonDays && free[p][i] === 0) i++;
    return i;
  });
  const advance = (p: number): void => {
    let i = nextFree[p];
    while (i < horizonDays && free[p][i] === 0) i++;
    nextFree[p] = i;
  };

  const seen = new Set<string>();
  const states: TicketState[] = input.tickets.map((t) => {
    if (seen.has(t.id)) throw new RangeError(`duplicate ticket id "${t.id}"`);
    seen.add(t.id);
    const hours = t.remainingHours ?? t.estimateHours;
    if (!Number.isFinite(hours) || hours < 0) throw new RangeError(`hours of ticket ${t.id} must be ≥ 0`);
    let pinnedIdx: number | null = null;
    if (t.assigneeId != null) {
      const p = personIdx.get(t.assigneeId);
      if (p === undefined) throw new RangeError(`ticket ${t.id} is pinned to unknown person "${t.assigneeId}"`);
      pinnedIdx = p;
    }
    return {
      input: t,
      remaining: toMinutes(hours),
      dueIdx: t.dueDate === null ? null : dayIndex(t.dueDate, `dueDate of ${t.id}`),
      startIdx: t.raisedOn === undefined ? 0 : Math.max(0, dayIndex(t.raisedOn, `raisedOn of ${t.id}`)),
      pinnedIdx,
    };
  });

  // Jackson's rule: earliest due date first; tickets no shoot day needs go last; ties by id.
  const open = states.filter((s) => s.remaining > 0);
  open.sort((a, b) => {
    if (a.dueIdx !== b.dueIdx) {
      if (a.dueIdx === null) return 1;
      if (b.dueIdx === null) return -1;
      return a.dueIdx - b.dueIdx;
    }
    return a.input.id < b.input.id ? -1 : a.input.id > b.input.id ? 1 : 0;
  });

  const probe = (p: number, s: TicketState): Probe | null => {
    let need = s.remaining;
    for (let i = Math.max(nextFree[p], s.startIdx); i < horizonDays; i++) {
      const f = free[p][i];
      if (f === 0) continue;
      if (f >= need) return { finishIdx: i, usedOnFinishDay: capacity[p][i] - f + need };
      need -= f;
    }
    return null;
  };
  const freeFrom = (p: number, start: number): number => {
    let total = 0;
    for (let i = Math.max(nextFree[p], start); i < horizonDays; i++) total += free[p][i];
    return total;
  };

  const plans = new Map<string, TicketPlan>();
  const blockMinutes = new Map<string, { p: number; i: number; m: number }[]>();
  for (const s of open) {
    const candidates = s.pinnedIdx !== null ? [s.pinnedIdx] : people.map((_, p) => p);
    let best = -1;
    let bestProbe: Probe | null = null;
    for (const p of candidates) {
      const r = probe(p, s);
      if (
        r &&
        (!bestProbe ||
          r.finishIdx < bestProbe.finishIdx ||
          (r.finishIdx === bestProbe.finishIdx && r.usedOnFinishDay < bestProbe.usedOnFinishDay))
      ) {
        best = p;
        bestProbe = r;
      }
    }
    if (best < 0) {
      // Nobody finishes inside the horizon: give it to whoever can do the most of it.
      let most = 0;
      for (const p of candidates) {
        const total = freeFrom(p, s.startIdx);
        if (total > most) {
          most = total;
          best = p;
        }
      }
      if (best < 0 && s.pinnedIdx !== null) best = s.pinnedIdx;
    }
    const blocks: { p: number; i: number; m: number }[] = [];
    let need = s.remaining;
    if (best >= 0) {
      for (let i = Math.max(nextFree[best], s.startIdx); i < horizonDays && need > 0; i++) {
        const m = Math.min(free[best][i], need);
        if (m === 0) continue;
        free[best][i] -= m;
        need -= m;
        blocks.push({ p: best, i, m });
      }
      advance(best);
    }
    blockMinutes.set(s.input.id, blocks);
    const finishIdx = need === 0 ? blocks[blocks.length - 1].i : null;
    let lateness: number | null = null;
    let late = false;
    if (s.dueIdx !== null) {
      if (finishIdx !== null) {
        lateness = workingDayDifference(s.dueIdx, finishIdx, isWorkingIdx);
        late = finishIdx > s.dueIdx;
      } else {
        // Would finish after the last planned day.
        late = s.dueIdx < horizonDays;
      }
    }
    plans.set(s.input.id, {
      id: s.input.id,
      assigneeId: best >= 0 ? people[best].id : null,
      pinned: s.pinnedIdx !== null,
      dueDate: s.input.dueDate,
      status: need === 0 ? "planned" : "unscheduled",
      blocks: blocks.map((b) => ({ personId: people[b.p].id, date: dates[b.i], hours: toHours(b.m) })),
      plannedFinish: finishIdx === null ? null : dates[finishIdx],
      unplannedHours: toHours(need),
      lateness,
      late,
    });
  }

  // Overbooked: the assignee's hours between a late ticket's start and its due date were not enough.
  // Every such day with capacity is full, because planning took all free minutes from the start onwards.
  const lateOn: string[][][] = people.map(() => Array.from({ length: horizonDays }, () => []));
  for (const s of open) {
    const plan = plans.get(s.input.id)!;
    if (!plan.late || plan.assigneeId === null || s.dueIdx === null) continue;
    const p = personIdx.get(plan.assigneeId)!;
    for (let i = s.startIdx; i <= Math.min(s.dueIdx, horizonDays - 1); i++) {
      if (capacity[p][i] > 0) lateOn[p][i].push(s.input.id);
    }
  }
  const personDays: PersonDay[] = [];
  people.forEach((person, p) => {
    for (let i = 0; i < horizonDays; i++) {
      personDays.push({
        personId: person.id,
        date: dates[i],
        capacityHours: toHours(capacity[p][i]),
        plannedHours: toHours(capacity[p][i] - free[p][i]),
        freeHours: toHours(free[p][i]),
        overbooked: lateOn[p][i].length > 0,
        lateTicketIds: lateOn[p][i],
      });
    }
  });

  const tickets: TicketPlan[] = states.map(
    (s) =>
      plans.get(s.input.id) ?? {
        id: s.input.id,
        assigneeId: s.input.assigneeId ?? null,
        pinned: s.pinnedIdx !== null,
        dueDate: s.input.dueDate,
        status: "done",
        blocks: [],
        plannedFinish: null,
        unplannedHours: 0,
        lateness: null,
        late: false,
      },
  );
  let maxLateness: number | null = null;
  for (const t of tickets) {
    if (t.lateness !== null) maxLateness = maxLateness === null ? t.lateness : Math.max(maxLateness, t.lateness);
  }
  return {
    tickets,
    order: open.map((s) => s.input.id),
    personDays,
    overbookedDays: personDays.filter((d) => d.overbooked),
    summary: {
      maxLateness,
      lateCount: tickets.filter((t) => t.late).length,
      unscheduledCount: tickets.filter((t) => t.status === "unscheduled").length,
    },
  };
}

/**
 * Signed working days from due to finish: working days in (due, finish] when late, minus those in
 * (finish, due] when early. Finishing late on a non-working day still counts as at least one day late.
 */
function workingDayDifference(dueIdx: number, finishIdx: number, isWorkingIdx: (i: number) => boolean): number {
  if (finishIdx === dueIdx) return 0;
  const [lo, hi] = finishIdx > dueIdx ? [dueIdx, finishIdx] : [finishIdx, dueIdx];
  let count = 0;
  for (let i = lo + 1; i <= hi; i++) if (isWorkingIdx(i)) count++;
  return finishIdx > dueIdx ? Math.max(1, count) : -count;
}
