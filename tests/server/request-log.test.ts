import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, afterEach, beforeEach, describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app.js";
import { logFormat, logger, redirectLogs } from "../../server/lib/logger.js";
import { loggablePath } from "../../server/middleware/request-log.js";
import { buildMember, buildUser, TEST_PASSWORD } from "../factories.js";
import { anonymousAgent, resetDb, signedInAgent, waitForMail } from "../setup/http.js";
import { childEnv, freePort, spawnTsx, waitFor, type Child } from "../setup/processes.js";

const app = createApp();

/** Every cookie value a response set (name=value, the value alone, and the signed session id inside it). */
function cookieSecrets(res: request.Response): string[] {
  const raw = res.headers["set-cookie"] as unknown as string[] | undefined;
  const out: string[] = [];
  for (const c of raw ?? []) {
    const pair = c.split(";", 1)[0]!;
    const value = pair.slice(pair.indexOf("=") + 1);
    if (!value) continue;
    out.push(pair, value, decodeURIComponent(value));
    const sid = /^s:([^.]+)\./.exec(decodeURIComponent(value))?.[1];
    if (sid) out.push(sid);
  }
  return out;
}

describe("request log", () => {
  let lines: string[] = [];
  let restore: () => void = () => undefined;

  beforeEach(async () => {
    await resetDb();
    lines = [];
    restore = redirectLogs({ write: (line: string) => void lines.push(line) });
    logger.level = "info";
  });

  afterEach(() => {
    logger.level = "silent";
    restore();
  });

  it("holds no session cookie, CSRF token, reset token or invitation token, one short line per request", async () => {
    const { user: boss, production } = await buildMember("supervisor");
    await buildUser({ email: "forgetful@test.invalid" });
    const secrets: string[] = [];
    let requests = 0;

    // Sign in (the response sets the session cookie) and use the session.
    const anon = await anonymousAgent(app);
    secrets.push(anon.csrf);
    const login = await anon.post("/api/auth/login", { email: boss.email, password: TEST_PASSWORD }).expect(200);
    secrets.push(...cookieSecrets(login));
    const me = await anon.agent.get("/api/auth/me").expect(200);
    secrets.push(...cookieSecrets(me));
    requests += 3;
    // Invite, preview and accept with the token in the URL and the body.
    const boss2 = await signedInAgent(app, boss.email);
    secrets.push(boss2.csrf);
    requests += 3;
    await boss2.post(`/api/productions/${production.id}/invitations`, { email: "new.cutter@test.invalid", role: "cutter" }).expect(201);
    const invitationToken = /invitations\/([A-Za-z0-9_-]+)/.exec(
      (await waitForMail((m) => m.recipients.includes("new.cutter@test.invalid"))).textBody ?? "",
    )![1]!;
    const invitee = await anonymousAgent(app);
    await invitee.get(`/api/invitations/${invitationToken}?utm=1`).expect(200);
    const accepted = await invitee
      .post("/api/invitations/accept", { token: invitationToken, name: "Nell Cutter", password: "long-enough-password" })
      .expect(200);
    secrets.push(invitationToken, ...cookieSecrets(accepted));
    requests += 4;
    // Ask for a reset and use the link.
    const resetter = await anonymousAgent(app);
    await resetter.post("/api/auth/password-reset", { email: "forgetful@test.invalid" }).expect(202);
    const resetToken = /reset-password\/([A-Za-z0-9_-]+)/.exec(
      (await waitForMail((m) => m.recipients.includes("forgetful@test.invalid"))).textBody ?? "",
    )![1]!;
    const confirmed = await resetter
      .post("/api/auth/password-reset/confirm", { token: resetToken, password: "a-brand-new-password" })
      .expect(200);
    secrets.push(resetToken, ...cookieSecrets(confirmed));
    requests += 3;
    const log = lines.join("");

    expect(secrets.length).toBeGreaterThan(10);
    for (const secret of secrets) expect(log, `log holds ${secret.slice(0, 12)}…`).not.toContain(secret);
    expect(log).not.toMatch(/set-cookie|"cookie"/i);
    expect(log).not.toContain("forgetful@test.invalid");
    const requestLines = lines.map((l) => JSON.parse(l) as Record<string, unknown>).filter((e) => typeof e.status === "number");
    expect(requestLines).toHaveLength(requests);
    for (const e of requestLines) expect(e.msg).toMatch(/^(GET|POST) \/api\/\S* \d{3} \d+ms$/);
    expect(requestLines.map((e) => e.path)).toContain("/api/invitations/:token");
    expect(Object.keys(requestLines[0]!).sort()).toEqual(
      ["level", "method", "ms", "msg", "path", "status", "time", "pid", "hostname"].sort(),
    );
  });
});

