import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { clock } from "../../server/lib/clock.js";
import { GarmentCheckout, GarmentStatusEvent, Garment } from "../../server/models/index.js";
import { buildGarment, buildMember, buildPerformer, buildProduction, buildScene, buildShootDay } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production, User } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let setCostumer: User;
let base: string;

beforeEach(async () => {
  await resetDb();
  clock.set("2030-09-02", { frozen: true });
  production = await buildProduction({ settings: { timeZone: "Europe/London" } });
  const m = await buildMember("set_costumer", { production });
  setCostumer = m.user;
  agent = await signedInAgent(app, m.user.email);
  base = `/api/productions/${production.id}/garments`;
});

afterEach(() => clock.reset());

describe("check-out to a person (POST /garments/moves and /scan with checkout)", () => {
  it("records to whom, for which shoot day and scene, due back on the day's date by default, with a history row", async () => {
    const g = await buildGarment({ production, name: "Oilskin" });
    const performer = await buildPerformer({ production, name: "Ada Pell" });
    const scene = await buildScene({ production, number: "42A" });
    const day = await buildShootDay({ production, date: "2030-09-03", scenes: [scene] });

    const res = await agent.post(`${base}/moves`, {
      garmentIds: [g.id],
      status: "on_set",
      checkout: { toPerformerId: performer.id, shootDayId: day.id, sceneId: scene.id },
    });

    expect(res.status).toBe(200);
    const dto = res.body.data[0].garment;
    expect(dto.checkout).toMatchObject({
      to: { kind: "performer", id: performer.id, name: "Ada Pell" },
      shootDay: { id: day.id, date: "2030-09-03", kind: "shoot" },
      scene: { id: scene.id, number: "42A" },
      dueBackOn: "2030-09-03",
      pastDue: false,
      returnedAt: null,
    });
    expect(res.body.data[0].event.note).toBe("Checked out to Ada Pell for shoot day Tue 3 Sep 2030, scene 42A, due back Tue 3 Sep 2030");
    expect(await GarmentCheckout.count({ where: { garmentId: g.id, returnedAt: null } })).toBe(1);
  });

  it("checks out to a member by user id through the tag-code scan, with an explicit due date", async () => {
    const g = await buildGarment({ production });

    const res = await agent.post(`${base}/scan`, {
      tagCode: g.tagCode,
      status: "on_set",
      checkout: { toUserId: setCostumer.id, dueBackOn: "2030-09-05" },
    });

    expect(res.status).toBe(200);
    expect(res.body.data.garment.checkout.to).toEqual({ kind: "member", id: setCostumer.id, name: setCostumer.name });
    expect(res.body.data.garment.checkout.dueBackOn).toBe("2030-09-05");
  });

  it("the wardrobe list and the garment page show who has it; `out=out` lists only garments with someone", async () => {
    const out = await buildGarment({ production, name: "Out" });
    await buildGarment({ production, name: "Home" });
    const performer = await buildPerformer({ production, name: "Ada Pell" });
    await agent.post(`${base}/moves`, { garmentIds: [out.id], status: "on_set", checkout: { toPerformerId: performer.id } });

    const list = await agent.get(`${base}?sort=name`);
    const onlyOut = await agent.get(`${base}?out=out`);
    const detail = await agent.get(`${base}/${out.id}`);

    expect(
      list.body.data.map((g: { name: string; checkout: { to: { name: string } } | null }) => [g.name, g.checkout?.to.name ?? null]),
    ).toEqual([
      ["Home", null],
      ["Out", "Ada Pell"],
    ]);
    expect(onlyOut.body.data.map((g: { name: string }) => g.name)).toEqual(["Out"]);
    expect(detail.body.data.checkout.to.name).toBe("Ada Pell");
    expect(detail.body.data.checkouts).toHaveLength(1);
  });

  it("a move back to stock checks the garment in (the check-out closes, the history says from whom)", async () => {
    const g = await buildGarment({ production });
    const performer = await buildPerformer({ production, name: "Ada Pell" });
    await agent.post(`${base}/moves`, { garmentIds: [g.id], status: "on_set", checkout: { toPerformerId: performer.id } });

    const res = await agent.post(`${base}/scan`, { tagCode: g.tagCode, status: "in_stock" });

    expect(res.status).toBe(200);
    expect(res.body.data.garment.checkout).toBeNull();
    expect(res.body.data.event.note).toBe("Back from Ada Pell");
    const c = await GarmentCheckout.findOne({ where: { garmentId: g.id } });
    expect(c!.returnedAt).not.toBeNull();
    expect(c!.returnedBy).toBe(setCostumer.id);
  });

  it("a check-out while already out hands the garment over: one open check-out, a history row even though the status stays", async () => {
    const g = await buildGarment({ production });
    const a = await buildPerformer({ production, name: "Ada Pell" });
    const b = await buildPerformer({ production, name: "Bram Tolley" });
    await agent.post(`${base}/moves`, { garmentIds: [g.id], status: "on_set", checkout: { toPerformerId: a.id } });

    const res = await agent.post(`${base}/moves`, { garmentIds: [g.id], status: "on_set", checkout: { toPerformerId: b.id } });

    expect(res.body.data[0].event.note).toBe("Handed over from Ada Pell · Checked out to Bram Tolley, due back Mon 2 Sep 2030");
    expect(await GarmentCheckout.count({ where: { garmentId: g.id } })).toBe(2);
    expect(await GarmentCheckout.count({ where: { garmentId: g.id, returnedAt: null } })).toBe(1);
  });

  it("400 naming the field for a person, day or scene outside the production, a scene not on the day, a past due date, or a status that is not 'with someone'; nothing is written", async () => {
    const g = await buildGarment({ production });
    const otherProduction = await buildProduction();
    const stranger = await buildPerformer({ production: otherProduction });
    const performer = await buildPerformer({ production });
    const scene = await buildScene({ production, number: "7" });
    const day = await buildShootDay({ production, date: "2030-09-04", scenes: [] });
    const { user: outsider } = await buildMember("set_costumer", { production: otherProduction });

    const cases: Array<[object, string, string, RegExp]> = [
      [{ toPerformerId: stranger.id }, "on_set", "checkout.toPerformerId", /not a performer of this production/],
      [{ toUserId: outsider.id }, "on_set", "checkout.toUserId", /not a member/],
      [
        { toPerformerId: performer.id, sceneId: scene.id, shootDayId: day.id },
        "on_set",
        "checkout.sceneId",
        /scene 7 is not on shoot day Wed 4 Sep 2030/,
      ],
      [{ toPerformerId: performer.id, dueBackOn: "2030-09-01" }, "on_set", "checkout.dueBackOn", /cannot be before today \(2030-09-02\)/],
      [{ toPerformerId: performer.id }, "cleaning", "status", /On set or Fitting/],
      [{}, "on_set", "checkout.toUserId", /one member or one performer/],
      [{ toPerformerId: performer.id, toUserId: setCostumer.id }, "on_set", "checkout.toUserId", /one member or one performer/],
    ];
    for (const [checkout, status, field, message] of cases) {
      const res = await agent.post(`${base}/moves`, { garmentIds: [g.id], status, checkout });
      expect(res.status, JSON.stringify(checkout)).toBe(400);
      expect(res.body.error.fields[field], JSON.stringify(res.body.error)).toMatch(message);
    }
    expect(await GarmentCheckout.count()).toBe(0);
    expect(await GarmentStatusEvent.count()).toBe(0);
    expect((await Garment.findByPk(g.id))!.status).toBe("in_stock");
  });

  it("a stage production's check-out names the performance, and any scene of the running order is allowed", async () => {
    const stage = await buildProduction({ kind: "stage" });
    const { user } = await buildMember("supervisor", { production: stage });
    const sup = await signedInAgent(app, user.email);
    const g = await buildGarment({ production: stage });
    const scene = await buildScene({ production: stage, number: "2" });
    const perf = await buildShootDay({ production: stage, date: "2030-09-02", kind: "performance" });

    const res = await sup.post(`/api/productions/${stage.id}/garments/moves`, {
      garmentIds: [g.id],
      status: "on_set",
      checkout: { toUserId: user.id, shootDayId: perf.id, sceneId: scene.id },
    });

    expect(res.status).toBe(200);
    expect(res.body.data[0].event.note).toContain("for performance Mon 2 Sep 2030, scene 2");
  });
});

