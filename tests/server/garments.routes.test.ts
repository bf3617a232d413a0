import { beforeEach, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { Garment, GarmentStatusEvent, MultiplesGroup } from "../../server/models/index.js";
import { parseTagCode } from "../../shared/domain/tag-codes.js";
import { buildGarment, buildMember } from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let base: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("designer");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  base = `/api/productions/${production.id}/garments`;
});

const jacket = {
  name: "Keeper's jacket",
  category: "jacket",
  source: "built",
  fitIntent: "fitted",
  finishedMeasurements: { chest: 1040, sleeve: 640 },
  locationRack: "C3",
};

describe("POST /garments", () => {
  it("401 without a session", async () => {
    const anon = await anonymousAgent(app);

    const res = await anon.post(base, jacket);

    expect(res.status).toBe(401);
  });

  it("creates one garment with a valid generated tag code and a first history row", async () => {
    const res = await agent.post(base, jacket);

    expect(res.status).toBe(201);
    const g = res.body.data[0];
    expect(parseTagCode(g.tagCode)).toEqual({ ok: true, code: g.tagCode });
    expect(g.finishedMeasurements).toEqual({ chest: 1040, sleeve: 640 });
    const events = await GarmentStatusEvent.findAll({ where: { garmentId: g.id } });
    expect(events.map((e) => [e.fromStatus, e.toStatus, e.toLocation])).toEqual([[null, "in_stock", "C3"]]);
  });

  it("makes a multiples group of 4 copies #1..#4 in one step, each with its own tag", async () => {
    const res = await agent.post(base, { ...jacket, copies: 4, groupName: "Keeper's jacket (stunt)" });

    expect(res.status).toBe(201);
    const rows = res.body.data as Array<{ copyNumber: number; multiplesGroupId: string; tagCode: string; multiplesGroupName: string }>;
    expect(rows.map((r) => r.copyNumber)).toEqual([1, 2, 3, 4]);
    expect(new Set(rows.map((r) => r.multiplesGroupId)).size).toBe(1);
    expect(new Set(rows.map((r) => r.tagCode)).size).toBe(4);
    expect(rows[0]!.multiplesGroupName).toBe("Keeper's jacket (stunt)");
    expect(await GarmentStatusEvent.count()).toBe(4);
  });

  it("400 naming tagCode for a duplicate tag code, and writes nothing", async () => {
    const existing = await buildGarment({ production });
    const before = { garments: await Garment.count(), events: await GarmentStatusEvent.count() };

    const res = await agent.post(base, { ...jacket, tagCode: existing.tagCode.toLowerCase() });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.tagCode).toMatch(/already used/);
    expect(await Garment.count()).toBe(before.garments);
    expect(await GarmentStatusEvent.count()).toBe(before.events);
  });

  it("400 naming the point for a negative length, and writes nothing", async () => {
    const res = await agent.post(base, { ...jacket, finishedMeasurements: { chest: -5 } });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["finishedMeasurements.chest"]).toMatch(/greater than 0/);
    expect(await Garment.count()).toBe(0);
  });

  it("400 for a tag code whose check character is wrong", async () => {
    const res = await agent.post(base, { ...jacket, tagCode: "22222-3" });

    expect(res.status).toBe(400);
    expect(res.body.error.fields.tagCode).toMatch(/does not match/);
  });
});

