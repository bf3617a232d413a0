import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { buildMember, buildProduction } from "../factories.js";
import { resetDb } from "../setup/http.js";
import { buildFilmScenario, snagFixtures, type SnagFixtures } from "../setup/snag-fixtures.js";
import { clock } from "../../server/lib/clock.js";
import { dismissSnag, listSnags, loadSnapshot, multiplesPlan } from "../../server/services/snags.service.js";
import type { Actor } from "../../server/middleware/require-auth.js";
import type { SnagDto } from "../../shared/schemas/snags.js";
import { AuditEvent, SnagDismissal } from "../../server/models/index.js";

let actor: Actor;
let f: SnagFixtures;
let sc: Awaited<ReturnType<typeof buildFilmScenario>>;

beforeEach(async () => {
  await resetDb();
  const { user, production, membership } = await buildMember("supervisor");
  actor = { user, productionId: production.id, role: membership.role };
  f = snagFixtures(production.id);
  sc = await buildFilmScenario(f);
  // Before the first shoot day (2027-01-11), so every day is upcoming.
  clock.set("2027-01-10", { frozen: true });
});

afterEach(() => {
  clock.reset();
});

const open = async () => (await listSnags(actor, { includeDismissed: false })).snags;
const byKey = (xs: SnagDto[]) => new Map(xs.map((s) => [s.key, s.evidenceHash]));
/** Keys added and removed between two lists, plus keys whose evidence changed. */
function diff(before: SnagDto[], after: SnagDto[]) {
  const b = byKey(before);
  const a = byKey(after);
  return {
    added: [...a.keys()].filter((k) => !b.has(k)).sort(),
    removed: [...b.keys()].filter((k) => !a.has(k)).sort(),
    changed: [...a.keys()].filter((k) => b.has(k) && b.get(k) !== a.get(k)).sort(),
  };
}

describe("loadSnapshot", () => {
  it("reads the production's rows into the engine's plain records", async () => {
    const { snapshot, days } = await loadSnapshot(actor.productionId);

    expect(snapshot.scenes.map((s) => s.number)).toEqual(["1", "2", "3", "4", "5", "6", "7"]);
    expect(snapshot.shootDays.map((d) => d.date)).toEqual(["2027-01-11", "2027-01-12", "2027-01-13", "2027-01-14"]);
    expect(snapshot.shootDays[0].sceneIds).toEqual([sc.scenes.s4, sc.scenes.s1]);
    expect(snapshot.performers.find((p) => p.id === sc.performers.pWren)?.measurements).toEqual({
      chest_girth: 1000,
      waist_girth: 820,
      arm_length: 600,
    });
    expect(snapshot.multiplesGroups[0].garmentIds.sort()).toEqual([sc.garments.oil1, sc.garments.oil2].sort());
    expect(snapshot.garments.find((g) => g.id === sc.garments.coat)).toMatchObject({ source: "rented", rentalDueDate: "2027-01-12" });
    expect(days).toHaveLength(4);
  });

  it("uses the newest measurement set and a knit fabric's crosswise stretch", async () => {
    await f.measurements(sc.performers.pWren, { chest_girth: 1040 }, "2026-12-01");
    const knit = await f.fabric({ construction: "knit", stretchWeftPct: 25 });
    const top = await f.garment({ tagCode: "K-1", category: "knit_top", fabricId: knit });

    const { snapshot } = await loadSnapshot(actor.productionId);

    expect(snapshot.performers.find((p) => p.id === sc.performers.pWren)?.measurements).toEqual({ chest_girth: 1040 });
    // 25 % stretch = stretched length 1.25 × relaxed length.
    expect(snapshot.garments.find((g) => g.id === top)).toMatchObject({ construction: "knit", stretchRatio: 1.25 });
  });
});

