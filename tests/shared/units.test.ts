import { describe, expect, it } from "vitest";
import { fraction, unit } from "mathjs";
import {
  GSM_PER_OZ_PER_SQ_YARD,
  cmToIn,
  cmToMm,
  formatCm,
  formatInchesDecimal,
  formatInchesFraction,
  formatLength,
  gsmToOzPerSqYd,
  inToCm,
  inToMm,
  mToYd,
  mmToCm,
  mmToIn,
  ozPerSqYdToGsm,
  parseLength,
  roundTo,
  toInchFraction,
  ydToM,
} from "@shared/domain/units";

// Tolerance for exact conversions: relative 1e-12 (chosen for exact conversions).
function expectRel(actual: number, expected: number, rel = 1e-12) {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(Math.abs(expected) * rel + 1e-15);
}

describe("exact conversions against worked values", () => {
  // NIST SP 811 App. B.8, 1959 international yard and pound worked checks, from the 1959 yard/pound definitions
  it.each([
    ["36 in → 91.44 cm", () => inToCm(36), 91.44, 1e-12],
    ["100 cm → 39.37007874015748 in", () => cmToIn(100), 39.37007874015748, 1e-12],
    ["4.5 yd → 4.1148 m", () => ydToM(4.5), 4.1148, 1e-12],
    ["1 m → 1.0936132983377078 yd", () => mToYd(1), 1.0936132983377078, 1e-12],
    ["60 in → 1.524 m", () => inToMm(60) / 1000, 1.524, 1e-12],
    ["45 in → 1.143 m", () => inToMm(45) / 1000, 1.143, 1e-12],
    ["14 oz/yd² denim → 474.680464648352 g/m²", () => ozPerSqYdToGsm(14), 474.680464648352, 1e-12],
    ["6 oz/yd² → 203.434484849294 g/m²", () => ozPerSqYdToGsm(6), 203.434484849294, 1e-12],
    ["200 g/m² → 5.89870493633 oz/yd²", () => gsmToOzPerSqYd(200), 5.89870493633, 1e-11],
    ["1 g/m² → 0.0294935246816 oz/yd²", () => gsmToOzPerSqYd(1), 0.0294935246816, 1e-11],
    ["135 g/m² → 3.98163 oz/yd² (§3 swatch)", () => gsmToOzPerSqYd(135), 3.98163, 1e-5],
  ])("%s", (_name, fn, expected, rel) => {
    // rel: 1e-12 for exact decimals, looser where the sheet prints fewer digits
    expectRel(fn(), expected, rel);
  });

  it("uses 1 oz/yd² = 5669904625/167225472 g/m² exactly", () => {
    // NIST SP 811 App. B.8, 1959 international yard and pound: 28.349523125 g ÷ 0.83612736 m² as an exact fraction; mathjs fraction is the oracle
    const exact = fraction(5669904625, 167225472);
    expectRel(GSM_PER_OZ_PER_SQ_YARD, Number(exact.valueOf()));
    expectRel(ozPerSqYdToGsm(1), 33.9057474748823);
  });
});

describe("conversions against mathjs as an independent oracle", () => {
  const lengths = [0.1, 1, 2.54, 25.4, 37.5, 91.44, 100, 952.5, 1234.567, 20000];
  // mathjs Unit.js defines inch 0.0254 m and yard 0.9144 m exactly (mathjs library)
  it.each(lengths)("mm → in and cm for %s mm", (mm) => {
    expectRel(mmToIn(mm), unit(mm, "mm").toNumber("inch"));
    expectRel(mmToCm(mm), unit(mm, "mm").toNumber("cm"));
  });
  it.each(lengths)("in → mm and cm → in for %s", (v) => {
    expectRel(inToMm(v), unit(v, "inch").toNumber("mm"));
    expectRel(cmToIn(v), unit(v, "cm").toNumber("inch"));
    expectRel(cmToMm(v), unit(v, "cm").toNumber("mm"));
  });
  it.each(lengths)("m ↔ yd for %s", (v) => {
    expectRel(mToYd(v), unit(v, "m").toNumber("yd"));
    expectRel(ydToM(v), unit(v, "yd").toNumber("m"));
  });
  // mathjs: ounce 28.349523125e-3 kg, sqyd 0.83612736 m² (mathjs library)
  it.each([1, 3.5, 6, 12, 14, 30, 100, 135, 200, 475])("g/m² ↔ oz/yd² for %s", (v) => {
    expectRel(gsmToOzPerSqYd(v), unit(v, "g/m^2").toNumber("oz/sqyd"));
    expectRel(ozPerSqYdToGsm(v), unit(v, "oz/sqyd").toNumber("g/m^2"));
  });
});

describe("round trips", () => {
  // NIST SP 811 App. B.8, 1959 international yard and pound: round trip toYd(toM(L)) == L to 1e-12
  it.each([0.5, 1, 3.3, 4.5, 17.25, 250])("yd → m → yd keeps %s", (yd) => {
    expectRel(mToYd(ydToM(yd)), yd);
  });
  it.each([1, 25.4, 333.3, 952.5])("mm → in → mm keeps %s", (mm) => {
    expectRel(inToMm(mmToIn(mm)), mm);
  });
  it.each([1, 135, 200, 474.68])("g/m² → oz/yd² → g/m² keeps %s", (gsm) => {
    expectRel(ozPerSqYdToGsm(gsmToOzPerSqYd(gsm)), gsm);
  });
});

