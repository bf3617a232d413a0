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
  it("records a wash shrinkage test as ISO 5077 calculates it: per pair (Xt − X0) / X0 × 100, mean per direction", async () => {
    // ISO 5077:2007: three pairs of marks 350 mm apart per direction (ISO 3759 marking). Constructed example:
    // length 339, 340, 341 mm → −11/350, −10/350, −9/350 → mean −10/350 × 100 = −20/7 % (−2.857 %);
    // width 352, 351, 353 mm → +2/350, +1/350, +3/350 → mean +2/350 × 100 = +4/7 % (+0.571 %).
    const simulationBefore = (await agent.get(base)).body.data.simulation;

    const res = await agent.post(`${base}/tests`, {
      testedOn: "2030-09-02",
      readings: {
        kind: "shrinkage",
        treatment: "washing",
        procedure: "ISO 6330 4N, line dry",
        length: pairs(350, 339, 340, 341),
        width: pairs(350, 352, 351, 353),
      },
    });

    expect(res.status).toBe(201);
    expect(res.body.data.readings.cycles).toBe(1);
    expect(res.body.data.derived.lengthChangePct).toBeCloseTo(-20 / 7, 9);
    expect(res.body.data.derived.widthChangePct).toBeCloseTo(4 / 7, 9);
    // Cut factor 1 / (1 + d/100): common practice, no source. 1 / (1 − 2/70) = 35/34; 1 / (1 + 0.4/70) = 175/176.
    expect(res.body.data.derived.lengthCutFactor).toBeCloseTo(35 / 34, 9);
    expect(res.body.data.derived.widthCutFactor).toBeCloseTo(175 / 176, 9);
    const detail = await agent.get(base);
    expect(detail.body.data.tests.map((t: { kind: string }) => t.kind)).toEqual(["shrinkage"]);
    // Care tests do not feed the cloth simulation.
    expect(detail.body.data.simulation).toEqual(simulationBefore);
  });

  it("records a dry-cleaning test over several cycles with single pairs 500 mm apart (ISO 3175 cleaning, ISO 5077 calculation)", async () => {
    // 500 → 490 mm is (490 − 500) / 500 × 100 = −2 %; 500 → 505 mm is +1 %.
    const res = await agent.post(`${base}/tests`, {
      testedOn: "2030-09-02",
      readings: {
        kind: "shrinkage",
        treatment: "dry_cleaning",
        cycles: 3,
        procedure: "ISO 3175-2, normal",
        length: pairs(500, 490),
        width: pairs(500, 505),
      },
    });

    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.data.readings).toMatchObject({ treatment: "dry_cleaning", cycles: 3 });
    expect(res.body.data.derived.lengthChangePct).toBeCloseTo(-2, 12);
    expect(res.body.data.derived.widthChangePct).toBeCloseTo(1, 12);
  });

  it("records colour fastness with half grades written as the trade writes them and the pair's CIELAB difference (ISO 105-A02 §2.4)", async () => {
    const res = await agent.post(`${base}/tests`, {
      testedOn: "2030-09-02",
      readings: { kind: "colourfastness", agent: "rubbing_wet", changeGrade: 4.5, stainingGrade: 3, adjacent: "cotton rubbing cloth" },
    });

    expect(res.status).toBe(201);
    // ISO 105-A02:1993 §2.4: grade 4-5 is the pair 0.8 ± 0.2 CIELAB units apart.
    expect(res.body.data.derived).toEqual({ changeLabel: "4-5", changeDeltaE: 0.8, changeDeltaETolerance: 0.2, stainingLabel: "3" });
  });

  it("every step of the 9-step scale is accepted and stored with its label and CIELAB difference (ISO 105-A02:1993 §2.1, §2.4)", async () => {
    // Grade → label, ΔE*ab, tolerance, as the standard's table gives them.
    const table: Array<[number, string, number, number]> = [
      [5, "5", 0, 0.2],
      [4.5, "4-5", 0.8, 0.2],
      [4, "4", 1.7, 0.3],
      [3.5, "3-4", 2.5, 0.35],
      [3, "3", 3.4, 0.4],
      [2.5, "2-3", 4.8, 0.5],
      [2, "2", 6.8, 0.6],
      [1.5, "1-2", 9.6, 0.7],
      [1, "1", 13.6, 1.0],
    ];
    for (const [grade, label, deltaE, tolerance] of table) {
      const res = await agent.post(`${base}/tests`, {
        testedOn: "2030-09-02",
        readings: { kind: "colourfastness", agent: "washing", changeGrade: grade, stainingGrade: grade },
      });
      expect(res.status, String(grade)).toBe(201);
      expect(res.body.data.derived, String(grade)).toEqual({
        changeLabel: label,
        changeDeltaE: deltaE,
        changeDeltaETolerance: tolerance,
        stainingLabel: label,
      });
    }
    expect(await FabricTest.count({ where: { kind: "colourfastness" } })).toBe(9);
  });

  it("400 naming the field for a grade off the scale, a pair with no distance, or a blank treatment; nothing is written", async () => {
    const cases: Array<[object, string, RegExp]> = [
      [
        { kind: "colourfastness", agent: "washing", changeGrade: 4.3 },
        "readings.changeGrade",
        /grey-scale grade from 1 to 5 in half steps/,
      ],
      [{ kind: "colourfastness", agent: "washing", changeGrade: 6 }, "readings.changeGrade", /grey-scale grade/],
      [{ kind: "colourfastness", agent: "washing", changeGrade: 0.5 }, "readings.changeGrade", /grey-scale grade/],
      [{ kind: "colourfastness", agent: "washing", changeGrade: 4, stainingGrade: 2.25 }, "readings.stainingGrade", /grey-scale grade/],
      [{ kind: "colourfastness", agent: "light", changeGrade: 4 }, "readings.agent", /not a colour-fastness test/],
      [{ kind: "shrinkage", treatment: "washing", length: [], width: pairs(350, 349) }, "readings.length", /at least one pair/],
      [
        { kind: "shrinkage", treatment: "washing", length: pairs(0, 340), width: pairs(350, 349) },
        "readings.length.0.beforeMm",
        /greater than 0/,
      ],
      [
        { kind: "shrinkage", treatment: "tumble", length: pairs(350, 340), width: pairs(350, 349) },
        "readings.treatment",
        /washing or dry-cleaning/,
      ],
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
      readings: {
        kind: "flame_retardancy",
        treatment: "Invented FR spray, applied by the workroom",
        treatedOn: "2030-09-01",
        certificateRef: "FR-0192",
        renewBy: "2030-12-01",
      },
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
