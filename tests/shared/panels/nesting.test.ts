import { describe, expect, it } from "vitest";
import fc from "fast-check";
// @ts-expect-error clipper-lib ships no type declarations; used here as an independent overlap oracle.
import ClipperLib from "clipper-lib";
import { polygonArea as d3Area, polygonContains } from "d3-polygon";
import { nestPieceFromPanel, nestPieces, type NestPiece, type NestResult } from "@shared/domain/panels/nesting";
import type { Point } from "@shared/domain/panels/geometry";
import { benchPieces } from "../../../scripts/bench/nesting";

type XY = [number, number];
const d3 = (p: readonly Point[]) => p.map(([x, y]) => [x, y] as XY);
const area = (p: readonly Point[]) => Math.abs(d3Area(d3(p)));
const rect = (w: number, h: number): Point[] => [
  [0, 0],
  [w, 0],
  [w, h],
  [0, h],
];

/** Overlap area of two polygons (mm²) computed directly with clipper-lib at 1 µm resolution. */
function overlapArea(a: readonly Point[], b: readonly Point[]): number {
  const scale = 1000;
  const toPath = (p: readonly Point[]) => p.map(([x, y]) => ({ X: Math.round(x * scale), Y: Math.round(y * scale) }));
  const c = new ClipperLib.Clipper();
  c.AddPath(toPath(a), ClipperLib.PolyType.ptSubject, true);
  c.AddPath(toPath(b), ClipperLib.PolyType.ptClip, true);
  const out: { X: number; Y: number }[][] = [];
  c.Execute(ClipperLib.ClipType.ctIntersection, out, ClipperLib.PolyFillType.pftNonZero, ClipperLib.PolyFillType.pftNonZero);
  return out.reduce((s, p) => s + Math.abs(ClipperLib.Clipper.Area(p)), 0) / (scale * scale);
}

/** Applies the reported mirror, rotation and offset to a point, as the placement documents them. */
function transform(p: Point, mirrored: boolean, deg: number, offset: Point): XY {
  const x0 = mirrored ? -p[0] : p[0];
  const rad = (deg * Math.PI) / 180;
  return [x0 * Math.cos(rad) - p[1] * Math.sin(rad) + offset[0], x0 * Math.sin(rad) + p[1] * Math.cos(rad) + offset[1]];
}

