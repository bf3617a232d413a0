import { describe, expect, it } from "vitest";
import {
  LETTER_BANDS,
  MONDOPOINT,
  SIZE_TABLES,
  letterCode,
  mondopoint,
  sizeDesignation,
  snapToGrid,
  type IntervalGrid,
} from "@shared/domain/sizes";

describe("letter codes (EN 13402-3 bands, from memory — check-values §5)", () => {
  // check-values §5 [M]: men's chest S 86–94, M 94–102, L 102–110, XL 110–118; women's bust S 82–90,
  // M 90–98, L 98–107. Boundary rule chosen and documented in sizes.ts: [min, max), edge → larger letter.
  it.each([
    ["mens_chest", 939, "S"], // §5 test idea: 93.9 cm men's chest → S
    ["mens_chest", 940, "M"], // §5 test idea: 94.0 is the boundary; our rule gives M
    ["mens_chest", 860, "S"],
    ["mens_chest", 1019, "M"],
    ["mens_chest", 1020, "L"],
    ["mens_chest", 1100, "XL"],
    ["mens_chest", 1179, "XL"],
    ["womens_bust", 820, "S"],
    ["womens_bust", 899, "S"],
    ["womens_bust", 900, "M"],
    ["womens_bust", 980, "L"],
    ["womens_bust", 1069, "L"],
  ] as const)("%s %s mm → %s", (table, mm, code) => {
    expect(letterCode(table, mm)).toBe(code);
  });

  it.each([
    ["mens_chest", 500],
    ["mens_chest", 1410],
    ["womens_bust", 2000],
  ] as const)("%s %s mm is outside the table → null", (table, mm) => {
    expect(letterCode(table, mm)).toBeNull();
  });

  it("has contiguous bands with no gap or overlap", () => {
    for (const bands of Object.values(LETTER_BANDS)) {
      for (let i = 1; i < bands.length; i++) expect(bands[i].minCm).toBe(bands[i - 1].maxCm);
    }
  });

  it("finds exactly one band for every whole mm inside a table (brute force)", () => {
    for (const bands of Object.values(LETTER_BANDS)) {
      const table = bands === LETTER_BANDS.mens_chest ? "mens_chest" : "womens_bust";
      for (let mm = bands[0].minCm * 10; mm < bands[bands.length - 1].maxCm * 10; mm++) {
        const holding = bands.filter((b) => mm / 10 >= b.minCm && mm / 10 < b.maxCm);
        expect(holding.length).toBe(1);
        expect(letterCode(table, mm)).toBe(holding[0].code);
      }
    }
  });
});

describe("snapToGrid", () => {
  // Oracle: enumerate the grid points independently and pick the nearest by brute force (ties → larger).
  function gridPoints(grid: IntervalGrid, upTo: number): number[] {
    const pts: number[] = [];
    grid.segments.forEach((s, i) => {
      const end = grid.segments[i + 1]?.from ?? upTo;
      for (let v = s.from; v < end; v += s.step) pts.push(v);
    });
    return pts;
  }
  function nearest(points: number[], x: number): number {
    let best = points[0];
    for (const p of points) if (Math.abs(p - x) < Math.abs(best - x) - 1e-9 || Math.abs(Math.abs(p - x) - Math.abs(best - x)) <= 1e-9 && p > best) best = p;
    return best;
  }

  it.each(Object.entries(SIZE_TABLES))("%s: every 0.1 cm from 60 to 200 snaps to the nearest grid point", (_name, table) => {
    for (const dim of [table.primary, ...table.secondary]) {
      const pts = gridPoints(dim.grid, 400);
      for (let tenth = 600; tenth <= 2000; tenth++) {
        const x = tenth / 10;
        expect(snapToGrid(x, dim.grid)).toBe(nearest(pts, x));
      }
    }
  });

  it("switches from 4 cm to 6 cm bust steps above 104 cm (check-values §5: 4 cm then 6 cm, from memory)", () => {
    const bust = SIZE_TABLES.womens_top.primary.grid;

    expect([100.9, 101.9, 106.9, 107, 112].map((x) => snapToGrid(x, bust))).toEqual([100, 100, 104, 110, 110]);
  });
});

