import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildSyntheticProduction, mulberry32 } from "../../../scripts/bench/snags";
import { canonicalJson, computeSnags, fnv1a32 } from "@shared/domain/snags/engine";
import { computeSnagsReference } from "@shared/domain/snags/reference";
import type { GarmentRec, ProductionSnapshot, Snag } from "@shared/domain/snags/types";

describe("evidence hash", () => {
  it("FNV-1a 32-bit matches the published test vectors", () => {
    // FNV test vectors (Fowler/Noll/Vo, draft-eastlake-fnv), from memory.
    expect(fnv1a32("")).toBe("811c9dc5");
    expect(fnv1a32("a")).toBe("e40c292c");
    expect(fnv1a32("foobar")).toBe("bf9cf968");
  });

  it("canonical JSON ignores key order and drops undefined members", () => {
    expect(canonicalJson({ b: 1, a: [2, { d: null, c: "x" }], u: undefined })).toBe('{"a":[2,{"c":"x","d":null}],"b":1}');
    expect(canonicalJson({ a: 1, b: 2 })).toBe(canonicalJson({ b: 2, a: 1 }));
  });
});

// ---------- random snapshots ----------

const CATS = ["jacket", "shirt", "trousers", "dress", "skirt", "knit_top", "bodice", "cape"];
const STATUSES: GarmentRec["status"][] = ["in_stock", "in_stock", "workroom", "cleaning", "returned", "lost", "on_set"];

interface Shape {
  seed: number;
  kind: "film" | "stage";
  scenes: number;
  days: number;
  chars: number;
  garments: number;
  groups: number;
}

