import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { DxfLimitError, noPieceReason, panelsToDxf, readDxfPieces, type DxfImport } from "@shared/domain/panels/dxf";
import { CHORD_TOLERANCE_MM } from "@shared/domain/panels/curves";
import { perimeter, polygonArea, type PanelShape, type Point } from "@shared/domain/panels/geometry";

// Fixtures under tests/fixtures/doubles/ezdxf/ are written by an outside library, ezdxf (Debian's
// python3-ezdxf), through tests/fixtures/doubles/make-dxf-fixtures.py; expected.json beside them holds
// the closed-form areas and lengths and ezdxf's own block placements and spline evaluations.
const dir = path.resolve("tests/fixtures/doubles/ezdxf");
const fixture = (name: string) => fs.readFileSync(path.join(dir, name), "utf8");
const expected = JSON.parse(fs.readFileSync(path.join(dir, "expected.json"), "utf8"));
const relErr = (got: number, want: number) => Math.abs(got - want) / Math.abs(want);

function expectSamePoints(a: readonly Point[], b: readonly Point[], tol = 1e-6) {
  expect(a).toHaveLength(b.length);
  a.forEach((p, i) => {
    expect(Math.abs(p[0] - b[i][0])).toBeLessThanOrEqual(tol);
    expect(Math.abs(p[1] - b[i][1])).toBeLessThanOrEqual(tol);
  });
}

/** Hand-written DXF: group code / value pairs, one per line. */
const dxfOf = (...entities: Array<Array<string | number>>) =>
  [
    ["0", "SECTION", "2", "HEADER", "9", "$INSUNITS", "70", "4", "0", "ENDSEC"],
    ["0", "SECTION", "2", "ENTITIES"],
    ...entities,
    ["0", "ENDSEC", "0", "EOF", ""],
  ]
    .flat()
    .join("\n");

const square = (x: number, y: number, side: number, layer = "0") => [
  "0",
  "LWPOLYLINE",
  "8",
  layer,
  "90",
  "4",
  "70",
  "1",
  "10",
  x,
  "20",
  y,
  "10",
  x + side,
  "20",
  y,
  "10",
  x + side,
  "20",
  y + side,
  "10",
  x,
  "20",
  y + side,
];

