import { describe, expect, it } from "vitest";
import { differenceInBusinessDays, parseISO } from "date-fns";
import { planTickets, type Weekday, type WorkroomPersonInput } from "@shared/domain/workroom";
import { overbookedRuns, taskSummary, workroomSnags, type WorkroomSnagTicket } from "@shared/domain/workroom-snags";

const MONDAY = "2030-09-02"; // invented planning day (a Monday)
const hours = (h: Partial<Record<Weekday, number>>): Record<Weekday, number> => ({
  mon: 0,
  tue: 0,
  wed: 0,
  thu: 0,
  fri: 0,
  sat: 0,
  sun: 0,
  ...h,
});
const ann: WorkroomPersonInput = {
  id: "ann",
  name: "Ann Example",
  hoursPerWeekday: hours({ mon: 8, tue: 8, wed: 8, thu: 8, fri: 8 }),
  daysOff: [],
};
const meta = (id: string, neededOn: string | null): WorkroomSnagTicket => ({
  id,
  garmentId: `g-${id}`,
  tagCode: `T-${id}`,
  garmentName: `Garment ${id}`,
  taskSummary: "take in",
  neededOn,
  neededShootDayIds: neededOn ? [`sd-${neededOn}`] : [],
});

// Hand-worked example (one person, 8 h Mon–Fri, EDD order A, B, C):
//   A 12 h due Mon, needed Tue → Mon 8 h + Tue 4 h, finishes Tue: 1 working day late, not ready on the shoot day.
//   B  4 h due Wed, needed Thu → Tue 4 h, finishes Tue: on time.
//   C 12 h due Wed, needed Fri (2-day buffer) → Wed 8 h + Thu 4 h, finishes Thu: late into the buffer only.
//   A and C are late, so Ann's days from their start to their due dates (Mon–Wed) are overbooked.
function handWorked() {
  const plan = planTickets({
    today: MONDAY,
    horizonDays: 7,
    people: [ann],
    tickets: [
      { id: "A", estimateHours: 12, dueDate: "2030-09-02" },
      { id: "B", estimateHours: 4, dueDate: "2030-09-04" },
      { id: "C", estimateHours: 12, dueDate: "2030-09-04" },
    ],
  });
  const tickets = [meta("A", "2030-09-03"), meta("B", "2030-09-05"), meta("C", "2030-09-06")];
  return { plan, tickets };
}