describe("toInchFraction (nearest 1/8 in, reduced)", () => {
  // Oracle: mathjs fraction reduces n/8 independently of our gcd.
  it.each([0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 12, 300, 301, 303])("%s eighths reduce like mathjs fraction(n, 8)", (n) => {
    const f = toInchFraction(n / 8);
    const whole = Math.floor(n / 8);
    const rest = fraction(n - whole * 8, 8);
    expect(f.whole).toBe(whole);
    if (n % 8 === 0) {
      expect([f.numerator, f.denominator]).toEqual([0, 1]);
    } else {
      expect([f.numerator, f.denominator]).toEqual([Number(rest.n), Number(rest.d)]);
    }
  });

  it("rounds 37.56 in to 37 1/2 and 37.57 in to 37 5/8 (midpoint 37.5625)", () => {
    expect(toInchFraction(37.56)).toMatchObject({ whole: 37, numerator: 1, denominator: 2 });
    expect(toInchFraction(37.57)).toMatchObject({ whole: 37, numerator: 5, denominator: 8 });
  });

  it("rounds an exact 1/16 tie away from zero", () => {
    expect(toInchFraction(1 / 16)).toMatchObject({ whole: 0, numerator: 1, denominator: 8 });
    expect(toInchFraction(-1 / 16)).toMatchObject({ negative: true, whole: 0, numerator: 1, denominator: 8 });
  });

  it("rejects a non-integer denominator", () => {
    expect(() => toInchFraction(1, 2.5)).toThrow(RangeError);
  });
});

describe("formatting a mm value in the production's unit", () => {
  // Expected strings are built from inch/cm definitions: 952.5 mm = 37.5 in exactly (1 in = 25.4 mm).
  it.each([
    ["952.5 mm in fraction inches", () => formatInchesFraction(952.5), '37 1/2"'],
    ["914.4 mm (1 yd) is a whole 36 in", () => formatInchesFraction(914.4), '36"'],
    ["9.525 mm is 3/8 in with no whole part", () => formatInchesFraction(9.525), '3/8"'],
    ["-31.75 mm (negative ease) is -1 1/4 in", () => formatInchesFraction(-31.75), '-1 1/4"'],
    ["-0.1 mm rounds to 0 in, never -0", () => formatInchesFraction(-0.1), '0"'],
    ["sixteenths when asked", () => formatInchesFraction(1.5875, 16), '1/16"'],
    ["952.5 mm as decimal inches", () => formatInchesDecimal(952.5), '37.50"'],
    ["1000 mm as decimal inches (39.370…)", () => formatInchesDecimal(1000), '39.37"'],
    ["953 mm to 1 decimal cm", () => formatCm(953), "95.3 cm"],
    ["952.5 mm ties away from zero to 95.3 cm", () => formatCm(952.5), "95.3 cm"],
    ["0.4 mm is 0.0 cm", () => formatCm(0.4), "0.0 cm"],
    ["formatLength cm", () => formatLength(914.4, "cm"), "91.4 cm"],
    ["formatLength in (fraction)", () => formatLength(914.4, "in"), '36"'],
    ["formatLength in (decimal)", () => formatLength(952.5, "in", "decimal"), '37.50"'],
  ])("%s", (_name, fn, expected) => {
    expect(fn()).toBe(expected);
  });

  it.each([
    [9.525, 1, 9.5],
    [2.675, 2, 2.68], // binary 2.67499… would round down with toFixed
    [-2.5, 0, -3],
    [-0.04, 1, 0],
  ])("roundTo(%s, %s) = %s", (v, d, expected) => {
    expect(Object.is(roundTo(v, d), expected)).toBe(true);
  });
});

describe("parseLength", () => {
  // Each accepted spelling is checked against mathjs's conversion of the same quantity.
  it.each([
    ["37.5", "in", 37.5, "inch"],
    ["37 1/2", "in", 37.5, "inch"],
    ["37-1/2", "in", 37.5, "inch"],
    ["37½", "in", 37.5, "inch"],
    ["37 ½", "in", 37.5, "inch"],
    ["37⅝", "in", 37.625, "inch"],
    ["½", "in", 0.5, "inch"],
    ["3/8", "in", 0.375, "inch"],
    ["37.5", "cm", 37.5, "cm"],
    ["37,5", "cm", 37.5, "cm"],
    ["95", "cm", 95, "cm"],
    [".5", "cm", 0.5, "cm"],
    ['37 1/2"', "cm", 37.5, "inch"],
    ["37.5 in", "cm", 37.5, "inch"],
    ["95 cm", "in", 95, "cm"],
    ["952 mm", "in", 952, "mm"],
    ["-1 1/4", "in", -1.25, "inch"],
    ["−2", "cm", -2, "cm"],
    ["  12  ", "in", 12, "inch"],
  ] as const)("%j in %s", (input, u, value, mathUnit) => {
    const r = parseLength(input, u);

    expect(r.ok).toBe(true);
    if (r.ok) expectRel(r.mm, unit(value, mathUnit).toNumber("mm"));
  });

  it.each([
    ["", "empty"],
    ["abc", "not a number"],
    ["37.5 1/2", "decimal plus fraction"],
    ["1/0", "zero denominator"],
    ["37 1/", "incomplete fraction"],
    ["3 7", "two numbers"],
  ])("rejects %j (%s) with a reason", (input) => {
    const r = parseLength(input, "in");

    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason.length).toBeGreaterThan(5);
  });

  it("parses what formatInchesFraction prints back to the rounded value", () => {
    // Round trip over every eighth from 0 to 60 in; mathjs converts the expected inches.
    for (let eighths = 0; eighths <= 480; eighths++) {
      const mm = unit(eighths / 8, "inch").toNumber("mm");
      const r = parseLength(formatInchesFraction(mm), "cm");
      expect(r.ok && Math.abs(r.mm - mm) < 1e-9).toBe(true);
    }
  });
});