/** A small random production: every rule gets a chance to fire, including dangling references. */
function randomSnapshot(sh: Shape): ProductionSnapshot {
  const r = mulberry32(sh.seed);
  const int = (lo: number, hi: number) => lo + Math.floor(r() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)];
  const date = (d: number) => `2027-03-${String(1 + d).padStart(2, "0")}`;
  const storyOrders = Array.from({ length: sh.scenes }, (_, i) => i + 1).sort(() => r() - 0.5);
  const scenes = storyOrders.map((o, i) => ({
    id: `s${i}`,
    number: `${i + 1}`,
    storyDay: 1 + Math.floor((o - 1) / 3),
    storyOrder: o,
    stageOrder: r() < 0.8 ? int(1, sh.scenes) : null,
    runningMinutes: r() < 0.85 ? int(0, 4) : null,
  }));
  const shootDays =
    sh.kind === "film"
      ? Array.from({ length: sh.days }, (_, d) => ({
          id: `d${d}`,
          date: date(int(0, 9)),
          sceneIds: scenes.filter(() => r() < 0.45).map((s) => s.id),
        }))
      : [];
  const performances =
    sh.kind === "stage" ? Array.from({ length: sh.days }, (_, d) => ({ id: `pf${d}`, date: date(d * 2), startsAt: "19:30" })) : [];
  const performers = Array.from({ length: sh.chars + 2 }, (_, i) => ({
    id: `p${i}`,
    name: `P${i}`,
    measurements: Object.fromEntries(
      (
        [
          ["chest_girth", 880, 1100],
          ["bust_girth", 820, 1050],
          ["waist_girth", 650, 950],
          ["hip_girth", 860, 1100],
          ["arm_length", 560, 650],
          ["neck_girth", 330, 420],
          ["inside_leg_length", 720, 860],
        ] as const
      )
        .filter(() => r() < 0.7)
        .map(([k, lo, hi]) => [k, int(lo, hi)]),
    ),
  }));
  const characters = Array.from({ length: sh.chars }, (_, i) => ({
    id: `c${i}`,
    name: `C${i}`,
    performerId: r() < 0.9 ? `p${i}` : null,
    doublePerformerIds: r() < 0.4 ? [`p${sh.chars + int(0, 1)}`] : [],
  }));
  const changes = characters.flatMap((c) =>
    Array.from({ length: int(1, 3) }, (_, k) => ({ id: `${c.id}x${k}`, characterId: c.id, number: k + 1 })),
  );
  const groups = Array.from({ length: sh.groups }, (_, i) => ({ id: `g${i}`, name: `Group ${i}`, garmentIds: [] as string[] }));
  const garments: GarmentRec[] = Array.from({ length: sh.garments }, (_, i) => {
    const category = pick(CATS);
    const inGroup = groups.length > 0 && r() < 0.5 ? pick(groups) : null;
    if (inGroup && r() < 0.5) inGroup.garmentIds.push(`t${i}`);
    const knit = r() < 0.2;
    const rented = r() < 0.3;
    return {
      id: `t${i}`,
      tagCode: `T${i}`,
      name: category,
      category,
      fitIntent: pick(["fitted", "regular", "loose"] as const),
      construction: knit ? "knit" : "woven",
      stretchRatio: knit ? pick([1.1, 1.25, 1.5]) : null,
      finished: Object.fromEntries(
        (
          [
            ["chest", 900, 1200],
            ["bust", 850, 1150],
            ["waist", 650, 1050],
            ["hip", 880, 1200],
            ["sleeve", 540, 680],
            ["neck", 330, 440],
            ["inside_leg", 700, 880],
          ] as const
        )
          .filter(() => r() < 0.5)
          .map(([k, lo, hi]) => [k, int(lo, hi)]),
      ),
      source: rented ? "rented" : "built",
      rentalDueDate: rented ? date(int(0, 9)) : null,
      status: pick(STATUSES),
      multiplesGroupId: inGroup && r() < 0.7 ? inGroup.id : null,
      copyNumber: r() < 0.7 ? int(1, 4) : null,
    };
  });
  const changeItems = changes.flatMap((c, ci) =>
    Array.from({ length: int(0, 3) }, (_, k) => {
      const toGroup = groups.length > 0 && r() < 0.35;
      return {
        id: `i${ci}_${k}`,
        changeId: c.id,
        garmentId: toGroup ? null : r() < 0.95 ? `t${int(0, sh.garments - 1)}` : "missing",
        multiplesGroupId: toGroup ? pick(groups).id : null,
      };
    }),
  );
  const appearances = scenes.flatMap((s) =>
    characters
      .filter(() => r() < 0.6)
      .map((c) => ({
        id: `a_${s.id}_${c.id}`,
        sceneId: s.id,
        characterId: c.id,
        changeId: pick(changes.filter((x) => x.characterId === c.id)).id,
        distressStage: int(0, 3),
        wet: r() < 0.2,
        stunt: r() < 0.2,
        blood: r() < 0.1,
        vfxShot: r() < 0.1,
        changeHere: r() < 0.4,
      })),
  );
  const runIds = sh.kind === "film" ? shootDays.map((d) => d.id) : performances.map((p) => p.id);
  const continuityEntries =
    runIds.length === 0
      ? []
      : appearances
          .filter(() => r() < 0.25)
          .map((a, i) => ({
            id: `e${i}`,
            ...(r() < 0.5 ? { appearanceId: a.id } : { sceneId: a.sceneId, characterId: a.characterId }),
            shootDayId: pick(runIds),
            garmentIds: garments.filter(() => r() < 0.2).map((g) => g.id),
            distressStage: r() < 0.6 ? int(0, 3) : null,
          }));
  // Drawn last, so the earlier draws (and the cases they make) stay as they were.
  const checkouts = garments
    .filter(() => r() < 0.25)
    .map((g, i) => ({
      id: `co${i}`,
      garmentId: r() < 0.9 ? g.id : "gone",
      toName: `Person ${i}`,
      dueBackOn: date(int(0, 9)),
      checkedOutOn: date(0),
      shootDayId: runIds.length && r() < 0.5 ? pick(runIds) : null,
      sceneId: r() < 0.5 ? pick(scenes).id : null,
    }));
  return {
    production: { id: "pr", kind: sh.kind, quickChangeThresholdMin: int(1, 5) },
    scenes,
    shootDays,
    performances,
    characters,
    performers,
    changes,
    changeItems,
    appearances,
    garments,
    multiplesGroups: groups,
    continuityEntries,
    checkouts,
  };
}

const shapeArb: fc.Arbitrary<Shape> = fc.record({
  seed: fc.integer({ min: 0, max: 2 ** 31 - 1 }),
  kind: fc.constantFrom("film" as const, "stage" as const),
  scenes: fc.integer({ min: 1, max: 12 }),
  days: fc.integer({ min: 1, max: 4 }),
  chars: fc.integer({ min: 1, max: 4 }),
  garments: fc.integer({ min: 1, max: 10 }),
  groups: fc.integer({ min: 0, max: 3 }),
});
const todayArb = fc.integer({ min: 0, max: 10 }).map((d) => `2027-03-${String(1 + d).padStart(2, "0")}`);

const summary = (xs: Snag[]) => xs.map((s) => `${s.key} ${s.severity} ${s.evidenceHash}`);

