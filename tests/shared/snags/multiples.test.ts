import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { computeMultiplesPlans, computeSnags } from "@shared/domain/snags/engine";
import { assignCopies, longestStrictlyDecreasing, patienceCover, type CopyDemand } from "@shared/domain/snags/multiples";
import type { AppearanceRec, GarmentRec, ProductionSnapshot } from "@shared/domain/snags/types";

// ---------- independent brute force ----------

/** All set partitions of {0..n-1} as block-index arrays (restricted growth strings). */
function* partitions(n: number): Generator<number[]> {
  const a = new Array<number>(n).fill(0);
  function* rec(i: number, max: number): Generator<number[]> {
    if (i === n) {
      yield a.slice();
      return;
    }
    for (let b = 0; b <= max + 1; b++) {
      a[i] = b;
      yield* rec(i + 1, Math.max(max, b));
    }
  }
  if (n === 0) yield [];
  else yield* rec(0, -1);
}

/** Can one copy serve exactly these uses? Stated from the rules, not from the algorithm:
 * in shoot order the level never falls; no two uses in one scene occurrence; after a
 * wet/stunt use, nothing else later that day. */
function oneCopyCanServe(ds: CopyDemand[]): boolean {
  const s = [...ds].sort((a, b) => a.day - b.day || a.batch - b.batch);
  for (let i = 0; i < s.length; i++) {
    for (let j = i + 1; j < s.length; j++) {
      if (s[i].batch === s[j].batch) return false;
      if (s[i].level > s[j].level) return false;
      if (s[i].outForDay && s[i].day === s[j].day) return false;
    }
  }
  return true;
}

/** Exhaustive minimum number of copies (n ≤ 8). */
function bruteMinCopies(ds: CopyDemand[]): number {
  let best = Number.POSITIVE_INFINITY;
  for (const p of partitions(ds.length)) {
    const k = ds.length === 0 ? 0 : Math.max(...p) + 1;
    if (k >= best) continue;
    let ok = true;
    for (let b = 0; b < k && ok; b++) ok = oneCopyCanServe(ds.filter((_, i) => p[i] === b));
    if (ok) best = k;
  }
  return ds.length === 0 ? 0 : best;
}

/** Exhaustive largest set of uses that pairwise cannot share a copy (n ≤ 8). */
function bruteMaxAntichain(ds: CopyDemand[]): number {
  let best = 0;
  for (let mask = 0; mask < 1 << ds.length; mask++) {
    const idx = ds.map((_, i) => i).filter((i) => mask & (1 << i));
    if (idx.length <= best) continue;
    let ok = true;
    for (let x = 0; x < idx.length && ok; x++)
      for (let y = x + 1; y < idx.length && ok; y++) ok = !oneCopyCanServe([ds[idx[x]], ds[idx[y]]]);
    if (ok) best = idx.length;
  }
  return best;
}

/** Exhaustive longest strictly decreasing subsequence length. */
function bruteLds(levels: number[]): number {
  let best = 0;
  for (let mask = 0; mask < 1 << levels.length; mask++) {
    const sub = levels.filter((_, i) => mask & (1 << i));
    if (sub.every((v, i) => i === 0 || sub[i - 1] > v)) best = Math.max(best, sub.length);
  }
  return best;
}

const plain = (levels: number[]): CopyDemand[] => levels.map((level, i) => ({ level, day: i, batch: i, outForDay: false }));