describe("out past due (snag and list filter)", () => {
  it("a check-out due yesterday on the server's clock is a snag and is listed by `out=past_due`; one due today is neither", async () => {
    const late = await buildGarment({ production, name: "Late coat" });
    const fine = await buildGarment({ production, name: "Fine coat" });
    const performer = await buildPerformer({ production, name: "Ada Pell" });
    await agent.post(`${base}/moves`, {
      garmentIds: [late.id],
      status: "on_set",
      checkout: { toPerformerId: performer.id, dueBackOn: "2030-09-03" },
    });
    await agent.post(`${base}/moves`, {
      garmentIds: [fine.id],
      status: "on_set",
      checkout: { toPerformerId: performer.id, dueBackOn: "2030-09-04" },
    });

    clock.set("2030-09-04", { frozen: true });
    const snags = await agent.get(`/api/productions/${production.id}/snags?kind=checkout_overdue`);
    const pastDue = await agent.get(`${base}?out=past_due`);

    expect(snags.status).toBe(200);
    expect(snags.body.data.snags).toHaveLength(1);
    const s = snags.body.data.snags[0];
    expect(s.garments).toEqual([{ id: late.id, tagCode: late.tagCode, name: "Late coat" }]);
    expect(s.explanation).toContain("was due back on Tue 3 Sep 2030; on Wed 4 Sep 2030 it is 1 day past due");
    expect(s.links[0].href).toBe(`/p/${production.id}/wardrobe/garments/${late.id}`);
    expect(s.links.map((l: { label: string }) => l.label)).toContain("Ada Pell");
    expect(pastDue.body.data.map((g: { name: string; checkout: { pastDue: boolean } }) => [g.name, g.checkout.pastDue])).toEqual([
      ["Late coat", true],
    ]);
  });

  it("the snag goes away when the garment is checked in", async () => {
    const g = await buildGarment({ production });
    const performer = await buildPerformer({ production });
    await agent.post(`${base}/moves`, { garmentIds: [g.id], status: "on_set", checkout: { toPerformerId: performer.id } });
    clock.set("2030-09-10", { frozen: true });
    expect((await agent.get(`/api/productions/${production.id}/snags?kind=checkout_overdue`)).body.data.snags).toHaveLength(1);

    await agent.post(`${base}/moves`, { garmentIds: [g.id], status: "cleaning" });

    expect((await agent.get(`/api/productions/${production.id}/snags?kind=checkout_overdue`)).body.data.snags).toHaveLength(0);
  });
});