function shuffled<T>(xs: T[], r: () => number): T[] {
  const a = [...xs];
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(r() * (i + 1));
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

describe("engine vs quadratic reference", () => {
  it("same snag keys, severities and evidence hashes on random snapshots", () => {
    let fired = 0;
    fc.assert(
      fc.property(shapeArb, todayArb, (shape, today) => {
        const snap = randomSnapshot(shape);
        const engine = computeSnags(snap, { today });
        fired += engine.length;
        expect(summary(engine)).toEqual(summary(computeSnagsReference(snap, { today })));
      }),
      { numRuns: 300 },
    );
    expect(fired).toBeGreaterThan(0); // the generator does make snags
  });

  it("every rule fires somewhere in the random runs (so the comparison covers all of them)", () => {
    const kinds = new Set<string>();
    fc.assert(
      fc.property(shapeArb, todayArb, (shape, today) => {
        for (const s of computeSnags(randomSnapshot(shape), { today })) kinds.add(s.kind);
      }),
      { numRuns: 300, seed: 42 },
    );
    expect([...kinds].sort()).toEqual([
      "availability",
      "booking",
      "checkout_overdue",
      "continuity",
      "fit",
      "multiples",
      "quick_change",
      "rental",
    ]);
  });

  it("same result on the benchmark generator at 1/10 scale", () => {
    const snap = buildSyntheticProduction(0.1, { seed: 7, start: "2027-01-04" });
    const today = "2027-01-10";
    const engine = computeSnags(snap, { today });
    expect(engine.length).toBeGreaterThan(0);
    expect(summary(engine)).toEqual(summary(computeSnagsReference(snap, { today })));
  });
});

describe("stable keys and evidence hashes", () => {
  it("same input → same keys and hashes; input order does not matter", () => {
    fc.assert(
      fc.property(shapeArb, fc.integer(), (shape, seed) => {
        const snap = randomSnapshot(shape);
        const r = mulberry32(seed);
        const reordered: ProductionSnapshot = {
          ...snap,
          scenes: shuffled(snap.scenes, r),
          shootDays: shuffled(snap.shootDays, r),
          characters: shuffled(snap.characters, r),
          performers: shuffled(snap.performers, r),
          changes: shuffled(snap.changes, r),
          changeItems: shuffled(snap.changeItems, r),
          appearances: shuffled(snap.appearances, r),
          garments: shuffled(snap.garments, r),
          multiplesGroups: shuffled(snap.multiplesGroups, r),
          continuityEntries: shuffled(snap.continuityEntries, r),
        };
        const today = "2027-03-04";
        const a = computeSnags(snap, { today });
        expect(summary(computeSnags(snap, { today }))).toEqual(summary(a));
        expect(summary(computeSnags(reordered, { today }))).toEqual(summary(a));
      }),
      { numRuns: 150 },
    );
  });

  it("changing a required distress stage keeps the key but changes the evidence hash", () => {
    const base: ProductionSnapshot = {
      production: { id: "p", kind: "film", quickChangeThresholdMin: 2 },
      scenes: [1, 2, 3].map((i) => ({ id: `s${i}`, number: `${i}`, storyDay: 1, storyOrder: i })),
      shootDays: [1, 2, 3].map((i) => ({ id: `d${i}`, date: `2027-03-0${i}`, sceneIds: [`s${i}`] })),
      characters: [{ id: "c1", name: "Ada", performerId: null, doublePerformerIds: [] }],
      performers: [],
      changes: [{ id: "x", characterId: "c1", number: 1 }],
      changeItems: [{ id: "i", changeId: "x", garmentId: null, multiplesGroupId: "g" }],
      appearances: [2, 1, 0].map((lvl, k) => ({
        id: `a${k + 1}`,
        sceneId: `s${k + 1}`,
        characterId: "c1",
        changeId: "x",
        distressStage: lvl,
        wet: false,
        stunt: false,
        blood: false,
        vfxShot: false,
        changeHere: false,
      })),
      garments: [],
      multiplesGroups: [{ id: "g", name: "Coat", garmentIds: [] }],
      continuityEntries: [],
    };
    const m = (s: ProductionSnapshot) => computeSnags(s, { today: "2027-02-01" }).find((x) => x.kind === "multiples")!;
    const before = m(base);
    expect(before.evidence.copiesNeeded).toBe(3); // 2,1,0 strictly decreasing → 3 copies (Dilworth 1950; patience sorting)
    const changed = structuredClone(base);
    changed.appearances[2].distressStage = 1; // 2,1,1 → still short (2 needed, 0 held)
    const after = m(changed);
    expect(after.key).toBe(before.key);
    expect(after.evidenceHash).not.toBe(before.evidenceHash);
    expect(m(structuredClone(base)).evidenceHash).toBe(before.evidenceHash);
  });
});
