import { beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { AuditEvent, Production } from "../../server/models/index.js";
import { buildMember } from "../factories.js";
import { resetDb, signedInAgent } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

describe("PATCH /api/productions/:productionId", () => {
  it("updates units and merges settings, recording before and after in the audit trail", async () => {
    const { user, production } = await buildMember("supervisor");
    await production.update({ settings: { reminderHour: 18 } });
    const agent = await signedInAgent(app, user.email);

    const res = await agent.patch(`/api/productions/${production.id}`, { units: "in", settings: { bufferWorkingDays: 2 } });
    const audit = await agent.get(`/api/productions/${production.id}/audit`);

    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ units: "in", settings: { reminderHour: 18, bufferWorkingDays: 2 } });
    expect(audit.body.data[0]).toMatchObject({ action: "production.update", actorName: user.name });
    expect(audit.body.data[0].before.units).toBe("cm");
    expect(audit.body.data[0].after.units).toBe("in");
  });

  it("refuses an out-of-range setting, names the field, and changes nothing", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);

    const res = await agent.patch(`/api/productions/${production.id}`, { units: "in", settings: { reminderHour: 24 } });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["settings.reminderHour"]).toBe("Reminder hour must be at most 23");
    expect((await Production.findByPk(production.id))?.units).toBe("cm");
    expect(await AuditEvent.count({ where: { action: "production.update" } })).toBe(0);
  });
});
