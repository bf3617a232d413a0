import { describe, expect, it } from "vitest";
import * as mathjs from "mathjs";
import {
  RETEST_TOLERANCE_PERCENT,
  bendingLengthFromRigidity,
  cantileverRetest,
  cantileverShape,
  overhangToBendingLengthRatio,
  simulatedOverhangMm,
  tipDeflectionMm,
} from "@shared/domain/cantilever";
import {
  STANDARD_GRAVITY,
  fabricSimulationValues,
  flexuralRigidity,
  peirceBendingLength,
  type FabricTest,
} from "@shared/domain/fabric-physics";
import { fabricSeeds } from "../../seeds/fabric-library";

// mathjs ships solveODE (adaptive Runge–Kutta) but its type declarations do not list it yet.
const { solveODE } = mathjs as unknown as {
  solveODE: (
    f: (t: number, y: number[]) => number[],
    span: [number, number],
    y0: number[],
    options?: { tol?: number },
  ) => { t: number[]; y: number[][] };
};

describe("heavy cantilever (planar elastica) solver", () => {
  it("reaches the 41.5° tip line at an overhang of twice the bending length (ASTM D1388-18 §11: c = O/2; section number from memory)", () => {
    const ratio = overhangToBendingLengthRatio(41.5);

    // The standard's rule holds for the exact elastica to well under 0.1 %.
    expect(Math.abs(ratio - 2)).toBeLessThan(2e-3);
  });

  it("differs from Peirce's cubic formula by about 2 % at 41.5° (Peirce, J. Textile Inst. 21 (1930) T377: c = l·(cos(θ/2) / (8·tan θ))^(1/3), an approximation)", () => {
    const exactCOverL = 1 / overhangToBendingLengthRatio(41.5);

    const peirceCOverL = peirceBendingLength(1, 41.5);

    // Peirce's closed form is an approximation: 0.5093 against the exact 0.4999, about 1.9 % apart.
    expect((peirceCOverL - exactCOverL) / exactCOverL).toBeGreaterThan(0.015);
    expect((peirceCOverL - exactCOverL) / exactCOverL).toBeLessThan(0.025);
  });

  it.each([
    // Small deflections: uniformly loaded cantilever, tip deflection w·l⁴ / (8·EI)
    // (Roark's Formulas for Stress and Strain, 7th ed., Table 8.1, cantilever with uniform load; case number from memory).
    [1e-3],
    [1e-2],
    [5e-2],
  ])("matches w·l⁴ / 8EI for small loads (λ = %s)", (lambda) => {
    const s = cantileverShape(lambda);

    // Geometric non-linearity enters at order λ², so the relative gap shrinks with λ.
    expect(Math.abs(s.tipY / (lambda / 8) - 1)).toBeLessThan(lambda * 0.02 + 1e-6);
  });

  it("gives the small-deflection tip drop of a real strip in millimetres (Roark's, as above)", () => {
    // A stiff strip barely bending: G = 1e-3 N·m, 0.2 kg/m², 20 mm overhang.
    const G = 1e-3;
    const m = 0.2;
    const l = 0.02;
    const w = m * STANDARD_GRAVITY;

    const drop = tipDeflectionMm(l * 1000, G, m);

    expect(drop).toBeCloseTo(((w * l ** 4) / (8 * G)) * 1000, 6);
  });

  it("is reproduced by a general-purpose ODE solver (mathjs solveODE, adaptive Runge–Kutta) integrating the solved shape", () => {
    const lambda = 8;
    const s = cantileverShape(lambda);

    // Integrate from the tip (v = 0) to the platform (v = 1): θ'' = −λ·v·cos θ; state [θ, θ', x, y].
    const sol = solveODE(
      (v: number, y: number[]) => [y[1], -lambda * v * Math.cos(y[0]), Math.cos(y[0]), Math.sin(y[0])],
      [0, 1],
      [s.tipSlopeRad, 0, 0, 0],
      { tol: 1e-10 },
    );
    const end = sol.y[sol.y.length - 1];

    expect(Math.abs(end[0])).toBeLessThan(1e-6);
    expect((Math.atan2(end[3], end[2]) * 180) / Math.PI).toBeCloseTo(s.chordAngleDeg, 5);
  });

  it("bends further as the load grows (the chord angle rises with λ)", () => {
    const angles = [0.5, 2, 8, 30].map((l) => cantileverShape(l).chordAngleDeg);

    expect([...angles].sort((a, b) => a - b)).toEqual(angles);
    expect(angles[3]).toBeLessThan(90);
  });

  it("inverts G = m·g·c³ (ASTM D1388 flexural rigidity)", () => {
    const G = flexuralRigidity(200, 20);

    expect(bendingLengthFromRigidity(G, 0.2)).toBeCloseTo(20, 9);
    expect(simulatedOverhangMm(G, 0.2)).toBeCloseTo(40, 1);
  });

  it.each([[0], [-1], [Number.NaN]])("rejects a load parameter of %s", (lambda) => {
    expect(() => cantileverShape(lambda)).toThrow(RangeError);
  });
});

