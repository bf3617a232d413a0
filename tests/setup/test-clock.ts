/**
 * The instant the server and e2e suites pin the server's clock to (and seed the demo on), so no test
 * depends on the wall-clock date. `.ci/run` runs those suites a second time with another `TEST_CLOCK_AT`.
 * Default: a Wednesday, 09:00 UTC (09:00 in the demo's Europe/London zone).
 * Give `TEST_CLOCK_AT` as a date-time with its offset (e.g. `2028-03-26T09:00:00Z`).
 */
import { DEMO_TIME_ZONE } from "../../seeds/calendar.js";

export const TEST_CLOCK_AT = process.env.TEST_CLOCK_AT ?? "2026-12-02T09:00:00Z";

/** The calendar date of the pinned instant in the demo's zone (yyyy-MM-dd). */
export function testToday(): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone: DEMO_TIME_ZONE, year: "numeric", month: "2-digit", day: "2-digit" }).format(
    new Date(TEST_CLOCK_AT),
  );
}
