/**
 * The demo's calendar, anchored to the day it is seeded, so a newcomer's `npm start` always finds the
 * shoot under way: two shoot days done, today (or the next working day) shoot day 3, fifteen to come.
 *
 * Every date in the seeds is written relative to that anchor, never as a calendar date:
 * - shoot days are 18 consecutive working days (Mon–Fri) starting two working days before today;
 * - fittings, tickets, days off and rental returns are working days from today, or tied to a shoot day;
 * - records of the past (measurements, tests, history) are calendar days before today;
 * - the stage show plays Thursday to Saturday in three consecutive weeks, the first night within the last week.
 * So the same snags, lateness and distances from today appear whatever the date (`npm run seed -- --today
 * YYYY-MM-DD` pins it for reproducible screenshots and tests).
 */
import { addDays, format, getISODay, parseISO } from "date-fns";
import { zonedInstant } from "../server/lib/zoned-time.js";

/** The demo productions' time zone (set on both productions, so "today" and fitting times agree). */
export const DEMO_TIME_ZONE = "Europe/London";

/** How many working days of the shoot are done before today (today is shoot day DAYS_DONE + 1). */
const DAYS_DONE = 2;
/** Number of shoot days in the film demo. */
export const SHOOT_DAY_COUNT = 18;

let anchor: Date | null = null;

const iso = (d: Date) => format(d, "yyyy-MM-dd");
const isWorkday = (d: Date) => getISODay(d) <= 5;

/** Sets the day the demo is seeded on (yyyy-MM-dd). */
export function anchorDemo(today: string): void {
  const d = parseISO(today);
  if (Number.isNaN(d.getTime()) || iso(d) !== today) throw new Error(`The demo anchor must be a date like 2027-03-01, not "${today}"`);
  anchor = d;
}

function today(): Date {
  if (!anchor) throw new Error("The demo calendar is not anchored: call anchorDemo(today) before seeding");
  return anchor;
}

/** The anchor day itself. */
export function demoToday(): string {
  return iso(today());
}

/** A calendar day relative to today (negative = before). */
export function demoDaysFromToday(days: number): string {
  return iso(addDays(today(), days));
}

/**
 * A working day (Mon–Fri) counted from today: 0 is today when today is a working day, else the next one;
 * 1 the working day after that; −1 the working day before day 0.
 */
export function demoWorkday(n: number): string {
  let d = today();
  while (!isWorkday(d)) d = addDays(d, 1);
  const step = n < 0 ? -1 : 1;
  for (let left = Math.abs(n); left > 0;) {
    d = addDays(d, step);
    if (isWorkday(d)) left--;
  }
  return iso(d);
}

/** Dates of the film's shoot days, in order (index 0 = shoot day 1). */
export function shootDayDates(): string[] {
  return Array.from({ length: SHOOT_DAY_COUNT }, (_, i) => demoWorkday(i - DAYS_DONE));
}

/** The date of shoot day `n` (1-based). */
export function shootDay(n: number): string {
  const d = shootDayDates()[n - 1];
  if (!d) throw new Error(`The demo has no shoot day ${n}`);
  return d;
}

/**
 * Stage performances: Thursday and Friday evenings and two shows on Saturday, for three weeks, the first
 * night on the Thursday within the last seven days (so some shows are played and most are to come).
 */
export function performanceDates(): Array<{ date: string; time: string }> {
  let opening = addDays(today(), -6);
  while (getISODay(opening) !== 4) opening = addDays(opening, 1);
  const out: Array<{ date: string; time: string }> = [];
  for (let week = 0; week < 3; week++) {
    const thu = addDays(opening, week * 7);
    out.push(
      { date: iso(thu), time: "19:30" },
      { date: iso(addDays(thu, 1)), time: "19:30" },
      { date: iso(addDays(thu, 2)), time: "14:30" },
      { date: iso(addDays(thu, 2)), time: "19:30" },
    );
  }
  return out;
}

/** The instant of a local time ("HH:mm") on a demo date, in the demo's time zone. */
export function demoInstant(date: string, time: string): Date {
  return zonedInstant(date, time, DEMO_TIME_ZONE);
}

/** A date written relative to the anchor, for data tables declared before the anchor is known. */
export type DemoDate = { shootDay: number } | { workday: number } | { daysFromToday: number };

/** Resolves a relative demo date to yyyy-MM-dd. */
export function demoDate(spec: DemoDate): string {
  if ("shootDay" in spec) return shootDay(spec.shootDay);
  if ("workday" in spec) return demoWorkday(spec.workday);
  return demoDaysFromToday(spec.daysFromToday);
}
