import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { AuditEvent, Scene, ShootDay, ShootDayScene } from "../../server/models/index.js";
import { buildMember } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";

const app = createApp();
const header = "scene,set,int_ext,time_of_day,story_day,story_order,pages,running_minutes,synopsis,shoot_day,shoot_date,shoot_position";

/** An invented breakdown of n scenes over 12 story days, 6 scenes per shoot day. */
function bigCsv(n: number): string {
  const lines = [header];
  const sets = ["Harbour wall", "Chapel", "Lighthouse gallery", "Net loft", "Penhallow kitchen"];
  for (let i = 1; i <= n; i++) {
    const day = Math.ceil(i / 6);
    const date = new Date(Date.UTC(2027, 0, 1) + (day - 1) * 86_400_000).toISOString().slice(0, 10);
    lines.push([i, sets[i % sets.length], i % 3 ? "EXT" : "INT", i % 4 ? "DAY" : "NIGHT", 1 + Math.floor(((i - 1) * 12) / n), i, `${i % 3} ${1 + (i % 7)}/8`, "", `"Scene ${i}, invented"`, day, date, ((i - 1) % 6) + 1].join(","));
  }
  return lines.join("\n");
}

describe("POST /api/productions/:pid/imports/breakdown", () => {
  let agent: TestAgent;
  let pid: string;

  beforeEach(async () => {
    await resetDb();
    const { user, production } = await buildMember("designer");
    pid = production.id;
    agent = await signedInAgent(app, user.email);
  });

  it("previews a valid file without saving anything", async () => {
    const csv = [header, "1,Harbour wall,EXT,DAY,1,1,1 3/8,,,1,2026-11-30,1", "2,Chapel,INT,NIGHT,1,2,4/8,,,1,2026-11-30,2"].join("\n");

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, { csv });

    expect(res.status).toBe(200);
    expect(res.body.data).toEqual({ valid: true, rows: 2, scenes: { created: 2, updated: 0 }, shootDays: { created: 1, updated: 0 }, errors: [] });
    expect(await Scene.count()).toBe(0);
  });

  it("imports a valid file: scenes, shoot day and order", async () => {
    const csv = [header, "1,Harbour wall,EXT,DAY,1,1,1 3/8,,,1,2026-11-30,2", "2,Chapel,INT,NIGHT,1,2,4/8,,,1,2026-11-30,1"].join("\n");

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv, fileName: "breakdown.csv" });

    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ rows: 2, scenes: { created: 2 }, shootDays: { created: 1 } });
    const scenes = await Scene.findAll({ where: { productionId: pid }, order: [["storyOrder", "ASC"]] });
    expect(scenes.map((s) => [s.number, s.lengthEighths, s.intExt])).toEqual([
      ["1", 11, "EXT"],
      ["2", 4, "INT"],
    ]);
    const day = await ShootDay.findOne({ where: { productionId: pid } });
    const slots = await ShootDayScene.findAll({ where: { shootDayId: day!.id }, order: [["position", "ASC"]] });
    expect(slots.map((s) => scenes.find((x) => x.id === s.sceneId)!.number)).toEqual(["2", "1"]);
    expect(await AuditEvent.count({ where: { action: "breakdown.import" } })).toBe(1);
  });

  it("imports nothing from a file with bad rows and reports every bad row", async () => {
    const csv = [header, "1,Harbour wall,EXT,DAY,1,1,1 3/8,,,1,2026-11-30,1", "2,Chapel,INSIDE,NIGHT,1,2,4/8,,,1,2026-11-30,2", "3,Chapel,INT,NIGHT,one,3,,,,,,", "4,Quay,EXT,DAY,1,4,1/4,,,2,2026-13-01,1"].join("\n");

    const preview = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, { csv });
    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv });

    expect(preview.body.data.valid).toBe(false);
    expect(preview.body.data.errors.map((e: { line: number; column: string }) => `${e.line}:${e.column}`)).toEqual(["3:int_ext", "4:story_day", "5:pages", "5:shoot_date"]);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_error");
    expect(Object.keys(res.body.error.fields)).toEqual(["line 3, int_ext", "line 4, story_day", "line 5, pages", "line 5, shoot_date"]);
    expect(await Scene.count()).toBe(0);
    expect(await ShootDay.count()).toBe(0);
  });

  it("rolls back everything when the database refuses a row mid-import", async () => {
    // A temporary constraint makes the last statement (shoot-day slots) fail after scenes and
    // shoot days were already written in the same transaction.
    const { sequelize } = await import("../../server/db.js");
    await sequelize.query("ALTER TABLE shoot_day_scenes ADD CONSTRAINT test_only_block CHECK (position < 3)");
    try {
      const csv = [header, "1,Quay,EXT,DAY,1,1,,,,1,2026-11-30,1", "2,Quay,EXT,DAY,1,2,,,,1,2026-11-30,2", "3,Quay,EXT,DAY,1,3,,,,1,2026-11-30,3"].join("\n");

      const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv });

      expect(res.status).toBeGreaterThanOrEqual(400);
      expect(await Scene.count()).toBe(0);
      expect(await ShootDay.count()).toBe(0);
      expect(await AuditEvent.count({ where: { action: "breakdown.import" } })).toBe(0);
    } finally {
      await sequelize.query("ALTER TABLE shoot_day_scenes DROP CONSTRAINT test_only_block");
    }
  });

  it("a second import updates scenes by number and keeps the rest", async () => {
    await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv: [header, "1,Harbour wall,EXT,DAY,1,1,,,,1,2026-11-30,1", "2,Chapel,INT,NIGHT,1,2,,,,1,2026-11-30,2"].join("\n") }).expect(201);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv: [header, "1,Changed set,EXT,DAY,1,1,,,,1,2026-11-30,1", "5,New,EXT,DAY,2,5,,,,3,2026-12-02,1"].join("\n") });

    expect(res.body.data).toMatchObject({ scenes: { created: 1, updated: 1 }, shootDays: { created: 1, updated: 1 } });
    expect((await Scene.findOne({ where: { productionId: pid, number: "1" } }))!.setName).toBe("Changed set");
    expect(await Scene.count({ where: { productionId: pid } })).toBe(3);
  });

  it("imports a 2,000-row file in one request", async () => {
    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv: bigCsv(2000) });

    expect(res.status, JSON.stringify(res.body).slice(0, 300)).toBe(201);
    expect(res.body.data).toMatchObject({ rows: 2000, scenes: { created: 2000 }, shootDays: { created: 334 } });
    expect(await Scene.count({ where: { productionId: pid } })).toBe(2000);
    expect(await ShootDayScene.count({ where: { productionId: pid } })).toBe(2000);
  });

  it("export then import into another production round-trips to the same CSV", async () => {
    await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv: bigCsv(60) }).expect(201);
    const exported = await agent.get(`/api/productions/${pid}/scenes/export`);
    const { user, production: other } = await buildMember("supervisor");
    const agent2 = await signedInAgent(app, user.email);

    await agent2.post(`/api/productions/${other.id}/imports/breakdown`, { csv: exported.text }).expect(201);
    const again = await agent2.get(`/api/productions/${other.id}/scenes/export`);

    expect(exported.status).toBe(200);
    expect(exported.headers["content-type"]).toMatch(/text\/csv/);
    expect(exported.text.split("\r\n")).toHaveLength(62); // header + 60 rows + final newline
    expect(again.text).toBe(exported.text);
  });
});