describe("worked sequences (Dilworth 1950; patience sorting, each checked by exhaustive search by hand)", () => {
  // Dilworth (1950), Annals of Math. 51(1):161–166: min cover by chains = max antichain;
  // Aldous & Diaconis (1999), Bull. AMS 36(4): patience sorting piles = longest monotone run.
  const cases: [number[], number, number[][]][] = [
    [[3, 1, 2, 1, 3, 2], 3, [[3, 3], [1, 2, 2], [1]]],
    [
      [0, 2, 1, 3, 1, 2],
      2,
      [
        [0, 2, 3],
        [1, 1, 2],
      ],
    ],
    [
      [2, 2, 1, 1],
      2,
      [
        [2, 2],
        [1, 1],
      ],
    ],
    [[1, 3, 2, 2, 4, 3, 1, 4], 3, [[1, 3, 4, 4], [2, 2, 3], [1]]],
    [[1, 2, 3, 4], 1, [[1, 2, 3, 4]]],
    [[4, 3, 2, 1], 4, [[4], [3], [2], [1]]],
  ];
  for (const [levels, copies, assignment] of cases) {
    it(`${levels.join(",")} needs ${copies}`, () => {
      expect(longestStrictlyDecreasing(levels)).toHaveLength(copies); // Dilworth 1950; patience sorting
      const piles = patienceCover(levels);
      expect(piles.map((p) => p.map((i) => levels[i]))).toEqual(assignment); // patience sorting, one valid assignment worked by hand
      expect(assignCopies(plain(levels)).copies).toBe(copies);
    });
  }

  it("edge cases: empty → 0, all equal → 1, strictly decreasing n → n (Dilworth 1950; patience sorting edge tests)", () => {
    expect(assignCopies([]).copies).toBe(0);
    expect(longestStrictlyDecreasing([])).toEqual([]);
    expect(assignCopies(plain([2, 2, 2, 2, 2])).copies).toBe(1);
    expect(assignCopies(plain([6, 5, 4, 3, 2, 1, 0])).copies).toBe(7);
  });
});

describe("against brute force on random sequences (fast-check, n ≤ 8)", () => {
  it("plain: patience piles = longest strictly decreasing = exhaustive minimum cover (Dilworth 1950)", () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 4 }), { maxLength: 8 }), (levels) => {
        const min = bruteMinCopies(plain(levels));
        expect(patienceCover(levels).length).toBe(min);
        expect(assignCopies(plain(levels)).copies).toBe(min);
        // Aldous & Diaconis (1999): pile count = longest decreasing run (here for the mirrored order).
        expect(bruteLds(levels)).toBe(min);
        const lds = longestStrictlyDecreasing(levels);
        expect(lds.length).toBe(min);
        for (let i = 1; i < lds.length; i++) {
          expect(lds[i]).toBeGreaterThan(lds[i - 1]);
          expect(levels[lds[i]]).toBeLessThan(levels[lds[i - 1]]);
        }
        for (const pile of patienceCover(levels)) {
          for (let i = 1; i < pile.length; i++) expect(levels[pile[i]]).toBeGreaterThanOrEqual(levels[pile[i - 1]]);
        }
      }),
      { numRuns: 300 },
    );
  });

  const demandsArb = fc
    .array(
      fc.record({
        level: fc.integer({ min: 0, max: 3 }),
        day: fc.integer({ min: 0, max: 2 }),
        scene: fc.integer({ min: 0, max: 2 }),
        outForDay: fc.boolean(),
      }),
      { maxLength: 8 },
    )
    .map((xs) =>
      xs
        .map((x) => ({ level: x.level, day: x.day, batch: x.day * 10 + x.scene, outForDay: x.outForDay }))
        .sort((a, b) => a.day - b.day || a.batch - b.batch),
    );

  it("day rule: greedy count = exhaustive minimum cover, and the assignment obeys every rule", () => {
    fc.assert(
      fc.property(demandsArb, (ds) => {
        const plan = assignCopies(ds);
        expect(plan.copies).toBe(bruteMinCopies(ds));
        for (let c = 0; c < plan.copies; c++) {
          expect(oneCopyCanServe(ds.filter((_, i) => plan.copyOf[i] === c))).toBe(true);
        }
      }),
      { numRuns: 400 },
    );
  });

  it("day rule keeps a partial order, so Dilworth applies: minimum cover = largest incompatible set", () => {
    fc.assert(
      fc.property(demandsArb, (ds) => {
        expect(bruteMinCopies(ds)).toBe(bruteMaxAntichain(ds));
      }),
      { numRuns: 200 },
    );
  });
});

describe("day rule by hand", () => {
  it("a wet scene takes its copy out for the rest of the day; the copy is back next day", () => {
    // Day 0: scene A stage 0 wet, scene B stage 0 → two copies. Day 1: scene C stage 0 → copy #1 again.
    const ds: CopyDemand[] = [
      { level: 0, day: 0, batch: 1, outForDay: true },
      { level: 0, day: 0, batch: 2, outForDay: false },
      { level: 0, day: 1, batch: 3, outForDay: false },
    ];
    const plan = assignCopies(ds);
    expect(plan.copies).toBe(2);
    expect(plan.copyOf).toEqual([0, 1, 0]);
    // Without the wet flag one copy does it all.
    expect(assignCopies(ds.map((d) => ({ ...d, outForDay: false }))).copies).toBe(1);
  });

  it("two uses in one scene need two copies even at equal stages", () => {
    const ds: CopyDemand[] = [
      { level: 1, day: 0, batch: 1, outForDay: false },
      { level: 1, day: 0, batch: 1, outForDay: false },
    ];
    expect(assignCopies(ds).copies).toBe(2);
  });
});

