import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polygonArea as d3Area, polygonContains, polygonLength } from "d3-polygon";
import {
  boundingBox,
  edgeLengths,
  insertOutlinePoints,
  mirrorPoints,
  notchPosition,
  perimeter,
  pointInPolygon,
  polygonArea,
  rotatePoints,
  runLength,
  runPoints,
  signedArea,
  translatePoints,
  validatePolygon,
  type Point,
} from "@shared/domain/panels/geometry";

// Star-shaped polygons (vertices at increasing angles around the origin) are simple by construction.
const starPolygon = fc
  .array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 5, max: 500, noNaN: true })), {
    // Four or more sectors keep every angular gap below π, so the origin is inside and the polygon simple.
    minLength: 4,
    maxLength: 40,
  })
  .map((pairs) => {
    const n = pairs.length;
    return pairs.map(([jitter, r], i): Point => {
      const a = ((i + 0.1 + 0.8 * jitter) / n) * 2 * Math.PI;
      return [r * Math.cos(a), r * Math.sin(a)];
    });
  });

const toD3 = (p: readonly Point[]) => p.map(([x, y]) => [x, y] as [number, number]);

describe("shoelace area", () => {
  // shoelace formula: trapezoid skirt panel (cm) → 3500 cm², reversed → −3500
  it("gives 3500 cm² for the trapezoid skirt panel and −3500 when reversed", () => {
    const trapezoid: Point[] = [
      [0, 0],
      [60, 0],
      [50, 70],
      [10, 70],
    ];

    expect(signedArea(trapezoid)).toBe(3500);
    expect(signedArea([...trapezoid].reverse())).toBe(-3500);
    expect(polygonArea([...trapezoid].reverse())).toBe(3500);
  });

  // shoelace formula: L-shaped yoke → 1400 cm² (= 40×20 + 15×40)
  it("gives 1400 cm² for the L-shaped yoke", () => {
    const yoke: Point[] = [
      [0, 0],
      [40, 0],
      [40, 20],
      [15, 20],
      [15, 60],
      [0, 60],
    ];

    expect(signedArea(yoke)).toBe(1400);
  });

  // d3-polygon library: d3-polygon polygonArea is signed positive for counter-clockwise in a y-down frame,
  // so in our y-up frame it is the negative of our signed area.
  it("agrees with d3-polygon polygonArea (opposite sign convention) on random polygons", () => {
    fc.assert(
      fc.property(starPolygon, (poly) => {
        const ours = signedArea(poly);
        const theirs = d3Area(toD3(poly));
        expect(Math.abs(ours + theirs)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(theirs)));
        expect(ours).toBeGreaterThan(0);
      }),
      { numRuns: 200 },
    );
  });

  it("is unchanged far from the origin (translation invariance of area)", () => {
    fc.assert(
      fc.property(starPolygon, fc.double({ min: -1e6, max: 1e6, noNaN: true }), (poly, d) => {
        const moved = translatePoints(poly, d, -d);
        expect(Math.abs(signedArea(moved) - signedArea(poly))).toBeLessThanOrEqual(1e-6 * signedArea(poly));
      }),
      { numRuns: 100 },
    );
  });
});

describe("lengths", () => {
  // d3-polygon polygonLength is the perimeter of the closed polygon (independent oracle, d3-polygon / mathjs library)
  it("perimeter matches d3-polygon polygonLength and the sum of edge lengths", () => {
    fc.assert(
      fc.property(starPolygon, (poly) => {
        const p = perimeter(poly);
        expect(p).toBeCloseTo(polygonLength(toD3(poly)), 6);
        expect(edgeLengths(poly)).toHaveLength(poly.length);
      }),
      { numRuns: 100 },
    );
  });

  // Worked by hand: 3-4-5 right triangle has edges 3, 4, 5 and perimeter 12.
  it("gives edge lengths 3, 4, 5 for a 3-4-5 triangle", () => {
    expect(
      edgeLengths([
        [0, 0],
        [3, 0],
        [3, 4],
      ]),
    ).toEqual([3, 4, 5]);
  });

  // Worked by hand on a 100 mm square (0,0),(100,0),(100,100),(0,100).
  const square: Point[] = [
    [0, 0],
    [100, 0],
    [100, 100],
    [0, 100],
  ];
  it.each([
    ["vertex 0 to vertex 2 forward", 0, 2, "forward", 200],
    ["vertex 0 to vertex 2 backward", 0, 2, "backward", 200],
    ["vertex 3 to vertex 1 forward, wrapping past vertex 0", 3, 1, "forward", 200],
    ["vertex 1 to vertex 0 forward (three edges)", 1, 0, "forward", 300],
    ["vertex 1 to vertex 0 backward (one edge)", 1, 0, "backward", 100],
    ["the same vertex (empty run)", 2, 2, "forward", 0],
  ] as const)("run length %s", (_name, from, to, dir, expected) => {
    expect(runLength(square, from, to, dir)).toBeCloseTo(expected, 12);
  });

  it("measures runs that start and end at notches mid-edge", () => {
    const notchA = notchPosition(square, { point: [25, 0], edge: 0 });
    const notchB = notchPosition(square, { point: [100, 60], edge: 1 });

    // 75 mm to the corner, then 60 mm up: 135 mm forward; the long way round is 400 − 135 = 265 mm.
    expect(runLength(square, notchA, notchB)).toBeCloseTo(135, 12);
    expect(runLength(square, notchB, notchA)).toBeCloseTo(265, 12);
    expect(runLength(square, notchA, notchB, "backward")).toBeCloseTo(265, 12);
    expect(runLength(square, { edge: 0, t: 0.25 }, { edge: 0, t: 0.75 })).toBeCloseTo(50, 12);
  });

  it("lists the run's points in walking order", () => {
    expect(runPoints(square, 3, 1)).toEqual([
      [0, 100],
      [0, 0],
      [100, 0],
    ]);
    expect(runPoints(square, 1, 3, "backward")).toEqual([
      [100, 0],
      [0, 0],
      [0, 100],
    ]);
  });

  it("forward and backward runs between two points add up to the perimeter", () => {
    fc.assert(
      fc.property(starPolygon, fc.nat(), fc.nat(), fc.double({ min: 0, max: 0.99, noNaN: true }), (poly, i, j, t) => {
        const n = poly.length;
        const a = { edge: i % n, t };
        const b = j % n;
        if (a.edge === b && t === 0) return;
        const sum = runLength(poly, a, b) + runLength(poly, b, a);
        expect(sum).toBeCloseTo(perimeter(poly), 6);
        expect(runLength(poly, a, b, "backward")).toBeCloseTo(runLength(poly, b, a), 6);
      }),
      { numRuns: 200 },
    );
  });
});

