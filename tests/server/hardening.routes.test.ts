import { beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app.js";
import { sequelize } from "../../server/db.js";
import { FabricTest, Performer } from "../../server/models/index.js";
import { buildFabric, buildMember, buildUser, TEST_PASSWORD } from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent } from "../setup/http.js";

const app = createApp();

beforeEach(async () => {
  await resetDb();
});

async function sessionRows(): Promise<number> {
  const [rows] = await sequelize.query(`SELECT count(*)::int AS n FROM session`);
  return (rows as Array<{ n: number }>)[0]!.n;
}

describe("sessions for signed-out visitors", () => {
  it("GET /api/auth/csrf stores no session row, nor does a failed sign-in, yet the token works for signing in", async () => {
    const user = await buildUser({ email: "a@test.invalid" });
    const anon = request.agent(app);

    for (let i = 0; i < 3; i++) await anon.get("/api/auth/csrf").expect(200);
    const token = (await anon.get("/api/auth/csrf")).body.token as string;
    expect(await sessionRows()).toBe(0);
    await anon.post("/api/auth/login").set("X-CSRF-Token", token).send({ email: user.email, password: "wrong-password" }).expect(401);
    expect(await sessionRows()).toBe(0);

    await anon.post("/api/auth/login").set("X-CSRF-Token", token).send({ email: user.email, password: TEST_PASSWORD }).expect(200);

    expect(await sessionRows()).toBe(1);
    expect((await anon.get("/api/auth/me")).status).toBe(200);
  });

  it("still refuses a sign-in without the token, or with another visitor's token", async () => {
    const user = await buildUser({ email: "a@test.invalid" });
    const mine = await anonymousAgent(app);
    const theirs = await anonymousAgent(app);

    const none = await request(app).post("/api/auth/login").send({ email: user.email, password: TEST_PASSWORD });
    const crossed = await mine.agent
      .post("/api/auth/login")
      .set("X-CSRF-Token", theirs.csrf)
      .send({ email: user.email, password: TEST_PASSWORD });

    expect(none.status).toBe(403);
    expect(crossed.status).toBe(403);
    expect(crossed.body.error.code).toBe("csrf_invalid");
  });

  it("a signed-in person's token lives in their session: a signed-out visitor's token does not work for them", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    const stranger = await anonymousAgent(app);

    const res = await agent.agent.post("/api/productions").set("X-CSRF-Token", stranger.csrf).send({ title: "Tidewater", kind: "film" });

    expect(res.status).toBe(403);
    void production;
  });
});

describe("GET /garments?rack=", () => {
  it("matches the whole rack name, any case, with % and _ taken literally", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    const base = `/api/productions/${production.id}/garments`;
    for (const [name, rack] of [
      ["Coat", "A1"],
      ["Shawl", "B1"],
      ["Cap", "5%"],
      ["Smock", "C_3"],
    ]) {
      await agent.post(base, { name, category: "jacket", source: "built", fitIntent: "fitted", locationRack: rack }).expect(201);
    }
    const names = async (rack: string) =>
      ((await agent.get(`${base}?rack=${encodeURIComponent(rack)}`)).body.data as Array<{ name: string }>).map((g) => g.name).sort();

    expect(await names("%")).toEqual([]);
    expect(await names("_1")).toEqual([]);
    expect(await names("5%")).toEqual(["Cap"]);
    expect(await names("C_3")).toEqual(["Smock"]);
    expect(await names("CX3")).toEqual([]);
    expect(await names("a1")).toEqual(["Coat"]);
  });
});

describe("names", () => {
  it("refuse NUL and invisible-only names with a field message; nothing is written", async () => {
    const { user, production } = await buildMember("supervisor");
    const agent = await signedInAgent(app, user.email);
    const url = `/api/productions/${production.id}/performers`;

    const nul = await agent.post(url, { name: "Ivy\u0000Example" });
    const invisible = await agent.post(url, { name: "\u200B\u2060\u3164" });

    expect(nul.status).toBe(400);
    expect(nul.body.error.fields.name).toMatch(/control characters/);
    expect(invisible.status).toBe(400);
    expect(invisible.body.error.fields.name).toMatch(/visible character/);
    expect(await Performer.count()).toBe(0);
  });
});

describe("POST /fabrics/:id/tests plausibility", () => {
  it("refuses 1e-300 g with the reason under the reading", async () => {
    const { user, production } = await buildMember("designer");
    const fabric = await buildFabric({ production });
    const agent = await signedInAgent(app, user.email);

    const res = await agent.post(`/api/productions/${production.id}/fabrics/${fabric.id}/tests`, {
      testedOn: "2026-11-20",
      readings: { kind: "mass", massG: 1e-300, lengthMm: 100, widthMm: 100 },
    });

    expect(res.status).toBe(400);
    expect(res.body.error.fields["readings.massG"]).toMatch(/below the plausible minimum of 0.01 g/);
    expect(await FabricTest.count()).toBe(0);
  });
});
