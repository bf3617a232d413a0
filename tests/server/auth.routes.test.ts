import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp, closeAppResources } from "../../server/app.js";
import { User, OutboxMessage } from "../../server/models/index.js";
import { buildMember, buildUser, TEST_PASSWORD } from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, waitForMail } from "../setup/http.js";

let app = createApp();

beforeEach(async () => {
  await resetDb();
});

describe("POST /api/auth/login", () => {
  it("refuses a request without the CSRF token", async () => {
    await buildUser({ email: "a@test.invalid" });

    const res = await request(app).post("/api/auth/login").send({ email: "a@test.invalid", password: TEST_PASSWORD });

    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe("csrf_invalid");
  });

  it("answers 400 naming the field when the e-mail is malformed", async () => {
    const anon = await anonymousAgent(app);

    const res = await anon.post("/api/auth/login", { email: "not-an-address", password: "x" });

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("validation_error");
    expect(res.body.error.fields.email).toBe("E-mail must be an e-mail address");
  });

  it("answers 401 with a clear message for a wrong password", async () => {
    await buildUser({ email: "a@test.invalid" });
    const anon = await anonymousAgent(app);

    const res = await anon.post("/api/auth/login", { email: "a@test.invalid", password: "wrong-password" });

    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: "invalid_credentials", message: expect.stringMatching(/do not match/) });
  });

  it("signs in, returns the user without the password hash, and lists memberships", async () => {
    const { user, production } = await buildMember("designer");

    const agent = await signedInAgent(app, user.email);
    const me = await agent.get("/api/auth/me");

    expect(me.status).toBe(200);
    expect(me.body.data).toMatchObject({ email: user.email, memberships: [{ productionId: production.id, role: "designer" }] });
    expect(JSON.stringify(me.body)).not.toContain("scrypt");
  });

  it("slows repeated failures down with 429 after the configured number", async () => {
    await buildUser({ email: "a@test.invalid" });
    const anon = await anonymousAgent(app);
    const statuses: number[] = [];

    for (let i = 0; i < 6; i++)
      statuses.push((await anon.post("/api/auth/login", { email: "a@test.invalid", password: "nope-nope" })).status);

    // LOGIN_MAX_FAILURES is 5 in tests: five 401s, then refused even before the password is checked.
    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
    const right = await anon.post("/api/auth/login", { email: "a@test.invalid", password: TEST_PASSWORD });
    expect(right.status).toBe(429);
  });
});

describe("POST /api/auth/logout", () => {
  it("ends the session", async () => {
    const user = await buildUser();
    const agent = await signedInAgent(app, user.email);

    await agent.post("/api/auth/logout").expect(204);
    const me = await agent.get("/api/auth/me");

    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe("authentication_required");
  });
});

describe("sessions", () => {
  it("survive a server restart because they live in PostgreSQL", async () => {
    const user = await buildUser();
    const agent = await signedInAgent(app, user.email);
    const cookie = (await agent.get("/api/auth/me")).request.cookies;

    await closeAppResources();
    app = createApp();
    const res = await request(app).get("/api/auth/me").set("Cookie", cookie);

    expect(res.status).toBe(200);
    expect(res.body.data.email).toBe(user.email);
  });
});

describe("password reset", () => {
  it("e-mails a single-use link that sets a new password", async () => {
    const user = await buildUser({ email: "forgetful@test.invalid", name: "Forgetful" });
    const anon = await anonymousAgent(app);

    await anon.post("/api/auth/password-reset", { email: "forgetful@test.invalid" }).expect(202);
    const mail = await waitForMail((m) => m.recipients.includes("forgetful@test.invalid"));
    const token = /reset-password\/([A-Za-z0-9_-]+)/.exec(mail.textBody ?? "")?.[1];
    expect(token).toBeTruthy();

    const first = await anon.post("/api/auth/password-reset/confirm", { token, password: "a-brand-new-password" });
    expect(first.status).toBe(200);
    const again = await (await anonymousAgent(app)).post("/api/auth/password-reset/confirm", { token, password: "another-new-password" });
    expect(again.status).toBe(404);

    await signedInAgent(app, user.email, "a-brand-new-password");
  });

  it("answers the same for an unknown address and sends nothing", async () => {
    const anon = await anonymousAgent(app);

    const res = await anon.post("/api/auth/password-reset", { email: "nobody@test.invalid" });

    expect(res.status).toBe(202);
    expect(await OutboxMessage.count()).toBe(0);
    expect(await User.count()).toBe(0);
  });
});

describe("GET /api/health", () => {
  it("reports the database up", async () => {
    const res = await request(app).get("/api/health");

    expect(res.body).toEqual({ ok: true, db: "up" });
  });
});
