import { afterEach, describe, expect, it } from "vitest";
import {
  calendarDateIn,
  formatDate,
  formatDateRange,
  formatDateTime,
  formatDateTimeWithZone,
  formatMonth,
  formatNumber,
  formatSignificant,
  formatTime,
  instantFromWallClock,
  instantFromZoned,
  wallClockOf,
} from "@shared/format";

const originalTz = process.env.TZ;
afterEach(() => {
  process.env.TZ = originalTz;
});

describe("calendar dates", () => {
  it("writes a date as weekday, day, month and year", () => {
    expect(formatDate("2026-12-03")).toBe("Thu 3 Dec 2026");
    expect(formatMonth("2026-12-03")).toBe("December 2026");
  });

  it("names the same weekday as the platform's ICU calendar for every day of 2026", () => {
    // Reference: Intl.DateTimeFormat (ICU), a general-purpose library outside the project.
    const icu = new Intl.DateTimeFormat("en-US", { weekday: "short", day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });
    for (let t = Date.UTC(2026, 0, 1); t < Date.UTC(2027, 0, 1); t += 86_400_000) {
      const iso = new Date(t).toISOString().slice(0, 10);
      const parts = Object.fromEntries(icu.formatToParts(new Date(t)).map((p) => [p.type, p.value]));
      expect(formatDate(iso)).toBe(`${parts.weekday} ${parts.day} ${parts.month} ${parts.year}`);
    }
  });

  it("writes a range with the shared month and year once", () => {
    expect(formatDateRange("2026-12-03", "2026-12-03")).toBe("Thu 3 Dec 2026");
    expect(formatDateRange("2026-12-01", "2026-12-06")).toBe("1 – 6 Dec 2026");
    expect(formatDateRange("2026-11-30", "2026-12-06")).toBe("30 Nov – 6 Dec 2026");
    expect(formatDateRange("2026-12-28", "2027-01-03")).toBe("28 Dec 2026 – 3 Jan 2027");
  });

  it("rejects a string that is not a date", () => {
    expect(() => formatDate("3/12/2026")).toThrow(RangeError);
  });
});

describe("instants in the production's time zone", () => {
  it("writes the wall clock of the zone, not of the machine", () => {
    process.env.TZ = "Asia/Tokyo";
    expect(formatDateTime("2026-12-03T09:30:00Z", "Europe/London")).toBe("Thu 3 Dec 2026, 09:30");
    expect(formatTime("2026-12-03T09:30:00Z", "America/New_York")).toBe("04:30");
    expect(calendarDateIn("2026-12-03T02:00:00Z", "America/Los_Angeles")).toBe("2026-12-02");
  });

  it("follows the EU summer-time change: last Sunday of March at 01:00 UTC", () => {
    // Directive 2000/84/EC, Art. 2: summer time begins at 1.00 a.m. GMT on the last Sunday in March (29 Mar 2026).
    expect(formatDateTimeWithZone("2026-03-29T00:30:00Z", "Europe/London")).toBe("Sun 29 Mar 2026, 00:30 GMT (Europe/London)");
    expect(formatDateTimeWithZone("2026-03-29T01:30:00Z", "Europe/London")).toBe("Sun 29 Mar 2026, 02:30 GMT+1 (Europe/London)");
  });

  it("follows the US change: second Sunday of March at 02:00 local", () => {
    // Energy Policy Act of 2005, §110 (15 U.S.C. §260a): DST begins the second Sunday of March (8 Mar 2026).
    expect(formatDateTimeWithZone("2026-03-08T06:30:00Z", "America/New_York")).toBe("Sun 8 Mar 2026, 01:30 EST (America/New_York)");
    expect(formatDateTimeWithZone("2026-03-08T07:30:00Z", "America/New_York")).toBe("Sun 8 Mar 2026, 03:30 EDT (America/New_York)");
  });

  it("turns a wall-clock date and time in a zone into the instant, whatever the machine's zone", () => {
    process.env.TZ = "Pacific/Auckland";
    expect(instantFromZoned("2026-12-03", "10:00", "Europe/Berlin")?.toISOString()).toBe("2026-12-03T09:00:00.000Z");
    expect(instantFromZoned("2026-07-03", "10:00", "Europe/Berlin")?.toISOString()).toBe("2026-07-03T08:00:00.000Z");
    expect(instantFromZoned("2026-12-3", "10:00", "Europe/Berlin")).toBeNull();
  });

  it("round-trips an instant through a calendar widget's wall-clock Date", () => {
    process.env.TZ = "Asia/Kolkata";
    const at = new Date("2026-12-03T15:45:00Z");
    const wall = wallClockOf(at, "America/Chicago");
    expect([wall.getHours(), wall.getMinutes(), wall.getDate()]).toEqual([9, 45, 3]);
    expect(instantFromWallClock(wall, "America/Chicago").toISOString()).toBe(at.toISOString());
  });
});

describe("numbers as people write them", () => {
  it("drops binary floating-point noise", () => {
    // IEEE 754 binary64: 0.1 + 0.2 = 0.30000000000000004; 2.64 is stored as 2.6399999999999997 after arithmetic.
    expect(formatNumber(0.1 + 0.2)).toBe("0.3");
    expect(formatNumber(2.6399999999999997)).toBe("2.64");
    expect(formatNumber(1.5)).toBe("1.5");
    expect(formatNumber(135)).toBe("135");
  });

  it("groups thousands and rounds half away from zero at the last place", () => {
    expect(formatNumber(12345.678)).toBe("12,345.68");
    expect(formatNumber(2.5, 0)).toBe("3");
    expect(formatNumber(-0.001)).toBe("0");
  });

  it("keeps significant digits for small physical values", () => {
    expect(formatSignificant(0.0000156906)).toBe("0.00001569");
    expect(formatSignificant(15.690644)).toBe("15.69");
  });
});