describe("listSnags on the film scenario", () => {
  it("finds one snag of every film kind, each explained and linked", async () => {
    const list = await listSnags(actor, { includeDismissed: false });
    const kinds = new Set(list.snags.map((s) => s.kind));

    expect([...kinds].sort()).toEqual(["booking", "continuity", "fit", "multiples", "rental"]);
    for (const s of list.snags) {
      expect(s.explanation.length).toBeGreaterThan(20);
      expect(s.links.length).toBeGreaterThan(0);
      expect(s.links[0].href).toMatch(new RegExp(`^/p/${actor.productionId}/`));
    }
    expect(list.counts.total).toBe(list.snags.length);
    expect(list.nextShootDay?.date).toBe("2027-01-11");
  });

  it("explains the tight jacket with the ease numbers", async () => {
    const fit = (await open()).find((s) => s.kind === "fit")!;

    // Ease = finished − body = 1010 − 1000 = 10 mm. A fitted bodice/jacket chest needs 1½–2 in of ease
    // (CWU costume text, "Ease in Clothing"): 1.5 × 25.4 = 38.1 mm, 2 × 25.4 = 50.8 mm (international inch,
    // exact), so the jacket is tight by 38.1 − 10 = 28.1 mm.
    expect(fit.explanation).toContain("Chest ease is 10 mm");
    expect(fit.explanation).toContain("38\u201351 mm");
    expect(fit.explanation).toContain("tight by 28 mm");
    expect(fit.severity).toBe("warning");
    expect(fit.garments).toEqual([{ id: sc.garments.jacket, tagCode: "J-1", name: "Keeper jacket" }]);
    expect(fit.characters.map((c) => c.name)).toEqual(["Wren"]);
    expect(fit.links[0].href).toBe(`/p/${actor.productionId}/wardrobe/garments/${sc.garments.jacket}`);
  });

  it("a short multiples group is blocking and its plan puts each falling stage on its own copy", async () => {
    const snag = (await open()).find((s) => s.kind === "multiples")!;
    const plan = await multiplesPlan(actor, sc.groups.oilskin);

    // Stages 2, 1, 0 in shoot order form a strictly falling chain of 3; distress cannot go down on one copy,
    // so by Dilworth's theorem (dual form, Mirsky) at least 3 copies are needed and 3 suffice.
    expect(snag.severity).toBe("blocking");
    expect(snag.evidence).toMatchObject({ copiesHeld: 2, copiesNeeded: 3 });
    expect(snag.links[0].href).toBe(`/p/${actor.productionId}/snags/multiples/${sc.groups.oilskin}`);
    expect(plan).toMatchObject({ copiesHeld: 2, copiesNeeded: 3 });
    expect(plan.uses.map((u) => [u.sceneNumber, u.stage, u.copy, u.date])).toEqual([
      ["4", 2, 1, "2027-01-11"],
      ["3", 1, 2, "2027-01-12"],
      ["2", 0, 3, "2027-01-13"],
    ]);
    expect(plan.copies.map((c) => c.garment?.tagCode ?? null)).toEqual(["O-1", "O-2", null]);
  });

  it("filters by character and by shoot day", async () => {
    const ivy = await listSnags(actor, { characterId: sc.characters.ivy, includeDismissed: false });
    const day1 = await listSnags(actor, { shootDayId: sc.days.d1, includeDismissed: false });

    // Ivy: the shared shawl on day 1 and her rented coat.
    expect(ivy.snags.map((s) => s.kind).sort()).toEqual(["booking", "rental"]);
    // Day 1 shoots scenes 4 and 1: the oilskin (scene 4), the jacket and shawl of scene 1, the unmarked change
    // (scenes 1–2) and Ivy's coat (she is in scene 1).
    expect(day1.snags.map((s) => s.kind).sort()).toEqual(["booking", "continuity", "fit", "multiples", "rental"]);
    const day4 = await listSnags(actor, { shootDayId: sc.days.d4, includeDismissed: false });
    expect(day4.snags.map((s) => s.kind).sort()).toEqual(["rental"]);
  });
});

