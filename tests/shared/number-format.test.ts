import { describe, expect, it } from "vitest";
import { formatNumber, formatQuantity, printedHalfUnit } from "@shared/domain/number-format";

// Expected strings written out by hand (thousands grouped with commas, as the summary PDF prints).
describe("formatNumber", () => {
  it.each([
    [28_000, { significant: 3 }, "28,000"],
    [22_000, { significant: 3 }, "22,000"],
    [27_345.6, { significant: 3 }, "27,300"],
    [0.25, { significant: 3 }, "0.250"],
    [15.690644, { significant: 3 }, "15.7"],
    [1234.56, { decimals: 1 }, "1,234.6"],
    [10, { decimals: 1 }, "10.0"],
    [-0, { decimals: 1 }, "0.0"],
  ] as const)("%s to %o prints %s (integers keep their trailing zeros)", (value, precision, want) => {
    expect(formatNumber(value, precision)).toBe(want);
  });

  it("puts the unit after the number", () => {
    expect(formatQuantity(28_000, "N/m", { significant: 3 })).toBe("28,000 N/m");
  });
});

describe("printedHalfUnit", () => {
  it("is half a unit in the last printed place", () => {
    expect(printedHalfUnit(28_000, { significant: 3 })).toBe(50);
    expect(printedHalfUnit(0.25, { significant: 3 })).toBeCloseTo(0.0005, 15);
    expect(printedHalfUnit(1234.56, { decimals: 1 })).toBeCloseTo(0.05, 15);
  });
});
