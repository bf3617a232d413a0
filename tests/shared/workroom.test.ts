import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { addDays, format, getISODay, parseISO, subBusinessDays } from "date-fns";
import {
  dueDateFor,
  lmaxSingleMachine,
  MONDAY_TO_FRIDAY,
  planTickets,
  WEEKDAYS,
  type PlanInput,
  type Weekday,
  type WorkingCalendar,
  type WorkroomPersonInput,
} from "@shared/domain/workroom";

const EVERY_DAY: WorkingCalendar = { workingWeekdays: WEEKDAYS };
const MONDAY = "2030-09-02"; // a Monday (ISO weekday 1)

const iso = (d: Date): string => format(d, "yyyy-MM-dd");
const plusDays = (date: string, n: number): string => iso(addDays(parseISO(date), n));

function hours(perDay: Partial<Record<Weekday, number>>): Record<Weekday, number> {
  return { mon: 0, tue: 0, wed: 0, thu: 0, fri: 0, sat: 0, sun: 0, ...perDay };
}

function* permutations(n: number): Generator<number[]> {
  const a = Array.from({ length: n }, (_, i) => i);
  // Heap's algorithm: every permutation of 0..n-1 exactly once.
  const c = new Array<number>(n).fill(0);
  yield [...a];
  let i = 0;
  while (i < n) {
    if (c[i] < i) {
      const j = i % 2 === 0 ? 0 : c[i];
      [a[j], a[i]] = [a[i], a[j]];
      yield [...a];
      c[i]++;
      i = 0;
    } else {
      c[i] = 0;
      i++;
    }
  }
}

describe("permutations helper", () => {
  it("yields n! distinct orders", () => {
    const all = [...permutations(4)].map((p) => p.join(""));

    expect(all).toHaveLength(24);
    expect(new Set(all).size).toBe(24);
  });
});

// Jackson, J. R. (1955), "Scheduling a production line to minimize maximum tardiness", Research Report 43,
// Management Science Research Project, UCLA: sequencing by non-decreasing due date minimises
// L_max = max(C_j − d_j) on one machine (exchange-argument proof; Jackson 1955, EDD rule).
/** Maximum lateness of jobs run back to back in the given order (L_max = max(C_j − d_j)), written out here. */
function maxLatenessOf(jobs: ReadonlyArray<{ p: number; d: number }>, order: readonly number[]): number {
  const completions = order.map((_, k) => order.slice(0, k + 1).reduce((t, i) => t + jobs[i]!.p, 0));
  return Math.max(...order.map((i, k) => completions[k]! - jobs[i]!.d));
}

describe("lmaxSingleMachine and EDD — worked example (Jackson 1955, EDD rule)", () => {
  // A(p=1,d=9), B(4,4), C(3,7), D(2,10)
  const jobs = [
    { p: 1, d: 9 },
    { p: 4, d: 4 },
    { p: 3, d: 7 },
    { p: 2, d: 10 },
  ];
  const [A, B, C, D] = [0, 1, 2, 3];

  it("EDD order B,C,A,D gives L_max = 0", () => {
    expect(lmaxSingleMachine(jobs, [B, C, A, D])).toBe(0);
  });

  it("input order A,B,C,D gives L_max = 1", () => {
    expect(lmaxSingleMachine(jobs, [A, B, C, D])).toBe(1);
  });

  it("shortest-first A,D,C,B and worst order D,C,A,B both give L_max = 6", () => {
    expect(lmaxSingleMachine(jobs, [A, D, C, B])).toBe(6);
    expect(lmaxSingleMachine(jobs, [D, C, A, B])).toBe(6);
  });

  it("over all 24 orders the minimum is 0 and only B,C,A,D reaches it", () => {
    const values = [...permutations(4)].map((order) => ({ order, lmax: lmaxSingleMachine(jobs, order) }));
    const best = Math.min(...values.map((v) => v.lmax));

    expect(best).toBe(0);
    expect(values.filter((v) => v.lmax === best).map((v) => v.order)).toEqual([[B, C, A, D]]);
  });

  it("the planner, with one person working 1 h every day, sequences B,C,A,D with L_max 0", () => {
    // Day k (0-based) ends at time k+1, so due time d means the due date is today + (d − 1) days.
    const input: PlanInput = {
      today: MONDAY,
      horizonDays: 20,
      calendar: EVERY_DAY,
      people: [{ id: "p1", name: "Cutter One", hoursPerWeekday: hours(Object.fromEntries(WEEKDAYS.map((w) => [w, 1]))), daysOff: [] }],
      tickets: ["A", "B", "C", "D"].map((id, i) => ({
        id,
        estimateHours: jobs[i].p,
        dueDate: plusDays(MONDAY, jobs[i].d - 1),
      })),
    };

    const plan = planTickets(input);

    expect(plan.order).toEqual(["B", "C", "A", "D"]);
    expect(plan.tickets.map((t) => [t.id, t.lateness])).toEqual([
      ["A", -1],
      ["B", 0],
      ["C", 0],
      ["D", 0],
    ]);
    expect(plan.summary.maxLateness).toBe(0);
    expect(plan.summary.lateCount).toBe(0);
  });

  it("rejects an order that is not a permutation", () => {
    expect(() => lmaxSingleMachine(jobs, [0, 0, 1, 2])).toThrow(RangeError);
    expect(() => lmaxSingleMachine(jobs, [0, 1, 2])).toThrow(RangeError);
  });
});

