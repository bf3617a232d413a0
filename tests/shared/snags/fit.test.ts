import { describe, expect, it } from "vitest";
import { computeSnags } from "@shared/domain/snags/engine";
import { checkFit, describePointFit, easeRangeFor, type PointFit } from "@shared/domain/snags/fit";
import type { GarmentRec, ProductionSnapshot } from "@shared/domain/snags/types";

const IN = 25.4; // 1 in = 25.4 mm exactly (1959 international yard; NIST SP 811 App. B.8, 1959 international yard and pound)

function g(over: Partial<GarmentRec> & Pick<GarmentRec, "category" | "finished">): GarmentRec {
  return {
    id: "g1",
    tagCode: "T1",
    name: "Test piece",
    fitIntent: "fitted",
    construction: "woven",
    source: "built",
    status: "in_stock",
    ...over,
  };
}

const at = (fits: PointFit[], point: string) => {
  const p = fits.find((f) => f.point === point);
  if (!p) throw new Error(`point ${point} not checked`);
  return p;
};

describe("fit check worked example (fit-check worked example, ease from CWU ch. 16 / McCunn)", () => {
  // Bodice bust wearing ease 1½–2 in = 38.1–50.8 mm — CWU costume text ch. 16 "Ease in Clothing".
  it("bust 92 cm, woven bodice finished 96 cm → ease +40 mm, inside 38.1–50.8 → fits", () => {
    const p = at(checkFit(g({ category: "bodice", finished: { bust: 960 } }), { bust_girth: 920 }), "bust");
    expect(p.ease).toBe(40);
    expect(p.min).toBeCloseTo(1.5 * IN, 9);
    expect(p.max).toBeCloseTo(2 * IN, 9);
    expect(p.status).toBe("fits");
  });

  it("finished 94 cm → +20 mm, below the 38.1 mm minimum → tight by 18.1 mm", () => {
    const p = at(checkFit(g({ category: "bodice", finished: { bust: 940 } }), { bust_girth: 920 }), "bust");
    expect(p.status).toBe("tight");
    expect(p.by).toBeCloseTo(18.1, 9);
  });

  it("same 94 cm in a knit with R = 1.25 → allowed down to 92/1.25 = 73.6 cm → fits", () => {
    // Negative-ease rule 1 − 1/R (common practice, no source).
    const knit = { category: "bodice", construction: "knit" as const, stretchRatio: 1.25 };
    expect(at(checkFit(g({ ...knit, finished: { bust: 940 } }), { bust_girth: 920 }), "bust").status).toBe("fits");
    expect(at(checkFit(g({ ...knit, finished: { bust: 736 } }), { bust_girth: 920 }), "bust").status).toBe("fits");
    const below = at(checkFit(g({ ...knit, finished: { bust: 735 } }), { bust_girth: 920 }), "bust");
    expect(below.status).toBe("tight");
    expect(below.by).toBeCloseTo(1, 9);
  });

  it("1 − 1/R: hip 90 cm, R = 1.25 → cut at 72 cm; R = 1.5 → 33.3 % → 60 cm (common practice, no source)", () => {
    const hip = (r: number) =>
      at(checkFit(g({ category: "skirt", construction: "knit", stretchRatio: r, finished: { hip: 800 } }), { hip_girth: 900 }), "hip");
    expect(hip(1.25).min).toBeCloseTo(720 - 900, 9);
    expect(hip(1.5).min).toBeCloseTo(600 - 900, 9);
  });

  it("knit stretch lowers girths only, not lengths (patternschool.online; common practice)", () => {
    const p = at(
      checkFit(g({ category: "knit_top", construction: "knit", stretchRatio: 1.5, finished: { sleeve: 560 } }), { arm_length: 600 }),
      "sleeve",
    );
    expect(p.stretchRatio).toBeNull();
    expect(p.status).toBe("tight");
    expect(p.by).toBeCloseTo(27, 9); // sleeve range −13…+25 mm: common practice, no source
  });
});