describe("recompute", () => {
  it("changing an appearance's stage adds exactly the distress break it causes, and clears it when undone", async () => {
    const before = await open();

    await f.update("appearances", sc.appearances.wrenS7, { distress_stage: 0 });
    const broken = await open();
    await f.update("appearances", sc.appearances.wrenS7, { distress_stage: 2 });
    const fixed = await open();

    // Shirt H-1 goes 1 (scene 6) → 0 (scene 7) in story order: distress is irreversible.
    expect(diff(before, broken)).toEqual({
      added: [`continuity:distress:${sc.garments.shirt}:app:${sc.appearances.wrenS6}:app:${sc.appearances.wrenS7}`],
      removed: [],
      changed: [],
    });
    expect(diff(before, fixed)).toEqual({ added: [], removed: [], changed: [] });
  });

  it("raising a stage so the shoot order no longer falls three times clears only the multiples snag", async () => {
    const before = await open();

    await f.update("appearances", sc.appearances.mossS3, { distress_stage: 2 });
    const after = await open();

    // Shoot order 2, 2, 0: the longest strictly falling run is 2 → 0, so 2 copies are enough.
    expect(diff(before, after)).toEqual({ added: [], removed: [`multiples:${sc.groups.oilskin}`], changed: [] });
    expect((await multiplesPlan(actor, sc.groups.oilskin)).copiesNeeded).toBe(2);
  });

  it("a garment's status adds and clears its availability snag", async () => {
    const before = await open();

    await f.update("garments", sc.garments.shirt, { status: "lost" });
    const lost = await open();
    await f.update("garments", sc.garments.shirt, { status: "in_stock" });
    const back = await open();

    expect(diff(before, lost)).toEqual({ added: [`availability:${sc.garments.shirt}`], removed: [], changed: [] });
    const snag = lost.find((s) => s.key === `availability:${sc.garments.shirt}`)!;
    expect(snag.severity).toBe("blocking");
    // Needed on 2027-01-12 (scene 5), 01-13 (scenes 2, 6) and 01-14 (scene 7).
    expect(snag.explanation).toContain("3 upcoming days need it, the first on 2027-01-12 and the last on 2027-01-14");
    expect(diff(before, back)).toEqual({ added: [], removed: [], changed: [] });
  });

  it("a garment in the workroom matters only on the day it is needed", async () => {
    await f.update("garments", sc.garments.shirt, { status: "workroom" });

    const dayBefore = await open();
    clock.set("2027-01-12", { frozen: true });
    const onTheDay = await open();

    expect(dayBefore.some((s) => s.key === `availability:${sc.garments.shirt}`)).toBe(false);
    expect(onTheDay.find((s) => s.key === `availability:${sc.garments.shirt}`)?.title).toContain("in the workroom and needed today");
  });
});

describe("dismissals", () => {
  const fitKey = () => `fit:${sc.garments.jacket}:${sc.performers.pWren}`;

  it("a dismissed snag stays dismissed through unrelated changes and lapses when its evidence changes", async () => {
    const dismissal = await dismissSnag(actor, { snagKey: fitKey(), reason: "Performer is losing weight for the role" });

    await f.update("garments", sc.garments.shirt, { status: "cleaning" });
    await f.update("appearances", sc.appearances.mossS3, { distress_stage: 2 });
    const still = await listSnags(actor, { includeDismissed: false });
    const withDismissed = await listSnags(actor, { includeDismissed: true });
    await f.update("garments", sc.garments.jacket, { finished_measurements: { chest: 1020 } });
    const lapsed = await listSnags(actor, { includeDismissed: false });

    expect(still.snags.some((s) => s.key === fitKey())).toBe(false);
    expect(still.counts.dismissed).toBe(1);
    expect(withDismissed.snags.find((s) => s.key === fitKey())?.dismissal).toMatchObject({
      id: dismissal.id,
      reason: "Performer is losing weight for the role",
    });
    const back = lapsed.snags.find((s) => s.key === fitKey())!;
    expect(back.dismissal).toBeNull();
    expect(back.lapsedDismissal?.id).toBe(dismissal.id);
    expect(back.explanation).toContain("Chest ease is 20 mm");
    expect(lapsed.counts).toMatchObject({ dismissed: 0, lapsed: 1 });
    expect(lapsed.lapsedDismissals.map((d) => d.id)).toEqual([dismissal.id]);
  });

  it("dismissing again after a lapse replaces the old dismissal, and the audit trail records both", async () => {
    await dismissSnag(actor, { snagKey: fitKey(), reason: "first reason" });
    await f.update("garments", sc.garments.jacket, { finished_measurements: { chest: 1020 } });

    await dismissSnag(actor, { snagKey: fitKey(), reason: "second reason" });
    const list = await listSnags(actor, { includeDismissed: true });

    expect(await SnagDismissal.count()).toBe(1);
    expect(list.snags.find((s) => s.key === fitKey())?.dismissal?.reason).toBe("second reason");
    expect(await AuditEvent.count({ where: { action: "snag.dismiss" } })).toBe(2);
  });

  it("refuses a snag that does not exist now and writes nothing", async () => {
    await expect(dismissSnag(actor, { snagKey: "fit:nothing:here", reason: "no reason" })).rejects.toMatchObject({ status: 404 });

    expect(await SnagDismissal.count()).toBe(0);
    expect(await AuditEvent.count()).toBe(0);
  });
});

