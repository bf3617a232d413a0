import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { config } from "../../server/config.js";
import { clock } from "../../server/lib/clock.js";
import { OutboxMessage } from "../../server/models/index.js";
import { queueWorkroomEmail } from "../../server/services/workroom-mail.service.js";
import { buildMember, buildUser } from "../factories.js";
import { buildPerformer } from "../factories.workroom.js";
import { anonymousAgent, resetDb, signedInAgent, waitForMail } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

afterEach(() => {
  clock.reset();
  (config as { DEV_OUTBOX: boolean }).DEV_OUTBOX = true;
});

const mailTo = (address: string, subject = "Tomorrow in the workroom") => ({
  to: address,
  subject,
  text: `For ${address}`,
  html: `<p>For ${address}</p>`,
});

describe("GET /api/productions/:productionId/outbox", () => {
  it("never shows another account's reset link, invitation token or fitting mail to a supervisor of a production they created", async () => {
    // The victim supervises their own production, with a performer who gets fitting mail.
    clock.set("2030-09-02", { frozen: true });
    const victim = await buildMember("supervisor");
    const performerId = await buildPerformer(victim.production.id, { name: "Ivy Example", email: "ivy@test.invalid" });
    const victimAgent = await signedInAgent(app, victim.user.email);
    await victimAgent
      .post(`/api/productions/${victim.production.id}/invitations`, { email: "new.cutter@test.invalid", role: "cutter" })
      .expect(201);
    await victimAgent
      .post(`/api/productions/${victim.production.id}/fittings`, {
        performerId,
        startsAt: "2030-09-03T09:30:00Z",
        durationMinutes: 45,
        attendeeIds: [victim.user.id],
      })
      .expect(201);
    // A digital-double artist creates their own production and so becomes its supervisor.
    const attacker = await buildMember("vfx");
    const attackerAgent = await signedInAgent(app, attacker.user.email);
    const own = await attackerAgent.post("/api/productions", { title: "Borrowed Light", kind: "film" });
    expect(own.status).toBe(201);
    // Signed out, they ask for a reset of the victim's password.
    await (await anonymousAgent(app)).post("/api/auth/password-reset", { email: victim.user.email }).expect(202);
    const reset = await waitForMail((m) => m.recipients.includes(victim.user.email) && /reset-password\//.test(m.textBody ?? ""));
    const invitation = await waitForMail((m) => m.recipients.includes("new.cutter@test.invalid"));
    const fitting = await waitForMail((m) => m.recipients.includes("ivy@test.invalid"));
    const resetToken = /reset-password\/([A-Za-z0-9_-]+)/.exec(reset.textBody ?? "")![1]!;
    const invitationToken = /invitations\/([A-Za-z0-9_-]+)/.exec(invitation.textBody ?? "")![1]!;

    const res = await attackerAgent.get(`/api/productions/${own.body.data.id}/outbox`);

    expect(res.status).toBe(200);
    expect(res.body.data).toEqual([]);
    expect(res.body.pagination.total).toBe(0);
    const text = JSON.stringify(res.body);
    expect(text).not.toContain(resetToken);
    expect(text).not.toContain(invitationToken);
    expect(text).not.toContain(victim.user.email);
    expect(text).not.toContain(fitting.id);
  });

  it("keeps password-reset and invitation mail out of the victim's own production outbox too", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    await agent.post(`/api/productions/${production.id}/invitations`, { email: "new.cutter@test.invalid", role: "cutter" }).expect(201);
    await (await anonymousAgent(app)).post("/api/auth/password-reset", { email: user.email }).expect(202);
    await waitForMail((m) => m.recipients.includes(user.email));
    await waitForMail((m) => m.recipients.includes("new.cutter@test.invalid"));

    const res = await agent.get(`/api/productions/${production.id}/outbox`);

    expect(res.status).toBe(200);
    expect(res.body.data).toEqual([]);
    expect(await OutboxMessage.count()).toBe(2);
  });

  it("shows mail sent for this production to its members, and nothing sent for another production or to outsiders", async () => {
    const { user, production } = await buildMember("supervisor");
    const cutter = await buildMember("cutter", { production });
    const other = await buildMember("supervisor");
    const outsider = await buildUser({ email: "outsider@test.invalid" });
    await queueWorkroomEmail({ productionId: production.id, kind: "evening_reminder", dedupeKey: "r1", mail: mailTo(cutter.user.email) });
    await queueWorkroomEmail({ productionId: production.id, kind: "evening_reminder", dedupeKey: "r2", mail: mailTo(outsider.email) });
    await queueWorkroomEmail({
      productionId: production.id,
      kind: "evening_reminder",
      dedupeKey: "r3",
      mail: { ...mailTo(cutter.user.email), to: [cutter.user.email, outsider.email] },
    });
    await queueWorkroomEmail({
      productionId: other.production.id,
      kind: "evening_reminder",
      dedupeKey: "r4",
      mail: mailTo(cutter.user.email, "Another production"),
    });
    while ((await OutboxMessage.count()) < 4) await new Promise((r) => setTimeout(r, 20));
    const agent = await signedInAgent(app, user.email);

    const res = await agent.get(`/api/productions/${production.id}/outbox`);

    expect(res.status).toBe(200);
    expect(res.body.data).toHaveLength(1);
    expect(res.body.data[0]).toMatchObject({ recipients: cutter.user.email, subject: "Tomorrow in the workroom" });
  });

  it("is for supervisors only", async () => {
    const { user, production } = await buildMember("designer");
    const agent = await signedInAgent(app, user.email);

    const res = await agent.get(`/api/productions/${production.id}/outbox`);

    expect(res.status).toBe(403);
  });

  it("does not exist (404) when the outbox is off, as on a production server", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    (config as { DEV_OUTBOX: boolean }).DEV_OUTBOX = false;

    const res = await agent.get(`/api/productions/${production.id}/outbox`);

    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
  });
});