describe("planTickets — Jackson's theorem against brute force (Jackson 1955, EDD rule)", () => {
  // Theorem (Jackson 1955, exchange argument): with one machine and all jobs available at time 0, EDD attains
  // the minimum L_max over all n! orders. Brute force over every order is the independent reference.
  // The planner reports lateness in whole days: finish day − due day = ceil((C − d) / h) with d = h·(due day + 1),
  // and ceil is monotone, so the day-level maximum is ceil(min L_max / h).
  it("one person, constant daily hours: planner L_max equals the brute-force minimum for n ≤ 7", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 8 }),
        fc.array(fc.record({ p: fc.integer({ min: 1, max: 12 }), dueDay: fc.integer({ min: -3, max: 20 }) }), {
          minLength: 1,
          maxLength: 7,
        }),
        (h, raw) => {
          const total = raw.reduce((s, j) => s + j.p, 0);
          const input: PlanInput = {
            today: MONDAY,
            horizonDays: Math.ceil(total / h) + 1,
            calendar: EVERY_DAY,
            people: [{ id: "solo", name: "Solo", hoursPerWeekday: hours(Object.fromEntries(WEEKDAYS.map((w) => [w, h]))), daysOff: [] }],
            tickets: raw.map((j, i) => ({ id: `J${i}`, estimateHours: j.p, dueDate: plusDays(MONDAY, j.dueDay) })),
          };
          const jobs = raw.map((j) => ({ p: j.p, d: h * (j.dueDay + 1) }));
          // Scored with the test's own lateness (not the module's), so the oracle cannot share its bug.
          let best = Infinity;
          for (const order of permutations(jobs.length)) best = Math.min(best, maxLatenessOf(jobs, order));

          const plan = planTickets(input);

          expect(plan.summary.unscheduledCount).toBe(0);
          const plannerOrder = plan.order.map((id) => Number(id.slice(1)));
          expect(maxLatenessOf(jobs, plannerOrder)).toBe(best);
          expect(plan.summary.maxLateness).toBe(Math.ceil(best / h) + 0); // + 0 turns Math.ceil's −0 into 0
        },
      ),
      { numRuns: 150, seed: 20300902 },
    );
  });
});

