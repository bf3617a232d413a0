import { describe, expect, it } from "vitest";
import { fraction, mean, number as mnumber, subtract, divide, multiply } from "mathjs";
import {
  cutAllowanceFactor,
  dimensionalChangePct,
  greyScaleChangeCielab,
  greyScaleGrades,
  greyScaleLabel,
  meanDimensionalChangePct,
  parseGreyScaleGrade,
  shrinkageResult,
} from "@shared/domain/fabric-care-tests";

describe("dimensional change after washing or dry-cleaning", () => {
  // Constructed example on the ISO 5077:2007 method (three pairs of marks 350 mm apart per direction, as ISO 3759
  // marks them; change = (Xt − X0) / X0 × 100, then the mean). The standard prints no numbers to copy here.
  // marks 350 mm apart; after washing the three length pairs read 339, 340 and 341 mm, the width pairs 352, 351, 353 mm.
  //   length: (339 − 350)/350 = −3.1429 %, (340 − 350)/350 = −2.8571 %, (341 − 350)/350 = −2.5714 %; mean −2.8571 % (= −20/7 %)
  //   width:  +0.5714 %, +0.2857 %, +0.8571 %; mean +0.5714 % (= +4/7 %)
  const length = [339, 340, 341].map((afterMm) => ({ beforeMm: 350, afterMm }));
  const width = [352, 351, 353].map((afterMm) => ({ beforeMm: 350, afterMm }));

  it("one pair: (after − before) / before × 100, negative is shrinkage (ISO 5077 convention)", () => {
    expect(dimensionalChangePct({ beforeMm: 350, afterMm: 340 })).toBeCloseTo(-2.857142857, 9);
    expect(dimensionalChangePct({ beforeMm: 500, afterMm: 510 })).toBeCloseTo(2, 12);
    expect(dimensionalChangePct({ beforeMm: 350, afterMm: 350 })).toBe(0);
  });

  it("the worked example gives −20/7 % in length and +4/7 % in width (exact fractions from mathjs as the oracle)", () => {
    const exact = (pairs: typeof length) =>
      mnumber(
        mean(
          pairs.map((p) => multiply(divide(subtract(fraction(p.afterMm), fraction(p.beforeMm)), fraction(p.beforeMm)), 100)) as never,
        ) as never,
      ) as number;

    const r = shrinkageResult(length, width);

    expect(r.lengthChangePct).toBeCloseTo(exact(length), 12);
    expect(r.lengthChangePct).toBeCloseTo(-20 / 7, 12);
    expect(r.widthChangePct).toBeCloseTo(4 / 7, 12);
    expect(meanDimensionalChangePct([length[1]!])).toBeCloseTo(-20 / 7, 12);
  });

  it("the cut factor brings a piece back to size after the same change (algebra: cut × (1 + d/100) = finished)", () => {
    const d = -20 / 7;
    const f = cutAllowanceFactor(d);

    expect(f).toBeCloseTo(1.029411765, 9); // 1 / (1 − 0.028571…) = 35/34
    expect(1000 * f * (1 + d / 100)).toBeCloseTo(1000, 9);
    expect(cutAllowanceFactor(0)).toBe(1);
  });

  it("refuses a zero starting distance, no pairs, or a change that leaves nothing", () => {
    expect(() => dimensionalChangePct({ beforeMm: 0, afterMm: 10 })).toThrow(RangeError);
    expect(() => meanDimensionalChangePct([])).toThrow(RangeError);
    expect(() => cutAllowanceFactor(-100)).toThrow(RangeError);
  });
});

describe("grey-scale grades", () => {
  it("has the nine steps of the 9-step scale, 1 to 5 in half steps (ISO 105-A02:1993 §2.1)", () => {
    expect(greyScaleGrades.map(greyScaleLabel)).toEqual(["1", "1-2", "2", "2-3", "3", "3-4", "4", "4-5", "5"]);
  });

  it("gives each change-in-colour step the CIELAB difference of its chip pair (ISO 105-A02:1993 §2.4 table)", () => {
    // ISO 105-A02:1993 §2.4: fastness grade → CIELAB difference ± tolerance, written out from the standard's table.
    const table: Array<[string, number, number]> = [
      ["5", 0, 0.2],
      ["4-5", 0.8, 0.2],
      ["4", 1.7, 0.3],
      ["3-4", 2.5, 0.35],
      ["3", 3.4, 0.4],
      ["2-3", 4.8, 0.5],
      ["2", 6.8, 0.6],
      ["1-2", 9.6, 0.7],
      ["1", 13.6, 1.0],
    ];
    for (const [label, deltaE, tolerance] of table) {
      const g = parseGreyScaleGrade(label)!;
      expect(greyScaleChangeCielab[g], label).toEqual({ deltaE, tolerance });
    }
    // A lower grade always stands for a larger difference, and neighbouring pairs' tolerance bands do not overlap.
    const rising = [...greyScaleGrades].reverse().map((g) => greyScaleChangeCielab[g]);
    for (let i = 1; i < rising.length; i++)
      expect(rising[i]!.deltaE - rising[i]!.tolerance).toBeGreaterThan(rising[i - 1]!.deltaE + rising[i - 1]!.tolerance);
  });

  it("reads the ways people write a grade and refuses values off the scale", () => {
    expect(["4-5", "4/5", "4–5", "4.5", "4,5"].map(parseGreyScaleGrade)).toEqual([4.5, 4.5, 4.5, 4.5, 4.5]);
    expect(parseGreyScaleGrade("3")).toBe(3);
    expect(["4-6", "0", "5.5", "4.3", "", "x", "3-5"].map(parseGreyScaleGrade)).toEqual([null, null, null, null, null, null, null]);
    for (const g of greyScaleGrades) expect(parseGreyScaleGrade(greyScaleLabel(g))).toBe(g);
  });
});
