import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { polygonArea as d3Area, polygonContains } from "d3-polygon";
import { demoPanels, demoSeams } from "../../../seeds/doubles-patterns";
import {
  meshPanelsForSimulation,
  meshToObj,
  type MeshPanelInput,
  type MeshSeamInput,
  type SimulationMeshes,
} from "@shared/domain/panels/mesh";
import { pointSegmentDistance, runLength, runPoints, type Point, type Polygon, type RunEnd } from "@shared/domain/panels/geometry";

type XY = [number, number];
const d3 = (p: readonly Point[]) => p.map(([x, y]) => [x, y] as XY);

/** Smallest interior angle of a triangle, degrees, from the law of cosines. */
function smallestAngle(a: Point, b: Point, c: Point): number {
  const ab = Math.hypot(b[0] - a[0], b[1] - a[1]);
  const bc = Math.hypot(c[0] - b[0], c[1] - b[1]);
  const ca = Math.hypot(a[0] - c[0], a[1] - c[1]);
  const at = (opp: number, s1: number, s2: number) =>
    (Math.acos(Math.max(-1, Math.min(1, (s1 * s1 + s2 * s2 - opp * opp) / (2 * s1 * s2)))) * 180) / Math.PI;
  return Math.min(at(bc, ab, ca), at(ca, ab, bc), at(ab, bc, ca));
}

/** Distance along a run from its start to the point on it nearest p. */
function distanceAlongRun(run: Point[], p: Point): { along: number; off: number } {
  let best = { along: 0, off: Infinity };
  let walked = 0;
  for (let i = 1; i < run.length; i++) {
    const seg = Math.hypot(run[i][0] - run[i - 1][0], run[i][1] - run[i - 1][1]);
    const { distance, t } = pointSegmentDistance(p, run[i - 1], run[i]);
    if (distance < best.off) best = { along: walked + t * seg, off: distance };
    walked += seg;
  }
  return best;
}

/** Every check a simulation mesh set must pass, done independently of the mesher. */
function checkMeshes(panels: MeshPanelInput[], seams: MeshSeamInput[], r: SimulationMeshes, minAngle = 20) {
  for (const m of r.meshes) {
    const outline = panels.find((p) => p.id === m.panelId)!.outline;
    const v = m.vertices;
    let sum = 0;
    let clockwise = 0;
    let outside = 0;
    let worst = 180;
    for (let t = 0; t < m.triangles.length; t += 3) {
      const [a, b, c] = [v[m.triangles[t]], v[m.triangles[t + 1]], v[m.triangles[t + 2]]];
      const cross = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
      if (cross <= 0) clockwise++;
      if (!polygonContains(d3(outline), [(a[0] + b[0] + c[0]) / 3, (a[1] + b[1] + c[1]) / 3])) outside++;
      worst = Math.min(worst, smallestAngle(a, b, c));
      sum += cross / 2;
    }
    // Counter-clockwise seen from +z, inside the sew line, and no sliver below the minimum angle.
    expect({ panel: m.panelId, clockwise, outside }).toEqual({ panel: m.panelId, clockwise: 0, outside: 0 });
    expect(worst).toBeGreaterThanOrEqual(minAngle);
    // The triangles tile the panel: their areas add up to the sew-line area (d3-polygon's shoelace) within 0.01 %.
    const exact = Math.abs(d3Area(d3(outline)));
    expect(Math.abs(sum - exact) / exact).toBeLessThan(1e-4);
    // Every vertex is used by some triangle (no stray points for the solver).
    expect(new Set(m.triangles).size).toBe(v.length);
  }
  for (const s of seams) {
    const st = r.stitches.find((x) => x.seamId === s.id);
    if (!st) continue;
    expect(st.a.indices.length).toBe(st.b.indices.length);
    expect(st.a.indices.length).toBeGreaterThanOrEqual(2);
    for (const side of ["a", "b"] as const) {
      const spec = s[side];
      const outline = panels.find((p) => p.id === spec.panelId)!.outline;
      const mesh = r.meshes.find((m) => m.panelId === spec.panelId)!;
      const run = runPoints(outline, spec.from, spec.to, spec.direction);
      const length = runLength(outline, spec.from, spec.to, spec.direction);
      const along = st[side].indices.map((i) => {
        expect(i).toBeLessThan(mesh.boundaryCount);
        const d = distanceAlongRun(run, mesh.vertices[i]);
        // Stitched vertices lie on the seam run (to float precision)…
        expect(d.off).toBeLessThan(1e-6);
        return d.along / length;
      });
      // …in order from the run's start to its end.
      expect(along[0]).toBeCloseTo(0, 9);
      expect(along[along.length - 1]).toBeCloseTo(1, 9);
      for (let k = 1; k < along.length; k++) expect(along[k]).toBeGreaterThan(along[k - 1]);
    }
    // Paired vertices sit at matching fractions of each side's length (ease spread evenly), give or take
    // the pairing of two outline vertices within a third of the target length.
    const fr = (side: "a" | "b") => {
      const spec = s[side];
      const outline = panels.find((p) => p.id === spec.panelId)!.outline;
      const mesh = r.meshes.find((m) => m.panelId === spec.panelId)!;
      const run = runPoints(outline, spec.from, spec.to, spec.direction);
      const length = runLength(outline, spec.from, spec.to, spec.direction);
      return { f: st[side].indices.map((i) => distanceAlongRun(run, mesh.vertices[i]).along / length), length };
    };
    const A = fr("a");
    const B = fr("b");
    const slack = r.targetEdgeMm / 3 / Math.min(A.length, B.length) + 1e-9;
    A.f.forEach((f, k) => expect(Math.abs(f - B.f[k])).toBeLessThanOrEqual(slack));
  }
}

