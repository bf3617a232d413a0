import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { addCalendarDays, calendarDaysBetween } from "@shared/calendar-days";

// Julian Day Number of a Gregorian date, by integer arithmetic alone: H. F. Fliegel and T. C. Van Flandern,
// "A machine algorithm for processing calendar dates", Communications of the ACM 11(10):657 (1968).
function julianDay(iso: string): number {
  const [y, m, d] = iso.split("-").map(Number) as [number, number, number];
  const t = Math.trunc;
  const a = t((m - 14) / 12);
  return t((1461 * (y + 4800 + a)) / 4) + t((367 * (m - 2 - 12 * a)) / 12) - t((3 * t((y + 4900 + a) / 100)) / 4) + d - 32075;
}

const day = fc
  .date({ min: new Date("1950-01-01T00:00:00Z"), max: new Date("2150-12-31T00:00:00Z"), noInvalidDate: true })
  .map((d) => d.toISOString().slice(0, 10));

describe("calendar days", () => {
  it("the oracle gives the published Julian Day of 1 January 2000 (2451545, noon epoch)", () => {
    // The Astronomical Almanac: J2000.0 = JD 2451545.0, 2000-01-01 12:00 TT.
    expect(julianDay("2000-01-01")).toBe(2451545);
  });

  it("counts days as the Julian Day difference, across leap days, year ends and daylight-saving changes", () => {
    expect(calendarDaysBetween("2028-02-28", "2028-03-01")).toBe(2); // 2028 is a leap year
    expect(calendarDaysBetween("2100-02-28", "2100-03-01")).toBe(1); // 2100 is not (Gregorian rule)
    expect(calendarDaysBetween("2026-03-28", "2026-03-30")).toBe(2); // clocks go forward in Europe on 29 March 2026
    expect(calendarDaysBetween("2026-12-31", "2026-12-01")).toBe(-30);
    fc.assert(fc.property(day, day, (a, b) => calendarDaysBetween(a, b) === julianDay(b) - julianDay(a)));
  });

  it("adds days so that the Julian Day moves by exactly that many", () => {
    expect(addCalendarDays("2028-02-28", 1)).toBe("2028-02-29");
    expect(addCalendarDays("2027-03-01", -1)).toBe("2027-02-28");
    fc.assert(fc.property(day, fc.integer({ min: -4000, max: 4000 }), (a, n) => julianDay(addCalendarDays(a, n)) - julianDay(a) === n));
  });
});
