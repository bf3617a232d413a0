import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polygonArea as d3Area, polygonContains } from "d3-polygon";
import { interiorPoint, triangulatePanel } from "@shared/domain/panels/triangulate";
import type { Point } from "@shared/domain/panels/geometry";

const starPolygon = fc
  .array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 5, max: 500, noNaN: true })), {
    // Four or more sectors keep every angular gap below π, so the origin is inside and the polygon simple.
    minLength: 4,
    maxLength: 40,
  })
  .chain((pairs) =>
    fc.boolean().map((reverse) => {
      const n = pairs.length;
      const pts = pairs.map(([jitter, r], i): Point => {
        const a = ((i + 0.1 + 0.8 * jitter) / n) * 2 * Math.PI;
        return [r * Math.cos(a), r * Math.sin(a)];
      });
      return reverse ? pts.reverse() : pts;
    }),
  );

describe("triangulatePanel", () => {
  // A triangulation of a simple polygon tiles it: n − 2 triangles whose areas sum to the polygon's
  // (polygon triangulation theorem); the polygon area comes from d3-polygon (d3-polygon library).
  it("tiles random polygons: n − 2 counter-clockwise triangles with the polygon's area", () => {
    fc.assert(
      fc.property(starPolygon, (poly) => {
        const mesh = triangulatePanel(poly);
        const n = poly.length;
        expect(mesh.triangles.length).toBe(3 * (n - 2));
        let sum = 0;
        for (let i = 0; i < mesh.triangles.length; i += 3) {
          const [a, b, c] = [0, 1, 2].map((k) => mesh.triangles[i + k]);
          const ax = mesh.positions[3 * a];
          const ay = mesh.positions[3 * a + 1];
          const cross =
            (mesh.positions[3 * b] - ax) * (mesh.positions[3 * c + 1] - ay) -
            (mesh.positions[3 * c] - ax) * (mesh.positions[3 * b + 1] - ay);
          expect(cross).toBeGreaterThanOrEqual(0);
          sum += cross / 2;
        }
        const expected = Math.abs(d3Area(poly.map(([x, y]) => [x, y] as [number, number]))) / 1e6;
        expect(Math.abs(sum - expected)).toBeLessThanOrEqual(1e-9 * expected + 1e-15);
      }),
      { numRuns: 200 },
    );
  });

  it("gives positions and UVs in metres, flat at z = 0", () => {
    const mesh = triangulatePanel([
      [0, 0],
      [500, 0],
      [500, 250],
    ]);

    expect(mesh.positions).toEqual([0, 0, 0, 0.5, 0, 0, 0.5, 0.25, 0]);
    expect(mesh.uvs).toEqual([0, 0, 0.5, 0, 0.5, 0.25]);
  });
});

describe("interiorPoint", () => {
  // d3-polygon polygonContains as the independent inside test.
  it("lies inside concave outlines such as a U shape", () => {
    const u: Point[] = [
      [0, 0],
      [300, 0],
      [300, 300],
      [250, 300],
      [250, 50],
      [50, 50],
      [50, 300],
      [0, 300],
    ];

    expect(
      polygonContains(
        u.map(([x, y]) => [x, y] as [number, number]),
        [...interiorPoint(u)] as [number, number],
      ),
    ).toBe(true);
  });
});
