/**
 * The server's one clock. Business dates ("today" for the shoot, due dates, the workroom plan, the
 * next shoot day) come from here, never from `new Date()` in a service, so tests and reproducible
 * demos can set the date. Security timers (sessions, reset links, throttles) keep the real time.
 *
 * `CLOCK_AT` (an ISO date or date-time) starts the clock at that instant; time then runs on from it,
 * so "now" still advances while a pinned server runs. Tests may freeze it with `clock.set(…, { frozen: true })`.
 */
import { config } from "../config.js";
import { zonedParts } from "./zoned-time.js";

/** Milliseconds added to the real time (0 = wall clock). */
let offsetMs = 0;
/** A frozen instant, when a test holds time still. */
let frozenAt: Date | null = null;

function parseInstant(at: string | Date): Date {
  if (at instanceof Date) return new Date(at.getTime());
  // A bare date means noon UTC: the same calendar date in every zone from UTC−11 to UTC+11.
  const d = new Date(/^\d{4}-\d{2}-\d{2}$/.test(at) ? `${at}T12:00:00Z` : at);
  if (Number.isNaN(d.getTime())) throw new Error(`Not a date or date-time: "${at}"`);
  return d;
}

/** Resets to the configured start (`CLOCK_AT`) or to the wall clock. */
function reset(): void {
  frozenAt = null;
  offsetMs = config.CLOCK_AT ? parseInstant(config.CLOCK_AT).getTime() - Date.now() : 0;
}

export const clock = {
  /** The current instant. */
  now(): Date {
    return frozenAt ? new Date(frozenAt.getTime()) : new Date(Date.now() + offsetMs);
  },
  /** Today's calendar date (yyyy-MM-dd) in a time zone (default: the server's configured zone). */
  today(timeZone: string = config.TIME_ZONE): string {
    return zonedParts(clock.now(), timeZone).date;
  },
  /**
   * Sets the clock (tests, reproducible demos). A bare date means noon UTC of that day.
   * @param options.frozen hold time still instead of letting it run on
   */
  set(at: string | Date, options: { frozen?: boolean } = {}): void {
    const d = parseInstant(at);
    if (options.frozen) {
      frozenAt = d;
      offsetMs = 0;
    } else {
      frozenAt = null;
      offsetMs = d.getTime() - Date.now();
    }
  },
  /** Back to `CLOCK_AT` (when configured) or the wall clock. */
  reset,
};

reset();

/** The production's time zone: its own setting, else the server's configured zone. */
export function productionTimeZone(production: { settings?: { timeZone?: string } | null }): string {
  return production.settings?.timeZone ?? config.TIME_ZONE;
}

/** Today's date in the production's time zone. */
export function productionToday(production: { settings?: { timeZone?: string } | null }): string {
  return clock.today(productionTimeZone(production));
}