describe("planTickets — two people, different weekday hours, days off (hand-worked)", () => {
  // Hand-worked example, computed step by step from the rules (EDD, ties by id; earliest finish day,
  // then fewer hours used on that day). Mon 2 Sep 2030 … Fri 6 Sep 2030.
  // Ana 8 h Mon–Fri, day off Wed. Ben Mon 4, Tue 4, Wed 0, Thu 6, Fri 6, day off Tue.
  // T1 12h due Wed: Ana Mon 8 + Tue 4 → Tue; Ben would need Mon 4 + Thu 6 + Fri 2 → Fri. Ana.
  // T2 6h due Wed, pinned Ben: Mon 4 + Thu 2 → Thu, 1 working day late.
  // T3 4h due Thu: Ana Tue 4 → Tue; Ben Thu → Thu. Ana.
  // T4 4h due Thu: Ana (Wed off) Thu 4 → Thu, 4 h used; Ben Thu → Thu, 6 h used. Ana.
  // T5 4h due Fri: Ana Thu → 8 h used; Ben Thu → 6 h used. Ben.
  const people: WorkroomPersonInput[] = [
    { id: "ana", name: "Ana Example", hoursPerWeekday: hours({ mon: 8, tue: 8, wed: 8, thu: 8, fri: 8 }), daysOff: ["2030-09-04"] },
    { id: "ben", name: "Ben Example", hoursPerWeekday: hours({ mon: 4, tue: 4, thu: 6, fri: 6 }), daysOff: ["2030-09-03"] },
  ];
  const input: PlanInput = {
    today: MONDAY,
    horizonDays: 7,
    people,
    tickets: [
      { id: "T5", estimateHours: 4, dueDate: "2030-09-06" },
      { id: "T4", estimateHours: 4, dueDate: "2030-09-05" },
      { id: "T3", estimateHours: 4, dueDate: "2030-09-05" },
      { id: "T2", estimateHours: 6, dueDate: "2030-09-04", assigneeId: "ben" },
      { id: "T1", estimateHours: 12, dueDate: "2030-09-04", assigneeId: null },
    ],
  };
  const plan = planTickets(input);
  const byId = new Map(plan.tickets.map((t) => [t.id, t]));

  it("plans in due-date order with ties broken by id", () => {
    expect(plan.order).toEqual(["T1", "T2", "T3", "T4", "T5"]);
  });

  it.each([
    [
      "T1",
      "ana",
      [
        ["ana", "2030-09-02", 8],
        ["ana", "2030-09-03", 4],
      ],
      "2030-09-03",
      -1,
      false,
    ],
    [
      "T2",
      "ben",
      [
        ["ben", "2030-09-02", 4],
        ["ben", "2030-09-05", 2],
      ],
      "2030-09-05",
      1,
      true,
    ],
    ["T3", "ana", [["ana", "2030-09-03", 4]], "2030-09-03", -2, false],
    ["T4", "ana", [["ana", "2030-09-05", 4]], "2030-09-05", 0, false],
    ["T5", "ben", [["ben", "2030-09-05", 4]], "2030-09-05", -1, false],
  ] as const)("%s → %s, blocks, finish, lateness, late", (id, assignee, blocks, finish, lateness, late) => {
    const t = byId.get(id)!;

    expect(t.assigneeId).toBe(assignee);
    expect(t.blocks.map((b) => [b.personId, b.date, b.hours])).toEqual(blocks);
    expect(t.plannedFinish).toBe(finish);
    expect(t.lateness).toBe(lateness);
    expect(t.late).toBe(late);
  });

  it("summarises the worst lateness and the late count", () => {
    expect(plan.summary).toEqual({ maxLateness: 1, lateCount: 1, unscheduledCount: 0 });
  });

  it("flags only Ben's Monday: his only hours between T2's start and its due date", () => {
    expect(plan.overbookedDays.map((d) => [d.personId, d.date, d.lateTicketIds])).toEqual([["ben", "2030-09-02", ["T2"]]]);
  });

  it("reports days off as zero capacity; Thursday holds 4 h for Ana and fills Ben's 6 h", () => {
    const day = (p: string, date: string) => plan.personDays.find((d) => d.personId === p && d.date === date)!;

    expect(day("ana", "2030-09-04")).toMatchObject({ capacityHours: 0, plannedHours: 0 });
    expect(day("ben", "2030-09-03")).toMatchObject({ capacityHours: 0, plannedHours: 0 });
    expect(day("ana", "2030-09-05")).toMatchObject({ capacityHours: 8, plannedHours: 4, freeHours: 4 });
    expect(day("ben", "2030-09-05")).toMatchObject({ capacityHours: 6, plannedHours: 6, freeHours: 0 });
    expect(day("ben", "2030-09-06")).toMatchObject({ capacityHours: 6, plannedHours: 0, freeHours: 6 });
  });

  it("puts no block on a day off", () => {
    const off = new Set(people.flatMap((p) => p.daysOff.map((d) => `${p.id}/${d}`)));

    for (const t of plan.tickets) for (const b of t.blocks) expect(off.has(`${b.personId}/${b.date}`)).toBe(false);
  });
});