/** Independent checks every marker must pass. */
function checkMarker(pieces: NestPiece[], result: NestResult, W: number) {
  const { placements } = result;
  const copies = pieces.reduce((s, p) => s + p.cutCount, 0);
  expect(placements.length + result.unplaced.length).toBe(copies);

  // Inside the strip: 0 ≤ x, 0 ≤ y ≤ usable width.
  const outside = placements.flatMap((p) => p.polygon.filter(([x, y]) => x < -1e-9 || y < -1e-9 || y > W + 1e-9));
  expect(outside).toEqual([]);

  // No overlaps: clipper intersection area ≈ 0 for every pair.
  let worstOverlap = 0;
  for (let i = 0; i < placements.length; i++) {
    for (let j = i + 1; j < placements.length; j++) {
      worstOverlap = Math.max(worstOverlap, overlapArea(placements[i].polygon, placements[j].polygon));
    }
  }
  expect(worstOverlap).toBeLessThan(1e-3);

  // No overlaps, second oracle: grid sample points are never strictly inside two pieces (d3 polygonContains).
  const L = result.markerLengthMm;
  const polys = placements.map((p) => d3(p.polygon));
  const doubly: XY[] = [];
  for (let x = 0.37; x < L; x += 7.3) {
    for (let y = 0.41; y < W; y += 7.3) {
      let inside = 0;
      for (const poly of polys) if (polygonContains(poly, [x, y])) inside++;
      if (inside > 1) doubly.push([x, y]);
    }
  }
  expect(doubly).toEqual([]);

  // Each placed polygon is the piece under the reported mirror/rotation/offset (within the 0.01 mm grid),
  // and the grain is kept: the transformed grainline runs along x, or also along y for bias/free pieces.
  for (const p of placements) {
    const piece = pieces.find((q) => q.id === p.pieceId)!;
    const moved = piece.outline.map((pt) => transform(pt, p.mirrored, p.rotationDeg, p.offset));
    expect(area(p.polygon)).toBeCloseTo(area(piece.outline), -1);
    // Match every vertex to its nearest counterpart both ways (sorting by x could pair up two vertices
    // that share an x coordinate in different orders after grid rounding).
    const nearest = (q: readonly [number, number], pts: ReadonlyArray<readonly [number, number]>) =>
      Math.min(...pts.map((r) => Math.max(Math.abs(q[0] - r[0]), Math.abs(q[1] - r[1]))));
    const worst = Math.max(...moved.map((q) => nearest(q, p.polygon)), ...p.polygon.map((q) => nearest(q, moved)));
    expect(worst).toBeLessThanOrEqual(0.006);
    const g = piece.grainline ?? [
      [0, 0],
      [0, 1],
    ];
    const [g0, g1] = g.map((pt) => transform(pt, p.mirrored, p.rotationDeg, [0, 0]));
    const angle = ((((Math.atan2(g1[1] - g0[1], g1[0] - g0[0]) * 180) / Math.PI) % 360) + 360) % 360;
    const allowed = (piece.grainMode ?? "straight") === "straight" ? [0, 180, 360] : [0, 90, 180, 270, 360];
    expect(Math.min(...allowed.map((a) => Math.abs(angle - a)))).toBeLessThan(1e-6);
    expect(p.mirrored).toBe(Boolean(piece.mirrored) && p.copy % 2 === 1);
  }

  // Marker making (common practice, no source): efficiency = piece area / (marker length × width); lower bound = Σ area / width.
  const maxX = Math.max(...placements.flatMap((p) => p.polygon.map(([x]) => x)));
  const placedArea = placements.reduce((s, p) => s + area(p.polygon), 0);
  expect(result.markerLengthMm).toBeCloseTo(maxX, 9);
  expect(result.efficiency).toBeCloseTo(placedArea / (maxX * W), 9);
  const totalArea = pieces.reduce((s, p) => s + area(p.outline) * p.cutCount, 0);
  expect(result.lowerBoundMm).toBeCloseTo(totalArea / W, 6);
  if (result.unplaced.length === 0) expect(result.markerLengthMm).toBeGreaterThanOrEqual(result.lowerBoundMm - 1e-6);
}

describe("nestPieces on rectangle sets with a known optimum", () => {
  const along = (w: number): [Point, Point] => [
    [0, 0],
    [w, 0],
  ];

  // Optimum by area argument: the pieces tile the strip exactly, so length = lower bound and efficiency 100 %.
  it.each([
    ["four 500 × 725 blocks in two rows", [{ id: "a", outline: rect(500, 725), grainline: along(500), cutCount: 4 }], 1000],
    ["ten 400 × 290 blocks in five rows", [{ id: "a", outline: rect(400, 290), grainline: along(400), cutCount: 10 }], 800],
    [
      "two 1000 × 725 and four 500 × 725 blocks",
      [
        { id: "big", outline: rect(1000, 725), grainline: along(1000), cutCount: 2 },
        { id: "small", outline: rect(500, 725), grainline: along(500), cutCount: 4 },
      ],
      2000,
    ],
  ] as [string, NestPiece[], number][])("%s tiles the 1450 mm strip exactly", (_name, pieces, optimum) => {
    const W = 1450;

    const result = nestPieces(pieces, { usableWidthMm: W });

    checkMarker(pieces, result, W);
    expect(result.markerLengthMm).toBeCloseTo(optimum, 6);
    expect(result.lowerBoundMm).toBeCloseTo(optimum, 6);
    expect(result.efficiency).toBeCloseTo(1, 9);
  });

  // A 300 × 1000 piece kept on grain (grain along its 300 mm side) cannot turn, so the marker is 300 mm long
  // although the area bound is 206.9 mm; allowed to lie cross-grain, the same piece needs only 300 mm
  // when its grain runs along the 1000 mm side.
  it("keeps a straight-grain piece from turning, and lets a free piece turn to fit", () => {
    const W = 1450;
    const straight: NestPiece[] = [{ id: "s", outline: rect(300, 1000), grainline: along(300), cutCount: 1 }];
    const free: NestPiece[] = [{ id: "f", outline: rect(1000, 300), grainline: along(1000), cutCount: 1, grainMode: "free" }];
    const wide: NestPiece[] = [{ id: "w", outline: rect(1000, 300), grainline: along(1000), cutCount: 1 }];

    const rs = nestPieces(straight, { usableWidthMm: W });
    const rf = nestPieces(free, { usableWidthMm: W });
    const rw = nestPieces(wide, { usableWidthMm: W });

    expect(rs.markerLengthMm).toBe(300);
    expect(rf.markerLengthMm).toBe(300);
    expect(rw.markerLengthMm).toBe(1000);
    checkMarker(free, rf, W);
  });

  it("reports copies wider than the strip in every allowed orientation as unplaced", () => {
    const pieces: NestPiece[] = [{ id: "cape", outline: rect(500, 1600), grainline: along(500), cutCount: 1 }];

    const result = nestPieces(pieces, { usableWidthMm: 1450 });

    expect(result.placements).toEqual([]);
    expect(result.unplaced).toEqual([{ pieceId: "cape", copy: 0, reason: expect.stringContaining("wider") }]);
  });
});

