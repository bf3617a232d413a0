import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { createApp } from "../../server/app.js";
import { config } from "../../server/config.js";
import { buildUser, TEST_PASSWORD } from "../factories.js";
import { anonymousAgent, resetDb } from "../setup/http.js";

const app = createApp();
const defaults = { perAccount: config.LOGIN_MAX_FAILURES, perClient: config.LOGIN_MAX_FAILURES_PER_CLIENT };

beforeEach(async () => {
  await resetDb();
});

afterEach(() => {
  config.LOGIN_MAX_FAILURES = defaults.perAccount;
  config.LOGIN_MAX_FAILURES_PER_CLIENT = defaults.perClient;
});

describe("POST /api/auth/login throttle", () => {
  it("counts ' Designer@…' and 'designer@…' as one account, so spacing and case buy no fresh tries", async () => {
    config.LOGIN_MAX_FAILURES = 5;
    await buildUser({ email: "designer@test.invalid" });
    const anon = await anonymousAgent(app);
    const variants = [
      "designer@test.invalid",
      " designer@test.invalid",
      "Designer@test.invalid",
      "designer@test.invalid ",
      "\tDESIGNER@test.invalid",
      " Designer@Test.Invalid ",
    ];
    const statuses: number[] = [];

    for (const email of variants) statuses.push((await anon.post("/api/auth/login", { email, password: "wrong-password" })).status);

    expect(statuses).toEqual([401, 401, 401, 401, 401, 429]);
  });

  it("refuses the right password with a leading space while the account is locked", async () => {
    config.LOGIN_MAX_FAILURES = 3;
    await buildUser({ email: "designer@test.invalid" });
    const anon = await anonymousAgent(app);
    for (let i = 0; i < 3; i++)
      await anon.post("/api/auth/login", { email: "designer@test.invalid", password: "wrong-password" }).expect(401);

    const spaced = await anon.post("/api/auth/login", { email: " designer@test.invalid", password: TEST_PASSWORD });
    const upper = await anon.post("/api/auth/login", { email: "DESIGNER@TEST.INVALID", password: TEST_PASSWORD });

    expect(spaced.status).toBe(429);
    expect(upper.status).toBe(429);
    expect(spaced.body.error.code).toBe("too_many_requests");
  });

  it("still signs in with a spaced, capitalised address when not locked", async () => {
    await buildUser({ email: "designer@test.invalid" });
    const anon = await anonymousAgent(app);

    const res = await anon.post("/api/auth/login", { email: "  Designer@Test.invalid ", password: TEST_PASSWORD });

    expect(res.status).toBe(200);
    expect(res.body.data.email).toBe("designer@test.invalid");
  });

  it("limits failures per client address across accounts", async () => {
    config.LOGIN_MAX_FAILURES = 5;
    config.LOGIN_MAX_FAILURES_PER_CLIENT = 6;
    const users = await Promise.all([1, 2, 3, 4].map((i) => buildUser({ email: `person${i}@test.invalid` })));
    const anon = await anonymousAgent(app);
    const statuses: number[] = [];

    // Two wrong guesses per account: no single account reaches its limit of 5.
    for (const u of users)
      for (let i = 0; i < 2; i++)
        statuses.push((await anon.post("/api/auth/login", { email: u.email, password: "wrong-password" })).status);
    const rightPassword = await anon.post("/api/auth/login", { email: users[0]!.email, password: TEST_PASSWORD });

    expect(statuses).toEqual([401, 401, 401, 401, 401, 401, 429, 429]);
    expect(rightPassword.status).toBe(429);
    expect(rightPassword.body.error.message).toMatch(/from this network/);
  });

  it("does not count successful sign-ins against the client", async () => {
    config.LOGIN_MAX_FAILURES_PER_CLIENT = 2;
    const user = await buildUser({ email: "often@test.invalid" });
    const statuses: number[] = [];

    for (let i = 0; i < 4; i++)
      statuses.push((await (await anonymousAgent(app)).post("/api/auth/login", { email: user.email, password: TEST_PASSWORD })).status);

    expect(statuses).toEqual([200, 200, 200, 200]);
  });
});
