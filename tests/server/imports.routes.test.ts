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
    lines.push(
      [
        i,
        sets[i % sets.length],
        i % 3 ? "EXT" : "INT",
        i % 4 ? "DAY" : "NIGHT",
        1 + Math.floor(((i - 1) * 12) / n),
        i,
        `${i % 3} ${1 + (i % 7)}/8`,
        "",
        `"Scene ${i}, invented"`,
        day,
        date,
        ((i - 1) % 6) + 1,
      ].join(","),
    );
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
    expect(res.body.data).toMatchObject({
      valid: true,
      rows: 2,
      scenes: { created: 2, updated: 0, unchanged: 0 },
      shootDays: { created: 1, updated: 0, unchanged: 0 },
      errors: [],
    });
    expect(res.body.data.changes.map((c: { scene: string; status: string }) => [c.scene, c.status])).toEqual([
      ["1", "new"],
      ["2", "new"],
    ]);
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
    const csv = [
      header,
      "1,Harbour wall,EXT,DAY,1,1,1 3/8,,,1,2026-11-30,1",
      "2,Chapel,INSIDE,NIGHT,1,2,4/8,,,1,2026-11-30,2",
      "3,Chapel,INT,NIGHT,one,3,,,,,,",
      "4,Quay,EXT,DAY,1,4,1/4,,,2,2026-13-01,1",
    ].join("\n");

    const preview = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, { csv });
    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, { csv });

    expect(preview.body.data.valid).toBe(false);
    expect(preview.body.data.errors.map((e: { line: number; column: string }) => `${e.line}:${e.column}`)).toEqual([
      "3:int_ext",
      "4:story_day",
      "5:pages",
      "5:shoot_date",
    ]);
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
      const csv = [
        header,
        "1,Quay,EXT,DAY,1,1,,,,1,2026-11-30,1",
        "2,Quay,EXT,DAY,1,2,,,,1,2026-11-30,2",
        "3,Quay,EXT,DAY,1,3,,,,1,2026-11-30,3",
      ].join("\n");

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
    await agent
      .post(`/api/productions/${pid}/imports/breakdown`, {
        csv: [header, "1,Harbour wall,EXT,DAY,1,1,,,,1,2026-11-30,1", "2,Chapel,INT,NIGHT,1,2,,,,1,2026-11-30,2"].join("\n"),
      })
      .expect(201);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, {
      csv: [header, "1,Changed set,EXT,DAY,1,1,,,,1,2026-11-30,1", "5,New,EXT,DAY,2,5,,,,3,2026-12-02,1"].join("\n"),
    });

    expect(res.body.data).toMatchObject({
      scenes: { created: 1, updated: 1, unchanged: 0 },
      shootDays: { created: 1, updated: 0, unchanged: 1 },
    });
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

  it("rows with only the scene and shoot columns keep every stored scene field (merge, not blank)", async () => {
    await agent
      .post(`/api/productions/${pid}/imports/breakdown`, {
        csv: [
          header,
          '1,Harbour wall,EXT,DAY,3,1,1 3/8,,"Nets mended at dusk",1,2026-11-30,1',
          "2,Chapel,INT,NIGHT,4,2,4/8,,Vigil,1,2026-11-30,2",
          "3,Net loft,INT/EXT,DAWN,5,3,2,,Storm warning,2,2026-12-01,1",
        ].join("\n"),
      })
      .expect(201);
    const before = (await Scene.findAll({ where: { productionId: pid }, order: [["number", "ASC"]] })).map((s) => [
      s.number,
      s.setName,
      s.intExt,
      s.timeOfDay,
      s.storyDay,
      s.storyOrder,
      s.lengthEighths,
      s.synopsis,
    ]);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, {
      csv: ["scene,shoot_day,shoot_date,shoot_position", "1,3,2026-12-02,1", "2,3,2026-12-02,2", "3,3,2026-12-02,3"].join("\n"),
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const after = (await Scene.findAll({ where: { productionId: pid }, order: [["number", "ASC"]] })).map((s) => [
      s.number,
      s.setName,
      s.intExt,
      s.timeOfDay,
      s.storyDay,
      s.storyOrder,
      s.lengthEighths,
      s.synopsis,
    ]);
    expect(after).toEqual(before);
    expect(before[0]).toEqual(["1", "Harbour wall", "EXT", "DAY", 3, 1, 11, "Nets mended at dusk"]);
  });

  it("an empty cell keeps the stored value and (clear) empties the field", async () => {
    await agent
      .post(`/api/productions/${pid}/imports/breakdown`, { csv: [header, "1,Harbour wall,EXT,DAY,3,1,1 3/8,,Nets mended,,,"].join("\n") })
      .expect(201);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, {
      csv: [header, "1,,INT,(clear),,,(CLEAR),,,,,"].join("\n"),
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const s = (await Scene.findOne({ where: { productionId: pid, number: "1" } }))!;
    expect([s.setName, s.intExt, s.timeOfDay, s.storyDay, s.lengthEighths, s.synopsis]).toEqual([
      "Harbour wall",
      "INT",
      null,
      3,
      null,
      "Nets mended",
    ]);
  });

  it("refuses (clear) where a value is required", async () => {
    const res = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, {
      csv: ["scene,story_order,shoot_day,shoot_date", "(clear),1,,", "2,(clear),,"].join("\n"),
    });

    expect(res.body.data.valid).toBe(false);
    expect(res.body.data.errors.map((e: { line: number; column: string }) => `${e.line}:${e.column}`)).toEqual([
      "2:scene",
      "3:story_order",
    ]);
  });

  it("the preview lists each row's fields old → new before anything is written", async () => {
    await agent
      .post(`/api/productions/${pid}/imports/breakdown`, {
        csv: [
          header,
          "1,Harbour wall,EXT,DAY,3,1,1 3/8,,Nets mended,1,2026-11-30,1",
          "2,Chapel,INT,NIGHT,4,2,4/8,,Vigil,1,2026-11-30,2",
        ].join("\n"),
      })
      .expect(201);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, {
      csv: [
        "scene,set,pages,synopsis,shoot_day,shoot_date,shoot_position",
        "1,Harbour steps,1 3/8,(clear),1,,2",
        "2,,,,,,",
        "7,Quay,2/8,,4,2026-12-03,1",
      ].join("\n"),
    });

    expect(res.status).toBe(200);
    const rows = res.body.data.changes;
    expect(rows).toEqual([
      {
        line: 2,
        scene: "1",
        status: "changed",
        fields: [
          { column: "set", old: "Harbour wall", new: "Harbour steps" },
          { column: "synopsis", old: "Nets mended", new: "" },
          { column: "shoot day 1", old: "position 1", new: "position 2" },
        ],
      },
      { line: 3, scene: "2", status: "unchanged", fields: [] },
      {
        line: 4,
        scene: "7",
        status: "new",
        fields: [
          { column: "set", old: "", new: "Quay" },
          { column: "story_order", old: "", new: "3" },
          { column: "pages", old: "", new: "2/8" },
          { column: "shoot day 4", old: "", new: "position 1" },
        ],
      },
    ]);
    expect(res.body.data.days).toEqual([
      { dayNumber: 1, status: "changed", date: { old: "2026-11-30", new: "2026-11-30" }, scenes: { old: ["1", "2"], new: ["2", "1"] } },
      { dayNumber: 4, status: "new", date: { old: "", new: "2026-12-03" }, scenes: { old: [], new: ["7"] } },
    ]);
    expect((await Scene.findOne({ where: { productionId: pid, number: "1" } }))!.setName).toBe("Harbour wall");
    expect(await Scene.count({ where: { productionId: pid } })).toBe(2);
  });

  it("a day named in the file keeps its other scenes; (clear) in shoot_position takes a scene off", async () => {
    await agent
      .post(`/api/productions/${pid}/imports/breakdown`, {
        csv: [header, "1,A,,,,1,,,,1,2026-11-30,1", "2,B,,,,2,,,,1,2026-11-30,2", "3,C,,,,3,,,,1,2026-11-30,3", "4,D,,,,4,,,,,,"].join(
          "\n",
        ),
      })
      .expect(201);

    const res = await agent.post(`/api/productions/${pid}/imports/breakdown`, {
      csv: ["scene,shoot_day,shoot_position", "4,1,1", "2,1,(clear)"].join("\n"),
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const day = await ShootDay.findOne({ where: { productionId: pid, dayNumber: 1 } });
    expect(day!.date).toBe("2026-11-30");
    const slots = await ShootDayScene.findAll({
      where: { shootDayId: day!.id },
      include: [{ model: Scene, as: "scene" }],
      order: [["position", "ASC"]],
    });
    expect(slots.map((s) => [s.scene!.number, s.position])).toEqual([
      ["4", 1],
      ["1", 2],
      ["3", 3],
    ]);
  });

  it("names the line when a new shoot day has no date", async () => {
    const res = await agent.post(`/api/productions/${pid}/imports/breakdown/preview`, { csv: ["scene,shoot_day", "1,9"].join("\n") });

    expect(res.body.data.errors).toEqual([
      { line: 2, column: "shoot_date", message: "is required for a new shoot day (day 9 does not exist yet)" },
    ]);
  });
});

describe("GET /api/productions/:pid/imports/breakdown/template", () => {
  it("downloads a template with the header, one example row and each column's accepted format that imports as it is", async () => {
    await resetDb();
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);

    const res = await agent.get(`/api/productions/${production.id}/imports/breakdown/template`);

    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toMatch(/text\/csv/);
    expect(res.headers["content-disposition"]).toMatch(/attachment; filename=".*template.*\.csv"/);
    const lines = res.text.trim().split(/\r?\n/);
    expect(lines.filter((l) => l.startsWith("#")).length).toBeGreaterThanOrEqual(12);
    expect(lines.find((l) => l.startsWith("# scene:"))).toMatch(/required/);
    expect(res.text).toMatch(/\(clear\)/);
    const data = lines.filter((l) => !l.startsWith("#"));
    expect(data[0]).toBe(header);
    expect(data).toHaveLength(2);
    const preview = await agent.post(`/api/productions/${production.id}/imports/breakdown/preview`, { csv: res.text });
    expect(preview.body.data).toMatchObject({ valid: true, scenes: { created: 1, updated: 0 } });
  });
});