describe("nestPieces on garment-like and random sets", () => {
  const trapezoid = (bottom: number, top: number, h: number): Point[] => [
    [0, 0],
    [bottom, 0],
    [(bottom + top) / 2, h],
    [(bottom - top) / 2, h],
  ];
  const lShape: Point[] = [
    [0, 0],
    [400, 0],
    [400, 200],
    [150, 200],
    [150, 600],
    [0, 600],
  ];

  it("lays mirrored pairs, concave and bias pieces without overlap, on grain and within the width", () => {
    const W = 1450;
    const pieces: NestPiece[] = [
      { id: "skirt", outline: trapezoid(600, 400, 700), cutCount: 2, mirrored: true },
      { id: "yoke", outline: lShape, cutCount: 2, mirrored: true },
      {
        id: "bias",
        outline: rect(40, 500),
        cutCount: 2,
        grainMode: "bias",
        grainline: [
          [0, 0],
          [40, 40],
        ],
      },
      { id: "pocket", outline: trapezoid(180, 150, 200), cutCount: 3, grainMode: "free" },
    ];
    const progress: [number, number][] = [];

    const result = nestPieces(pieces, { usableWidthMm: W, onProgress: (d, t) => progress.push([d, t]) });

    checkMarker(pieces, result, W);
    expect(progress[0]).toEqual([0, 9]);
    expect(progress.at(-1)).toEqual([9, 9]);
    expect(progress.map(([d]) => d)).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("never overlaps and respects the lower bound on random polygon sets", () => {
    const pieceArb = fc
      .record({
        radii: fc.array(fc.integer({ min: 40, max: 300 }), { minLength: 4, maxLength: 12 }),
        cutCount: fc.integer({ min: 1, max: 3 }),
        mirrored: fc.boolean(),
        grainMode: fc.constantFrom("straight" as const, "bias" as const, "free" as const),
        grainAngle: fc.integer({ min: 0, max: 359 }),
      })
      .map(({ radii, cutCount, mirrored, grainMode, grainAngle }) => {
        const n = radii.length;
        const outline = radii.map((r, i): Point => [r * Math.cos((2 * Math.PI * i) / n), r * Math.sin((2 * Math.PI * i) / n)]);
        const a = (grainAngle * Math.PI) / 180;
        return {
          outline,
          cutCount,
          mirrored,
          grainMode,
          grainline: [
            [0, 0],
            [Math.cos(a), Math.sin(a)],
          ] as [Point, Point],
        };
      });
    fc.assert(
      fc.property(fc.array(pieceArb, { minLength: 2, maxLength: 6 }), fc.integer({ min: 700, max: 1500 }), (raw, W) => {
        const pieces: NestPiece[] = raw.map((p, i) => ({ id: `p${i}`, ...p }));

        const result = nestPieces(pieces, { usableWidthMm: W });

        expect(result.unplaced).toEqual([]);
        checkMarker(pieces, result, W);
      }),
      { numRuns: 12 },
    );
  });

  it("builds the cut line from a panel's seam allowance", () => {
    const piece = nestPieceFromPanel({ id: "p", name: "Panel", outline: rect(100, 200), seamAllowanceMm: 10, cutCount: 2 });

    // A 100 × 200 sew line with 10 mm allowance and miter corners cuts as 120 × 220 (elementary geometry).
    expect(area(piece.outline)).toBe(120 * 220);
    expect(piece.cutCount).toBe(2);
  });
});

describe("nestPieces local search", () => {
  const W = 1450;

  it("keeps every layout it accepts valid: no overlap, inside the width, on grain (the 30-copy bench set, 40 layouts)", () => {
    const pieces = benchPieces();

    const first = nestPieces(pieces, { usableWidthMm: W });
    const improved = nestPieces(pieces, { usableWidthMm: W, search: { seed: 7, maxEvaluations: 40 } });

    checkMarker(pieces, improved, W);
    expect(improved.placements).toHaveLength(30);
    expect(improved.markerLengthMm).toBeLessThanOrEqual(first.markerLengthMm);
    // Length can never beat the area bound (total area / width).
    expect(improved.markerLengthMm).toBeGreaterThanOrEqual(improved.lowerBoundMm);
  });

  it("repeats exactly for the same seed and budget, and reports its progress", () => {
    const pieces = benchPieces().slice(5, 12);
    const progress: number[] = [];

    const a = nestPieces(pieces, {
      usableWidthMm: W,
      search: { seed: 3, maxEvaluations: 25, onProgress: (p) => progress.push(p.fraction) },
    });
    const b = nestPieces(pieces, { usableWidthMm: W, search: { seed: 3, maxEvaluations: 25 } });

    expect(b).toEqual(a);
    expect(progress.at(-1)).toBe(1);
    expect([...progress].sort((x, y) => x - y)).toEqual(progress);
  });

  it("stops at the time budget on the clock it is given", () => {
    let t = 0;
    const pieces = benchPieces().slice(5, 12);
    let layouts = 0;

    nestPieces(pieces, {
      usableWidthMm: W,
      search: { seed: 1, timeBudgetMs: 100, now: () => (t += 10), onProgress: (p) => (layouts = p.evaluations) },
    });

    // Each clock reading advances 10 ms: a 100 ms budget allows about ten readings.
    expect(layouts).toBeGreaterThan(1);
    expect(layouts).toBeLessThan(15);
  });

  it("never overlaps on random polygon sets after searching", () => {
    const pieceArb = fc
      .record({
        radii: fc.array(fc.integer({ min: 40, max: 300 }), { minLength: 4, maxLength: 10 }),
        cutCount: fc.integer({ min: 1, max: 3 }),
        mirrored: fc.boolean(),
        grainMode: fc.constantFrom("straight" as const, "free" as const),
      })
      .map(({ radii, cutCount, mirrored, grainMode }) => ({
        outline: radii.map((r, i): Point => [
          r * Math.cos((2 * Math.PI * i) / radii.length),
          r * Math.sin((2 * Math.PI * i) / radii.length),
        ]),
        cutCount,
        mirrored,
        grainMode,
      }));
    fc.assert(
      fc.property(
        fc.array(pieceArb, { minLength: 2, maxLength: 5 }),
        fc.integer({ min: 700, max: 1500 }),
        fc.integer({ min: 1, max: 1000 }),
        (raw, width, seed) => {
          const pieces: NestPiece[] = raw.map((p, i) => ({ id: `p${i}`, ...p }));

          const result = nestPieces(pieces, { usableWidthMm: width, search: { seed, maxEvaluations: 8 } });

          checkMarker(pieces, result, width);
        },
      ),
      { numRuns: 6 },
    );
  });
});
