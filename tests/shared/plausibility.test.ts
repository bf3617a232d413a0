import { describe, expect, it } from "vitest";
import {
  MEASUREMENT_KEYS,
  MEASUREMENT_LABELS,
  PLAUSIBLE_RANGES_MM,
  checkMeasurement,
  checkMeasurementSet,
  isMeasurementKey,
  type MeasurementKey,
} from "@shared/domain/plausibility";
import { LETTER_BANDS } from "@shared/domain/sizes";

describe("measurement keys", () => {
  it("lists the ISO 8559-1 keys named in product.md plus foot width, each with a label", () => {
    // product.md "Measurement set" names these keys; foot length/width serve ISO 9407 shoe sizing.
    const fromProductMd = [
      "height",
      "neck_girth",
      "chest_girth",
      "bust_girth",
      "waist_girth",
      "hip_girth",
      "across_back_width",
      "shoulder_width",
      "arm_length",
      "upper_arm_girth",
      "wrist_girth",
      "back_waist_length",
      "inside_leg_length",
      "thigh_girth",
      "head_girth",
      "foot_length",
      "foot_width",
    ];

    expect([...MEASUREMENT_KEYS].sort()).toEqual([...fromProductMd].sort());
    for (const key of MEASUREMENT_KEYS) {
      expect(MEASUREMENT_LABELS[key]).toMatch(/^[a-z][a-z -]+$/);
      expect(PLAUSIBLE_RANGES_MM[key].minMm).toBeLessThan(PLAUSIBLE_RANGES_MM[key].maxMm);
    }
  });

  it.each([
    ["waist_girth", true],
    ["hip_girth", true],
    ["waist", false],
    ["", false],
  ])("isMeasurementKey(%j) is %s", (key, expected) => {
    expect(isMeasurementKey(key)).toBe(expected);
  });
});

describe("checkMeasurement", () => {
  it("explains an implausible waist in plain words with the numbers", () => {
    // Wording given in the project brief for this check.
    expect(checkMeasurement("waist_girth", 5000)).toEqual({
      ok: false,
      key: "waist_girth",
      reason: "waist girth 5000 mm is above the plausible maximum of 2000 mm",
    });
  });

  it("suggests a cm/mm slip when ten times the value would be plausible", () => {
    const r = checkMeasurement("chest_girth", 96);

    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toContain("was it entered in cm? 96 cm = 960 mm");
  });

  it.each([
    [0, "greater than 0"],
    [-10, "greater than 0"],
    [Number.NaN, "must be a number"],
    [Number.POSITIVE_INFINITY, "must be a number"],
  ])("rejects %s with %j", (value, text) => {
    const r = checkMeasurement("height", value);

    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.reason).toContain(text);
  });

  it("treats both range ends as plausible and 1 mm beyond as not, for every key", () => {
    // Exhaustive over keys: the ranges are inclusive on both ends.
    for (const key of MEASUREMENT_KEYS) {
      const { minMm, maxMm } = PLAUSIBLE_RANGES_MM[key];
      expect(checkMeasurement(key, minMm).ok).toBe(true);
      expect(checkMeasurement(key, maxMm).ok).toBe(true);
      expect(checkMeasurement(key, minMm - 1).ok).toBe(false);
      expect(checkMeasurement(key, maxMm + 1).ok).toBe(false);
    }
  });
});

describe("ranges include real bodies from outside references", () => {
  // WHO Child Growth Standards, birth medians (from memory): length boys 49.9 cm / girls 49.1 cm,
  // head circumference boys 34.5 cm / girls 33.9 cm. Children must pass: stage and film cast them.
  it.each([
    ["height", 491],
    ["height", 499],
    ["head_girth", 339],
    ["head_girth", 345],
  ] as [MeasurementKey, number][])("newborn %s %s mm is plausible (WHO birth median, from memory)", (key, mm) => {
    expect(checkMeasurement(key, mm)).toEqual({ ok: true });
  });

  // Adult extremes (from memory): tallest living adult about 251 cm, shortest recorded adult about 54.6 cm.
  it.each([
    ["height", 2510],
    ["height", 546],
  ] as [MeasurementKey, number][])("extreme adult %s %s mm is plausible (from memory)", (key, mm) => {
    expect(checkMeasurement(key, mm).ok).toBe(true);
  });

  it("accepts every EN 13402-3 letter-band edge for chest and bust (band values from memory, EN 13402-3)", () => {
    for (const band of LETTER_BANDS.mens_chest) {
      expect(checkMeasurement("chest_girth", band.minCm * 10).ok).toBe(true);
      expect(checkMeasurement("chest_girth", band.maxCm * 10).ok).toBe(true);
    }
    for (const band of LETTER_BANDS.womens_bust) {
      expect(checkMeasurement("bust_girth", band.minCm * 10).ok).toBe(true);
      expect(checkMeasurement("bust_girth", band.maxCm * 10).ok).toBe(true);
    }
  });

  it("accepts the fit-check worked example body (fit-check worked example, ease from CWU ch. 16 / McCunn: bust 92 cm, hip 90 cm)", () => {
    expect(checkMeasurementSet({ bust_girth: 920, hip_girth: 900 })).toEqual([]);
  });
});

describe("checkMeasurementSet", () => {
  it("returns nothing for an invented adult set", () => {
    const set = {
      height: 1750,
      neck_girth: 380,
      chest_girth: 980,
      waist_girth: 840,
      hip_girth: 990,
      across_back_width: 380,
      shoulder_width: 150,
      arm_length: 620,
      upper_arm_girth: 310,
      wrist_girth: 170,
      back_waist_length: 450,
      inside_leg_length: 800,
      thigh_girth: 560,
      head_girth: 570,
      foot_length: 265,
      foot_width: 100,
    };

    expect(checkMeasurementSet(set)).toEqual([]);
  });

  it.each([
    [{ height: 900, inside_leg_length: 950 }, "inside_leg_length", "inside leg length 950 mm is not less than height 900 mm"],
    [{ foot_length: 100, foot_width: 120 }, "foot_width", "foot width 120 mm is not less than foot length 100 mm"],
    [{ upper_arm_girth: 150, wrist_girth: 160 }, "wrist_girth", "wrist girth 160 mm is not less than upper-arm girth 150 mm"],
  ] as [Partial<Record<MeasurementKey, number>>, MeasurementKey, string][])(
    "flags a part not smaller than its whole: %j",
    (set, key, reason) => {
      expect(checkMeasurementSet(set)).toEqual([{ ok: false, key, reason }]);
    },
  );

  it("lists range problems and relation problems together", () => {
    const problems = checkMeasurementSet({ waist_girth: 5000, height: 170, inside_leg_length: 800 });

    expect(problems.map((p) => p.key)).toEqual(["height", "waist_girth", "inside_leg_length"]);
    expect(problems[0].reason).toContain("was it entered in cm? 170 cm = 1700 mm");
  });
});