describe("curves are flattened within the stated tolerance (areas within 0.1 % of the exact shape)", () => {
  it("a closed LWPOLYLINE with bulge arcs keeps its area and length (defect: bulges became chords, −7 % area here)", () => {
    const want = expected["bulge-piece.dxf"];

    const r = readDxfPieces(fixture("bulge-piece.dxf"));

    expect(r.pieces).toHaveLength(1);
    const p = r.pieces[0];
    // Closed form: shoelace of the vertices plus each bulge's circular segment r²/2·(θ − sin θ).
    expect(relErr(p.areaMm2, want.areaMm2)).toBeLessThan(1e-3);
    expect(relErr(p.perimeterMm, want.perimeterMm)).toBeLessThan(1e-3);
    expect(relErr(want.chordAreaMm2, want.areaMm2)).toBeGreaterThan(0.05);
    expect(p).toMatchObject({ name: "Bodice front", cutCount: 2, importable: true });
    expect(p.recognised[0]).toMatch(/3 bulge arcs/);
  });

  it("a CIRCLE: area πr² and circumference 2πr, and no chord strays more than the tolerance from the circle", () => {
    const want = expected["curves.dxf"];

    const r = readDxfPieces(fixture("curves.dxf"));

    const circle = r.pieces.find((p) => p.recognised[0].includes("CIRCLE"))!;
    expect(relErr(circle.areaMm2, want.circleAreaMm2)).toBeLessThan(1e-3);
    expect(relErr(circle.perimeterMm, want.circlePerimeterMm)).toBeLessThan(1e-3);
    // Sagitta of every chord: radius minus the distance of the chord's midpoint from the centre.
    const o = circle.outline;
    const worst = Math.max(
      ...o.map((a, i) => {
        const b = o[(i + 1) % o.length];
        return 120 - Math.hypot((a[0] + b[0]) / 2, (a[1] + b[1]) / 2);
      }),
    );
    expect(worst).toBeLessThanOrEqual(CHORD_TOLERANCE_MM + 1e-9);
    expect(worst).toBeGreaterThan(0);
  });

  it("a full ELLIPSE: area πab", () => {
    const r = readDxfPieces(fixture("curves.dxf"));

    const ellipse = r.pieces.find((p) => p.recognised[0].includes("ELLIPSE"))!;
    expect(relErr(ellipse.areaMm2, expected["curves.dxf"].ellipseAreaMm2)).toBeLessThan(1e-3);
  });

  it("a LINE and an ARC drawn separately are joined into one outline: half a circle, πr²/2", () => {
    const r = readDxfPieces(fixture("curves.dxf"));

    const d = r.pieces.find((p) => p.recognised[0].includes("joined end to end"))!;
    expect(relErr(d.areaMm2, expected["curves.dxf"].dShapeAreaMm2)).toBeLessThan(1e-3);
    expect(d.recognised[0]).toMatch(/1 ARC \+ 1 LINE joined end to end/);
  });

  it("closed SPLINEs import (defect: refused as 'no closed piece outline'): a weighted NURBS circle (πr²) and a periodic cubic (ezdxf's area)", () => {
    const want = expected["curves.dxf"];

    const r = readDxfPieces(fixture("curves.dxf"));

    const rational = r.pieces.find((p) => p.recognised[0].includes("weighted"))!;
    const periodic = r.pieces.find((p) => /closed SPLINE \(degree 3\)/.test(p.recognised[0]))!;
    expect(relErr(rational.areaMm2, want.rationalSplineCircleAreaMm2)).toBeLessThan(1e-3);
    expect(relErr(periodic.areaMm2, want.periodicSplineAreaMm2)).toBeLessThan(1e-3);
    expect(r.pieces.every((p) => p.importable)).toBe(true);
    expect(r.pieces).toHaveLength(5);
  });
});

describe("blocks placed by INSERT", () => {
  it("a piece inside a rotated (75°), scaled (1.2) and mirrored INSERT in centimetres, edged by LINEs, a polyline and a weighted SPLINE", () => {
    const r = readDxfPieces(fixture("insert-sleeve-cm.dxf"));

    expect(r.units).toEqual({ unit: "cm", from: "header", headerCode: 5 });
    expect(r.pieces).toHaveLength(1);
    // ezdxf's placement of the block and its own evaluation of the weighted spline give the area.
    expect(relErr(r.pieces[0].areaMm2, expected["insert-sleeve-cm.dxf"].areaMm2)).toBeLessThan(1e-3);
    expect(r.pieces[0]).toMatchObject({ name: "Sleeve", cutCount: 2 });
  });
});