describe("planTickets — overbooked days (hand-worked)", () => {
  const solo: WorkroomPersonInput = {
    id: "cy",
    name: "Cy Example",
    hoursPerWeekday: hours({ mon: 8, tue: 8, wed: 8, thu: 8, fri: 8 }),
    daysOff: [],
  };

  it("pinned work beyond capacity before its due date flags the days up to the due date", () => {
    // 20 h pinned, due Tue, 8 h/day: Mon 8 + Tue 8 + Wed 4 → Wed, 1 working day late; Mon and Tue were not enough.
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [solo],
      tickets: [
        { id: "big", estimateHours: 20, dueDate: "2030-09-03", assigneeId: "cy" },
        { id: "small", estimateHours: 2, dueDate: "2030-09-06" },
      ],
    });
    const big = plan.tickets.find((t) => t.id === "big")!;

    expect(big.blocks.map((b) => b.hours)).toEqual([8, 8, 4]);
    expect(big).toMatchObject({ plannedFinish: "2030-09-04", lateness: 1, late: true });
    expect(plan.overbookedDays.map((d) => d.date)).toEqual(["2030-09-02", "2030-09-03"]);
    expect(plan.tickets.find((t) => t.id === "small")).toMatchObject({ plannedFinish: "2030-09-04", late: false });
  });

  it("unpinned work that cannot fit before its due date flags the chosen person's days", () => {
    // Two 8 h tickets due Mon for one 8 h/day person: the second finishes Tue, one day late; Monday is overbooked.
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [solo],
      tickets: [
        { id: "a", estimateHours: 8, dueDate: MONDAY },
        { id: "b", estimateHours: 8, dueDate: MONDAY },
      ],
    });

    expect(plan.tickets.map((t) => [t.id, t.plannedFinish, t.lateness, t.late])).toEqual([
      ["a", MONDAY, 0, false],
      ["b", "2030-09-03", 1, true],
    ]);
    expect(plan.overbookedDays.map((d) => [d.personId, d.date])).toEqual([["cy", MONDAY]]);
  });

  it("counts lateness in working days: Friday due, Monday finish is 1 day late", () => {
    // 8 h Mon–Fri; 40 h of earlier work fills the week, so the Friday ticket lands on the next Monday.
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 10,
      people: [solo],
      tickets: [
        { id: "fill", estimateHours: 40, dueDate: "2030-09-05" },
        { id: "fri", estimateHours: 2, dueDate: "2030-09-06" },
      ],
    });

    expect(plan.tickets.find((t) => t.id === "fri")).toMatchObject({ plannedFinish: "2030-09-09", lateness: 1, late: true });
  });

  it("a ticket that does not fit in the horizon is unscheduled and late when due inside it", () => {
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 1,
      people: [solo],
      tickets: [{ id: "huge", estimateHours: 30, dueDate: MONDAY, assigneeId: "cy" }],
    });

    expect(plan.tickets[0]).toMatchObject({ status: "unscheduled", unplannedHours: 22, plannedFinish: null, late: true });
    expect(plan.summary).toEqual({ maxLateness: null, lateCount: 1, unscheduledCount: 1 });
  });

  it("an overdue ticket (due before today) is late but flags no day", () => {
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [solo],
      tickets: [{ id: "old", estimateHours: 2, dueDate: "2030-08-29" }], // Thu before: Fri, Mon → 2 working days
    });

    expect(plan.tickets[0]).toMatchObject({ plannedFinish: MONDAY, lateness: 2, late: true });
    expect(plan.overbookedDays).toEqual([]);
  });
});

