import { describe, expect, it } from "vitest";
import { checkSeam, seamSideLength } from "@shared/domain/panels/seams";
import { notchPosition, type Point } from "@shared/domain/panels/geometry";

// Hand-worked panels with 3-4-5 triangles so every length is a whole number (elementary geometry).
// Front bodice: side seam is edge 1, from (300, 0) to (300, 400): 400 mm.
const front: Point[] = [
  [0, 0],
  [300, 0],
  [300, 400],
  [0, 400],
];
// Back bodice, drawn clockwise: side seam from (0, 0) up to (0, 402): 402 mm.
const back: Point[] = [
  [0, 0],
  [0, 402],
  [280, 402],
  [280, 0],
];
// Sleeve head (0,0)→(30,40)→(60,0): two 3-4-5 sides of 50 mm = 100 mm, closed by a straight hem below.
const sleeve: Point[] = [
  [0, 0],
  [30, 40],
  [60, 0],
  [60, -300],
  [0, -300],
];
// Armhole as a 90 mm straight run for simplicity: (0,0) to (0,90).
const armhole: Point[] = [
  [0, 0],
  [0, 90],
  [-200, 90],
  [-200, 0],
];

describe("checkSeam", () => {
  it("passes side seams 400 and 402 mm long within the default 3 mm (common practice, no source)", () => {
    const r = checkSeam({ a: { outline: front, from: 1, to: 2 }, b: { outline: back, from: 0, to: 1 } });

    expect(r).toMatchObject({ lengthA: 400, lengthB: 402, differenceMm: -2, status: "ok" });
  });

  it("flags a mismatch beyond the tolerance", () => {
    const r = checkSeam({ a: { outline: front, from: 1, to: 2 }, b: { outline: back, from: 0, to: 1 }, toleranceMm: 1.5 });

    expect(r.status).toBe("mismatch");
    expect(r.message).toContain("differ by 2.0 mm");
  });

  it("accepts a sleeve head 10 mm longer than the armhole when the ease range allows 5–15 mm", () => {
    const r = checkSeam({
      a: { outline: sleeve, from: 0, to: 2 },
      b: { outline: armhole, from: 0, to: 1 },
      eased: { minMm: 5, maxMm: 15 },
    });

    expect(r).toMatchObject({ lengthA: 100, lengthB: 90, differenceMm: 10, status: "eased_within_range" });
  });

  it("flags ease outside the allowed range", () => {
    const r = checkSeam({
      a: { outline: sleeve, from: 0, to: 2 },
      b: { outline: armhole, from: 0, to: 1 },
      eased: { minMm: 12, maxMm: 20 },
    });

    expect(r.status).toBe("eased_out_of_range");
  });

  it("measures between notches and walks backward when asked", () => {
    // Notch 10 mm along the sleeve's first side (t = 0.2 of 50 mm) to the apex: 40 mm.
    const notch = notchPosition(sleeve, { point: [6, 8], edge: 0 });

    expect(seamSideLength({ outline: sleeve, from: notch, to: 1 })).toBeCloseTo(40, 12);
    // Backward from vertex 2 to vertex 0 crosses the apex: the same 100 mm as forward 0 → 2.
    expect(seamSideLength({ outline: sleeve, from: 2, to: 0, direction: "backward" })).toBeCloseTo(100, 12);
  });

  it("rejects an empty ease range", () => {
    expect(() =>
      checkSeam({ a: { outline: front, from: 1, to: 2 }, b: { outline: back, from: 0, to: 1 }, eased: { minMm: 5, maxMm: 1 } }),
    ).toThrow(/empty/);
  });
});