describe("ASTM D6673 conventions (layer numbers from memory, see astm-d6673.ts)", () => {
  const want = expected["astm-pieces.dxf"];

  it("reads cut line, sew line, grain line, notches and piece texts from blocks; the seam allowance is measured", () => {
    const r = readDxfPieces(fixture("astm-pieces.dxf"));

    expect(r.convention).toBe("astm-d6673");
    const [back] = r.pieces;
    expect(back).toMatchObject({
      name: "Back",
      size: "M",
      cutCount: 2,
      mirrored: true,
      seamAllowanceMm: want.seamAllowanceMm,
      seamAllowanceFrom: "file",
    });
    expectSamePoints(back.outline, want.plainSewVertices, 1e-9);
    expect(back.grainline).toEqual([
      [125, 50],
      [125, 350],
    ]);
    expect(back.notches).toEqual([
      { point: [0, 200], edge: 3 },
      { point: [125, 0], edge: 0 },
    ]);
    expect(back.areaMm2).toBeCloseTo(want.sewAreaMm2, 6);
  });

  it("places the second piece by its rotated, scaled, mirrored INSERT exactly where ezdxf does", () => {
    const r = readDxfPieces(fixture("astm-pieces.dxf"));

    const facing = r.pieces[1];
    expect(facing).toMatchObject({ name: "Facing", cutCount: 1, mirrored: false, seamAllowanceMm: want.turnedSeamAllowanceMm });
    expectSamePoints(facing.outline, want.turnedSewVertices, 1e-9);
    const g = want.turnedGrain;
    expectSamePoints(
      facing.grainline!,
      [
        [g[0], g[1]],
        [g[2], g[3]],
      ],
      1e-9,
    );
    expect(facing.areaMm2).toBeCloseTo(want.turnedSewAreaMm2, 6);
  });

  it("names every entity it did not use, with the reason", () => {
    const r = readDxfPieces(fixture("astm-pieces.dxf"));

    const why = (entity: string, layer: string) => r.ignored.find((g) => g.entity === entity && g.layer === layer);
    expect(why("POINT", "2")).toMatchObject({ count: 8, reason: expect.stringMatching(/turn points/) });
    expect(why("LINE", "8")).toMatchObject({ count: 2, reason: expect.stringMatching(/internal lines/) });
    expect(why("HATCH", "any")).toMatchObject({ count: 1, reason: expect.stringMatching(/not a pattern line/) });
    expect(why("TEXT", "0")!.reason).toMatch(/Style 1207 - invented.*outside every piece/);
    expect(why("POINT", "2")!.where[0]).toMatch(/^handle /);
  });

  it("a cut line without a sew line gets its sew line the entered allowance inside", () => {
    const file = dxfOf(square(0, 0, 300, "1"), ["0", "TEXT", "8", "1", "10", "100", "20", "100", "40", "5", "1", "Piece Name: Yoke"]);

    const r = readDxfPieces(file, { seamAllowanceMm: 15 });

    expect(r.pieces[0]).toMatchObject({ name: "Yoke", seamAllowanceMm: 15, seamAllowanceFrom: "entered" });
    // 300 mm square less 15 mm each side: 270 × 270.
    expect(r.pieces[0].areaMm2).toBeCloseTo(270 * 270, 3);
  });
});

describe("units", () => {
  it("a file that does not say its units: millimetres assumed with a warning, and the override reads inches (1 in = 25.4 mm exactly, NIST SP 811 B.8)", () => {
    const assumed = readDxfPieces(fixture("unitless-inches.dxf"));
    const inches = readDxfPieces(fixture("unitless-inches.dxf"), { units: "in" });

    expect(assumed.units).toEqual({ unit: "mm", from: "assumed", headerCode: 0 });
    expect(assumed.warnings.join(" ")).toMatch(/does not say its drawing units/);
    expect(assumed.pieces).toHaveLength(0);
    expect(inches.units.from).toBe("override");
    expect(inches.pieces[0].areaMm2).toBeCloseTo(expected["unitless-inches.dxf"].areaMm2IfInches, 6);
    expect(inches.pieces[0].name).toBe("Patch pocket");
  });

  it("a mirrored CIRCLE (extrusion 0,0,−1) sits at −x, the DXF arbitrary-axis rule", () => {
    const file = dxfOf(["0", "CIRCLE", "8", "0", "10", "200", "20", "50", "30", "0", "40", "40", "210", "0", "220", "0", "230", "-1"]);

    const r = readDxfPieces(file);

    // Vertices are spread evenly round the circle, so their mean is its centre.
    const o = r.pieces[0].outline;
    expect(o.reduce((s, p) => s + p[0], 0) / o.length).toBeCloseTo(-200, 6);
    expect(o.reduce((s, p) => s + p[1], 0) / o.length).toBeCloseTo(50, 6);
  });
});