describe("planTickets — edge rules", () => {
  const person: WorkroomPersonInput = {
    id: "dee",
    name: "Dee Example",
    hoursPerWeekday: hours({ mon: 6, tue: 6, wed: 6, thu: 6, fri: 6 }),
    daysOff: [],
  };

  it("never plans before the day a ticket is raised", () => {
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [person],
      tickets: [{ id: "r", estimateHours: 3, dueDate: "2030-09-06", raisedOn: "2030-09-04" }],
    });

    expect(plan.tickets[0].blocks).toEqual([{ personId: "dee", date: "2030-09-04", hours: 3 }]);
  });

  it("plans the remaining hours, skips finished tickets and puts tickets with no due date last", () => {
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [person],
      tickets: [
        { id: "nodue", estimateHours: 1, dueDate: null },
        { id: "done", estimateHours: 5, remainingHours: 0, dueDate: MONDAY },
        { id: "part", estimateHours: 10, remainingHours: 2.5, dueDate: "2030-09-06" },
      ],
    });

    expect(plan.order).toEqual(["part", "nodue"]);
    expect(plan.tickets.map((t) => [t.id, t.status, t.blocks.map((b) => b.hours)])).toEqual([
      ["nodue", "planned", [1]],
      ["done", "done", []],
      ["part", "planned", [2.5]],
    ]);
    expect(plan.tickets[0]).toMatchObject({ lateness: null, late: false });
  });

  it("rejects unknown pinned people, duplicate ids and malformed dates", () => {
    const base = { today: MONDAY, horizonDays: 3, people: [person] };

    expect(() => planTickets({ ...base, tickets: [{ id: "x", estimateHours: 1, dueDate: null, assigneeId: "nobody" }] })).toThrow(
      RangeError,
    );
    expect(() =>
      planTickets({
        ...base,
        tickets: [
          { id: "x", estimateHours: 1, dueDate: null },
          { id: "x", estimateHours: 1, dueDate: null },
        ],
      }),
    ).toThrow(RangeError);
    expect(() => planTickets({ ...base, tickets: [{ id: "x", estimateHours: 1, dueDate: "2030-02-30" }] })).toThrow(RangeError);
  });

  it("random plans: blocks only on working days from today on, within capacity, hours conserved", () => {
    // Definitions checked: a block never falls on a day off, a zero-hour weekday or before today; a person-day's
    // blocks never exceed its capacity; planned + unplanned hours equal the hours asked for.
    const personArb = fc.record({
      hours: fc.array(fc.integer({ min: 0, max: 9 }), { minLength: 7, maxLength: 7 }),
      off: fc.uniqueArray(fc.integer({ min: 0, max: 20 }), { maxLength: 6 }),
    });
    const ticketArb = fc.record({
      quarterHours: fc.integer({ min: 0, max: 80 }),
      dueDay: fc.option(fc.integer({ min: -5, max: 25 })),
      pin: fc.option(fc.integer({ min: 0, max: 3 })),
      raisedDay: fc.option(fc.integer({ min: -5, max: 10 })),
    });
    fc.assert(
      fc.property(fc.array(personArb, { minLength: 1, maxLength: 4 }), fc.array(ticketArb, { maxLength: 25 }), (ps, ts) => {
        const people: WorkroomPersonInput[] = ps.map((p, i) => ({
          id: `P${i}`,
          name: `Person ${i}`,
          hoursPerWeekday: Object.fromEntries(WEEKDAYS.map((w, k) => [w, p.hours[k]])) as Record<Weekday, number>,
          daysOff: p.off.map((d) => plusDays(MONDAY, d)),
        }));
        const tickets = ts.map((t, i) => ({
          id: `K${i}`,
          estimateHours: t.quarterHours / 4,
          dueDate: t.dueDay === null ? null : plusDays(MONDAY, t.dueDay),
          assigneeId: t.pin === null ? null : people[t.pin % people.length].id,
          ...(t.raisedDay === null ? {} : { raisedOn: plusDays(MONDAY, t.raisedDay) }),
        }));

        const plan = planTickets({ today: MONDAY, horizonDays: 21, people, tickets });

        const cap = new Map<string, number>();
        for (const p of people) {
          for (let d = 0; d < 21; d++) {
            const date = plusDays(MONDAY, d);
            const weekday = WEEKDAYS[getISODay(parseISO(date)) - 1];
            cap.set(`${p.id}/${date}`, p.daysOff.includes(date) ? 0 : p.hoursPerWeekday[weekday]);
          }
        }
        const used = new Map<string, number>();
        plan.tickets.forEach((t, i) => {
          let sum = 0;
          for (const b of t.blocks) {
            const key = `${b.personId}/${b.date}`;
            expect(cap.get(key)).toBeGreaterThan(0); // inside horizon, not a day off, not a zero-hour weekday
            if (tickets[i].raisedOn) expect(b.date >= tickets[i].raisedOn!).toBe(true);
            if (tickets[i].assigneeId) expect(b.personId).toBe(tickets[i].assigneeId);
            used.set(key, (used.get(key) ?? 0) + b.hours);
            sum += b.hours;
          }
          expect(sum + t.unplannedHours).toBeCloseTo(tickets[i].estimateHours, 9);
        });
        for (const [key, h] of used) expect(h).toBeLessThanOrEqual(cap.get(key)! + 1e-9);
      }),
      { numRuns: 150, seed: 7 },
    );
  });
});

