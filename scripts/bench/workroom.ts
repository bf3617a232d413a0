// Benchmark for the workroom planner: one full plan of 600 tickets for 8 people over 90 shoot days, against a
// naive approach that re-plans from scratch after each ticket is added. Prints figures; asserts nothing.
import { pathToFileURL } from "node:url";
import { performance } from "node:perf_hooks";
import fc from "fast-check";
import { addDays, format, getISODay, parseISO } from "date-fns";
import {
  dueDateFor,
  MONDAY_TO_FRIDAY,
  planTickets,
  type PlanInput,
  type PlanResult,
  type WorkroomTicketInput,
} from "@shared/domain/workroom";

/** Figures from one benchmark run. */
export interface WorkroomBenchResult {
  tickets: number;
  people: number;
  shootDays: number;
  horizonDays: number;
  /** Median wall time of one full plan, ms. */
  planMs: number;
  /** Wall time of the naive approach (n plans with growing input), ms. */
  naiveMs: number;
  /** naiveMs / planMs. */
  ratio: number;
  lateCount: number;
  maxLateness: number | null;
  overbookedDays: number;
}

const TODAY = "2031-03-03"; // a Monday; invented production dates
const SEED = 20310303;

/** Builds a seeded, invented workroom: shoot days Mon–Sat, tickets due from garments' needed shoot days. */
function buildInput(ticketCount: number, peopleCount: number, shootDayCount: number): PlanInput {
  const shootDays: string[] = [];
  for (let i = 0; shootDays.length < shootDayCount; i++) {
    const d = addDays(parseISO(TODAY), i + 7); // shooting starts a week after planning starts
    if (getISODay(d) !== 7) shootDays.push(format(d, "yyyy-MM-dd"));
  }
  const horizonDays = shootDays.length + Math.ceil(shootDays.length / 6) + 7;

  const personArb = fc.record({
    hours: fc.constantFrom(6, 7, 8, 8, 8, 10),
    saturday: fc.constantFrom(0, 0, 4),
    offDays: fc.uniqueArray(fc.integer({ min: 0, max: horizonDays - 1 }), { maxLength: 8 }),
  });
  const ticketArb = fc.record({
    quarterHours: fc.integer({ min: 2, max: 32 }), // 0.5 h to 8 h
    needed: fc.uniqueArray(fc.integer({ min: 0, max: shootDayCount - 1 }), { minLength: 1, maxLength: 3 }),
    buffer: fc.integer({ min: 1, max: 3 }),
    pinned: fc.integer({ min: 0, max: 9 }), // ~1 in 5 pinned
    raisedDay: fc.integer({ min: -30, max: 0 }), // raised at a fitting before planning day
  });
  const [peopleRaw] = fc.sample(fc.array(personArb, { minLength: peopleCount, maxLength: peopleCount }), { seed: SEED, numRuns: 1 });
  const [ticketsRaw] = fc.sample(fc.array(ticketArb, { minLength: ticketCount, maxLength: ticketCount }), { seed: SEED + 1, numRuns: 1 });

  const people = peopleRaw.map((p, i) => ({
    id: `person-${i + 1}`,
    name: `Stitcher ${i + 1}`,
    hoursPerWeekday: { mon: p.hours, tue: p.hours, wed: p.hours, thu: p.hours, fri: p.hours, sat: p.saturday, sun: 0 },
    daysOff: p.offDays.map((d) => format(addDays(parseISO(TODAY), d), "yyyy-MM-dd")),
  }));
  const tickets: WorkroomTicketInput[] = ticketsRaw.map((t, i) => {
    const raisedOn = format(addDays(parseISO(TODAY), t.raisedDay), "yyyy-MM-dd");
    return {
      id: `ticket-${String(i + 1).padStart(4, "0")}`,
      estimateHours: t.quarterHours / 4,
      dueDate: dueDateFor(
        t.needed.map((k) => shootDays[k]),
        t.buffer,
        MONDAY_TO_FRIDAY,
        TODAY,
      ),
      assigneeId: t.pinned < 2 ? people[t.pinned * 4 + (i % 4)].id : null,
      raisedOn,
    };
  });
  return { today: TODAY, horizonDays, tickets, people };
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

/** Runs the benchmark, prints its figures and returns them. */
export function runWorkroomBench(
  options: { tickets?: number; people?: number; shootDays?: number; repeats?: number } = {},
): WorkroomBenchResult {
  const ticketCount = options.tickets ?? 600;
  const peopleCount = options.people ?? 8;
  const shootDayCount = options.shootDays ?? 90;
  const repeats = options.repeats ?? 30;
  const input = buildInput(ticketCount, peopleCount, shootDayCount);

  // Warm-up so the timed runs measure compiled code rather than JIT start-up.
  for (let w = 0; w < 10; w++) planTickets(input);
  const times: number[] = [];
  let result: PlanResult | undefined;
  for (let r = 0; r < repeats; r++) {
    const t0 = performance.now();
    result = planTickets(input);
    times.push(performance.now() - t0);
  }
  const planMs = median(times);

  // Naive: re-plan everything from scratch each time one more ticket arrives.
  const t0 = performance.now();
  for (let k = 1; k <= input.tickets.length; k++) planTickets({ ...input, tickets: input.tickets.slice(0, k) });
  const naiveMs = performance.now() - t0;

  const figures: WorkroomBenchResult = {
    tickets: ticketCount,
    people: peopleCount,
    shootDays: shootDayCount,
    horizonDays: input.horizonDays,
    planMs,
    naiveMs,
    ratio: naiveMs / planMs,
    lateCount: result!.summary.lateCount,
    maxLateness: result!.summary.maxLateness,
    overbookedDays: result!.overbookedDays.length,
  };
  console.log(
    `workroom: ${ticketCount} tickets × ${peopleCount} people × ${shootDayCount} shoot days (${input.horizonDays}-day horizon)\n` +
      `  one plan (median of ${repeats}): ${planMs.toFixed(2)} ms\n` +
      `  naive re-plan after each ticket (${ticketCount} plans): ${naiveMs.toFixed(0)} ms\n` +
      `  ratio naive / one plan: ${figures.ratio.toFixed(0)}×\n` +
      `  late tickets: ${figures.lateCount}, max lateness: ${figures.maxLateness} working days, overbooked person-days: ${figures.overbookedDays}`,
  );
  return figures;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) runWorkroomBench();
