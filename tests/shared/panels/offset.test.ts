import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polygonArea as d3Area, polygonHull, polygonLength } from "d3-polygon";
import { cutLineFromSewLine, offsetOutline, sewLineFromCutLine } from "@shared/domain/panels/offset";
import type { Point } from "@shared/domain/panels/geometry";

const area = (p: readonly Point[]) => Math.abs(d3Area(p.map(([x, y]) => [x, y] as [number, number])));
const square = (a: number): Point[] => [
  [0, 0],
  [a, 0],
  [a, a],
  [0, a],
];

describe("offsetOutline", () => {
  // Miter joins keep square corners: a square of side a grown by s is a square of side a + 2s (elementary geometry).
  it.each([
    [100, 10],
    [250, 15],
    [40, 6],
  ])("grows a %i mm square by %i mm with miter joins to exactly (a + 2s)²", (a, s) => {
    const out = cutLineFromSewLine(square(a), s, { join: "miter" });

    expect(area(out)).toBe((a + 2 * s) ** 2);
  });

  // Steiner formula for convex sets: area(K ⊕ s·disc) = A + P·s + π·s². Round joins approximate the arcs by
  // chords within the arc tolerance, which can only lose area, at most (arc length × tolerance) = 2πs·tol.
  it("grows a square with round joins to a² + 4as + πs² less at most the chord loss", () => {
    const a = 100;
    const s = 10;
    const tol = 0.05;

    const got = area(cutLineFromSewLine(square(a), s, { join: "round", arcToleranceMm: tol }));

    const steiner = a * a + 4 * a * s + Math.PI * s * s;
    expect(got).toBeLessThanOrEqual(steiner + 1e-3);
    expect(got).toBeGreaterThanOrEqual(steiner - 2 * Math.PI * s * tol - 1e-3);
  });

  it("follows the Steiner formula for random convex outlines with round joins", () => {
    const hullArb = fc
      .array(fc.tuple(fc.integer({ min: 0, max: 600 }), fc.integer({ min: 0, max: 600 })), { minLength: 3, maxLength: 30 })
      .map((pts) => polygonHull(pts.map(([x, y]) => [x, y] as [number, number])))
      .filter((h): h is [number, number][] => h !== null && area(h) > 100);
    fc.assert(
      fc.property(hullArb, fc.integer({ min: 3, max: 25 }), (hull, s) => {
        const tol = 0.02;
        const got = area(offsetOutline(hull, s, { join: "round", arcToleranceMm: tol })[0]);
        const steiner = area(hull) + polygonLength(hull) * s + Math.PI * s * s;
        // Chord loss on the arcs plus µm rounding of every vertex (perimeter × 0.5 µm × 2).
        const slack = 2 * Math.PI * s * tol + (polygonLength(hull) + 2 * Math.PI * s) * 0.001;
        expect(got).toBeLessThanOrEqual(steiner + slack);
        expect(got).toBeGreaterThanOrEqual(steiner - slack);
      }),
      { numRuns: 60 },
    );
  });

  it("offsets clockwise outlines outward too", () => {
    const cw = [...square(100)].reverse();

    expect(area(cutLineFromSewLine(cw, 10))).toBe(120 * 120);
  });

  // Inset by s of a square of side a is a square of side a − 2s (elementary geometry).
  it("recovers the sew line from the cut line", () => {
    expect(area(sewLineFromCutLine(square(120), 10))).toBe(100 * 100);
  });

  it("leaves the outline unchanged for a zero seam allowance and reports an outline used up by an inset", () => {
    expect(cutLineFromSewLine(square(50), 0)).toEqual(square(50));
    expect(offsetOutline(square(10), -6)).toEqual([]);
    expect(() => sewLineFromCutLine(square(10), 6)).toThrow(/no outline/);
  });
});
