import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { fraction, multiply, add, number as mnumber } from "mathjs";
import { compareSceneNumbers, formatEighths, minutesSincePreviousExit, parseEighths } from "@shared/domain/breakdown";

describe("page length in eighths", () => {
  // Script pages are timed in eighths of a page (common practice, no source); the arithmetic is
  // checked against mathjs fractions: (whole + n/8) × 8.
  const cases: Array<[string, number, number, number]> = [
    ["3/8", 0, 3, 8],
    ["1", 1, 0, 8],
    ["1 3/8", 1, 3, 8],
    ["2 4/8", 2, 4, 8],
    ["12 7/8", 12, 7, 8],
  ];
  for (const [text, whole, n, d] of cases) {
    it(`reads "${text}"`, () => {
      const expected = mnumber(multiply(add(fraction(whole), fraction(n, d)), 8) as never) as number;
      expect(parseEighths(text)).toBe(expected);
    });
  }

  it("refuses lengths that are not in eighths", () => {
    for (const bad of ["1/4", "0/8", "8/8", "1 9/8", "1.5", "", "abc", "-1"]) expect(parseEighths(bad), bad).toBeNull();
  });

  it("writes back what it reads (round trip over 0–800 eighths)", () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 800 }), (e) => parseEighths(formatEighths(e)) === e));
  });
});

describe("scene number order", () => {
  // Reference: ICU numeric collation (Intl.Collator with numeric: true), a general-purpose library.
  const collator = new Intl.Collator("en", { numeric: true, sensitivity: "base" });
  it("agrees with numeric collation on random scene numbers", () => {
    const sceneNo = fc.tuple(fc.integer({ min: 1, max: 400 }), fc.stringMatching(/^[A-Z]{0,2}$/)).map(([n, s]) => `${n}${s}`);
    fc.assert(
      fc.property(sceneNo, sceneNo, (a, b) => Math.sign(compareSceneNumbers(a, b)) === Math.sign(collator.compare(a, b))),
      { numRuns: 2000 },
    );
  });

  it("puts inserted scenes between their neighbours", () => {
    const sorted = ["43", "42B", "42", "42AA", "9", "42A"].sort(compareSceneNumbers);
    expect(sorted).toEqual(["9", "42", "42A", "42AA", "42B", "43"]);
  });
});

describe("minutes since a character's previous exit", () => {
  /** Brute force: walk the running order between the two scenes and add their minutes. */
  function naive(
    scenes: Array<{ id: string; runningMinutes: number | null }>,
    apps: Array<{ id: string; sceneId: string; characterId: string }>,
  ) {
    const out = new Map<string, number | null>();
    const idx = (sid: string) => scenes.findIndex((s) => s.id === sid);
    for (const a of apps) {
      const mine = apps.filter((x) => x.characterId === a.characterId && idx(x.sceneId) < idx(a.sceneId));
      if (!mine.length) {
        out.set(a.id, null);
        continue;
      }
      const prev = Math.max(...mine.map((x) => idx(x.sceneId)));
      let sum = 0;
      for (let i = prev + 1; i < idx(a.sceneId); i++) sum += scenes[i]!.runningMinutes ?? 0;
      out.set(a.id, Math.round(sum * 100) / 100);
    }
    return out;
  }

  it("matches a brute-force walk of the running order", () => {
    const arb = fc
      .record({
        minutes: fc.array(
          fc.option(
            fc.integer({ min: 0, max: 2000 }).map((c) => c / 100),
            { nil: null },
          ),
          { minLength: 1, maxLength: 15 },
        ),
        chars: fc.integer({ min: 1, max: 4 }),
        seed: fc.array(fc.tuple(fc.nat(), fc.nat()), { maxLength: 40 }),
      })
      .map(({ minutes, chars, seed }) => {
        const scenes = minutes.map((m, i) => ({ id: `s${i}`, runningMinutes: m }));
        const seen = new Set<string>();
        const apps: Array<{ id: string; sceneId: string; characterId: string }> = [];
        for (const [a, b] of seed) {
          const key = `${a % scenes.length}:${b % chars}`;
          if (seen.has(key)) continue;
          seen.add(key);
          apps.push({ id: `a${apps.length}`, sceneId: `s${a % scenes.length}`, characterId: `c${b % chars}` });
        }
        return { scenes, apps };
      });
    fc.assert(
      fc.property(arb, ({ scenes, apps }) => {
        const got = minutesSincePreviousExit(scenes, apps);
        const want = naive(scenes, apps);
        for (const a of apps) if (got.get(a.id) !== want.get(a.id)) return false;
        return true;
      }),
      { numRuns: 500 },
    );
  });

  it("worked example: exit after scene 2, two scenes of 1.5 and 0.25 min, entrance in scene 5", () => {
    // By hand: 1.5 + 0.25 = 1.75 minutes between the exit and the next entrance.
    const scenes = [1, 2, 3, 4, 5].map((n, i) => ({ id: `s${n}`, runningMinutes: [4, 6, 1.5, 0.25, 3][i]! }));
    const apps = [
      { id: "a", sceneId: "s2", characterId: "nell" },
      { id: "b", sceneId: "s5", characterId: "nell" },
    ];
    const gaps = minutesSincePreviousExit(scenes, apps);
    expect(gaps.get("a")).toBeNull();
    expect(gaps.get("b")).toBe(1.75);
  });
});