describe("virtual re-test of exported fabric values", () => {
  it("compares each direction's measured overhang with the simulated one", () => {
    const tests: FabricTest[] = [
      { id: "m1", kind: "mass", massG: 2, lengthMm: 100, widthMm: 100 },
      { id: "b1", kind: "bending", direction: "warp", overhangMm: 50 },
      { id: "b2", kind: "bending", direction: "warp", overhangMm: 54 },
    ];
    const values = fabricSimulationValues({ fabricClass: "woven_medium", tests });

    const r = cantileverRetest(values, tests)!;

    expect(r.directions).toHaveLength(1);
    expect(r.directions[0]).toMatchObject({ direction: "warp", angleDeg: 41.5, measuredOverhangMm: 52, testIds: ["b1", "b2"] });
    expect(Math.abs(r.directions[0].differencePercent)).toBeLessThan(0.1);
  });

  it("shows when the exported values no longer reproduce the test (a wrong mass per area)", () => {
    const tests: FabricTest[] = [{ id: "b1", kind: "bending", direction: "weft", overhangMm: 40 }];
    const values = fabricSimulationValues({ fabricClass: "woven_medium", declaredMassPerAreaGsm: 200, tests });
    // The exporter was given 8× the mass: the strip would bend at half the overhang.
    const wrong = { ...values, massPerArea: { ...values.massPerArea, value: values.massPerArea.value * 8 } };

    const r = cantileverRetest(wrong, tests)!;

    expect(r.directions[0].simulatedOverhangMm).toBeCloseTo(20, 1);
    expect(r.directions[0].differencePercent).toBeLessThan(-49);
  });

  it("is null for a fabric without a cantilever test", () => {
    const values = fabricSimulationValues({ fabricClass: "knit_light", tests: [] });

    expect(cantileverRetest(values, [])).toBeNull();
  });

  it.each(fabricSeeds.map((f) => [f.name, f] as const))("agrees within 1 %% for the demo fabric %s", (_name, f) => {
    // The demo's tests as the seed records them: two mass specimens and one cantilever reading per direction at 41.5°.
    const tests: FabricTest[] = [
      { id: "mass", kind: "mass", massG: f.gsm / 100, lengthMm: 100, widthMm: 100 },
      { id: "warp", kind: "bending", direction: "warp", overhangMm: f.overhang[0], angleDeg: 41.5 },
      { id: "weft", kind: "bending", direction: "weft", overhangMm: f.overhang[1], angleDeg: 41.5 },
    ];
    const values = fabricSimulationValues({ fabricClass: f.construction === "knit" ? "knit_medium" : "woven_medium", tests });

    const r = cantileverRetest(values, tests)!;

    expect(r.directions.map((d) => d.direction)).toEqual(["warp", "weft"]);
    for (const d of r.directions) expect(Math.abs(d.differencePercent)).toBeLessThanOrEqual(RETEST_TOLERANCE_PERCENT);
  });
});