describe("outlines that do not make a piece", () => {
  it("lines that stop 2 mm short report the gap, and the reason names it", () => {
    const r = readDxfPieces(fixture("open-outline.dxf"));

    expect(r.pieces).toHaveLength(0);
    expect(r.ignored[0]).toMatchObject({
      entity: "LINE",
      count: 4,
      reason: expect.stringMatching(/do not close: the ends are 2 mm apart/),
    });
    expect(noPieceReason(r)).toMatch(/4 × LINE on layer 0: .*2 mm apart/);
  });

  it("a SPLINE given by fit points only is named with the reason", () => {
    const file = dxfOf([
      "0",
      "SPLINE",
      "8",
      "CUT",
      "70",
      "8",
      "71",
      "3",
      "74",
      "3",
      "11",
      "0",
      "21",
      "0",
      "31",
      "0",
      "11",
      "50",
      "21",
      "80",
      "31",
      "0",
      "11",
      "100",
      "21",
      "0",
      "31",
      "0",
    ]);

    const r = readDxfPieces(file);

    expect(noPieceReason(r)).toMatch(/SPLINE on layer CUT: defined by fit points only/);
  });

  it("a self-crossing outline is shown but marked not importable, with at most 20 crossings", () => {
    // Star polygon {61/30}: each vertex joined to the one 30 steps on, 61 × 29 crossings.
    const pts: Point[] = Array.from({ length: 61 }, (_, i) => [
      300 * Math.cos((2 * Math.PI * 30 * i) / 61),
      300 * Math.sin((2 * Math.PI * 30 * i) / 61),
    ]);
    const file = dxfOf(["0", "LWPOLYLINE", "8", "0", "90", pts.length, "70", "1", ...pts.flatMap(([x, y]) => ["10", x, "20", y])]);

    const r = readDxfPieces(file);

    expect(r.pieces[0].importable).toBe(false);
    expect(r.pieces[0].problems.filter((m) => /cross at/.test(m))).toHaveLength(20);
  });

  it("refuses text that is not DXF and binary DXF", () => {
    expect(() => readDxfPieces("hello")).toThrow();
    expect(() => readDxfPieces("AutoCAD Binary DXF\r\n\u001a\u0000")).toThrow(/ASCII DXF/);
  });
});

describe("limits", () => {
  it("a piece with more points than the limit refuses the file with a message naming the piece", () => {
    const n = 5001;
    const pts = Array.from({ length: n }, (_, i) => [300 * Math.cos((2 * Math.PI * i) / n), 300 * Math.sin((2 * Math.PI * i) / n)]);
    const file = dxfOf(
      ["0", "LWPOLYLINE", "8", "0", "90", n, "70", "1", ...pts.flatMap(([x, y]) => ["10", x, "20", y])],
      ["0", "TEXT", "8", "0", "10", "0", "20", "0", "40", "5", "1", "Circle skirt"],
    );

    expect(() => readDxfPieces(file)).toThrow(DxfLimitError);
    expect(() => readDxfPieces(file)).toThrow(/piece "Circle skirt" has 5,001 points.*at most 5,000/);
  });

  it("more than 200 pieces in one file are refused", () => {
    const file = dxfOf(...Array.from({ length: 201 }, (_, i) => square((i % 20) * 50, Math.floor(i / 20) * 50, 40)));

    expect(() => readDxfPieces(file)).toThrow(/201 piece outlines; at most 200/);
  });
});

