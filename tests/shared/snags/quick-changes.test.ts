import { describe, expect, it } from "vitest";
import { computeSnags } from "@shared/domain/snags/engine";
import type { AppearanceRec, ProductionSnapshot } from "@shared/domain/snags/types";

// Hand-worked: the time for a quick change is the running time of the scenes played between the
// exit and the entrance (product.md, Computations 6). Arithmetic only; no external source needed.

function app(id: string, sceneId: string, changeId: string): AppearanceRec {
  return {
    id,
    sceneId,
    characterId: "c1",
    changeId,
    distressStage: 0,
    wet: false,
    stunt: false,
    blood: false,
    vfxShot: false,
    changeHere: true,
  };
}

function stage(minutes: (number | null)[], apps: AppearanceRec[], kind: "stage" | "film" = "stage", threshold = 4): ProductionSnapshot {
  return {
    production: { id: "p", kind, quickChangeThresholdMin: threshold },
    // stageOrder runs opposite to storyOrder here, to prove running order is used.
    scenes: minutes.map((m, i) => ({
      id: `s${i + 1}`,
      number: `${i + 1}`,
      storyDay: 1,
      storyOrder: 100 - i,
      stageOrder: i + 1,
      runningMinutes: m,
    })),
    shootDays: [],
    performances: [{ id: "pf1", date: "2027-05-01", startsAt: "19:30" }],
    characters: [{ id: "c1", name: "Wren", performerId: null, doublePerformerIds: [] }],
    performers: [],
    changes: [
      { id: "k1", characterId: "c1", number: 1 },
      { id: "k2", characterId: "c1", number: 2 },
    ],
    changeItems: [],
    appearances: apps,
    garments: [],
    multiplesGroups: [],
    continuityEntries: [],
  };
}
const qc = (s: ProductionSnapshot) => computeSnags(s, { today: "2027-04-01" }).filter((x) => x.kind === "quick_change");

describe("stage quick changes", () => {
  it("exit after scene 1 in change 1, enter scene 4 in change 2; scenes 2+3 run 1+2 = 3 min < 4 → warning", () => {
    const snags = qc(stage([10, 1, 2, 8], [app("a1", "s1", "k1"), app("a4", "s4", "k2")]));
    expect(snags.map((s) => s.key)).toEqual(["quick_change:a1:a4"]);
    expect(snags[0].evidence.minutes).toBe(3);
    expect(snags[0].explanation).toContain("3 min against the 4 min");
  });

  it("4 min or more in between → nothing; same change → nothing", () => {
    expect(qc(stage([10, 2, 2, 8], [app("a1", "s1", "k1"), app("a4", "s4", "k2")]))).toEqual([]);
    expect(qc(stage([10, 0, 0, 8], [app("a1", "s1", "k1"), app("a4", "s4", "k1")]))).toEqual([]);
  });

  it("consecutive scenes give 0 min; each consecutive pair is judged", () => {
    const snags = qc(stage([5, 5, 5, 5], [app("a1", "s1", "k1"), app("a2", "s2", "k2"), app("a4", "s4", "k1")]));
    // s1→s2: 0 min; s2→s4: scene 3 = 5 min ≥ 4.
    expect(snags.map((s) => [s.key, s.evidence.minutes])).toEqual([["quick_change:a1:a2", 0]]);
  });

  it("an unknown running time counts as 0 and is said so", () => {
    const [s] = qc(stage([5, null, 5], [app("a1", "s1", "k1"), app("a3", "s3", "k2")]));
    expect(s.evidence.minutes).toBe(0);
    expect(s.evidence.unknownCount).toBe(1);
    expect(s.explanation).toContain("Running time unknown for 1 scene");
  });

  it("film productions have no quick-change snags", () => {
    expect(qc(stage([10, 1, 1, 8], [app("a1", "s1", "k1"), app("a4", "s4", "k2")], "film"))).toEqual([]);
  });
});
