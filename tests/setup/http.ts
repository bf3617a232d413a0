/** Supertest helpers: a signed-in agent that sends the CSRF token like the client does. */
import request from "supertest";
import type { Express } from "express";
import { sequelize } from "../../server/db.js";
import { TEST_PASSWORD } from "../factories.js";

export interface TestAgent {
  agent: ReturnType<typeof request.agent>;
  csrf: string;
  get: (url: string) => request.Test;
  post: (url: string, body?: object) => request.Test;
  patch: (url: string, body?: object) => request.Test;
  put: (url: string, body?: object) => request.Test;
  delete: (url: string) => request.Test;
}

async function withCsrf(agent: ReturnType<typeof request.agent>): Promise<TestAgent> {
  const res = await agent.get("/api/auth/csrf").expect(200);
  const csrf = res.body.token as string;
  return {
    agent,
    csrf,
    get: (url) => agent.get(url),
    post: (url, body) =>
      agent
        .post(url)
        .set("X-CSRF-Token", csrf)
        .send(body ?? {}),
    patch: (url, body) =>
      agent
        .patch(url)
        .set("X-CSRF-Token", csrf)
        .send(body ?? {}),
    put: (url, body) =>
      agent
        .put(url)
        .set("X-CSRF-Token", csrf)
        .send(body ?? {}),
    delete: (url) => agent.delete(url).set("X-CSRF-Token", csrf),
  };
}

/** An anonymous agent that has fetched a CSRF token. */
export async function anonymousAgent(app: Express): Promise<TestAgent> {
  return withCsrf(request.agent(app));
}

/** Signs in and returns an agent with a fresh CSRF token (the session is regenerated at sign-in). */
export async function signedInAgent(app: Express, email: string, password = TEST_PASSWORD): Promise<TestAgent> {
  const anon = await anonymousAgent(app);
  await anon.post("/api/auth/login", { email, password }).expect(200);
  return withCsrf(anon.agent);
}

/** Empties every table except the migration log (between tests). */
export async function resetDb(): Promise<void> {
  const [rows] = await sequelize.query(`SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'schema_migrations'`);
  const names = (rows as Array<{ tablename: string }>).map((r) => `"${r.tablename}"`);
  if (names.length) await sequelize.query(`TRUNCATE ${names.join(", ")} RESTART IDENTITY CASCADE`);
}

/** Waits until the SMTP fake has stored a message matching the predicate. */
export async function waitForMail(
  match: (m: { recipients: string; subject: string; textBody: string | null }) => boolean,
  timeoutMs = 5000,
) {
  const { OutboxMessage } = await import("../../server/models/index.js");
  const start = Date.now();
  while (Date.now() - start < timeoutMs) {
    const all = await OutboxMessage.findAll({ order: [["receivedAt", "DESC"]] });
    const hit = all.find((m) => match(m));
    if (hit) return hit;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error("No matching e-mail reached the SMTP fake");
}
