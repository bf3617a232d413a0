import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { garmentCost, groupCosts, hireWeeks, rentalWeeks, splitCents } from "../../shared/domain/reports/money.js";
import { daysOverdue, groupRentalsByVendor, wrapAction } from "../../shared/domain/reports/returns.js";
import type { RentalLineDto } from "../../shared/schemas/reports.js";

describe("hire weeks", () => {
  // Every started week is charged and a hire is at least one week (common practice for costume hire, no source).
  it.each([
    ["same day", "2030-09-01", "2030-09-01", 1],
    ["six days", "2030-09-01", "2030-09-07", 1],
    ["exactly a week", "2030-09-01", "2030-09-08", 1],
    ["a week and a day", "2030-09-01", "2030-09-09", 2],
    ["across a month end (29 days)", "2030-09-01", "2030-09-30", 5],
    ["across a year end (7 days)", "2030-12-28", "2031-01-04", 1],
    ["end before start", "2030-09-10", "2030-09-01", 1],
  ])("%s → %i", (_n, from, to, weeks) => {
    expect(hireWeeks(from, to)).toBe(weeks);
  });

  it("counts a hire from the production's start to the return, else the due date, else the production's end", () => {
    const period = { from: "2030-09-01", to: "2030-10-15" };
    const hire = { source: "rented" as const, costCents: 1000, rentalCostPerWeekCents: 4500 };

    expect(garmentCost({ ...hire, rentalDueOn: "2030-09-30", returnedOn: "2030-09-05" }, period)).toEqual({
      costCents: 1000,
      weeklyCents: 4500,
      weeks: 1,
      totalCents: 5500,
    });
    expect(garmentCost({ ...hire, rentalDueOn: "2030-09-30", returnedOn: null }, period).weeks).toBe(5);
    expect(garmentCost({ ...hire, rentalDueOn: null, returnedOn: null }, period).weeks).toBe(7);
    // Owned garments cost what they cost, whatever rate a form left behind.
    expect(
      garmentCost({ source: "bought", costCents: 18000, rentalCostPerWeekCents: 500, rentalDueOn: null, returnedOn: null }, period),
    ).toEqual({ costCents: 18000, weeklyCents: 0, weeks: 0, totalCents: 18000 });
  });
});

describe("splitting and grouping costs", () => {
  // Largest-remainder split of cents: common practice, no source; checked by its defining properties.
  it("splits cents into shares that add up exactly and differ by at most one cent", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 10_000_000 }), fc.integer({ min: 1, max: 12 }), (cents, n) => {
        const shares = splitCents(cents, n);
        expect(shares).toHaveLength(n);
        expect(shares.reduce((a, b) => a + b, 0)).toBe(cents);
        expect(Math.max(...shares) - Math.min(...shares)).toBeLessThanOrEqual(1);
      }),
    );
  });

  it("keeps every grouping's sum equal to the total, however garments are shared", () => {
    const garment = fc.record({
      totalCents: fc.integer({ min: 0, max: 1_000_000 }),
      groups: fc.uniqueArray(fc.constantFrom("a", "b", "c", "d"), { maxLength: 4 }),
    });
    fc.assert(
      fc.property(fc.array(garment, { maxLength: 30 }), (gs) => {
        const rows = groupCosts(gs, (g) => g.groups.map((k) => ({ key: k, label: k })), { key: "none", label: "none" });
        expect(rows.reduce((s, r) => s + r.cents, 0)).toBe(gs.reduce((s, g) => s + g.totalCents, 0));
        // Garment counts are shown to two decimals (a third is 0.33), so each row may be off by half a hundredth.
        expect(Math.abs(rows.reduce((s, r) => s + r.garments, 0) - gs.length)).toBeLessThanOrEqual(0.005 * rows.length + 1e-9);
      }),
    );
  });

  it("spreads rental cost over the weeks of the shoot so the weeks add up to rate × weeks", () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ weeklyCents: fc.integer({ min: 0, max: 100_000 }), weeks: fc.integer({ min: 0, max: 20 }) }), {
          maxLength: 20,
        }),
        (gs) => {
          const weeks = rentalWeeks(gs, "2030-09-02");
          expect(weeks.reduce((s, w) => s + w.cents, 0)).toBe(gs.reduce((s, g) => s + g.weeklyCents * g.weeks, 0));
          weeks.forEach((w, i) => expect(w.week).toBe(i + 1));
        },
      ),
    );
    expect(rentalWeeks([{ weeklyCents: 100, weeks: 2 }], "2030-12-30").map((w) => w.starts)).toEqual(["2030-12-30", "2031-01-06"]);
  });
});

describe("returns", () => {
  const line = (tagCode: string, vendor: string | null, dueOn: string | null, today = "2030-09-10"): RentalLineDto => {
    const d = daysOverdue(dueOn, today);
    return {
      garmentId: tagCode,
      tagCode,
      name: tagCode,
      category: "coat",
      vendor,
      status: "in_stock",
      location: null,
      dueOn,
      daysOverdue: d,
      overdue: d !== null && d > 0,
      weeklyCents: null,
      weeks: 0,
      hireCents: 0,
    };
  };

  it("puts hire houses with anything overdue first, and the most overdue first within a house", () => {
    const groups = groupRentalsByVendor([
      line("A-2", "Alder Hire", "2030-09-20"),
      line("B-1", "Birch Hire", "2030-09-09"),
      line("B-2", "Birch Hire", "2030-09-01"),
      line("B-3", "Birch Hire", null),
      line("X-1", null, "2030-09-12"),
    ]);

    expect(groups.map((g) => [g.vendor, g.overdue, g.lines.map((l) => l.tagCode)])).toEqual([
      ["Birch Hire", 2, ["B-2", "B-1", "B-3"]],
      ["Hire house not recorded", 0, ["X-1"]],
      ["Alder Hire", 0, ["A-2"]],
    ]);
  });

  it("counts days overdue from the due date (due today is not overdue)", () => {
    expect(daysOverdue("2030-09-10", "2030-09-10")).toBe(0);
    expect(daysOverdue("2030-09-08", "2030-09-10")).toBe(2);
    expect(daysOverdue("2030-10-01", "2030-09-10")).toBe(-21);
    expect(daysOverdue(null, "2030-09-10")).toBeNull();
  });

  it("sends every hire back at wrap and keeps or sells owned garments as decided", () => {
    expect(wrapAction("rented", "keep")).toBe("return");
    expect(wrapAction("built", "sell")).toBe("sell");
    expect(wrapAction("bought", "keep")).toBe("keep");
    expect(wrapAction("bought", null)).toBe("undecided");
  });
});
