// Calendar-day arithmetic on YYYY-MM-DD strings, through date-fns: the one place the app adds days to a
// date or counts the days between two. Pure, no time zone: a calendar date has none.
import { addDays, differenceInCalendarDays, format, parseISO } from "date-fns";

/** `iso` plus `days` calendar days (negative goes back). */
export function addCalendarDays(iso: string, days: number): string {
  return format(addDays(parseISO(iso), days), "yyyy-MM-dd");
}

/** Whole calendar days from `a` to `b` (negative when `b` is earlier). */
export function calendarDaysBetween(a: string, b: string): number {
  return differenceInCalendarDays(parseISO(b), parseISO(a));
}
