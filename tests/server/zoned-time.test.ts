import { describe, expect, it } from "vitest";
import { zonedInstant, zonedParts } from "../../server/lib/zoned-time.js";

describe("zoned time", () => {
  it("reads each zone's own wall clock, also when zones are read in turn", () => {
    // EU summer time begins at 01:00 UTC on the last Sunday of March (Directive 2000/84/EC, Art. 2):
    // 26 March 2028 in Europe/London.
    const before = new Date("2028-03-26T00:30:00Z");
    const after = new Date("2028-03-26T01:30:00Z");
    expect(zonedParts(before, "Europe/London")).toEqual({ date: "2028-03-26", hour: 0, minute: 30 });
    // The same instant in New York (UTC−4 in late March, daylight time since 12 March 2028) is the evening before.
    expect(zonedParts(before, "America/New_York")).toEqual({ date: "2028-03-25", hour: 20, minute: 30 });
    expect(zonedParts(after, "Europe/London")).toEqual({ date: "2028-03-26", hour: 2, minute: 30 });
    expect(zonedParts(after, "Asia/Kolkata")).toEqual({ date: "2028-03-26", hour: 7, minute: 0 });
  });

  it("finds the first instant of a repeated hour, and moves a time in a skipped hour forward", () => {
    // US daylight time ends at 2:00 local on the first Sunday of November (Energy Policy Act of 2005,
    // §110): 7 November 2027, so 01:30 in New York happens at 05:30 UTC (EDT) and again at 06:30 UTC (EST).
    expect(zonedInstant("2027-11-07", "01:30", "America/New_York").toISOString()).toBe("2027-11-07T05:30:00.000Z");
    // 01:30 on 26 March 2028 does not exist in London (Directive 2000/84/EC): it is read as 02:30 BST.
    expect(zonedInstant("2028-03-26", "01:30", "Europe/London").toISOString()).toBe("2028-03-26T01:30:00.000Z");
    expect(zonedInstant("2027-07-01", "09:00", "Europe/London").toISOString()).toBe("2027-07-01T08:00:00.000Z");
  });

  it("refuses an unknown zone every time, not only the first", () => {
    expect(() => zonedParts(new Date(0), "Mars/Olympus_Mons")).toThrow(RangeError);
    expect(() => zonedParts(new Date(0), "Mars/Olympus_Mons")).toThrow(RangeError);
  });
});
