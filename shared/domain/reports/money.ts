// Costs for the budget and the returns list. Amounts are integer cents of the production's currency.
import { addCalendarDays, calendarDaysBetween } from "../../calendar-days.js";

/**
 * Weeks charged for a hire from `from` to `to`: every started week counts, and a hire is at least
 * one week (common practice for costume hire, no source).
 */
export function hireWeeks(from: string, to: string): number {
  const days = calendarDaysBetween(from, to);
  return Math.max(1, Math.ceil(days / 7));
}

/** What a garment comes to in the budget. */
export interface GarmentCostFacts {
  source: "built" | "bought" | "rented";
  costCents: number | null;
  rentalCostPerWeekCents: number | null;
  rentalDueOn: string | null;
  /** The day a rented garment went back early (its status history), if it has. */
  returnedOn: string | null;
}

/** The hire period rentals are counted over, when the garment names no dates of its own. */
export interface HirePeriod {
  from: string | null;
  to: string | null;
}

/** Start and end of one garment's hire: the production's period, ended early by a return or the due date. */
export function hireSpan(g: GarmentCostFacts, period: HirePeriod): { from: string; to: string } | null {
  if (g.source !== "rented" || !period.from) return null;
  const to = g.returnedOn ?? g.rentalDueOn ?? period.to ?? period.from;
  return { from: period.from, to: to < period.from ? period.from : to };
}

/** Cost of one garment: its flat cost plus, for a hire, the weekly rate for every week hired. */
export function garmentCost(
  g: GarmentCostFacts,
  period: HirePeriod,
): { costCents: number; weeklyCents: number; weeks: number; totalCents: number } {
  const costCents = g.costCents ?? 0;
  const span = hireSpan(g, period);
  const weeklyCents = g.source === "rented" ? (g.rentalCostPerWeekCents ?? 0) : 0;
  const weeks = span && weeklyCents > 0 ? hireWeeks(span.from, span.to) : 0;
  return { costCents, weeklyCents, weeks, totalCents: costCents + weeklyCents * weeks };
}

/**
 * Splits `cents` into `n` integer shares that add up exactly (largest remainder: the first
 * `cents mod n` shares get one cent more).
 */
export function splitCents(cents: number, n: number): number[] {
  if (n <= 0) return [];
  const base = Math.floor(cents / n);
  const extra = cents - base * n;
  return Array.from({ length: n }, (_, i) => base + (i < extra ? 1 : 0));
}

/** A garment's cost share in one group of a grouping. */
export interface CostShare {
  key: string;
  label: string;
}

/**
 * Sums garment costs into groups. A garment in several groups (shared by characters or changes) is
 * split evenly, so every grouping adds up to the same total.
 * @param groupsOf the groups a garment belongs to (empty = the `none` group)
 */
export function groupCosts<G extends { totalCents: number }>(
  garments: G[],
  groupsOf: (g: G) => CostShare[],
  none: CostShare,
): Array<{ key: string; label: string; cents: number; garments: number }> {
  const rows = new Map<string, { key: string; label: string; cents: number; garments: number }>();
  for (const g of garments) {
    const groups = groupsOf(g);
    const list = groups.length ? groups : [none];
    const shares = splitCents(g.totalCents, list.length);
    list.forEach((grp, i) => {
      const row = rows.get(grp.key) ?? rows.set(grp.key, { key: grp.key, label: grp.label, cents: 0, garments: 0 }).get(grp.key)!;
      row.cents += shares[i]!;
      row.garments += 1 / list.length;
    });
  }
  return [...rows.values()]
    .map((r) => ({ ...r, garments: Math.round(r.garments * 100) / 100 }))
    .sort((a, b) => b.cents - a.cents || a.label.localeCompare(b.label));
}

/**
 * Rental cost per week over the shoot: week 1 starts on the first hire day; each week sums the weekly
 * rates of the garments on hire in it (a hire of w weeks counts in weeks 1..w).
 */
export function rentalWeeks(
  garments: Array<{ weeklyCents: number; weeks: number }>,
  from: string | null,
): Array<{ week: number; starts: string; cents: number; garments: number }> {
  if (!from) return [];
  const last = garments.reduce((m, g) => (g.weeklyCents > 0 ? Math.max(m, g.weeks) : m), 0);
  return Array.from({ length: last }, (_, i) => {
    const on = garments.filter((g) => g.weeklyCents > 0 && g.weeks > i);
    return { week: i + 1, starts: addCalendarDays(from, i * 7), cents: on.reduce((s, g) => s + g.weeklyCents, 0), garments: on.length };
  });
}

/** Cents as a plain number of currency units (for spreadsheets: 12345 → 123.45). */
export function centsToUnits(cents: number): number {
  return Math.round(cents) / 100;
}
