import { describe, expect, it } from "vitest";
import { SIZE_TABLES, letterCode, mondopoint, sizeDesignation, snapToGrid } from "@shared/domain/sizes";

// Expected values are written out here, not read from the code's tables, so a wrong table fails.
// EN 13402-3:2013 letter bands as recalled (from memory; men's S/M/L corroborated by a secondary source,
// see docs/references.md "EN 13402"): men's chest S 86–94, M 94–102, L 102–110, XL 110–118; women's bust
// S 82–90, M 90–98, L 98–107. Edge rule (documented in sizes.ts): [min, max), an edge takes the larger letter.
const MENS_CHEST_BANDS: Array<[string, number, number]> = [
  ["XS", 78, 86],
  ["S", 86, 94],
  ["M", 94, 102],
  ["L", 102, 110],
  ["XL", 110, 118],
  ["XXL", 118, 129],
  ["3XL", 129, 141],
];
const WOMENS_BUST_BANDS: Array<[string, number, number]> = [
  ["XS", 74, 82],
  ["S", 82, 90],
  ["M", 90, 98],
  ["L", 98, 107],
  ["XL", 107, 119],
  ["XXL", 119, 131],
  ["3XL", 131, 143],
];
const bandOf = (bands: Array<[string, number, number]>, cm: number) => bands.find(([, lo, hi]) => cm >= lo && cm < hi)?.[0] ?? null;

describe("letter codes (EN 13402-3 bands, from memory)", () => {
  it.each([
    ["mens_chest", 939, "S"], // 93.9 cm men's chest → S
    ["mens_chest", 940, "M"], // 94.0 is the shared edge; the rule gives the larger letter
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

  it("matches the written-out bands for every whole mm from 70 to 145 cm", () => {
    for (let mm = 700; mm <= 1450; mm++) {
      expect(letterCode("mens_chest", mm)).toBe(bandOf(MENS_CHEST_BANDS, mm / 10));
      expect(letterCode("womens_bust", mm)).toBe(bandOf(WOMENS_BUST_BANDS, mm / 10));
    }
  });
});

describe("snapToGrid", () => {
  // Grid points written out (EN 13402-3 intervals, from memory): men's chest 4 cm steps on 2 + 4k
  // (…, 86, 90, 94, …); women's bust 4 cm steps to 104, then 6 cm (104, 110, 116, …).
  const mensChestPoints = Array.from({ length: 60 }, (_, k) => 2 + 4 * k);
  const womensBustPoints = [...Array.from({ length: 27 }, (_, k) => 4 * k), ...Array.from({ length: 20 }, (_, k) => 104 + 6 * k)];
  function nearest(points: number[], x: number): number {
    let best = points[0]!;
    for (const p of points)
      if (Math.abs(p - x) < Math.abs(best - x) - 1e-9 || (Math.abs(Math.abs(p - x) - Math.abs(best - x)) <= 1e-9 && p > best)) best = p;
    return best;
  }

  it("men's chest: every 0.1 cm from 60 to 200 snaps to the nearest written-out point (ties → larger)", () => {
    for (let tenth = 600; tenth <= 2000; tenth++)
      expect(snapToGrid(tenth / 10, SIZE_TABLES.mens_top.primary.grid)).toBe(nearest(mensChestPoints, tenth / 10));
  });

  it("women's bust: every 0.1 cm from 60 to 104 snaps to 4 cm points, above 104 to 6 cm points", () => {
    for (let tenth = 600; tenth <= 2000; tenth++) {
      const x = tenth / 10;
      // Above the 104 cm threshold only the 6 cm segment's points apply.
      const pts = x >= 104 ? womensBustPoints.filter((p) => p >= 104) : womensBustPoints;
      expect(snapToGrid(x, SIZE_TABLES.womens_top.primary.grid)).toBe(nearest(pts, x));
    }
  });

  it("switches from 4 cm to 6 cm bust steps above 104 cm (from memory)", () => {
    const bust = SIZE_TABLES.womens_top.primary.grid;

    expect([100.9, 101.9, 106.9, 107, 112].map((x) => snapToGrid(x, bust))).toEqual([100, 100, 104, 110, 110]);
  });
});

describe("sizeDesignation", () => {
  it("designates a men's top as chest-height, e.g. 94-182, letter M", () => {
    // Chest girth is the primary dimension of men's tops (EN 13402-2).
    const r = sizeDesignation("mens_top", { chest_girth: 940, height: 1820 });

    expect(r).toMatchObject({ ok: true, pictogram: "94-182", letter: "M", missing: [] });
  });

  it("uses bust girth, not chest girth, for women's tops (EN 13402-2)", () => {
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

  it.each([
    [920, "94", "M"], // 92 cm is midway between 90 and 94: designated 94, so the letter is M, not S
    [1080, "110", "XL"], // 108 → 110: XL, not L
    [1030, "102", "L"],
  ])("men's chest %s mm: pictogram %s and letter %s name the same size", (mm, pictogram, letter) => {
    const r = sizeDesignation("mens_top", { chest_girth: mm });

    expect(r).toMatchObject({ ok: true, pictogram, letter });
  });

  it("the letter always names the band of the designated chest, for every whole mm from 78 to 140 cm", () => {
    for (let mm = 780; mm <= 1400; mm++) {
      const r = sizeDesignation("mens_top", { chest_girth: mm });
      if (!r.ok) throw new Error("sized without a result");
      expect(r.letter).toBe(bandOf(MENS_CHEST_BANDS, Number(r.pictogram)));
    }
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
  it.each([
    [265, undefined, "265"],
    [263, undefined, "265"],
    [262, undefined, "265"], // never shorter than the foot: 262 mm is size 265, not 260
    [260.1, undefined, "265"],
    [260, undefined, "260"],
    [280, 110, "280/110"], // the commonly quoted "280/110" form (from memory)
    [241.6, 93.4, "245/93"],
  ])("foot %s mm, width %s mm → %s", (length, width, label) => {
    expect(mondopoint(length, width).label).toBe(label);
  });

  it("every 0.1 mm from 100 to 330 mm gets the smallest 5 mm size that is at least the foot (brute force)", () => {
    for (let t = 1000; t <= 3300; t++) {
      const len = t / 10;
      let size = 0;
      while (size < len - 1e-9) size += 5;
      expect(mondopoint(len).lengthMm).toBe(size);
    }
  });

  it.each([0, -5, Number.NaN])("rejects foot length %s", (len) => {
    expect(() => mondopoint(len)).toThrow(RangeError);
  });
});