const demoInput = () => ({
  panels: demoPanels.map((p) => ({ id: p.key, outline: p.outline })),
  seams: demoSeams.map((s) => ({
    id: s.key,
    a: { panelId: s.a.panel, from: s.a.from, to: s.a.to, direction: s.a.direction },
    b: { panelId: s.b.panel, from: s.b.from, to: s.b.to, direction: s.b.direction },
  })),
});

describe("simulation meshes of the demo change", () => {
  const { panels, seams } = demoInput();
  const r = meshPanelsForSimulation(panels, seams, { targetEdgeMm: 10 });

  it("meshes all 16 panels and stitches all 11 seams", () => {
    expect(r.meshes).toHaveLength(16);
    expect(r.stitches).toHaveLength(11);
    expect(r.skipped).toEqual([]);
  });

  it("passes area, angle, containment and stitch checks", () => {
    checkMeshes(panels, seams, r);
  });

  it("stays near the target edge length (mean boundary spacing ≤ 10 mm)", () => {
    for (const m of r.meshes) {
      const b = m.vertices.slice(0, m.boundaryCount);
      const perim = b.reduce((s, p, i) => s + Math.hypot(b[(i + 1) % b.length][0] - p[0], b[(i + 1) % b.length][1] - p[1]), 0);
      expect(perim / m.boundaryCount).toBeLessThanOrEqual(10 + 1e-9);
      expect(m.maxEdgeMm).toBeLessThan(2.5 * 10);
    }
  });

  it("spreads an eased seam's extra length over the whole run (sleeve head 5–25 mm ease)", () => {
    const st = r.stitches.find((s) => s.seamId === "jacket:sleeve-head-front")!;

    // Consecutive stitches on the longer sleeve side are further apart than on the armhole side.
    const gap = (panelId: string, idx: number[]) => {
      const v = r.meshes.find((m) => m.panelId === panelId)!.vertices;
      return idx
        .slice(1)
        .map((i, k) => Math.hypot(v[i][0] - v[idx[k]][0], v[i][1] - v[idx[k]][1]))
        .reduce((s, x) => s + x, 0);
    };
    expect(gap("jacket:sleeve", st.a.indices)).toBeGreaterThan(gap("jacket:front", st.b.indices));
  });

  it("is deterministic", () => {
    expect(meshPanelsForSimulation(panels, seams, { targetEdgeMm: 10 })).toEqual(r);
  });

  it.each([[25], [50]])("meets the checks at a %s mm target", (h) => {
    checkMeshes(panels, seams, meshPanelsForSimulation(panels, seams, { targetEdgeMm: h }));
  });
});