// ---------- through the engine ----------

function garment(id: string, groupId: string, copy: number): GarmentRec {
  return {
    id,
    tagCode: id.toUpperCase(),
    name: "Hero coat",
    category: "coat",
    fitIntent: "regular",
    construction: "woven",
    finished: {},
    source: "built",
    status: "in_stock",
    multiplesGroupId: groupId,
    copyNumber: copy,
  };
}

function film(levels: number[], opts: { wetAt?: number[]; sameDay?: boolean } = {}): ProductionSnapshot {
  const scenes = levels.map((_, i) => ({ id: `s${i + 1}`, number: String(i + 1), storyDay: 1, storyOrder: i + 1 }));
  const appearances: AppearanceRec[] = levels.map((lvl, i) => ({
    id: `a${i + 1}`,
    sceneId: `s${i + 1}`,
    characterId: "c1",
    changeId: "ch1",
    distressStage: lvl,
    wet: opts.wetAt?.includes(i) ?? false,
    stunt: false,
    blood: false,
    vfxShot: false,
    changeHere: false,
  }));
  return {
    production: { id: "p", kind: "film", quickChangeThresholdMin: 2 },
    scenes,
    shootDays: opts.sameDay
      ? [{ id: "d1", date: "2027-03-01", sceneIds: scenes.map((s) => s.id) }]
      : scenes.map((s, i) => ({ id: `d${i + 1}`, date: `2027-03-${String(i + 1).padStart(2, "0")}`, sceneIds: [s.id] })),
    characters: [{ id: "c1", name: "Ada", performerId: null, doublePerformerIds: [] }],
    performers: [],
    changes: [{ id: "ch1", characterId: "c1", number: 1 }],
    changeItems: [{ id: "i1", changeId: "ch1", garmentId: null, multiplesGroupId: "g" }],
    appearances,
    garments: [garment("m1", "g", 1), garment("m2", "g", 2)],
    multiplesGroups: [{ id: "g", name: "Hero coat", garmentIds: ["m1", "m2"] }],
    continuityEntries: [],
  };
}

describe("multiples snag through computeSnags", () => {
  it("3,1,2,1,3,2 in shoot order with 2 copies held → blocking, 3 needed, copy plan per Dilworth 1950; patience sorting", () => {
    const snags = computeSnags(film([3, 1, 2, 1, 3, 2]), { today: "2027-02-01" });
    const m = snags.find((s) => s.kind === "multiples");
    expect(m?.severity).toBe("blocking");
    expect(m?.key).toBe("multiples:g");
    expect(m?.evidence.copiesNeeded).toBe(3);
    expect(m?.evidence.copiesHeld).toBe(2);
    expect(m?.explanation).toContain("3 \u2192 2 \u2192 1");
    // piles {3,3} {1,2,2} {1} → scenes {1,5} {2,3,6} {4}
    expect(m?.assignment?.map((a) => a.sceneIds)).toEqual([["s1", "s5"], ["s2", "s3", "s6"], ["s4"]]);
    expect(m?.assignment?.map((a) => a.garmentId)).toEqual(["m1", "m2", null]);
  });

  it("no snag when the group holds enough copies, but the plan is still available", () => {
    const snap = film([0, 2, 1, 3, 1, 2]); // needs 2 (Dilworth 1950; patience sorting)
    expect(computeSnags(snap, { today: "2027-02-01" }).some((s) => s.kind === "multiples")).toBe(false);
    const [plan] = computeMultiplesPlans(snap);
    expect(plan.copiesNeeded).toBe(2);
  });

  it("same day, rising stages, one wet scene in the middle → 2 copies (day rule)", () => {
    const snap = film([0, 1, 2], { sameDay: true, wetAt: [1] });
    const [plan] = computeMultiplesPlans(snap);
    expect(plan.copiesNeeded).toBe(2);
    const dry = computeMultiplesPlans(film([0, 1, 2], { sameDay: true }))[0];
    expect(dry.copiesNeeded).toBe(1);
  });
});
