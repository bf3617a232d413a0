import { describe, expect, it } from "vitest";
import { panelsToDxf, parseDxfPanels } from "@shared/domain/panels/dxf";
import type { PanelShape, Point } from "@shared/domain/panels/geometry";

const front: PanelShape = {
  id: "front",
  name: "Front bodice",
  outline: [
    [0, 0],
    [310.125, 0],
    [300.3333333333333, 480.7],
    [225.1, 600.05],
    [95, 740],
    [0, 640.123456789],
  ],
  grainline: [
    [150, 100],
    [150, 600],
  ],
  notches: [
    { point: [155.0625, 0], edge: 0 },
    { point: [0, 320.0617283945], edge: 5 },
  ],
  cutCount: 2,
  mirrored: true,
};
const sleeve: PanelShape = {
  id: "sleeve",
  name: "Ärmel – top sleeve №2",
  // Clockwise, far from the origin, with coordinates that need all their digits.
  outline: [
    [1000.000001, 2000],
    [1190.5, 2650.25],
    [1370.75, 2470.1],
    [1300, 2000.000002],
  ],
  grainline: [
    [1190, 2100],
    [1190, 2500],
  ],
  notches: [],
  cutCount: 1,
  mirrored: false,
};
const cuff: PanelShape = {
  id: "cuff",
  name: " CUT 4 ",
  outline: [
    [0, 3000],
    [260, 3000],
    [260, 3070],
    [0, 3070],
  ],
  grainline: null,
  notches: [{ point: [130, 3070], edge: 2 }],
  cutCount: 4,
  mirrored: false,
};

function expectSamePoints(a: readonly Point[], b: readonly Point[]) {
  expect(a).toHaveLength(b.length);
  a.forEach((p, i) => {
    expect(Math.abs(p[0] - b[i][0])).toBeLessThanOrEqual(1e-6);
    expect(Math.abs(p[1] - b[i][1])).toBeLessThanOrEqual(1e-6);
  });
}

describe("DXF round trip (writer → dxf-parser reader)", () => {
  it("gives back the same pieces: names, cut counts, mirroring, vertices, grainlines and notches", () => {
    const panels = [front, sleeve, cuff];

    const { panels: back, warnings } = parseDxfPanels(panelsToDxf(panels));

    expect(warnings).toEqual([]);
    expect(back.map((p) => p.name)).toEqual(panels.map((p) => p.name));
    expect(back.map((p) => p.cutCount)).toEqual([2, 1, 4]);
    expect(back.map((p) => p.mirrored)).toEqual([true, false, false]);
    back.forEach((p, i) => {
      expectSamePoints(p.outline, panels[i].outline);
      if (panels[i].grainline) expectSamePoints(p.grainline!, panels[i].grainline!);
      else expect(p.grainline).toBeNull();
      expect(p.notches!.map((n) => n.edge)).toEqual(panels[i].notches!.map((n) => n.edge));
      expectSamePoints(p.notches!.map((n) => n.point), panels[i].notches!.map((n) => n.point));
    });
  });

  it("writes an R12-style file in millimetres with one layer per piece", () => {
    const dxf = panelsToDxf([front, sleeve]);

    expect(dxf).toMatch(/\$INSUNITS\n70\n4\n/);
    expect(dxf).toMatch(/\$ACADVER\n1\nAC1009\n/);
    expect(dxf).toContain("PIECE_1_FRONT_BODICE");
    expect(dxf).toContain("\\U+00C4rmel");
    expect(dxf.trimEnd().endsWith("EOF")).toBe(true);
  });
});

describe("parseDxfPanels on files from elsewhere", () => {
  // A hand-written DXF in inches ($INSUNITS 1): 1 in = 25.4 mm exactly (check-values §1).
  const inchFile = [
    "0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "1", "0", "ENDSEC",
    "0", "SECTION", "2", "ENTITIES",
    "0", "LWPOLYLINE", "8", "POCKET", "90", "4", "70", "1",
    "10", "0", "20", "0", "10", "6", "20", "0", "10", "6", "20", "7", "10", "0", "20", "7",
    "0", "TEXT", "8", "POCKET", "10", "1", "20", "3", "40", "0.4", "1", "Patch pocket",
    "0", "TEXT", "8", "POCKET", "10", "1", "20", "2", "40", "0.4", "1", "CUT 2",
    "0", "LINE", "8", "POCKET", "10", "3", "20", "1", "30", "0", "11", "3", "21", "6", "31", "0",
    "0", "POLYLINE", "8", "STRAY", "66", "1", "70", "0",
    "0", "VERTEX", "8", "STRAY", "10", "20", "20", "20",
    "0", "VERTEX", "8", "STRAY", "10", "30", "20", "20",
    "0", "SEQEND",
    "0", "TEXT", "8", "0", "10", "50", "20", "50", "40", "0.4", "1", "Title block",
    "0", "ENDSEC", "0", "EOF", "",
  ].join("\n");

  it("reads closed LWPOLYLINEs in inches, converts to mm and attaches the text and grainline inside", () => {
    const { panels, warnings } = parseDxfPanels(inchFile);

    expect(panels).toHaveLength(1);
    expect(panels[0]).toMatchObject({ name: "Patch pocket", cutCount: 2, mirrored: false });
    expectSamePoints(panels[0].outline, [
      [0, 0],
      [152.4, 0],
      [152.4, 177.8],
      [0, 177.8],
    ]);
    expectSamePoints(panels[0].grainline!, [
      [76.2, 25.4],
      [76.2, 152.4],
    ]);
    expect(warnings).toEqual([
      "open polyline on layer STRAY skipped",
      'text "Title block" outside every piece ignored',
    ]);
  });

  it("gives nested text to the smallest piece that contains it", () => {
    const outer: PanelShape = { id: "o", name: "Outer", outline: [[0, 0], [1000, 0], [1000, 1000], [0, 1000]], cutCount: 1 };
    const inner: PanelShape = { id: "i", name: "Inner", outline: [[100, 100], [300, 100], [300, 300], [100, 300]], cutCount: 3 };

    const { panels } = parseDxfPanels(panelsToDxf([outer, inner]));

    expect(panels.map((p) => [p.name, p.cutCount])).toEqual([
      ["Outer", 1],
      ["Inner", 3],
    ]);
  });

  it("rejects text that is not DXF", () => {
    expect(() => parseDxfPanels("hello")).toThrow();
  });
});
