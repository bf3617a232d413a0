// The one way Seamscene writes dates, times and numbers, on screens and in e-mails. Calendar dates
// (YYYY-MM-DD) are written as they are; instants are written in the production's time zone, never the
// browser's or the server's. Pure: date-fns and @date-fns/tz, no I/O.
import { format, isValid, parseISO } from "date-fns";
import { TZDate, tzName } from "@date-fns/tz";

/** A calendar date (YYYY-MM-DD) or a Date standing for one (its local fields are read). */
export type CalendarDay = string | Date;
/** An instant: an ISO 8601 date-time string with offset, or a Date. */
export type Instant = string | Date;

const DATE = "EEE d MMM yyyy";
const TIME = "HH:mm";

function day(d: CalendarDay): Date {
  const out = typeof d === "string" ? parseISO(d) : d;
  if (!isValid(out)) throw new RangeError(`Not a calendar date: "${String(d)}"`);
  return out;
}

function zoned(at: Instant, timeZone: string): TZDate {
  const ms = typeof at === "string" ? Date.parse(at) : at.getTime();
  if (Number.isNaN(ms)) throw new RangeError(`Not an instant: "${String(at)}"`);
  return new TZDate(ms, timeZone);
}

/** "Thu 3 Dec 2026" from a calendar date. */
export function formatDate(d: CalendarDay): string {
  return format(day(d), DATE);
}

/** "Thu 3 Dec" (no year), for places where the year is plain from the context (a week's columns). */
export function formatDayShort(d: CalendarDay): string {
  return format(day(d), "EEE d MMM");
}

/** "December 2026". */
export function formatMonth(d: CalendarDay): string {
  return format(day(d), "MMMM yyyy");
}

/**
 * A span of calendar days, with the shared parts written once:
 * "Thu 3 Dec 2026" (one day), "30 Nov – 6 Dec 2026", "28 Dec 2026 – 3 Jan 2027".
 */
export function formatDateRange(start: CalendarDay, end: CalendarDay): string {
  const a = day(start);
  const b = day(end);
  if (format(a, "yyyy-MM-dd") === format(b, "yyyy-MM-dd")) return formatDate(a);
  if (a.getFullYear() !== b.getFullYear()) return `${format(a, "d MMM yyyy")} – ${format(b, "d MMM yyyy")}`;
  if (a.getMonth() !== b.getMonth()) return `${format(a, "d MMM")} – ${format(b, "d MMM yyyy")}`;
  return `${format(a, "d")} – ${format(b, "d MMM yyyy")}`;
}

/** "2026-12-03": the ISO calendar date of a Date's own (local) fields, for addresses and inputs, not for reading. */
export function isoDateOf(d: Date): string {
  return format(d, "yyyy-MM-dd");
}

/** "14:30" from a Date's own (local) fields: for wall-clock Dates made by `wallClockOf`. */
export function formatWallTime(d: Date): string {
  return format(d, TIME);
}

/** "Mon 30": weekday and day of the month, for calendar columns under a heading that gives month and year. */
export function formatWeekdayDay(d: CalendarDay): string {
  return format(day(d), "EEE d");
}

/** "Mon" (weekday) of a calendar date. */
export function formatWeekday(d: CalendarDay): string {
  return format(day(d), "EEE");
}

/** The calendar date (YYYY-MM-DD) of an instant in a time zone. */
export function calendarDateIn(at: Instant, timeZone: string): string {
  return format(zoned(at, timeZone), "yyyy-MM-dd");
}

/** "07:00" from a stored time of day ("07:00:00" or "07:00"), such as a shoot day's call time. */
export function formatClockTime(t: string): string {
  const m = /^(\d{1,2}):(\d{2})/.exec(t);
  return m ? `${m[1]!.padStart(2, "0")}:${m[2]}` : t;
}

/** "Thu 3 Dec 2026": the calendar date of an instant in a time zone (when it happened, without the time). */
export function formatDateOf(at: Instant, timeZone: string): string {
  return formatDate(calendarDateIn(at, timeZone));
}

/** "14:30": the wall-clock time of an instant in a time zone (24-hour). */
export function formatTime(at: Instant, timeZone: string): string {
  return format(zoned(at, timeZone), TIME);
}