describe("GET /garments/checkouts and /garments/checkout-options", () => {
  it("lists open check-outs soonest due first, with the garment", async () => {
    const a = await buildGarment({ production, name: "A" });
    const b = await buildGarment({ production, name: "B" });
    const performer = await buildPerformer({ production });
    await agent.post(`${base}/moves`, {
      garmentIds: [a.id],
      status: "on_set",
      checkout: { toPerformerId: performer.id, dueBackOn: "2030-09-09" },
    });
    await agent.post(`${base}/moves`, {
      garmentIds: [b.id],
      status: "fitting",
      checkout: { toUserId: setCostumer.id, dueBackOn: "2030-09-03" },
    });

    const res = await agent.get(`${base}/checkouts`);

    expect(res.status).toBe(200);
    expect(res.body.data.map((c: { garment: { name: string }; dueBackOn: string }) => [c.garment.name, c.dueBackOn])).toEqual([
      ["B", "2030-09-03"],
      ["A", "2030-09-09"],
    ]);
  });

  it("offers members, performers with their characters, and the days from today on with their scenes", async () => {
    const performer = await buildPerformer({ production, name: "Ada Pell" });
    const scene = await buildScene({ production, number: "12" });
    await buildShootDay({ production, date: "2030-09-01", dayNumber: 1 });
    const next = await buildShootDay({ production, date: "2030-09-02", dayNumber: 2, scenes: [scene] });

    const res = await agent.get(`${base}/checkout-options`);

    expect(res.status).toBe(200);
    expect(res.body.data.today).toBe("2030-09-02");
    expect(res.body.data.members).toEqual([{ userId: setCostumer.id, name: setCostumer.name, role: "Set costumer" }]);
    expect(res.body.data.performers).toEqual([{ id: performer.id, name: "Ada Pell", characters: [] }]);
    expect(res.body.data.days).toEqual([
      { id: next.id, date: "2030-09-02", kind: "shoot", dayNumber: 2, scenes: [{ id: scene.id, number: "12" }] },
    ]);
  });
});