describe("export → import returns the same pieces (ASTM D6673 layout)", () => {
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
    seamAllowanceMm: 15,
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
    seamAllowanceMm: 10,
    cutCount: 1,
    mirrored: false,
  };
  const cuff: PanelShape = {
    id: "cuff",
    // A name that reads like the older "CUT n" text stays a name.
    name: "CUT 4",
    outline: [
      [0, 3000],
      [260, 3000],
      [260, 3070],
      [0, 3070],
    ],
    grainline: null,
    notches: [{ point: [130, 3070], edge: 2 }],
    seamAllowanceMm: 0,
    cutCount: 4,
    mirrored: false,
  };

  function roundTrip(panels: PanelShape[]): DxfImport {
    return readDxfPieces(panelsToDxf(panels), { seamAllowanceMm: 99 });
  }

  it("gives back names, cut counts, mirroring, sew lines, seam allowances, grain lines and notches", () => {
    const panels = [front, sleeve, cuff];

    const r = roundTrip(panels);

    expect(r.convention).toBe("astm-d6673");
    expect(r.units).toEqual({ unit: "mm", from: "header", headerCode: 4 });
    expect(r.warnings).toEqual([]);
    expect(r.pieces.map((p) => p.name)).toEqual(panels.map((p) => p.name));
    expect(r.pieces.map((p) => p.cutCount)).toEqual([2, 1, 4]);
    expect(r.pieces.map((p) => p.mirrored)).toEqual([true, false, false]);
    expect(r.pieces.map((p) => p.seamAllowanceMm)).toEqual([15, 10, 0]);
    expect(r.pieces.map((p) => p.seamAllowanceFrom)).toEqual(["file", "file", "file"]);
    r.pieces.forEach((p, i) => {
      expectSamePoints(p.outline, panels[i].outline);
      if (panels[i].grainline) expectSamePoints(p.grainline!, panels[i].grainline!);
      else expect(p.grainline).toBeNull();
      expect(p.notches!.map((n) => n.edge)).toEqual(panels[i].notches!.map((n) => n.edge));
      expectSamePoints(
        p.notches!.map((n) => n.point),
        panels[i].notches!.map((n) => n.point),
      );
    });
  });

  it("draws the cut line the seam allowance outside the sew line (defect: the export had no cut line)", () => {
    const r = roundTrip([front]);

    const cut = r.pieces[0].cutLine!;
    expect(cut).not.toBeNull();
    // Steiner's formula for a convex outline offset by d with mitred corners: area ≥ A + P·d + π·d².
    const a = polygonArea(front.outline);
    expect(polygonArea(cut)).toBeGreaterThanOrEqual(a + perimeter(front.outline) * 15 + Math.PI * 15 * 15 - 1);
    expect(r.pieces[0].recognised).toContain("seam allowance 15 mm, measured between the cut and sew lines");
  });

  it("writes an R12 file in millimetres with one block per piece on the numbered layers", () => {
    const dxf = panelsToDxf([front, sleeve]);

    expect(dxf).toMatch(/\$INSUNITS\n70\n4\n/);
    expect(dxf).toMatch(/\$ACADVER\n1\nAC1009\n/);
    expect(dxf).toContain("0\nBLOCK\n8\n0\n2\nPIECE_1_FRONT_BODICE\n");
    expect(dxf).toContain("0\nINSERT\n8\n0\n2\nPIECE_2_ARMEL_TOP_SLEEVE_NO2\n");
    expect(dxf).toContain("Piece Name: \\U+00C4rmel");
    for (const layer of ["1", "4", "7", "14", "15"]) expect(dxf).toContain(`0\nLAYER\n2\n${layer}\n`);
    expect(dxf.trimEnd().endsWith("EOF")).toBe(true);
  });
});

