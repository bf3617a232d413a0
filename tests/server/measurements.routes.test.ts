import { beforeEach, describe, expect, it } from "vitest";
import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app.js";
import { MeasurementSet } from "../../server/models/index.js";
import { buildMeasurementSet, buildMember, buildPerformer } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;
let performer: { id: string; name: string };
let url: string;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("cutter");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
  performer = await buildPerformer({ production, name: "Corwen Blakely" });
  url = `/api/productions/${production.id}/performers/${performer.id}/measurements`;
});

describe("POST measurements", () => {
  it("stores inches as exact millimetres (1 in = 25.4 mm) with who took them", async () => {
    const res = await agent.post(url, {
      takenOn: "2026-11-18",
      unit: "in",
      values: { chest_girth: 40, waist_girth: 33.5, height: 70, inside_leg_length: 32 },
    });

    expect(res.status).toBe(201);
    // 1959 international yard: 1 in = 25.4 mm exactly (NIST SP 811 App. B.8, 1959 international yard and pound).
    expect(res.body.data.valuesMm).toEqual({ chest_girth: 1016, waist_girth: 850.9, height: 1778, inside_leg_length: 812.8 });
    expect(res.body.data.enteredUnit).toBe("in");
    expect(res.body.data.takenByName).toBe("Test cutter");
  });

  it("400 naming the value for a 5 m waist, with the reason, and writes nothing", async () => {
    const res = await agent.post(url, { takenOn: "2026-11-18", unit: "cm", values: { waist_girth: 500, chest_girth: 100 } });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["values.waist_girth"]).toMatch(/5000 mm is above the plausible maximum/);
    expect(await MeasurementSet.count()).toBe(0);
  });

  it("400 for a negative length", async () => {
    const res = await agent.post(url, { takenOn: "2026-11-18", unit: "cm", values: { arm_length: -60 } });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["values.arm_length"]).toMatch(/greater than 0/);
    expect(await MeasurementSet.count()).toBe(0);
  });

  it("400 for an unknown measurement name", async () => {
    const res = await agent.post(url, { takenOn: "2026-11-18", unit: "cm", values: { tail_length: 10 } });

    expect(res.status).toBe(400);
  });

  it("404 for a performer of another production", async () => {
    const other = await buildPerformer();

    const res = await agent.post(`/api/productions/${production.id}/performers/${other.id}/measurements`, {
      takenOn: "2026-11-18",
      unit: "cm",
      values: { chest_girth: 100 },
    });

    expect(res.status).toBe(404);
    expect(await MeasurementSet.count()).toBe(0);
  });

  it("404 for an unknown or malformed performer id", async () => {
    expect((await agent.get(`/api/productions/${production.id}/performers/${randomUUID()}/measurements`)).status).toBe(404);
    expect((await agent.get(`/api/productions/${production.id}/performers/nope/measurements`)).status).toBe(404);
  });
});

describe("GET measurements", () => {
  it("lists sets newest first with sizes from the newest set", async () => {
    await buildMeasurementSet(performer.id, production, { chest_girth: 980, height: 1800 }, "2026-10-01");
    await buildMeasurementSet(
      performer.id,
      production,
      { chest_girth: 1016, height: 1778, waist_girth: 851, inside_leg_length: 813, foot_length: 268 },
      "2026-11-18",
    );

    const res = await agent.get(url);

    expect(res.status).toBe(200);
    expect(res.body.data.performer).toEqual({ id: performer.id, name: "Corwen Blakely" });
    expect(res.body.data.sets.map((s: { takenOn: string }) => s.takenOn)).toEqual(["2026-11-18", "2026-10-01"]);
    const top = res.body.data.sizes.find((s: { garment: string }) => s.garment === "mens_top");
    // EN 13402-3 letter bands (from memory): 101.6 cm is designated 102, the M/L edge; an edge takes the
    // larger letter, L ([102, 110) cm), so the letter and the pictogram agree.
    expect(top.letter).toBe("L");
    // ISO 9407 Mondopoint with the 5 mm length step [M], rounded up: 268 mm → 270.
    expect(res.body.data.mondopoint.label).toBe("270");
  });
});
