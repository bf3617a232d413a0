import { describe, expect, it } from "vitest";
import { checkFabricReadings } from "@shared/domain/fabric-plausibility";
import { createFabricTestInputSchema } from "@shared/schemas/fabrics";

describe("checkFabricReadings", () => {
  it.each([
    // 1.35 g on 100 × 100 mm = 135 g/m², a calico (ASTM D3776: mass ÷ area).
    ["a calico mass test", { kind: "mass", massG: 1.35, lengthMm: 100, widthMm: 100 }],
    // ASTM D1388 strip 25 × 200 mm: a 40 mm overhang.
    ["a cantilever overhang", { kind: "cantilever", direction: "warp", overhangMm: 40, angleDeg: 41.5 }],
    // ISO 13934-1 strip 50 mm wide, 200 mm gauge; the demo jersey's 0.1 N at 4 mm.
    ["a light knit strip test", { kind: "strip", direction: "weft", loadN: 0.1, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 }],
    ["a lawn's thickness", { kind: "thickness", thicknessMm: 0.12 }],
  ] as const)("accepts %s", (_label, readings) => {
    expect(checkFabricReadings(readings)).toEqual([]);
  });

  it.each([
    ["1e-300 g", { kind: "mass", massG: 1e-300, lengthMm: 100, widthMm: 100 }, "massG", /below the plausible minimum of 0.01 g/],
    ["a 2 m specimen", { kind: "mass", massG: 2, lengthMm: 2000, widthMm: 100 }, "lengthMm", /above the plausible maximum of 1000 mm/],
    // 900 g on 100 × 100 mm would be 90,000 g/m².
    ["grams for a tiny swatch", { kind: "mass", massG: 900, lengthMm: 100, widthMm: 100 }, "massG", /90000 g\/m²/],
    [
      "an overhang longer than the strip",
      { kind: "cantilever", direction: "warp", overhangMm: 400, angleDeg: 41.5 },
      "overhangMm",
      /200 mm long/,
    ],
    [
      "a tiny load",
      { kind: "strip", direction: "warp", loadN: 1e-9, stripWidthMm: 50, gaugeLengthMm: 200, extensionMm: 4 },
      "loadN",
      /below/,
    ],
    [
      "a strain above 500 %",
      { kind: "strip", direction: "warp", loadN: 5, stripWidthMm: 50, gaugeLengthMm: 100, extensionMm: 600 },
      "extensionMm",
      /strain above 500 %/,
    ],
    ["a 40 mm thickness", { kind: "thickness", thicknessMm: 40 }, "thicknessMm", /above/],
  ] as const)("refuses %s with the field and a reason", (_label, readings, field, reason) => {
    const problems = checkFabricReadings(readings);

    expect(problems[0]?.field).toBe(field);
    expect(problems[0]?.reason).toMatch(reason);
  });

  it("puts the reason under the reading's field in the request schema", () => {
    const res = createFabricTestInputSchema.safeParse({
      testedOn: "2026-11-20",
      readings: { kind: "mass", massG: 1e-300, lengthMm: 100, widthMm: 100 },
    });

    expect(res.success).toBe(false);
    expect(res.error?.issues[0]).toMatchObject({ path: ["readings", "massG"], message: expect.stringMatching(/plausible minimum/) });
  });
});
