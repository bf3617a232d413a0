import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { breakdownToCsv, parseBreakdownCsv } from "@shared/domain/breakdown-csv";

const header = "scene,set,int_ext,time_of_day,story_day,story_order,pages,running_minutes,synopsis,shoot_day,shoot_date,shoot_position";

describe("parseBreakdownCsv", () => {
  it("reads scenes, shoot days and a scene shot on two days", () => {
    const csv = [header, `1,Harbour wall,EXT,DAY,1,1,1 3/8,,"Boats come in, late",1,2026-11-30,2`, "2,Chapel,INT,NIGHT,1,2,4/8,,,1,2026-11-30,1", "2,,,,,,,,,2,2026-12-01,1"].join("\n");

    const r = parseBreakdownCsv(csv);

    expect(r.errors).toEqual([]);
    expect(r.rows).toBe(3);
    expect(r.scenes.map((s) => [s.number, s.lengthEighths, s.synopsis])).toEqual([
      ["1", 11, "Boats come in, late"],
      ["2", 4, null],
    ]);
    expect(r.shootDays).toEqual([
      { dayNumber: 1, date: "2026-11-30", scenes: [{ number: "2", position: 1 }, { number: "1", position: 2 }] },
      { dayNumber: 2, date: "2026-12-01", scenes: [{ number: "2", position: 1 }] },
    ]);
  });

  it("reports every bad cell with its line and column", () => {
    const csv = [header, "1,Quay,OUTSIDE,DAY,1,,1 3/8,,,,,", "1B?,Quay,EXT,DAY,x,,,,,,,", "3,Quay,EXT,DAY,2,,1/4,,,1,2026-02-30,", "4,Quay,EXT,DAY,2,,,,,,,"].join("\n");

    const r = parseBreakdownCsv(csv);

    expect(r.errors).toEqual([
      { line: 2, column: "int_ext", message: expect.any(String) },
      { line: 3, column: "scene", message: expect.any(String) },
      { line: 4, column: "pages", message: expect.any(String) },
      { line: 4, column: "shoot_date", message: expect.any(String) },
    ]);
  });

  it("refuses one shoot day with two dates and a date used by two days", () => {
    const csv = [header, "1,,,,,,,,,1,2026-11-30,", "2,,,,,,,,,1,2026-12-01,", "3,,,,,,,,,2,2026-11-30,"].join("\n");

    const lines = parseBreakdownCsv(csv).errors.map((e) => [e.line, e.column]);

    expect(lines).toEqual([
      [3, "shoot_date"],
      [4, "shoot_date"],
    ]);
  });

  it("refuses a file without a scene column", () => {
    expect(parseBreakdownCsv("set,int_ext\nQuay,EXT\n").errors[0]).toMatchObject({ line: 1, column: "scene" });
  });
});

describe("breakdownToCsv", () => {
  it("round-trips through the parser, and papaparse reads the same cells", () => {
    const scenes = [
      { number: "2", setName: "Chapel, vestry", intExt: "INT", timeOfDay: "NIGHT", storyDay: 1, storyOrder: 2, lengthEighths: 4, runningMinutes: null, synopsis: 'He says "no"' },
      { number: "1", setName: "Harbour wall", intExt: "EXT", timeOfDay: "DAY", storyDay: 1, storyOrder: 1, lengthEighths: 11, runningMinutes: null, synopsis: null },
    ];
    const days = [
      { dayNumber: 1, date: "2026-11-30", scenes: [{ number: "2", position: 1 }, { number: "1", position: 2 }] },
      { dayNumber: 2, date: "2026-12-01", scenes: [{ number: "2", position: 1 }] },
    ];

    const csv = breakdownToCsv(scenes, days);
    const back = parseBreakdownCsv(csv);
    // Independent reader: papaparse without our checks.
    const raw = Papa.parse<string[]>(csv.trim()).data;

    expect(back.errors).toEqual([]);
    expect(back.shootDays).toEqual(days);
    expect(back.scenes.map(({ line: _l, ...s }) => s)).toEqual([scenes[1], scenes[0]].map((s) => ({ ...s, storyOrder: s.storyOrder })));
    expect(raw[2]![1]).toBe("Chapel, vestry");
    expect(raw[2]![8]).toBe('He says "no"');
    expect(breakdownToCsv(back.scenes.map((s) => ({ ...s, storyOrder: s.storyOrder ?? 0 })), back.shootDays)).toBe(csv);
  });
});