describe("loggablePath", () => {
  it.each([
    ["/api/invitations/AbCdEfGhIjKlMnOpQrStUvWxYz0123456789_-abcde", "/api/invitations/:token"],
    ["/api/invitations/short", "/api/invitations/:token"],
    ["/api/invitations/accept", "/api/invitations/accept"],
    ["/reset-password/AbCdEfGhIjKlMnOpQrStUvWxYz0123456789_-abcde", "/reset-password/:token"],
    ["/api/auth/password-reset/confirm", "/api/auth/password-reset/confirm"],
    [
      "/api/productions/0b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f/invitations/1b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f",
      "/api/productions/0b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f/invitations/1b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f",
    ],
    [
      "/api/productions/0b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f/garments?q=Ivy+Example",
      "/api/productions/0b7c6c1e-2f0a-4c1e-9d7e-3a2b1c0d9e8f/garments",
    ],
    ["/api/something/QUJDREVGR0hJSktMTU5PUFFSU1RVVldY", "/api/something/:token"],
  ])("%s → %s", (url, expected) => {
    expect(loggablePath(url)).toBe(expected);
  });
});

describe("logged errors", () => {
  it("keep type, message, code and stack, never a database error's SQL or bound values", () => {
    const lines: string[] = [];
    const restore = redirectLogs({ write: (line: string) => void lines.push(line) });
    logger.level = "info";
    const err = Object.assign(new Error("relation went away"), {
      name: "SequelizeDatabaseError",
      sql: "SELECT * FROM users WHERE email = 'ivy@test.invalid'",
      parameters: ["ivy@test.invalid"],
      parent: { code: "57P01" },
    });

    logger.error({ err }, "request failed");
    logger.level = "silent";
    restore();

    const entry = JSON.parse(lines[0]!) as { err: Record<string, unknown> };
    expect(entry.err).toMatchObject({ type: "SequelizeDatabaseError", message: "relation went away", code: "57P01" });
    expect(lines[0]).not.toContain("ivy@test.invalid");
  });
});

describe("log format", () => {
  it("is one readable line in development and JSON in production and tests", () => {
    expect(logFormat({ NODE_ENV: "development" })).toBe("pretty");
    expect(logFormat({ NODE_ENV: "production" })).toBe("json");
    expect(logFormat({ NODE_ENV: "test" })).toBe("json");
  });
});

describe("the server process's log", () => {
  let child: Child | undefined;
  const root = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-log-"));

  afterEach(async () => {
    if (child?.alive()) {
      child.proc.kill("SIGTERM");
      await child.exited;
    }
    child = undefined;
  });

  afterAll(() => fs.rmSync(root, { recursive: true, force: true }));

  /** Starts server/index.ts, asks for a CSRF token (a cookie) and the health check, and returns what it printed. */
  async function runAndLog(nodeEnv: "development" | "production"): Promise<{ out: string; cookieValue: string }> {
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    child = spawnTsx(
      ["server/index.ts"],
      childEnv({
        NODE_ENV: nodeEnv,
        SESSION_SECRET: "Lr8-w2Qv9Zk4Tn7Yp1Xs6Bm3Hd0Jf5Gc_",
        LOG_LEVEL: "info",
        DATABASE_URL: process.env.DATABASE_URL,
        HOST: "127.0.0.1",
        PORT: String(port),
        APP_URL: base,
        STORAGE_DRIVER: "disk",
        STORAGE_DIR: path.join(root, nodeEnv, "storage"),
        DATA_DIR: path.join(root, nodeEnv, "data"),
        JOBS_ENABLED: "false",
        SMTP_HOST: "127.0.0.1",
        SMTP_PORT: String(await freePort()),
      }),
    );
    const c = child;
    await waitFor("the server", async () => c.alive() && (await fetch(`${base}/api/health`)).ok, 90_000).catch((err: Error) => {
      throw new Error(`${err.message}\n${c.output()}`);
    });
    const csrf = await fetch(`${base}/api/auth/csrf`);
    const cookieValue = csrf.headers.getSetCookie()[0]!.split(";", 1)[0]!.split("=")[1]!;
    await fetch(`${base}/api/auth/csrf`, { headers: { cookie: `seamscene.csrf=${cookieValue}` } });
    await waitFor("the request lines", () => (c.output().match(/\/api\/auth\/csrf 200/g) ?? []).length >= 2 || undefined, 20_000);
    return { out: c.output(), cookieValue };
  }

  it("is one readable line per request in development, without cookies", async () => {
    const { out, cookieValue } = await runAndLog("development");

    const requestLines = out.split("\n").filter((l) => l.includes("/api/auth/csrf"));
    expect(requestLines, out).toHaveLength(2);
    // "[17:35:02] INFO: GET /api/auth/csrf 200 4ms": time, level, the request; no JSON, no extra fields.
    for (const l of requestLines) expect(l).toMatch(/^\[\d\d:\d\d:\d\d\] INFO: GET \/api\/auth\/csrf 200 \d+ms$/);
    expect(out).not.toContain(cookieValue);
    expect(out).not.toContain(decodeURIComponent(cookieValue));
  }, 120_000);

  it("is JSON lines in production, without cookies", async () => {
    const { out, cookieValue } = await runAndLog("production");

    const requestLines = out.split("\n").filter((l) => l.includes("/api/auth/csrf"));
    expect(requestLines, out).toHaveLength(2);
    for (const l of requestLines)
      expect(JSON.parse(l)).toMatchObject({
        level: 30,
        method: "GET",
        path: "/api/auth/csrf",
        status: 200,
        msg: expect.stringMatching(/^GET \/api\/auth\/csrf 200 \d+ms$/),
      });
    expect(out).not.toContain(cookieValue);
    expect(out).not.toContain(decodeURIComponent(cookieValue));
  }, 120_000);
});