describe("POST /garments/moves (bulk status change)", () => {
  it("moves several garments and writes exactly one history row each, with who, from and to", async () => {
    const a = await buildGarment({ production });
    const b = await buildGarment({ production });

    const res = await agent.post(`${base}/moves`, {
      garmentIds: [a.id, b.id],
      status: "cleaning",
      locationRack: null,
      note: "after day 3",
    });

    expect(res.status).toBe(200);
    const events = await GarmentStatusEvent.findAll({ order: [["garmentId", "ASC"]] });
    expect(events).toHaveLength(2);
    for (const e of events) {
      expect(e.fromStatus).toBe("in_stock");
      expect(e.toStatus).toBe("cleaning");
      expect(e.fromLocation).toBe("A1");
      expect(e.toLocation).toBeNull();
      expect(e.note).toBe("after day 3");
      expect(e.actorId).toBeTruthy();
    }
    expect((await Garment.findByPk(a.id))!.status).toBe("cleaning");
  });

  it("rolls the whole move back when one id is unknown (no status and no history written)", async () => {
    const a = await buildGarment({ production });

    const res = await agent.post(`${base}/moves`, { garmentIds: [a.id, randomUUID()], status: "on_set" });

    expect(res.status).toBe(404);
    expect((await Garment.findByPk(a.id))!.status).toBe("in_stock");
    expect(await GarmentStatusEvent.count()).toBe(0);
  });

  it("writes no row when nothing changes", async () => {
    const a = await buildGarment({ production });

    const res = await agent.post(`${base}/moves`, { garmentIds: [a.id], status: "in_stock" });

    expect(res.status).toBe(200);
    expect(res.body.data[0].event).toBeNull();
    expect(await GarmentStatusEvent.count()).toBe(0);
  });

  it("every status change writes its history row in the same transaction as the status (a failed event insert leaves the status)", async () => {
    const a = await buildGarment({ production });
    // Make the history insert fail: the status update must roll back with it.
    await sequelize.query(`ALTER TABLE garment_status_events ADD CONSTRAINT no_lost CHECK (to_status <> 'lost')`);
    try {
      const res = await agent.post(`${base}/moves`, { garmentIds: [a.id], status: "lost" });
      expect(res.status).toBe(400);
      expect((await Garment.findByPk(a.id))!.status).toBe("in_stock");
    } finally {
      await sequelize.query(`ALTER TABLE garment_status_events DROP CONSTRAINT no_lost`);
    }
  });
});

describe("POST /garments/scan (check in / out)", () => {
  it("finds the garment by a typed tag code and moves it", async () => {
    const a = await buildGarment({ production });
    const typed = a.tagCode.replace("-", " ").toLowerCase();

    const res = await agent.post(`${base}/scan`, { tagCode: typed, status: "on_set", locationRack: "Truck 2" });

    expect(res.status).toBe(200);
    expect(res.body.data.garment.status).toBe("on_set");
    expect(res.body.data.event.toLocation).toBe("Truck 2");
  });

  it("404 for a valid code that is not in this production", async () => {
    const other = await buildGarment();

    const res = await agent.post(`${base}/scan`, { tagCode: other.tagCode, status: "on_set" });

    expect(res.status).toBe(404);
  });
});