describe("transforms and bounding box", () => {
  it("rotates by 90° exactly and keeps the area", () => {
    const r = rotatePoints(
      [
        [10, 0],
        [20, 5],
      ],
      90,
    );

    expect(r).toEqual([
      [0, 10],
      [-5, 20],
    ]);
  });

  it("keeps area under rotation and flips its sign under mirroring", () => {
    fc.assert(
      fc.property(starPolygon, fc.double({ min: -720, max: 720, noNaN: true }), (poly, deg) => {
        const a = signedArea(poly);
        expect(signedArea(rotatePoints(poly, deg, [3, 7]))).toBeCloseTo(a, 6);
        expect(signedArea(mirrorPoints(poly, 12))).toBeCloseTo(-a, 6);
      }),
      { numRuns: 100 },
    );
  });

  it("finds the bounding box", () => {
    expect(
      boundingBox([
        [1, 5],
        [-2, 3],
        [4, -1],
      ]),
    ).toEqual({ minX: -2, minY: -1, maxX: 4, maxY: 5, width: 6, height: 6 });
  });
});

describe("pointInPolygon", () => {
  // d3-polygon polygonContains is an independent even-odd point-in-polygon test (d3-polygon library).
  it("agrees with d3-polygon polygonContains away from the boundary", () => {
    fc.assert(
      fc.property(
        starPolygon,
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        (poly, x, y) => {
          const ours = pointInPolygon([x, y], poly, 1e-6);
          if (ours === "boundary") return;
          expect(ours === "inside").toBe(polygonContains(toD3(poly), [x, y]));
        },
      ),
      { numRuns: 500 },
    );
  });

  it("reports points on an edge as boundary", () => {
    expect(
      pointInPolygon(
        [50, 0],
        [
          [0, 0],
          [100, 0],
          [100, 100],
          [0, 100],
        ],
      ),
    ).toBe("boundary");
  });
});

describe("validatePolygon", () => {
  it("accepts a simple quadrilateral", () => {
    expect(
      validatePolygon([
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ]),
    ).toMatchObject({ valid: true, issues: [] });
  });

  it("reports which edges of a bow-tie cross, and where", () => {
    const r = validatePolygon([
      [0, 0],
      [10, 10],
      [10, 0],
      [0, 10],
    ]);

    expect(r.valid).toBe(false);
    expect(r.crossings).toEqual([{ edgeA: 0, edgeB: 2, point: [5, 5] }]);
    expect(r.issues.map((i) => i.code)).toEqual(["zero_area", "self_intersection"]);
  });

  it("rejects fewer than 3 points", () => {
    expect(
      validatePolygon([
        [0, 0],
        [1, 1],
      ]).issues[0].code,
    ).toBe("too_few_points");
  });

  it("rejects an open polyline and accepts one whose last point repeats the first", () => {
    const open = validatePolygon(
      [
        [0, 0],
        [10, 0],
        [10, 10],
      ],
      { closed: false },
    );
    const closedByRepeat = validatePolygon(
      [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 0],
      ],
      { closed: false },
    );

    expect(open.issues.map((i) => i.code)).toContain("not_closed");
    expect(closedByRepeat.valid).toBe(true);
  });

  it("rejects repeated vertices and an edge folding back on its neighbour", () => {
    expect(
      validatePolygon([
        [0, 0],
        [10, 0],
        [10, 0],
        [0, 10],
      ]).issues.map((i) => i.code),
    ).toContain("zero_length_edge");
    expect(
      validatePolygon([
        [0, 0],
        [10, 0],
        [5, 0],
        [5, 5],
      ]).crossings[0],
    ).toMatchObject({ edgeA: 0, edgeB: 1 });
  });

  it("accepts every star-shaped polygon (simple by construction)", () => {
    fc.assert(
      fc.property(starPolygon, (poly) => {
        expect(validatePolygon(poly).crossings).toEqual([]);
      }),
      { numRuns: 200 },
    );
  });
});

describe("insertOutlinePoints", () => {
  it("splits edges at the given positions without changing the area", () => {
    const square: Point[] = [
      [0, 0],
      [100, 0],
      [100, 100],
      [0, 100],
    ];

    const r = insertOutlinePoints(square, [{ edge: 0, t: 0.5 }, 2, { edge: 0, t: 0.25 }]);

    expect(r.outline).toEqual([
      [0, 0],
      [25, 0],
      [50, 0],
      [100, 0],
      [100, 100],
      [0, 100],
    ]);
    expect(r.indices).toEqual([2, 4, 1]);
    expect(signedArea(r.outline)).toBe(10000);
  });
});
