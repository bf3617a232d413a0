import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import {
  breakdownTemplateCsv,
  breakdownToCsv,
  mergeDayOrder,
  parseBreakdownCsv,
  planBreakdownImport,
  type SceneValues,
} from "@shared/domain/breakdown-csv";

const header = "scene,set,int_ext,time_of_day,story_day,story_order,pages,running_minutes,synopsis,shoot_day,shoot_date,shoot_position";

describe("parseBreakdownCsv", () => {
  it("reads scenes, shoot days and a scene shot on two days", () => {
    const csv = [
      header,
      `1,Harbour wall,EXT,DAY,1,1,1 3/8,,"Boats come in, late",1,2026-11-30,2`,
      "2,Chapel,INT,NIGHT,1,2,4/8,,,1,2026-11-30,1",
      "2,,,,,,,,,2,2026-12-01,1",
    ].join("\n");

    const r = parseBreakdownCsv(csv);

    expect(r.errors).toEqual([]);
    expect(r.rows).toBe(3);
    expect(r.scenes.map((s) => [s.number, s.fields.lengthEighths, s.fields.synopsis])).toEqual([
      ["1", 11, "Boats come in, late"],
      ["2", 4, undefined],
    ]);
    expect(r.shootDays.map((d) => ({ dayNumber: d.dayNumber, date: d.date, scenes: d.scenes.map((s) => [s.number, s.position]) }))).toEqual(
      [
        {
          dayNumber: 1,
          date: "2026-11-30",
          scenes: [
            ["1", 2],
            ["2", 1],
          ],
        },
        { dayNumber: 2, date: "2026-12-01", scenes: [["2", 1]] },
      ],
    );
  });

  it("reports every bad cell with its line and column", () => {
    const csv = [
      header,
      "1,Quay,OUTSIDE,DAY,1,,1 3/8,,,,,",
      "1B?,Quay,EXT,DAY,x,,,,,,,",
      "3,Quay,EXT,DAY,2,,1/4,,,1,2026-02-30,",
      "4,Quay,EXT,DAY,2,,,,,,,",
    ].join("\n");

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
      {
        number: "2",
        setName: "Chapel, vestry",
        intExt: "INT",
        timeOfDay: "NIGHT",
        storyDay: 1,
        storyOrder: 2,
        lengthEighths: 4,
        runningMinutes: null,
        synopsis: 'He says "no"',
      },
      {
        number: "1",
        setName: "Harbour wall",
        intExt: "EXT",
        timeOfDay: "DAY",
        storyDay: 1,
        storyOrder: 1,
        lengthEighths: 11,
        runningMinutes: null,
        synopsis: null,
      },
    ];
    const days = [
      {
        dayNumber: 1,
        date: "2026-11-30",
        scenes: [
          { number: "2", position: 1 },
          { number: "1", position: 2 },
        ],
      },
      { dayNumber: 2, date: "2026-12-01", scenes: [{ number: "2", position: 1 }] },
    ];

    const csv = breakdownToCsv(scenes, days);
    const back = parseBreakdownCsv(csv);
    // Independent reader: papaparse without our checks.
    const raw = Papa.parse<string[]>(csv.trim()).data;

    const plan = planBreakdownImport(back, { scenes: new Map(), days: new Map(), nextStoryOrder: 1 });
    const values = new Map(plan.sceneWrites.map((w) => [w.number, w.values]));

    expect(back.errors).toEqual([]);
    expect(plan.errors).toEqual([]);
    expect(
      plan.dayWrites.map((d) => ({
        dayNumber: d.dayNumber,
        date: d.date,
        scenes: d.sceneNumbers.map((number, i) => ({ number, position: i + 1 })),
      })),
    ).toEqual(days);
    expect([...values.entries()].map(([number, v]) => ({ number, ...v }))).toEqual([scenes[1], scenes[0]]);
    expect(raw[2]![1]).toBe("Chapel, vestry");
    expect(raw[2]![8]).toBe('He says "no"');
    expect(
      breakdownToCsv(
        [...values.entries()].map(([number, v]) => ({ number, ...v })),
        days,
      ),
    ).toBe(csv);
  });
});

