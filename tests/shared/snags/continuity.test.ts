import { describe, expect, it } from "vitest";
import { computeSnags } from "@shared/domain/snags/engine";
import type { AppearanceRec, GarmentRec, ProductionSnapshot } from "@shared/domain/snags/types";

// Hand-worked examples of the two continuity rules (product.md, Computations 2):
// a character keeps one change within a story day unless the breakdown marks a change, and a
// garment copy's distress stage never goes down in story order. Trade rules, no external source.

function app(id: string, sceneId: string, changeId: string, over: Partial<AppearanceRec> = {}): AppearanceRec {
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
    changeHere: false,
    ...over,
  };
}
function garment(id: string): GarmentRec {
  return {
    id,
    tagCode: id.toUpperCase(),
    name: "Shirt",
    category: "shirt",
    fitIntent: "regular",
    construction: "woven",
    finished: {},
    source: "built",
    status: "in_stock",
  };
}

/** Scenes s1..s4: story days 1,1,1,2 in story order 1..4, shot on one day in reverse. */
function snap(appearances: AppearanceRec[], extra: Partial<ProductionSnapshot> = {}): ProductionSnapshot {
  return {
    production: { id: "p", kind: "film", quickChangeThresholdMin: 2 },
    scenes: [
      { id: "s1", number: "10", storyDay: 1, storyOrder: 1 },
      { id: "s2", number: "11", storyDay: 1, storyOrder: 2 },
      { id: "s3", number: "12", storyDay: 1, storyOrder: 3 },
      { id: "s4", number: "13", storyDay: 2, storyOrder: 4 },
    ],
    shootDays: [{ id: "d1", date: "2027-03-01", sceneIds: ["s4", "s3", "s2", "s1"] }],
    characters: [{ id: "c1", name: "Ada", performerId: null, doublePerformerIds: [] }],
    performers: [],
    changes: [
      { id: "ch1", characterId: "c1", number: 1 },
      { id: "ch2", characterId: "c1", number: 2 },
    ],
    changeItems: [
      { id: "i1", changeId: "ch1", garmentId: "shirt", multiplesGroupId: null },
      { id: "i2", changeId: "ch2", garmentId: "coat", multiplesGroupId: null },
    ],
    appearances,
    garments: [garment("shirt"), garment("coat")],
    multiplesGroups: [],
    continuityEntries: [],
    ...extra,
  };
}
const cont = (s: ProductionSnapshot) => computeSnags(s, { today: "2027-02-01" }).filter((x) => x.kind === "continuity");

describe("one change per story day", () => {
  it("change 1 → 2 inside story day 1 without a marked change → warning on the later scene", () => {
    const snags = cont(snap([app("a1", "s1", "ch1"), app("a2", "s2", "ch2")]));
    expect(snags.map((s) => [s.key, s.severity])).toEqual([["continuity:change:a2", "warning"]]);
    expect(snags[0].explanation).toContain("change 1 in scene 10 and change 2 in scene 11");
  });

  it("no snag when the breakdown marks the change, or the story day turns", () => {
    expect(cont(snap([app("a1", "s1", "ch1"), app("a2", "s2", "ch2", { changeHere: true })]))).toEqual([]);
    expect(cont(snap([app("a1", "s3", "ch1"), app("a2", "s4", "ch2")]))).toEqual([]);
  });

  it("judged in story order, not input or shoot order", () => {
    // Input order s3, s1; story order s1 (ch1) → s3 (ch2): the break is at s3.
    const snags = cont(snap([app("a3", "s3", "ch2"), app("a1", "s1", "ch1")]));
    expect(snags.map((s) => s.key)).toEqual(["continuity:change:a3"]);
  });
});

describe("distress never goes down for one copy", () => {
  it("planned: same shirt at stage 2 then stage 1 later in the story → warning", () => {
    const snags = cont(
      snap([app("a1", "s1", "ch1", { distressStage: 2 }), app("a4", "s4", "ch1", { distressStage: 1, changeHere: true })]),
    );
    expect(snags.map((s) => s.key)).toEqual(["continuity:distress:shirt:app:a1:app:a4"]);
    expect(snags[0].evidence).toMatchObject({ from: { stage: 2 }, to: { stage: 1 } });
  });

  it("rising or level distress is fine", () => {
    expect(
      cont(
        snap([
          app("a1", "s1", "ch1", { distressStage: 1 }),
          app("a2", "s2", "ch1", { distressStage: 1 }),
          app("a3", "s3", "ch1", { distressStage: 3 }),
        ]),
      ),
    ).toEqual([]);
  });

  it("a continuity entry's recorded stage is used instead of the planned one", () => {
    const apps = [app("a1", "s1", "ch1", { distressStage: 0 }), app("a2", "s2", "ch1", { distressStage: 1 })];
    // Recorded: scene 10 was actually shot at stage 2 → scene 11 at planned 1 goes down.
    const withEntry = snap(apps, {
      continuityEntries: [{ id: "e1", appearanceId: "a1", shootDayId: "d1", garmentIds: ["shirt"], distressStage: 2 }],
    });
    expect(cont(withEntry).map((s) => s.key)).toEqual(["continuity:distress:shirt:entry:e1:app:a2"]);
    expect(cont(snap(apps))).toEqual([]);
  });

  it("an entry matched by scene and character works like one with an appearance id", () => {
    const apps = [app("a1", "s1", "ch1"), app("a2", "s2", "ch1", { distressStage: 1 })];
    const s = snap(apps, {
      continuityEntries: [{ id: "e2", sceneId: "s2", characterId: "c1", shootDayId: "d1", garmentIds: ["shirt"], distressStage: 3 }],
    });
    expect(cont(s)).toEqual([]);
    const s2 = snap([...apps, app("a3", "s3", "ch1", { distressStage: 2 })], { continuityEntries: s.continuityEntries });
    expect(cont(s2).map((x) => x.key)).toEqual(["continuity:distress:shirt:entry:e2:app:a3"]);
  });
});