describe("files in the older one-layer-per-piece layout and from elsewhere", () => {
  // A hand-written DXF in inches ($INSUNITS 1): 1 in = 25.4 mm exactly (NIST SP 811, B.8).
  const inchFile = [
    "0",
    "SECTION",
    "2",
    "HEADER",
    "9",
    "$INSUNITS",
    "70",
    "1",
    "0",
    "ENDSEC",
    "0",
    "SECTION",
    "2",
    "ENTITIES",
    "0",
    "LWPOLYLINE",
    "8",
    "POCKET",
    "90",
    "4",
    "70",
    "1",
    "10",
    "0",
    "20",
    "0",
    "10",
    "6",
    "20",
    "0",
    "10",
    "6",
    "20",
    "7",
    "10",
    "0",
    "20",
    "7",
    "0",
    "TEXT",
    "8",
    "POCKET",
    "10",
    "1",
    "20",
    "3",
    "40",
    "0.4",
    "1",
    "Patch pocket",
    "0",
    "TEXT",
    "8",
    "POCKET",
    "10",
    "1",
    "20",
    "2",
    "40",
    "0.4",
    "1",
    "CUT 2 MIRRORED",
    "0",
    "LINE",
    "8",
    "POCKET",
    "10",
    "3",
    "20",
    "1",
    "30",
    "0",
    "11",
    "3",
    "21",
    "6",
    "31",
    "0",
    "0",
    "POLYLINE",
    "8",
    "STRAY",
    "66",
    "1",
    "70",
    "0",
    "0",
    "VERTEX",
    "8",
    "STRAY",
    "10",
    "20",
    "20",
    "20",
    "0",
    "VERTEX",
    "8",
    "STRAY",
    "10",
    "30",
    "20",
    "20",
    "0",
    "SEQEND",
    "0",
    "TEXT",
    "8",
    "0",
    "10",
    "50",
    "20",
    "50",
    "40",
    "0.4",
    "1",
    "Title block",
    "0",
    "ENDSEC",
    "0",
    "EOF",
    "",
  ].join("\n");

  it("reads closed LWPOLYLINEs in inches, converts to mm and attaches the text and grainline inside", () => {
    const r = readDxfPieces(inchFile);

    expect(r.convention).toBe("generic");
    expect(r.pieces).toHaveLength(1);
    expect(r.pieces[0]).toMatchObject({ name: "Patch pocket", cutCount: 2, mirrored: true });
    expectSamePoints(r.pieces[0].outline, [
      [0, 0],
      [152.4, 0],
      [152.4, 177.8],
      [0, 177.8],
    ]);
    expectSamePoints(r.pieces[0].grainline!, [
      [76.2, 25.4],
      [76.2, 152.4],
    ]);
    expect(r.ignored.map((g) => [g.entity, g.layer])).toEqual([
      ["TEXT", "0"],
      ["POLYLINE", "STRAY"],
    ]);
  });

  it("a name with a colon stays a name; a block no INSERT places is named as left out", () => {
    const file = [
      "0",
      "SECTION",
      "2",
      "BLOCKS",
      "0",
      "BLOCK",
      "8",
      "0",
      "2",
      "SPARE",
      "70",
      "0",
      "10",
      "0",
      "20",
      "0",
      "30",
      "0",
      ...square(0, 0, 100),
      "0",
      "ENDBLK",
      "8",
      "0",
      "0",
      "ENDSEC",
      "0",
      "SECTION",
      "2",
      "ENTITIES",
      ...square(0, 0, 200),
      "0",
      "TEXT",
      "8",
      "0",
      "10",
      "50",
      "20",
      "50",
      "40",
      "5",
      "1",
      "Sleeve: upper",
      "0",
      "ENDSEC",
      "0",
      "EOF",
      "",
    ].join("\n");

    const r = readDxfPieces(file);

    expect(r.pieces.map((p) => p.name)).toEqual(["Sleeve: upper"]);
    expect(r.ignored).toContainEqual(
      expect.objectContaining({ entity: "BLOCK", reason: expect.stringMatching(/block "SPARE" is defined but no INSERT places it/) }),
    );
  });

  it("gives nested text to the smallest piece that contains it", () => {
    const file = dxfOf(
      square(0, 0, 1000, "OUTER"),
      square(100, 100, 200, "INNER"),
      ["0", "TEXT", "8", "0", "10", "150", "20", "150", "40", "5", "1", "Inner"],
      ["0", "TEXT", "8", "0", "10", "500", "20", "500", "40", "5", "1", "Outer"],
    );

    const r = readDxfPieces(file);

    expect(r.pieces.map((p) => p.name)).toEqual(["Outer", "Inner"]);
  });
});