describe("dueDateFor — due dates from a shoot schedule", () => {
  // Invented schedule: shoot days 1–4 of a fictional unit.
  const shootDay: Record<number, string> = { 1: "2030-09-09", 2: "2030-09-10", 3: "2030-09-12", 4: "2030-09-16" };
  // date-fns subBusinessDays (Mon–Fri, no holidays) is the independent oracle where it applies.
  const oracle = (date: string, n: number) => iso(subBusinessDays(parseISO(date), n));

  it("a garment needed on two days counts from the earliest one", () => {
    const needed = [shootDay[3], shootDay[1]];

    expect(dueDateFor(needed, 2, MONDAY_TO_FRIDAY)).toBe(oracle(shootDay[1], 2)); // Thu 2030-09-05
    expect(dueDateFor(needed, 2, MONDAY_TO_FRIDAY)).toBe("2030-09-05");
  });

  it("a ticket raised after its first shoot day counts from the next upcoming needed date", () => {
    const needed = [shootDay[1], shootDay[4]];

    expect(dueDateFor(needed, 2, MONDAY_TO_FRIDAY, "2030-09-11")).toBe(oracle(shootDay[4], 2)); // Thu 2030-09-12
  });

  it("a needed date equal to today still counts", () => {
    expect(dueDateFor([shootDay[1], shootDay[4]], 0, MONDAY_TO_FRIDAY, shootDay[4])).toBe(shootDay[4]);
  });

  it("returns null when every needed date has passed or there are none", () => {
    expect(dueDateFor([shootDay[1], shootDay[4]], 2, MONDAY_TO_FRIDAY, "2030-09-17")).toBeNull();
    expect(dueDateFor([], 2, MONDAY_TO_FRIDAY)).toBeNull();
  });

  it("a Saturday shoot with a 1-day buffer is due the Friday before", () => {
    expect(dueDateFor(["2030-09-14"], 1, MONDAY_TO_FRIDAY)).toBe("2030-09-13");
  });

  it("skips the workroom's closed dates when counting the buffer", () => {
    // Fri 6 Sep closed: one working day before Mon 9 Sep is Thu 5 Sep.
    expect(dueDateFor(["2030-09-09"], 1, { ...MONDAY_TO_FRIDAY, closedDates: ["2030-09-06"] })).toBe("2030-09-05");
  });

  it("matches date-fns subBusinessDays for weekday shoot days and buffers 0–15", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 3000 }), fc.integer({ min: 0, max: 15 }), (offset, buffer) => {
        const date = plusDays("2028-01-03", offset);
        fc.pre(getISODay(parseISO(date)) <= 5);

        expect(dueDateFor([date], buffer, MONDAY_TO_FRIDAY)).toBe(oracle(date, buffer));
      }),
      { numRuns: 300, seed: 11 },
    );
  });

  it("feeds the planner: the schedule's due date makes a late ticket visible", () => {
    // Coat needed on shoot days 3 and 1 (Mon 9 Sep), buffer 2 → due Thu 5 Sep; 40 h of work from Mon 2 Sep at
    // 8 h/day finishes Fri 6 Sep, one working day late.
    const due = dueDateFor([shootDay[3], shootDay[1]], 2, MONDAY_TO_FRIDAY, MONDAY);
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 7,
      people: [{ id: "eve", name: "Eve Example", hoursPerWeekday: hours({ mon: 8, tue: 8, wed: 8, thu: 8, fri: 8 }), daysOff: [] }],
      tickets: [{ id: "coat", estimateHours: 40, dueDate: due }],
    });

    expect(plan.tickets[0]).toMatchObject({ dueDate: "2030-09-05", plannedFinish: "2030-09-06", lateness: 1, late: true });
  });

  it("rejects a negative or fractional buffer and malformed dates", () => {
    expect(() => dueDateFor([shootDay[1]], -1, MONDAY_TO_FRIDAY)).toThrow(RangeError);
    expect(() => dueDateFor([shootDay[1]], 1.5, MONDAY_TO_FRIDAY)).toThrow(RangeError);
    expect(() => dueDateFor(["9/9/2030"], 1, MONDAY_TO_FRIDAY)).toThrow(RangeError);
  });
});
