import { differenceInCalendarDays, parseISO } from "date-fns";
import { describe, expect, it } from "vitest";
import { computeSnags } from "@shared/domain/snags/engine";
import type { AppearanceRec, GarmentRec, ProductionSnapshot } from "@shared/domain/snags/types";

function app(id: string, sceneId: string, characterId: string, changeId: string): AppearanceRec {
  return {
    id,
    sceneId,
    characterId,
    changeId,
    distressStage: 0,
    wet: false,
    stunt: false,
    blood: false,
    vfxShot: false,
    changeHere: false,
  };
}
function garment(id: string, over: Partial<GarmentRec> = {}): GarmentRec {
  return {
    id,
    tagCode: id.toUpperCase(),
    name: "Cloak",
    category: "coat",
    fitIntent: "loose",
    construction: "woven",
    finished: {},
    source: "built",
    status: "in_stock",
    ...over,
  };
}

/** Two characters; scenes s1 (day d1, 2027-03-01), s2 (d1), s3 (d2, 2027-03-05). */
function snap(appearances: AppearanceRec[], garments: GarmentRec[], items: [string, string][]): ProductionSnapshot {
  return {
    production: { id: "p", kind: "film", quickChangeThresholdMin: 2 },
    scenes: [
      { id: "s1", number: "1", storyDay: 1, storyOrder: 1 },
      { id: "s2", number: "2", storyDay: 2, storyOrder: 2 },
      { id: "s3", number: "3", storyDay: 3, storyOrder: 3 },
    ],
    shootDays: [
      { id: "d1", date: "2027-03-01", sceneIds: ["s1", "s2"] },
      { id: "d2", date: "2027-03-05", sceneIds: ["s3"] },
    ],
    characters: [
      { id: "c1", name: "Ada", performerId: null, doublePerformerIds: [] },
      { id: "c2", name: "Bram", performerId: null, doublePerformerIds: [] },
    ],
    performers: [],
    changes: [
      { id: "x1", characterId: "c1", number: 1 },
      { id: "x2", characterId: "c2", number: 1 },
    ],
    changeItems: items.map(([changeId, garmentId], i) => ({ id: `i${i}`, changeId, garmentId, multiplesGroupId: null })),
    appearances,
    garments,
    multiplesGroups: [],
    continuityEntries: [],
  };
}
const of = (s: ProductionSnapshot, kind: string, today = "2027-02-01") => computeSnags(s, { today }).filter((x) => x.kind === kind);

describe("double booking", () => {
  const items: [string, string][] = [
    ["x1", "cloak"],
    ["x2", "cloak"],
  ];
  it("one garment on two characters the same shoot day → blocking", () => {
    const snags = of(snap([app("a1", "s1", "c1", "x1"), app("a2", "s2", "c2", "x2")], [garment("cloak")], items), "booking");
    expect(snags.map((s) => [s.key, s.severity])).toEqual([["booking:cloak:d1", "blocking"]]);
    expect(snags[0].explanation).toContain("Ada (scene 1) and Bram (scene 2) on shoot day Mon 1 Mar 2027");
  });
  it("different days, or the same character twice, is fine", () => {
    expect(of(snap([app("a1", "s1", "c1", "x1"), app("a2", "s3", "c2", "x2")], [garment("cloak")], items), "booking")).toEqual([]);
    expect(of(snap([app("a1", "s1", "c1", "x1"), app("a2", "s2", "c1", "x1")], [garment("cloak")], items), "booking")).toEqual([]);
  });
  it("a continuity entry replaces the planned garments of that appearance for that day", () => {
    const s = snap([app("a1", "s1", "c1", "x1"), app("a2", "s2", "c2", "x2")], [garment("cloak"), garment("other")], items);
    s.continuityEntries = [{ id: "e1", appearanceId: "a2", shootDayId: "d1", garmentIds: ["other"] }];
    expect(of(s, "booking")).toEqual([]);
  });
});

describe("rentals", () => {
  it("due back before the last scene → warning with the days late (date-fns as the calendar oracle)", () => {
    const s = snap(
      [app("a1", "s1", "c1", "x1"), app("a3", "s3", "c1", "x1")],
      [garment("cloak", { source: "rented", rentalDueDate: "2027-03-02" })],
      [["x1", "cloak"]],
    );
    const [r] = of(s, "rental");
    expect(r.key).toBe("rental:cloak");
    expect(r.severity).toBe("warning");
    expect(r.evidence.lastNeeded).toBe("2027-03-05");
    expect(r.evidence.daysLate).toBe(differenceInCalendarDays(parseISO("2027-03-05"), parseISO("2027-03-02")));
  });
  it("due on or after the last scene → nothing", () => {
    const s = snap([app("a3", "s3", "c1", "x1")], [garment("cloak", { source: "rented", rentalDueDate: "2027-03-05" })], [["x1", "cloak"]]);
    expect(of(s, "rental")).toEqual([]);
  });
});

describe("availability against today", () => {
  const s = (status: GarmentRec["status"]) =>
    snap([app("a1", "s1", "c1", "x1"), app("a3", "s3", "c1", "x1")], [garment("cloak", { status })], [["x1", "cloak"]]);
  it("lost or returned while still needed on or after today → blocking", () => {
    expect(of(s("lost"), "availability", "2027-03-03").map((x) => [x.key, x.severity])).toEqual([["availability:cloak", "blocking"]]);
    expect(of(s("returned"), "availability", "2027-03-05")).toHaveLength(1);
    expect(of(s("lost"), "availability", "2027-03-06")).toEqual([]); // last need has passed
  });
  it("in the workroom or cleaning: a snag only when needed today", () => {
    expect(of(s("workroom"), "availability", "2027-03-05")).toHaveLength(1);
    expect(of(s("cleaning"), "availability", "2027-03-01")).toHaveLength(1);
    expect(of(s("workroom"), "availability", "2027-03-04")).toEqual([]);
    expect(of(s("in_stock"), "availability", "2027-03-05")).toEqual([]);
  });
});