describe("workroomSnags — hand-worked example", () => {
  it("flags a late ticket that misses its shoot day as blocking and one late into its buffer as a warning", () => {
    const { plan, tickets } = handWorked();

    const snags = workroomSnags({ plan, tickets, people: [ann], bufferWorkingDays: 1 });

    const late = snags.filter((s) => s.kind === "workroom_late");
    expect(late.map((s) => [s.key, s.severity])).toEqual([
      ["workroom_late:A", "blocking"],
      ["workroom_late:C", "warning"],
    ]);
    // Lateness in working days, checked with date-fns differenceInBusinessDays (Mon–Fri) as the oracle.
    expect(late[0].evidence.lateness).toBe(differenceInBusinessDays(parseISO("2030-09-03"), parseISO("2030-09-02")));
    expect(late[1].evidence.lateness).toBe(differenceInBusinessDays(parseISO("2030-09-05"), parseISO("2030-09-04")));
    expect(late[0].explanation).toContain("finishes it on Tue 3 Sep 2030 with Ann Example, 1 working day late");
    expect(late[0].explanation).toContain("would not be ready for the shoot on Tue 3 Sep 2030");
    expect(late[1].explanation).toContain("without time for pressing");
    expect(late[0].subject).toEqual({ garmentId: "g-A", shootDayIds: ["sd-2030-09-03"] });
  });

  it("on a stage production the garment must be ready for the performance, not the shoot", () => {
    const { plan, tickets } = handWorked();

    const snags = workroomSnags({ plan, tickets, people: [ann], bufferWorkingDays: 1, scheduleKind: "stage" });

    const a = snags.find((s) => s.key === "workroom_late:A")!;
    expect(a.explanation).toContain("would not be ready for the performance on Tue 3 Sep 2030");
    expect(a.explanation).not.toContain("shoot");
  });

  it("groups Ann's overbooked Monday to Wednesday into one snag naming both late tickets", () => {
    const { plan, tickets } = handWorked();

    const snags = workroomSnags({ plan, tickets, people: [ann], bufferWorkingDays: 1 });

    const over = snags.filter((s) => s.kind === "workroom_overbooked");
    expect(over).toHaveLength(1);
    expect(over[0].key).toBe("workroom_overbooked:ann:2030-09-02");
    expect(over[0].evidence).toMatchObject({
      dates: ["2030-09-02", "2030-09-03", "2030-09-04"],
      capacityHours: 24,
      plannedHours: 24,
      lateTicketIds: ["A", "C"],
    });
    expect(over[0].explanation).toContain("24 h of 24 h booked from Mon 2 Sep 2030 to Wed 4 Sep 2030 (3 working days)");
  });

  it("a weekend inside an overbooked stretch does not split the run", () => {
    // 50 h due the second Monday: every working day Mon–Mon is full and the ticket is still late.
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 10,
      people: [ann],
      tickets: [{ id: "big", estimateHours: 50, dueDate: "2030-09-09" }],
    });

    const runs = overbookedRuns(plan);

    expect(runs).toHaveLength(1);
    expect(runs[0].days.map((d) => d.date)).toEqual(["2030-09-02", "2030-09-03", "2030-09-04", "2030-09-05", "2030-09-06", "2030-09-09"]);
  });

  it("a ticket that fits nowhere in the window is blocking and says how many hours do not fit", () => {
    const plan = planTickets({ today: MONDAY, horizonDays: 2, people: [ann], tickets: [{ id: "X", estimateHours: 30, dueDate: MONDAY }] });

    const [snag] = workroomSnags({ plan, tickets: [meta("X", "2030-09-03")], people: [ann], bufferWorkingDays: 1 }).filter(
      (s) => s.kind === "workroom_late",
    );

    expect(snag.severity).toBe("blocking");
    expect(snag.explanation).toContain("14 h of it do not fit"); // 30 h − 2 days × 8 h
  });

  it("keys and evidence hashes do not depend on input order, and change when the finish changes", () => {
    const { plan, tickets } = handWorked();
    const a = workroomSnags({ plan, tickets, people: [ann], bufferWorkingDays: 1 });
    const b = workroomSnags({
      plan: { ...plan, tickets: [...plan.tickets].reverse() },
      tickets: [...tickets].reverse(),
      people: [ann],
      bufferWorkingDays: 1,
    });
    const slower = planTickets({
      today: MONDAY,
      horizonDays: 7,
      people: [{ ...ann, hoursPerWeekday: hours({ mon: 5, tue: 5, wed: 5, thu: 5, fri: 5 }) }],
      tickets: [
        { id: "A", estimateHours: 12, dueDate: "2030-09-02" },
        { id: "B", estimateHours: 4, dueDate: "2030-09-04" },
        { id: "C", estimateHours: 12, dueDate: "2030-09-04" },
      ],
    });
    const c = workroomSnags({ plan: slower, tickets, people: [ann], bufferWorkingDays: 1 });

    expect(b.map((s) => [s.key, s.evidenceHash])).toEqual(a.map((s) => [s.key, s.evidenceHash]));
    expect(c.find((s) => s.key === "workroom_late:A")!.evidenceHash).not.toBe(a.find((s) => s.key === "workroom_late:A")!.evidenceHash);
  });

  it("an on-time plan has no snags", () => {
    const plan = planTickets({
      today: MONDAY,
      horizonDays: 5,
      people: [ann],
      tickets: [{ id: "ok", estimateHours: 6, dueDate: "2030-09-04" }],
    });

    expect(workroomSnags({ plan, tickets: [meta("ok", "2030-09-05")], people: [ann], bufferWorkingDays: 1 })).toEqual([]);
  });
});

describe("taskSummary", () => {
  it("writes amounts in the production's unit", () => {
    // 1 in = 25.4 mm exactly (international yard and pound, 1959).
    expect(
      taskSummary(
        [
          { kind: "take_in", amountMm: 20 },
          { kind: "shorten", amountMm: 25.4 },
        ],
        "in",
      ),
    ).toBe('take in 3/4", shorten 1"'); // 20 mm = 0.787 in → nearest 1/8 is 6/8 = 3/4
    expect(taskSummary([{ kind: "take_in", amountMm: 20 }], "cm")).toBe("take in 2.0 cm");
    expect(taskSummary([{ kind: "distress", distressStage: 2 }, { kind: "repair" }], "cm")).toBe("distress to stage 2, repair");
  });
});
