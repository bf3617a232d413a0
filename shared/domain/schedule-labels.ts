// The words for a production's scheduled days: a film or series shoots on shoot days, a stage
// production plays performances. Every screen heading, filter, snag text and e-mail asks here, so a
// stage production never reads "shoot day".
import { formatDate } from "../format";

/** Production kinds as the schedule wording sees them. */
export type ScheduleKind = "film" | "series" | "stage";

/** The words for one production's scheduled days. */
export interface ScheduleLabels {
  /** "shoot day" / "performance" (lower case, singular). */
  day: string;
  /** "shoot days" / "performances". */
  days: string;
  /** "Shoot day" / "Performance" (start of a sentence, headings, filter labels). */
  Day: string;
  /** "Shoot days" / "Performances". */
  Days: string;
  /** "the next shoot day" / "the next performance". */
  next: string;
  /** "Next shoot day" / "Next performance". */
  Next: string;
  /** "No shoot days yet" / "No performances yet". */
  none: string;
  /** "shoot day Fri 4 Dec 2026" / "performance Fri 4 Dec 2026" from "2026-12-04" (a day named by its date, written by the one formatter). */
  on(date: string): string;
  /** "Day 3" / "Performance 3" (a day named by its number). */
  numbered(n: number): string;
  /** "the shoot" / "the performance" (what a garment must be ready for). */
  event: string;
}

const FILM: ScheduleLabels = {
  day: "shoot day",
  days: "shoot days",
  Day: "Shoot day",
  Days: "Shoot days",
  next: "the next shoot day",
  Next: "Next shoot day",
  none: "No shoot days yet",
  on: (date) => `shoot day ${formatDate(date)}`,
  numbered: (n) => `Day ${n}`,
  event: "the shoot",
};

const STAGE: ScheduleLabels = {
  day: "performance",
  days: "performances",
  Day: "Performance",
  Days: "Performances",
  next: "the next performance",
  Next: "Next performance",
  none: "No performances yet",
  on: (date) => `performance ${formatDate(date)}`,
  numbered: (n) => `Performance ${n}`,
  event: "the performance",
};

/**
 * The schedule words for a production kind (or a production-like object). Unknown or missing kinds
 * read as film, the app's default.
 */
export function scheduleLabels(kind: ScheduleKind | { kind?: string | null } | null | undefined): ScheduleLabels {
  const k = typeof kind === "string" ? kind : kind?.kind;
  return k === "stage" ? STAGE : FILM;
}