/** "Thu 3 Dec 2026, 14:30": an instant in a time zone. */
export function formatDateTime(at: Instant, timeZone: string): string {
  return format(zoned(at, timeZone), `${DATE}, ${TIME}`);
}

/** The zone's short name at that instant as people read it ("GMT", "BST", "CET", "GMT-5"). */
export function zoneAbbreviation(at: Instant, timeZone: string): string {
  return tzName(timeZone, zoned(at, timeZone), "short");
}

/**
 * "Thu 3 Dec 2026, 14:30 GMT (Europe/London)": an instant with its zone named, for anything sent to
 * someone who may read it elsewhere (invitations, reminders).
 */
export function formatDateTimeWithZone(at: Instant, timeZone: string): string {
  return `${formatDateTime(at, timeZone)} ${zoneAbbreviation(at, timeZone)} (${timeZone})`;
}

/** "14:30 GMT": a time of day with its zone named. */
export function formatTimeWithZone(at: Instant, timeZone: string): string {
  return `${formatTime(at, timeZone)} ${zoneAbbreviation(at, timeZone)}`;
}

/**
 * The instant at which a wall clock in `timeZone` reads `date` `time` (what someone means by "10:00 on
 * 3 Dec" in the department's zone). Returns null for malformed input.
 */
export function instantFromZoned(date: string, time: string, timeZone: string): Date | null {
  const dm = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  const tm = /^(\d{2}):(\d{2})$/.exec(time);
  if (!dm || !tm) return null;
  const t = new TZDate(Number(dm[1]), Number(dm[2]) - 1, Number(dm[3]), Number(tm[1]), Number(tm[2]), timeZone);
  return Number.isNaN(t.getTime()) ? null : new Date(t.getTime());
}

/**
 * A plain Date whose local fields show the wall clock of `at` in `timeZone`: what a calendar widget that
 * works in the device's zone needs to draw the department's times. Pair with `instantFromWallClock`.
 */
export function wallClockOf(at: Instant, timeZone: string): Date {
  const z = zoned(at, timeZone);
  return new Date(z.getFullYear(), z.getMonth(), z.getDate(), z.getHours(), z.getMinutes(), z.getSeconds());
}

/** The instant meant by a wall-clock Date (local fields) read in `timeZone`; inverse of `wallClockOf`. */
export function instantFromWallClock(wall: Date, timeZone: string): Date {
  const t = new TZDate(
    wall.getFullYear(),
    wall.getMonth(),
    wall.getDate(),
    wall.getHours(),
    wall.getMinutes(),
    wall.getSeconds(),
    timeZone,
  );
  return new Date(t.getTime());
}

/** "Mon 30 Nov, 10:00 – 11:00" style range of two instants on one day, else both in full. */
export function formatTimeRange(start: Instant, end: Instant, timeZone: string): string {
  return calendarDateIn(start, timeZone) === calendarDateIn(end, timeZone)
    ? `${formatTime(start, timeZone)} – ${formatTime(end, timeZone)}`
    : `${formatDateTime(start, timeZone)} – ${formatDateTime(end, timeZone)}`;
}

const numberFormats = new Map<string, Intl.NumberFormat>();
function numberFormat(key: string, options: Intl.NumberFormatOptions): Intl.NumberFormat {
  let f = numberFormats.get(key);
  if (!f) numberFormats.set(key, (f = new Intl.NumberFormat("en-GB", options)));
  return f;
}

/**
 * A number as people write it: rounded to at most `maxDecimals` places, no trailing zeros, thousands
 * grouped ("2.64", "1,250", "0.5"). Binary floating-point noise (2.6399999999999997) disappears.
 */
export function formatNumber(x: number, maxDecimals = 2): string {
  if (!Number.isFinite(x)) return "—";
  const s = numberFormat(`d${maxDecimals}`, { maximumFractionDigits: maxDecimals, useGrouping: true }).format(x);
  return s === "-0" ? "0" : s;
}

/** A number to `digits` significant digits, as people write it ("0.01234", "152.3", "12,350"). */
export function formatSignificant(x: number, digits = 4): string {
  if (!Number.isFinite(x)) return "—";
  return numberFormat(`s${digits}`, { maximumSignificantDigits: digits, useGrouping: true }).format(x);
}

/** "2.5 h", "1 h". */
export function formatHours(h: number): string {
  return `${formatNumber(h, 2)} h`;
}