describe("stage production", () => {
  it("flags a quick change shorter than the production's threshold, with the minutes in between", async () => {
    const production = await buildProduction({ kind: "stage", settings: { quickChangeThresholdMin: 3 } });
    const g = snagFixtures(production.id);
    const nell = await g.character({ name: "Nell" });
    const c1 = await g.change({ characterId: nell, number: 1 });
    const c2 = await g.change({ characterId: nell, number: 2 });
    const a1 = await g.scene({ number: "1.1", runningMinutes: 6 });
    const a2 = await g.scene({ number: "1.2", runningMinutes: 1.5 });
    const a3 = await g.scene({ number: "2.1", runningMinutes: 8 });
    await g.shootDay({ date: "2027-01-20", kind: "performance", startsAt: "19:30" });
    await g.appearance({ sceneId: a1, characterId: nell, changeId: c1 });
    await g.appearance({ sceneId: a3, characterId: nell, changeId: c2, changeHere: true });
    void a2;
    const stageActor: Actor = { ...actor, productionId: production.id };

    const list = await listSnags(stageActor, { includeDismissed: false });

    // Between Nell's exit after 1.1 and entrance in 2.1 only scene 1.2 plays: 1.5 min < 3 min.
    expect(list.snags.map((s) => s.kind)).toEqual(["quick_change"]);
    expect(list.snags[0].title).toContain("1.5 min");
    expect(list.snags[0].explanation).toContain("against the 3 min set");
    expect(list.nextShootDay).toMatchObject({ date: "2027-01-20", kind: "performance" });
  });
});

describe("per-production ease ranges", () => {
  it("a department's own range for fitted jacket chests replaces the handbook's and clears the tight snag", async () => {
    const { Production } = await import("../../server/models/index.js");
    const { productionSettingsSchema } = await import("../../shared/schemas/productions.js");
    const before = (await open()).filter((s) => s.kind === "fit");
    // The scenario's jacket has 10 mm chest ease; this department accepts 5–30 mm for a fitted jacket.
    const settings = productionSettingsSchema.parse({ easeOverrides: { jacket: { chest: { fitted: { min: 5, max: 30 } } } } });

    await Production.update({ settings }, { where: { id: actor.productionId } });
    const after = (await open()).filter((s) => s.kind === "fit");

    expect(before.some((s) => /Chest ease is 10 mm/.test(s.explanation))).toBe(true);
    expect(after.some((s) => /Chest ease is 10 mm/.test(s.explanation))).toBe(false);
  });

  it("refuses a range whose maximum is below its minimum, naming the field", async () => {
    const { productionSettingsSchema } = await import("../../shared/schemas/productions.js");

    const res = productionSettingsSchema.safeParse({ easeOverrides: { jacket: { chest: { fitted: { min: 40, max: 30 } } } } });

    expect(res.success).toBe(false);
    expect(res.error!.issues[0]!.path.join(".")).toBe("easeOverrides.jacket.chest.fitted.max");
  });
});
