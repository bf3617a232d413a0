// Returns and wrap: what goes back to the hire houses (overdue first), and what happens to
// everything else at wrap.
import type { RentalLineDto, VendorReturnsDto, WrapAction } from "../../schemas/reports.js";
import type { GarmentSource, WrapDisposition } from "../../schemas/garments.js";
import { calendarDaysBetween } from "../../calendar-days.js";

/** Days past due (positive = overdue) on `today`, or null without a due date. */
export function daysOverdue(dueOn: string | null, today: string): number | null {
  return dueOn ? calendarDaysBetween(dueOn, today) : null;
}

const byDue = (a: RentalLineDto, b: RentalLineDto): number =>
  Number(b.overdue) - Number(a.overdue) ||
  (a.overdue && b.overdue ? (b.daysOverdue ?? 0) - (a.daysOverdue ?? 0) : 0) ||
  (a.dueOn ?? "9999-12-31").localeCompare(b.dueOn ?? "9999-12-31") ||
  a.tagCode.localeCompare(b.tagCode);

/**
 * Groups rentals by hire house. Overdue lines come first (most overdue first), then by due date;
 * houses with anything overdue come first, then by their earliest due date.
 */
export function groupRentalsByVendor(lines: RentalLineDto[]): VendorReturnsDto[] {
  const groups = new Map<string, RentalLineDto[]>();
  for (const l of lines) {
    const v = l.vendor?.trim() || "Hire house not recorded";
    (groups.get(v) ?? groups.set(v, []).get(v)!).push(l);
  }
  const out = [...groups.entries()].map(([vendor, ls]) => {
    ls.sort(byDue);
    return { vendor, lines: ls, overdue: ls.filter((l) => l.overdue).length, hireCents: ls.reduce((s, l) => s + l.hireCents, 0) };
  });
  return out.sort(
    (a, b) =>
      Number(b.overdue > 0) - Number(a.overdue > 0) ||
      (a.lines[0]?.dueOn ?? "9999-12-31").localeCompare(b.lines[0]?.dueOn ?? "9999-12-31") ||
      a.vendor.localeCompare(b.vendor),
  );
}

/** At wrap: rented garments go back; owned ones are kept or sold as decided (or still to decide). */
export function wrapAction(source: GarmentSource, disposition: WrapDisposition | null): WrapAction {
  if (source === "rented") return "return";
  return disposition ?? "undecided";
}

export const wrapActionLabels: Record<WrapAction, string> = {
  return: "Return to hire house",
  keep: "Keep in stock",
  sell: "Sell",
  undecided: "Not decided",
};