describe("sizeDesignation", () => {
  it("designates a men's top as chest-height, e.g. 94-182, letter M", () => {
    // Brief example "94-182"; chest primary for men [V: check-values §5].
    const r = sizeDesignation("mens_top", { chest_girth: 940, height: 1820 });

    expect(r).toMatchObject({ ok: true, pictogram: "94-182", letter: "M", missing: [] });
  });

  it("uses bust girth, not chest girth, for women's tops (check-values §5 test idea)", () => {
    const r = sizeDesignation("womens_top", { chest_girth: 1000, bust_girth: 880, height: 1680, hip_girth: 960 });

    expect(r.ok && r.primary.key).toBe("bust_girth");
    expect(r.ok && r.letter).toBe("S"); // 88 cm bust: S 82–90 [M]; chest 100 would have given a different size
    expect(r.ok && r.pictogram).toBe("88-168-96");
  });

  it("uses chest girth, not bust girth, for men's tops", () => {
    const r = sizeDesignation("mens_top", { chest_girth: 1030, bust_girth: 880, height: 1760 });

    expect(r).toMatchObject({ ok: true, letter: "L", primary: { key: "chest_girth", measuredCm: 103, designatedCm: 102 } });
  });

  it("designates trousers by waist with inside leg secondary [M]", () => {
    const r = sizeDesignation("trousers", { waist_girth: 822, inside_leg_length: 815, height: 1780 });

    expect(r).toMatchObject({ ok: true, pictogram: "84-82-176", letter: null });
  });

  it("designates skirts by waist with hip and height secondary [M]", () => {
    const r = sizeDesignation("skirt", { waist_girth: 700, hip_girth: 950, height: 1640 });

    expect(r).toMatchObject({ ok: true, pictogram: "72-96-168" });
  });

  it("leaves a missing secondary out and names it", () => {
    const r = sizeDesignation("mens_top", { chest_girth: 990 });

    expect(r).toMatchObject({ ok: true, pictogram: "98", missing: ["height"] });
  });

  it("puts a value midway between grid points on the larger one (100 cm chest on 98/102)", () => {
    const r = sizeDesignation("mens_top", { chest_girth: 1000, height: 1790 });

    expect(r).toMatchObject({ ok: true, pictogram: "102-182" });
  });

  it.each([
    ["mens_top", { height: 1800 }, "chest_girth"],
    ["womens_top", { chest_girth: 900 }, "bust_girth"],
    ["trousers", { waist_girth: 0 }, "waist_girth"],
  ] as const)("fails without the primary dimension: %s", (garment, body, key) => {
    const r = sizeDesignation(garment, body);

    expect(r).toMatchObject({ ok: false, missing: [key] });
  });
});

describe("mondopoint (ISO 9407; 5 mm length step from memory)", () => {
  it("uses the documented steps", () => {
    expect(MONDOPOINT.lengthStepMm).toBe(5);
  });

  it.each([
    [265, undefined, "265"],
    [263, undefined, "265"],
    [262.4, undefined, "260"],
    [262.5, undefined, "265"], // tie rounds up (documented in sizes.ts)
    [280, 110, "280/110"], // the commonly quoted "280/110" example form [M]
    [241.6, 93.4, "240/93"],
  ])("foot %s mm, width %s mm → %s", (length, width, label) => {
    expect(mondopoint(length, width).label).toBe(label);
  });

  it("rounds every 0.1 mm from 100 to 330 mm to the nearest multiple of 5 (brute force)", () => {
    for (let t = 1000; t <= 3300; t++) {
      const len = t / 10;
      const candidates = [Math.floor(len / 5) * 5, Math.floor(len / 5) * 5 + 5];
      const best = Math.abs(candidates[1] - len) <= Math.abs(candidates[0] - len) + 1e-9 ? candidates[1] : candidates[0];
      expect(mondopoint(len).lengthMm).toBe(best);
    }
  });

  it.each([0, -5, Number.NaN])("rejects foot length %s", (len) => {
    expect(() => mondopoint(len)).toThrow(RangeError);
  });
});