describe("GET /garments", () => {
  it("filters rented garments due within N days of a given day, overdue included, returned excluded", async () => {
    const mk = (name: string, due: string, status: Garment["status"] = "in_stock") =>
      Garment.create({
        productionId: production.id,
        tagCode: `${name}`,
        name,
        category: "coat",
        sizeLabel: null,
        fabricId: null,
        colour: null,
        source: "rented",
        vendor: "Hire",
        costCents: 1000,
        rentalDueOn: due,
        locationRack: null,
        locationBin: null,
        status,
        multiplesGroupId: null,
        copyNumber: null,
        notes: null,
      });
    await mk("22222-2", "2026-12-11");
    await mk("23222-4", "2026-12-30");
    await mk("32222-3", "2026-12-01");
    await mk("33222-5", "2026-12-05", "returned");

    const res = await agent.get(`${base}?dueWithinDays=7&asOf=2026-12-06&sort=rentalDueOn`);

    expect(res.status).toBe(200);
    expect(res.body.data.map((g: { rentalDueOn: string }) => g.rentalDueOn)).toEqual(["2026-12-01", "2026-12-11"]);
    expect(res.body.pagination.total).toBe(2);
  });

  it("filters by character through change items (a copy directly, or its whole multiples group)", async () => {
    const direct = await buildGarment({ production, name: "direct" });
    await buildGarment({ production, name: "unrelated" });
    const group = await MultiplesGroup.create({ productionId: production.id, name: "oilskin", notes: null });
    const copy = await buildGarment({ production, name: "copy" });
    await copy.update({ multiplesGroupId: group.id, copyNumber: 1 });
    const cid = randomUUID();
    const chid = randomUUID();
    await sequelize.query(`INSERT INTO characters (id, production_id, name) VALUES (:cid, :pid, 'Silas')`, {
      replacements: { cid, pid: production.id },
    });
    await sequelize.query(`INSERT INTO changes (id, production_id, character_id, number) VALUES (:chid, :pid, :cid, 1)`, {
      replacements: { chid, cid, pid: production.id },
    });
    await sequelize.query(
      `INSERT INTO change_items (id, production_id, change_id, label, garment_id, multiples_group_id) VALUES (:a, :pid, :chid, 'coat', :g, NULL), (:b, :pid, :chid, 'oilskin', NULL, :grp)`,
      { replacements: { a: randomUUID(), b: randomUUID(), pid: production.id, chid, g: direct.id, grp: group.id } },
    );

    const res = await agent.get(`${base}?characterId=${cid}&sort=name`);
    const detail = await agent.get(`${base}/${copy.id}`);

    expect(res.body.data.map((g: { name: string }) => g.name)).toEqual(["copy", "direct"]);
    expect(detail.body.data.changes).toEqual([
      expect.objectContaining({ characterName: "Silas", changeNumber: 1, label: "oilskin", viaGroup: true }),
    ]);
  });

  it("exports CSV with mm and production-unit columns", async () => {
    await agent.post(base, jacket);

    const res = await agent.get(`${base}/export.csv`);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/text\/csv/);
    const [header, row] = res.text.split(/\r?\n/);
    expect(header).toContain("chest_mm");
    expect(header).toContain("chest_cm");
    expect(row).toContain("1040");
    expect(row).toContain("104.0");
  });

  it("renders a tag-label PDF", async () => {
    const a = await buildGarment({ production });

    const res = await agent
      .get(`${base}/labels.pdf?ids=${a.id}`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on("data", (c: Buffer) => chunks.push(c));
        r.on("end", () => cb(null, Buffer.concat(chunks)));
      });

    expect(res.status).toBe(200);
    expect((res.body as Buffer).subarray(0, 5).toString()).toBe("%PDF-");
  });
});

describe("POST /garments/:id/copies", () => {
  it("turns a single garment into #1 of a new group and adds #2..#3", async () => {
    const a = await buildGarment({ production, name: "Smock" });

    const res = await agent.post(`${base}/${a.id}/copies`, { count: 2 });

    expect(res.status).toBe(201);
    expect(res.body.data.map((g: { copyNumber: number }) => g.copyNumber)).toEqual([1, 2, 3]);
    expect(res.body.data[0].id).toBe(a.id);
  });

  it("writes a history row per copy: each copy says what it copies, the original names each copy made", async () => {
    const a = await buildGarment({ production, name: "Smock" });

    const res = await agent.post(`${base}/${a.id}/copies`, { count: 2 });

    const [, c2, c3] = res.body.data as Array<{ id: string; tagCode: string }>;
    const onOriginal = await GarmentStatusEvent.findAll({ where: { garmentId: a.id }, order: [["note", "ASC"]] });
    expect(onOriginal.map((e) => [e.fromStatus, e.toStatus, e.note])).toEqual([
      ["in_stock", "in_stock", `Copy #2 made: ${c2!.tagCode}`],
      ["in_stock", "in_stock", `Copy #3 made: ${c3!.tagCode}`],
    ]);
    for (const c of [c2!, c3!]) {
      const rows = await GarmentStatusEvent.findAll({ where: { garmentId: c.id } });
      expect(rows.map((e) => [e.fromStatus, e.toStatus, e.note])).toEqual([[null, "in_stock", `Copy of ${a.tagCode}`]]);
    }
    const detail = await agent.get(`${base}/${a.id}`);
    expect(detail.body.data.history).toHaveLength(2);
  });
});
