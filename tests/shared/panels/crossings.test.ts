import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { findCrossings } from "@shared/domain/panels/crossings";
import { orient2d } from "robust-predicates";
import { validatePolygon, type Point } from "@shared/domain/panels/geometry";

// The reference uses the same exact orientation sign as the sweep, so the two differ only in which
// pairs they look at: all of them, or neighbours in the sweep order.
const orient = (a: Point, b: Point, c: Point) => -orient2d(a[0], a[1], b[0], b[1], c[0], c[1]);
const within = (a: Point, b: Point, p: Point) =>
  Math.min(a[0], b[0]) <= p[0] && p[0] <= Math.max(a[0], b[0]) && Math.min(a[1], b[1]) <= p[1] && p[1] <= Math.max(a[1], b[1]);
function touches(a: Point, b: Point, c: Point, d: Point): boolean {
  const [d1, d2, d3, d4] = [orient(c, d, a), orient(c, d, b), orient(a, b, c), orient(a, b, d)];
  if (((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0))) return true;
  return (d1 === 0 && within(c, d, a)) || (d2 === 0 && within(c, d, b)) || (d3 === 0 && within(a, b, c)) || (d4 === 0 && within(a, b, d));
}

/**
 * Reference: every pair of edges tested against every other (O(n²)), the check the sweep replaced.
 * Neighbours may share their vertex and are faulty only when they fold back along each other.
 */
function bruteForcePairs(poly: readonly Point[]): Set<string> {
  const n = poly.length;
  const out = new Set<string>();
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const [a, b, c, d] = [poly[i], poly[(i + 1) % n], poly[j], poly[(j + 1) % n]];
      const nextTo = j === i + 1;
      const wrap = i === 0 && j === n - 1;
      if (nextTo || wrap) {
        const shared = nextTo ? b : a;
        const p = nextTo ? a : b;
        const q = nextTo ? d : c;
        if (orient(p, shared, q) === 0 && (q[0] - shared[0]) * (p[0] - shared[0]) + (q[1] - shared[1]) * (p[1] - shared[1]) > 0)
          out.add(`${i}:${j}`);
        continue;
      }
      if (touches(a, b, c, d)) out.add(`${i}:${j}`);
    }
  }
  return out;
}

// Integer grids make touching, collinear and repeated cases common, which is where sweeps go wrong.
/** Drops consecutive repeats (zero-length edges are a separate fault the sweep skips). */
function withoutRepeats(pts: readonly Point[]): Point[] {
  const out: Point[] = [];
  for (const p of pts) if (!out.length || out[out.length - 1][0] !== p[0] || out[out.length - 1][1] !== p[1]) out.push(p);
  while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  return out;
}
const gridPolygon = fc
  .array(fc.tuple(fc.integer({ min: 0, max: 8 }), fc.integer({ min: 0, max: 8 })), { minLength: 3, maxLength: 14 })
  .map(withoutRepeats);
// Millimetres with micrometre steps (exact predicates misjudge subnormal numbers, which no drawing holds).
const mm = fc.integer({ min: -100_000_000, max: 100_000_000 }).map((v) => v / 1e6);
const realPolygon = fc.array(fc.tuple(mm, mm), { minLength: 3, maxLength: 30 }).map(withoutRepeats);

describe("findCrossings (sweep line) against the all-pairs reference", () => {
  it("finds a crossing exactly when the all-pairs check does, and only real ones (integer grid, touching and collinear cases)", () => {
    fc.assert(
      fc.property(gridPolygon, (poly) => {
        fc.pre(poly.length >= 3);
        const reference = bruteForcePairs(poly);

        const found = findCrossings(poly, Infinity).crossings;

        expect(found.length > 0).toBe(reference.size > 0);
        for (const c of found) expect(reference.has(`${c.edgeA}:${c.edgeB}`)).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });

  it("agrees on random real coordinates", () => {
    fc.assert(
      fc.property(realPolygon, (poly) => {
        fc.pre(poly.length >= 3);
        const reference = bruteForcePairs(poly);

        const found = findCrossings(poly, Infinity).crossings;

        expect(found.length > 0).toBe(reference.size > 0);
        for (const c of found) expect(reference.has(`${c.edgeA}:${c.edgeB}`)).toBe(true);
      }),
      { numRuns: 1000 },
    );
  });

  it("reports a figure eight's single crossing at its centre", () => {
    const bowTie: Point[] = [
      [0, 0],
      [100, 100],
      [100, 0],
      [0, 100],
    ];

    expect(findCrossings(bowTie)).toEqual({ crossings: [{ edgeA: 0, edgeB: 2, point: [50, 50] }], truncated: false });
  });

  it("finds nothing in a simple 40,000-point outline (a circle of radius 500 mm)", () => {
    const n = 40_000;
    const circle: Point[] = Array.from({ length: n }, (_, i) => [
      500 * Math.cos((2 * Math.PI * i) / n),
      500 * Math.sin((2 * Math.PI * i) / n),
    ]);

    expect(findCrossings(circle)).toEqual({ crossings: [], truncated: false });
  });

  it("stops at 20 on a 2,000-point zigzag that crosses itself about a million times", () => {
    // Teeth along x at the bottom, then back along x at the top shifted by half a tooth, closing the
    // outline: every tall tooth crosses every returning one.
    const n = 1000;
    const pts: Point[] = [];
    for (let i = 0; i < n; i++) pts.push([i * 10, i % 2 ? 1000 : 0]);
    for (let i = n - 1; i >= 0; i--) pts.push([i * 10 + 5, i % 2 ? 0 : 1000]);

    const r = findCrossings(pts);

    expect(r.crossings).toHaveLength(20);
    expect(r.truncated).toBe(true);
    const reference = bruteForcePairs(pts.slice(0, 60).concat(pts.slice(-60)));
    expect(reference.size).toBeGreaterThan(0);
  });
});

describe("validatePolygon lists at most 20 crossings", () => {
  it("gives a short answer for a badly crossed outline", () => {
    const n = 1000;
    const pts: Point[] = [];
    for (let i = 0; i < n; i++) pts.push([i * 10, i % 2 ? 1000 : 0]);
    for (let i = n - 1; i >= 0; i--) pts.push([i * 10 + 5, i % 2 ? 0 : 1000]);

    const v = validatePolygon(pts);

    expect(v.valid).toBe(false);
    expect(v.crossings).toHaveLength(20);
    expect(v.issues.filter((i) => i.code === "self_intersection")).toHaveLength(21);
    expect(v.issues.at(-1)!.message).toMatch(/first 20 crossings/);
  });
});
