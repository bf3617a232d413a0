import path from "node:path";
import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { FabricTest, Photo } from "../../server/models/index.js";
import { buildFabric, buildMember } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Fabric, Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let fabric: Fabric;
let base: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("cutter");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  fabric = await buildFabric({ production, name: "Wool crepe" });
  base = `/api/productions/${production.id}/fabrics/${fabric.id}`;
});

const pairs = (before: number, ...after: number[]) => after.map((afterMm) => ({ beforeMm: before, afterMm }));

describe("shrinkage, colour fastness and flame-retardancy tests", () => {
  it("records a wash shrinkage test with the mean change per direction (worked example: −20/7 % and +4/7 %)", async () => {
    const simulationBefore = (await agent.get(base)).body.data.simulation;

    const res = await agent.post(`${base}/tests`, {
      testedOn: "2030-09-02",
      readings: { kind: "shrinkage", treatment: "washing", procedure: "ISO 6330 4N, line dry", length: pairs(350, 339, 340, 341), width: pairs(350, 352, 351, 353) },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.readings.cycles).toBe(1);
    expect(res.body.data.derived.lengthChangePct).toBeCloseTo(-20 / 7, 9);
    expect(res.body.data.derived.widthChangePct).toBeCloseTo(4 / 7, 9);
    expect(res.body.data.derived.lengthCutFactor).toBeCloseTo(35 / 34, 9);
    const detail = await agent.get(base);
    expect(detail.body.data.tests.map((t: { kind: string }) => t.kind)).toEqual(["shrinkage"]);
    // Care tests do not feed the cloth simulation.
    expect(detail.body.data.simulation).toEqual(simulationBefore);
  });

  it("records colour fastness with half grades written as the trade writes them", async () => {
    const res = await agent.post(`${base}/tests`, { testedOn: "2030-09-02", readings: { kind: "colourfastness", agent: "rubbing_wet", changeGrade: 4.5, stainingGrade: 3, adjacent: "cotton rubbing cloth" } });

    expect(res.status).toBe(201);
    expect(res.body.data.derived).toEqual({ changeLabel: "4-5", stainingLabel: "3" });
  });

  it("400 naming the field for a grade off the scale, a pair with no distance, or a blank treatment; nothing is written", async () => {
    const cases: Array<[object, string, RegExp]> = [
      [{ kind: "colourfastness", agent: "washing", changeGrade: 4.3 }, "readings.changeGrade", /grey-scale grade from 1 to 5 in half steps/],
      [{ kind: "colourfastness", agent: "washing", changeGrade: 6 }, "readings.changeGrade", /grey-scale grade/],
      [{ kind: "colourfastness", agent: "light", changeGrade: 4 }, "readings.agent", /not a colour-fastness test/],
      [{ kind: "shrinkage", treatment: "washing", length: [], width: pairs(350, 349) }, "readings.length", /at least one pair/],
      [{ kind: "shrinkage", treatment: "washing", length: pairs(0, 340), width: pairs(350, 349) }, "readings.length.0.beforeMm", /greater than 0/],
      [{ kind: "shrinkage", treatment: "tumble", length: pairs(350, 340), width: pairs(350, 349) }, "readings.treatment", /washing or dry-cleaning/],
      [{ kind: "flame_retardancy", treatment: " ", treatedOn: "2030-09-01" }, "readings.treatment", /required/],
    ];
    for (const [readings, field, message] of cases) {
      const res = await agent.post(`${base}/tests`, { testedOn: "2030-09-02", readings });
      expect(res.status, JSON.stringify(readings)).toBe(400);
      expect(res.body.error.fields[field], JSON.stringify(res.body.error)).toMatch(message);
    }
    expect(await FabricTest.count()).toBe(0);
  });

  it("a flame-retardancy record carries its certificate photo; deleting the record deletes the photo", async () => {
    const rec = await agent.post(`${base}/tests`, {
      testedOn: "2030-09-02",
      readings: { kind: "flame_retardancy", treatment: "Invented FR spray, applied by the workroom", treatedOn: "2030-09-01", certificateRef: "FR-0192", renewBy: "2030-12-01" },
    });
    expect(rec.status).toBe(201);
    const testId = rec.body.data.id as string;

    const up = await agent.agent
      .post(`/api/productions/${production.id}/photos`)
      .set("X-CSRF-Token", agent.csrf)
      .field("ownerType", "fabric_test")
      .field("ownerId", testId)
      .field("view", "detail")
      .attach("file", path.resolve("tests/fixtures", "gps-rotated.jpg"));
    expect(up.status).toBe(201);
    expect(await Photo.count({ where: { ownerType: "fabric_test", ownerId: testId } })).toBe(1);

    const del = await agent.delete(`${base}/tests/${testId}`);

    expect(del.status).toBe(204);
    expect(await Photo.count({ where: { ownerType: "fabric_test", ownerId: testId } })).toBe(0);
  });
});
