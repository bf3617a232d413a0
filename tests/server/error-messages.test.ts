import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { buildFabric, buildMember } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";
import type { Production } from "../../server/models/index.js";

const app = createApp();
let agent: TestAgent;
let production: Production;

beforeEach(async () => {
  await resetDb();
  const m = await buildMember("supervisor");
  production = m.production;
  agent = await signedInAgent(app, m.user.email);
});

describe("validation errors in the person's words", () => {
  it("POST /characters without a name says 'Name is required', in the message and under the field", async () => {
    const res = await agent.post(`/api/productions/${production.id}/characters`, { name: "" });

    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe("Name is required");
    expect(res.body.error.fields.name).toBe("Name is required");
  });

  it("a nested reading is named as on the form, not by its path", async () => {
    const f = await buildFabric({ production });

    const res = await agent.post(`/api/productions/${production.id}/fabrics/${f.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "cantilever", direction: "warp", overhangMm: -4 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe("Overhang must be greater than 0");
    expect(res.body.error.fields["readings.overhangMm"]).toBe("Overhang must be greater than 0");
  });

  it("a service's own 'field: reason' message is rewritten with the field's label", async () => {
    const res = await agent.post(`/api/productions/${production.id}/fittings`, {
      performerId: "00000000-0000-4000-8000-000000000001",
      startsAt: "2026-12-03T10:00:00Z",
      durationMinutes: 30,
    });

    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe("Performer: no such performer in this production");
    expect(res.body.error.fields.performerId).toBe("Performer: no such performer in this production");
  });

  it("zod's own messages for unworded checks read as plain words", async () => {
    const res = await agent.get(`/api/productions/${production.id}/garments?page=0`);

    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe("Page must be at least 1");
  });
});