const stored = (over: Partial<SceneValues> = {}): SceneValues => ({
  setName: "Harbour wall",
  intExt: "EXT",
  timeOfDay: "DAY",
  storyDay: 3,
  storyOrder: 1,
  lengthEighths: 11,
  runningMinutes: null,
  synopsis: "Nets",
  ...over,
});

describe("planBreakdownImport (merge into the stored breakdown)", () => {
  it("keeps every stored field a row leaves empty or does not have, and clears only on (clear)", () => {
    const parsed = parseBreakdownCsv("scene,set,time_of_day,synopsis\n1,,(Clear),\n");

    const plan = planBreakdownImport(parsed, { scenes: new Map([["1", stored()]]), days: new Map(), nextStoryOrder: 2 });

    expect(plan.sceneWrites).toEqual([{ number: "1", isNew: false, values: stored({ timeOfDay: null }) }]);
    expect(plan.changes).toEqual([{ line: 2, scene: "1", status: "changed", fields: [{ column: "time_of_day", old: "DAY", new: "" }] }]);
    expect(plan.counts.scenes).toEqual({ created: 0, updated: 1, unchanged: 0 });
  });

  it("leaves an unchanged scene out of the writes and counts it as unchanged", () => {
    const plan = planBreakdownImport(parseBreakdownCsv("scene,set\n1,Harbour wall\n"), {
      scenes: new Map([["1", stored()]]),
      days: new Map(),
      nextStoryOrder: 2,
    });

    expect(plan.sceneWrites).toEqual([]);
    expect(plan.changes[0]!.status).toBe("unchanged");
    expect(plan.counts.scenes).toEqual({ created: 0, updated: 0, unchanged: 1 });
  });

  it("reads a file that starts with comment lines and counts lines from the top of the file", () => {
    const parsed = parseBreakdownCsv("# a note\n# another\nscene,story_day\n1,x\n");

    expect(parsed.errors).toEqual([{ line: 4, column: "story_day", message: "must be a whole number" }]);
  });

  it("the template parses cleanly and has one example row", () => {
    for (const kind of ["film", "stage"] as const) {
      const parsed = parseBreakdownCsv(breakdownTemplateCsv(kind));

      expect(parsed.errors).toEqual([]);
      expect(parsed.rows).toBe(1);
    }
  });
});

describe("mergeDayOrder", () => {
  const slot = (number: string, position: number | null, remove = false) => ({ number, position, remove, line: 0 });

  it("places, keeps, appends and takes off", () => {
    expect(mergeDayOrder(["1", "2", "3"], [slot("4", 1), slot("2", null, true)])).toEqual(["4", "1", "3"]);
    expect(mergeDayOrder(["1", "2"], [slot("1", null), slot("5", null)])).toEqual(["1", "2", "5"]);
    expect(mergeDayOrder(["1", "2"], [slot("1", 2)])).toEqual(["2", "1"]);
    expect(mergeDayOrder([], [slot("1", 2), slot("2", 1)])).toEqual(["2", "1"]);
    expect(mergeDayOrder(["1"], [slot("9", 40)])).toEqual(["1", "9"]);
  });

  it("reproduces any full order written with positions 1..n over any stored order (export → import is stable)", () => {
    // Property: a file that lists every scene of a day with positions 1..n yields exactly that order.
    const orders = [
      ["1", "2", "3"],
      ["3", "1", "2"],
      ["2", "3", "1"],
    ];
    for (const storedOrder of orders)
      for (const target of orders) {
        expect(
          mergeDayOrder(
            storedOrder,
            target.map((n, i) => slot(n, i + 1)),
          ),
        ).toEqual(target);
      }
  });
});