describe("handbook ease values per point", () => {
  it("dress waist, fitted: ¾–1 in = 19.05–25.4 mm (CWU ch. 16, waist for dresses)", () => {
    const w = (f: number) => at(checkFit(g({ category: "dress", finished: { waist: f } }), { waist_girth: 700 }), "waist");
    expect(w(719.05).status).toBe("fits");
    expect(w(719).status).toBe("tight");
    expect(w(725.4).status).toBe("fits");
    expect(w(726).status).toBe("loose");
    expect(w(726).by).toBeCloseTo(0.6, 9);
  });

  it("skirt/trouser waistband: ½–¾ in = 12.7–19.05 mm for every intent (CWU ch. 16, waist for skirts/trousers)", () => {
    const w = at(checkFit(g({ category: "trousers", fitIntent: "loose", finished: { waist: 810 } }), { waist_girth: 800 }), "waist");
    expect(w.status).toBe("tight");
    expect(w.by).toBeCloseTo(2.7, 9);
  });

  it("hips, all garments: 2–2¾ in = 50.8–69.85 mm fitted (CWU ch. 16, hips)", () => {
    const h = (f: number) => at(checkFit(g({ category: "skirt", finished: { hip: f } }), { hip_girth: 950 }), "hip");
    expect(h(1000).status).toBe("tight");
    expect(h(1000).by).toBeCloseTo(0.8, 9);
    expect(h(1010).status).toBe("fits");
    expect(h(1020).status).toBe("loose");
    expect(h(1020).by).toBeCloseTo(0.15, 9);
  });

  it("shirt chest: fitted 1½–2½ in, classic up to 3 in (CWU ch. 16, chest for shirts)", () => {
    const c = (intent: GarmentRec["fitIntent"], f: number) =>
      at(checkFit(g({ category: "shirt", fitIntent: intent, finished: { chest: f } }), { chest_girth: 1000 }), "chest");
    expect(c("fitted", 1060).status).toBe("fits"); // 60 ≤ 63.5
    expect(c("fitted", 1075).status).toBe("loose"); // 75 > 63.5
    expect(c("fitted", 1075).by).toBeCloseTo(11.5, 9);
    expect(c("regular", 1075).status).toBe("fits"); // ≤ 76.2
  });

  it("regular bust: 2–4 in = 50.8–101.6 mm (McCunn, How to Make Sewing Patterns, fitting ease)", () => {
    const b = (f: number) =>
      at(checkFit(g({ category: "bodice", fitIntent: "regular", finished: { bust: f } }), { bust_girth: 900 }), "bust");
    expect(b(1000).status).toBe("fits");
    expect(b(1010).status).toBe("loose");
    expect(b(1010).by).toBeCloseTo(8.4, 9);
    expect(b(950).status).toBe("tight"); // 50 < 50.8
  });

  it("explanation carries the numbers (fitted jacket, chest ease 12 mm vs 38.1–50.8 mm, CWU ch. 16)", () => {
    const jacket = g({ category: "jacket", finished: { chest: 1012 } });
    const p = at(checkFit(jacket, { chest_girth: 1000 }), "chest");
    expect(p.by).toBeCloseTo(26.1, 9);
    expect(describePointFit(p, "fitted", "jacket")).toBe("Chest ease is 12 mm; a fitted jacket needs 38\u201351 mm: tight by 26 mm.");
  });
});

describe("lookups and overrides", () => {
  it("a production override replaces the table range", () => {
    const overrides = { jacket: { chest: { fitted: { min: 60, max: 80 } } } };
    expect(easeRangeFor("Jacket", "chest_girth", "fitted", overrides)).toEqual({
      range: { min: 60, max: 80 },
      source: "production override",
    });
    const p = at(checkFit(g({ category: "jacket", finished: { chest: 1050 } }), { chest_girth: 1000 }, overrides), "chest");
    expect(p.status).toBe("tight");
    expect(p.by).toBe(10);
  });

  it("skips points without a body measurement, unknown categories and prototype names", () => {
    expect(checkFit(g({ category: "jacket", finished: { chest: 1000, waist: 900 } }), { waist_girth: 850 }).map((p) => p.point)).toEqual([
      "waist",
    ]);
    expect(checkFit(g({ category: "cape", finished: { chest: 1000 } }), { chest_girth: 900 })).toEqual([]);
    expect(checkFit(g({ category: "constructor", finished: { constructor: 5, toString: 4 } }), { chest_girth: 900 })).toEqual([]);
  });

  it("bust falls back to chest girth when only chest is measured", () => {
    const p = at(checkFit(g({ category: "dress", finished: { bust: 960 } }), { chest_girth: 920 }), "bust");
    expect(p.bodyKey).toBe("chest_girth");
    expect(p.ease).toBe(40);
  });
});

describe("fit snags through computeSnags", () => {
  const snap = (finished: Record<string, number>, stunt = false): ProductionSnapshot => ({
    production: { id: "p", kind: "film", quickChangeThresholdMin: 2 },
    scenes: [{ id: "s1", number: "1", storyDay: 1, storyOrder: 1 }],
    shootDays: [{ id: "d1", date: "2027-03-01", sceneIds: ["s1"] }],
    characters: [{ id: "c1", name: "Ada", performerId: "pf1", doublePerformerIds: ["pf2"] }],
    performers: [
      { id: "pf1", name: "Performer One", measurements: { chest_girth: 1000, waist_girth: 850 } },
      { id: "pf2", name: "Double Two", measurements: { chest_girth: 1100 } },
    ],
    changes: [{ id: "ch1", characterId: "c1", number: 1 }],
    changeItems: [{ id: "i1", changeId: "ch1", garmentId: "g1", multiplesGroupId: null }],
    appearances: [
      {
        id: "a1",
        sceneId: "s1",
        characterId: "c1",
        changeId: "ch1",
        distressStage: 0,
        wet: false,
        stunt,
        blood: false,
        vfxShot: false,
        changeHere: false,
      },
    ],
    garments: [g({ category: "jacket", finished })],
    multiplesGroups: [],
    continuityEntries: [],
  });
  const fitSnags = (s: ProductionSnapshot) => computeSnags(s, { today: "2027-02-01" }).filter((x) => x.kind === "fit");

  it("tight → warning with the numbers; loose only → note; fits → nothing", () => {
    const tight = fitSnags(snap({ chest: 1012 }));
    expect(tight).toHaveLength(1);
    expect(tight[0].key).toBe("fit:g1:pf1");
    expect(tight[0].severity).toBe("warning");
    expect(tight[0].explanation).toContain("tight by 26 mm");
    const loose = fitSnags(snap({ chest: 1060 })); // 60 > 50.8 (CWU ch. 16)
    expect(loose.map((s) => s.severity)).toEqual(["note"]);
    expect(fitSnags(snap({ chest: 1045 }))).toEqual([]);
  });

  it("doubles are checked only for garments of stunt appearances", () => {
    // Double's chest 1100: 1045 → −55 mm → tight.
    expect(fitSnags(snap({ chest: 1045 }, true)).map((s) => s.key)).toEqual(["fit:g1:pf2"]);
  });
});
