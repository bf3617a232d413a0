import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { randomUUID } from "node:crypto";
import { createApp } from "../../server/app.js";
import { Invitation, Membership, Production } from "../../server/models/index.js";
import { buildMember, buildUser } from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, waitForMail } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

describe("POST /api/productions", () => {
  it("creates a production and makes its creator supervisor", async () => {
    const user = await buildUser();
    const agent = await signedInAgent(app, user.email);

    const res = await agent.post("/api/productions", { title: "Harbour Lights", kind: "series", units: "in" });

    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ title: "Harbour Lights", kind: "series", units: "in", role: "supervisor" });
    expect(await Membership.count({ where: { userId: user.id, role: "supervisor" } })).toBe(1);
  });

  it("rejects bad input with the error shape and writes nothing", async () => {
    const user = await buildUser();
    const agent = await signedInAgent(app, user.email);

    const missing = await agent.post("/api/productions", { kind: "film" });
    const tooLong = await agent.post("/api/productions", { title: "x".repeat(201), kind: "film" });
    const badKind = await agent.post("/api/productions", { title: "A", kind: "opera" });
    const badDates = await agent.post("/api/productions", { title: "A", kind: "film", startsOn: "2027-01-10", endsOn: "2027-01-01" });
    const malformed = await agent.agent
      .post("/api/productions")
      .set("X-CSRF-Token", agent.csrf)
      .set("Content-Type", "application/json")
      .send('{"title": ');

    expect(missing.status).toBe(400);
    expect(missing.body.error.fields.title).toBe("Title is required");
    expect(tooLong.body.error.fields.title).toMatch(/200/);
    expect(badKind.body.error.fields.kind).toBe("Kind must be one of: film, series, stage");
    expect(badDates.body.error.fields.endsOn).toMatch(/after/);
    expect(malformed.status).toBe(400);
    expect(malformed.body.error).toEqual({ code: "validation_error", message: "The request body is not valid JSON." });
    expect(await Production.count()).toBe(0);
  });
});

describe("production access", () => {
  it("answers 404 for a production the user does not belong to and for an unknown id", async () => {
    const { production } = await buildMember("supervisor");
    const outsider = await buildUser();
    const agent = await signedInAgent(app, outsider.email);

    expect((await agent.get(`/api/productions/${production.id}`)).status).toBe(404);
    expect((await agent.get(`/api/productions/${randomUUID()}/members`)).status).toBe(404);
    expect((await agent.get(`/api/productions/not-a-uuid/members`)).status).toBe(404);
  });
});

describe("invitations", () => {
  it("e-mails a link; the invitee sets a password, lands in the production, and the link works once", async () => {
    const { user: boss, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, boss.email);

    const sent = await agent.post(`/api/productions/${production.id}/invitations`, { email: "New.Cutter@Test.invalid", role: "cutter" });
    expect(sent.status).toBe(201);
    const mail = await waitForMail((m) => m.recipients.includes("new.cutter@test.invalid"));
    expect(mail.subject).toContain(production.title);
    const token = /invitations\/([A-Za-z0-9_-]+)/.exec(mail.textBody ?? "")![1]!;

    const anon = await anonymousAgent(app);
    const preview = await anon.get(`/api/invitations/${token}`);
    expect(preview.body.data).toMatchObject({ email: "new.cutter@test.invalid", role: "cutter", accountExists: false });
    const accepted = await anon.post("/api/invitations/accept", { token, name: "Nell Cutter", password: "long-enough-password" });
    expect(accepted.status).toBe(200);
    expect(accepted.body.data.productionId).toBe(production.id);

    const me = await anon.get("/api/auth/me");
    expect(me.body.data.memberships).toEqual([expect.objectContaining({ productionId: production.id, role: "cutter" })]);
    const reuse = await (
      await anonymousAgent(app)
    ).post("/api/invitations/accept", { token, name: "Someone", password: "long-enough-password" });
    expect(reuse.status).toBe(404);
  });

  it("refuses to invite someone who is already a member (409, field named)", async () => {
    const { user: boss, production } = await buildMember("supervisor");
    const { user: member } = await buildMember("designer", { production });
    const agent = await signedInAgent(app, boss.email);

    const res = await agent.post(`/api/productions/${production.id}/invitations`, { email: member.email, role: "cutter" });

    expect(res.status).toBe(409);
    expect(res.body.error.fields.email).toBe("E-mail is already a member of this production");
    expect(await Invitation.count()).toBe(0);
  });

  it("lets an existing user join after signing in as the invited address", async () => {
    const { user: boss, production } = await buildMember("supervisor");
    const other = await buildUser({ email: "known@test.invalid" });
    const agent = await signedInAgent(app, boss.email);
    await agent.post(`/api/productions/${production.id}/invitations`, { email: "known@test.invalid", role: "vfx" }).expect(201);
    const token = /invitations\/([A-Za-z0-9_-]+)/.exec(
      (await waitForMail((m) => m.recipients.includes("known@test.invalid"))).textBody ?? "",
    )![1]!;

    const anon = await anonymousAgent(app);
    const refused = await anon.post("/api/invitations/accept", { token });
    const asOther = await signedInAgent(app, other.email);
    const ok = await asOther.post("/api/invitations/accept", { token });

    expect(refused.status).toBe(409);
    expect(ok.status).toBe(200);
    expect(await Membership.findOne({ where: { userId: other.id, productionId: production.id } })).toMatchObject({ role: "vfx" });
  });
});

describe("members", () => {
  it("changes a role and removes a member", async () => {
    const { user: boss, production } = await buildMember("supervisor");
    const { membership } = await buildMember("designer", { production });
    const agent = await signedInAgent(app, boss.email);

    const changed = await agent.patch(`/api/productions/${production.id}/members/${membership.id}`, { role: "cutter" });
    const removed = await agent.delete(`/api/productions/${production.id}/members/${membership.id}`);

    expect(changed.body.data.role).toBe("cutter");
    expect(removed.status).toBe(204);
    expect(await Membership.count({ where: { productionId: production.id } })).toBe(1);
  });

  it("never leaves a production without a supervisor", async () => {
    const { user: boss, production, membership } = await buildMember("supervisor");
    const agent = await signedInAgent(app, boss.email);

    const demote = await agent.patch(`/api/productions/${production.id}/members/${membership.id}`, { role: "designer" });
    const remove = await agent.delete(`/api/productions/${production.id}/members/${membership.id}`);

    expect(demote.status).toBe(409);
    expect(remove.status).toBe(409);
    expect((await Membership.findByPk(membership.id))?.role).toBe("supervisor");
  });

  it("a user in two productions has a different role in each", async () => {
    const { user, production: a } = await buildMember("supervisor");
    const { production: b } = await buildMember("cutter", { user });
    const agent = await signedInAgent(app, user.email);

    const list = await agent.get("/api/productions");

    expect(list.body.data.map((p: { id: string; role: string }) => [p.id, p.role]).sort()).toEqual(
      [
        [a.id, "supervisor"],
        [b.id, "cutter"],
      ].sort(),
    );
    expect((await agent.get(`/api/productions/${b.id}/members`)).status).toBe(403);
    expect((await agent.get(`/api/productions/${a.id}/members`)).status).toBe(200);
  });
});

describe("unknown API routes", () => {
  it("answer 404 in the error shape", async () => {
    const res = await request(app).get("/api/no-such-thing");

    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe("not_found");
  });
});