describe("mesher inputs", () => {
  const square: Polygon = [
    [0, 0],
    [100, 0],
    [100, 100],
    [0, 100],
  ];

  it.each([[4.9], [50.1], [Number.NaN]])("rejects a target edge length of %s mm", (h) => {
    expect(() => meshPanelsForSimulation([{ id: "p", outline: square }], [], { targetEdgeMm: h })).toThrow(/5 to 50 mm/);
  });

  it("skips a seam whose run overlaps another seam, with the reason", () => {
    const seams: MeshSeamInput[] = [
      { id: "first", a: { panelId: "p", from: 0, to: 1, direction: "forward" }, b: { panelId: "q", from: 0, to: 1, direction: "forward" } },
      {
        id: "second",
        a: { panelId: "p", from: { edge: 0, t: 0.5 }, to: 2, direction: "forward" },
        b: { panelId: "q", from: 2, to: 3, direction: "forward" },
      },
    ];

    const r = meshPanelsForSimulation(
      [
        { id: "p", outline: square },
        { id: "q", outline: square },
      ],
      seams,
    );

    expect(r.stitches.map((s) => s.seamId)).toEqual(["first"]);
    expect(r.skipped).toEqual([{ seamId: "second", reason: "its run overlaps seam first" }]);
  });

  it("stitches runs that start and end at notches (edge positions)", () => {
    const from: RunEnd = { edge: 0, t: 0.25 };
    const to: RunEnd = { edge: 1, t: 0.5 };
    const seams: MeshSeamInput[] = [
      { id: "s", a: { panelId: "p", from, to, direction: "forward" }, b: { panelId: "q", from: 3, to: 1, direction: "backward" } },
    ];
    const panels = [
      { id: "p", outline: square },
      { id: "q", outline: square },
    ];

    const r = meshPanelsForSimulation(panels, seams);

    checkMeshes(panels, seams, r);
  });

  it("writes OBJ with positions in metres and texture coordinates in millimetres", () => {
    const r = meshPanelsForSimulation([{ id: "p", outline: square }], [], { targetEdgeMm: 20 });
    const m = r.meshes[0];

    const obj = meshToObj(m, "Test square");
    const v = obj
      .split("\n")
      .filter((l) => l.startsWith("v "))
      .map((l) => l.split(" ").slice(1).map(Number));
    const vt = obj
      .split("\n")
      .filter((l) => l.startsWith("vt "))
      .map((l) => l.split(" ").slice(1).map(Number));
    const f = obj.split("\n").filter((l) => l.startsWith("f "));

    expect(v).toHaveLength(m.vertices.length);
    expect(f).toHaveLength(m.triangles.length / 3);
    v.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(m.vertices[i][0] / 1000, 6);
      expect(p[2]).toBe(0);
      expect(vt[i][0]).toBeCloseTo(m.vertices[i][0], 5);
      expect(vt[i][1]).toBeCloseTo(m.vertices[i][1], 5);
    });
    expect(f[0]).toMatch(/^f (\d+)\/\1 (\d+)\/\2 (\d+)\/\3$/);
  });
});

describe("mesher properties", () => {
  /** A star-shaped outline with no corner sharper than the mesher can keep at 20°. */
  const starOutline = fc
    .array(fc.integer({ min: 110, max: 250 }), { minLength: 5, maxLength: 14 })
    .map((radii) =>
      radii.map(
        (r, i) =>
          [
            Math.round(r * Math.cos((2 * Math.PI * i) / radii.length) * 100) / 100,
            Math.round(r * Math.sin((2 * Math.PI * i) / radii.length) * 100) / 100,
          ] as Point,
      ),
    );

  it("meets every check for random outlines joined by an eased seam", () => {
    fc.assert(
      fc.property(starOutline, fc.integer({ min: 150, max: 420 }), fc.integer({ min: 8, max: 20 }), (outline, stripLength, h) => {
        // The seam joins two of the star's edges to a strip's long edge: usually eased, sometimes heavily.
        const strip: Polygon = [
          [0, 0],
          [stripLength, 0],
          [stripLength, 60],
          [0, 60],
        ];
        const panels = [
          { id: "star", outline },
          { id: "strip", outline: strip },
        ];
        const seams: MeshSeamInput[] = [
          {
            id: "s",
            a: { panelId: "star", from: 0, to: 2, direction: "forward" },
            b: { panelId: "strip", from: 0, to: 1, direction: "forward" },
          },
        ];

        const r = meshPanelsForSimulation(panels, seams, { targetEdgeMm: h });

        checkMeshes(panels, seams, r);
      }),
      { numRuns: 25 },
    );
  });
});
