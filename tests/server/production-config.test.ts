import { describe, expect, it } from "vitest";
import fs from "node:fs";
import http from "node:http";
import path from "node:path";
import { spawn, spawnSync } from "node:child_process";
import { ConfigError, parseConfig } from "../../server/config.js";
import { hashConcurrency } from "../../server/auth/passwords.js";
import { startBanner } from "../../scripts/lib/banner.js";
import { START_THREADPOOL_SIZE } from "../../scripts/lib/threadpool.js";
import { buildUser, TEST_PASSWORD } from "../factories.js";

const SECRET = "k3J9w-Qx7vB2pL0sTz8aYc4NmR6uE1dHfG5";
const tsx = path.resolve("node_modules/tsx/dist/cli.mjs");

describe("parseConfig in production", () => {
  it("refuses to start without SESSION_SECRET, naming the variable", () => {
    expect(() => parseConfig({ NODE_ENV: "production" })).toThrow(ConfigError);
    expect(() => parseConfig({ NODE_ENV: "production" })).toThrow(/SESSION_SECRET/);
  });

  it.each([
    ["the public development default", "seamscene-development-session-secret"],
    ["a short one", "abcdefghijklmnopq"],
    ["a repeated character", "a".repeat(40)],
  ])("refuses %s", (_label, secret) => {
    expect(() => parseConfig({ NODE_ENV: "production", SESSION_SECRET: secret })).toThrow(/SESSION_SECRET/);
  });

  it("turns on Secure cookies, HSTS and the proxy trust (loopback listener) for an https APP_URL, and the outbox off", () => {
    const c = parseConfig({
      NODE_ENV: "production",
      SESSION_SECRET: SECRET,
      APP_URL: "https://costumes.example.invalid",
      DEV_OUTBOX: "true",
    });

    expect(c).toMatchObject({ SECURE_COOKIES: true, HSTS: true, TRUST_PROXY: true, DEV_OUTBOX: false });
  });

  it("does not trust forwarded headers when listening on every interface unless told to", () => {
    expect(
      parseConfig({ NODE_ENV: "production", SESSION_SECRET: SECRET, APP_URL: "https://x.example.invalid", HOST: "0.0.0.0" }).TRUST_PROXY,
    ).toBe(false);
    expect(
      parseConfig({
        NODE_ENV: "production",
        SESSION_SECRET: SECRET,
        APP_URL: "https://x.example.invalid",
        HOST: "0.0.0.0",
        TRUST_PROXY: "true",
      }).TRUST_PROXY,
    ).toBe(true);
  });

  it("refuses SECURE_COOKIES=false with an https APP_URL", () => {
    expect(() =>
      parseConfig({ NODE_ENV: "production", SESSION_SECRET: SECRET, APP_URL: "https://x.example.invalid", SECURE_COOKIES: "false" }),
    ).toThrow(/SECURE_COOKIES/);
  });

  it("keeps development convenient: a fixed secret, plain cookies on http, the outbox on", () => {
    const c = parseConfig({});

    expect(c).toMatchObject({ NODE_ENV: "development", SECURE_COOKIES: false, HSTS: false, TRUST_PROXY: false, DEV_OUTBOX: true });
    expect(c.SESSION_SECRET.length).toBeGreaterThanOrEqual(16);
  });
});

describe("npm start", () => {
  it("lists demo accounts and their password outside production only", () => {
    const demoAccounts = [{ role: "supervisor", email: "supervisor@seamscene.test", password: "seamscene-demo" }];
    const base = { url: "http://127.0.0.1:3000", seeded: true, mailTo: "relay", demoAccounts };

    expect(startBanner({ ...base, production: false }).join("\n")).toContain("seamscene-demo");
    const prod = startBanner({ ...base, production: true }).join("\n");
    expect(prod).not.toContain("seamscene-demo");
    expect(prod).not.toContain("supervisor@seamscene.test");
  });

  it("starts Node with libuv's thread pool sized (package.json), since Node reads it before any code runs", () => {
    const pkg = JSON.parse(fs.readFileSync("package.json", "utf8")) as { scripts: Record<string, string> };

    expect(pkg.scripts.start).toMatch(
      new RegExp(`^UV_THREADPOOL_SIZE=\\$\\{UV_THREADPOOL_SIZE:-${START_THREADPOOL_SIZE}\\} tsx scripts/start\\.ts$`),
    );
    // Hashing takes at most half the pool (and leaves a core free), so file reads always find a thread.
    expect(hashConcurrency({ HASH_CONCURRENCY: undefined, UV_THREADPOOL_SIZE: START_THREADPOOL_SIZE }, 2)).toBe(1);
    expect(hashConcurrency({ HASH_CONCURRENCY: undefined, UV_THREADPOOL_SIZE: 4 }, 16)).toBe(2);
    expect(hashConcurrency({ HASH_CONCURRENCY: 3, UV_THREADPOOL_SIZE: 4 }, 16)).toBe(3);
  });
});

function get(
  port: number,
  urlPath: string,
  headers: Record<string, string> = {},
  body?: object,
): Promise<{ status: number; headers: http.IncomingHttpHeaders; text: string }> {
  return new Promise((resolve, reject) => {
    const payload = body ? JSON.stringify(body) : undefined;
    const req = http.request(
      {
        host: "127.0.0.1",
        port,
        path: urlPath,
        method: body ? "POST" : "GET",
        headers: { ...headers, ...(payload ? { "content-type": "application/json" } : {}) },
      },
      (res) => {
        let text = "";
        res.on("data", (c: Buffer) => (text += c.toString()));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, text }));
      },
    );
    req.on("error", reject);
    req.end(payload);
  });
}

describe("the server process with NODE_ENV=production", () => {
  it("exits at once with a message naming SESSION_SECRET when it is missing", () => {
    const env = { ...process.env, NODE_ENV: "production", SESSION_SECRET: "", PORT: "0" };
    delete (env as Record<string, string | undefined>).SESSION_SECRET;

    const res = spawnSync(process.execPath, [tsx, "server/index.ts"], { env, encoding: "utf8", timeout: 60_000 });

    expect(res.status).toBe(1);
    expect(res.stderr).toMatch(/SESSION_SECRET: set a long random secret/);
    expect(res.stderr).not.toMatch(/\n\s+at /); // a message for the operator, not a stack trace
  }, 70_000);

  it("behind https sends HSTS and Secure cookies, and has no outbox", async () => {
    const user = await buildUser({ email: "prod.supervisor@test.invalid" });
    const { Membership } = await import("../../server/models/index.js");
    const { buildProduction } = await import("../factories.js");
    const production = await buildProduction();
    await Membership.create({ productionId: production.id, userId: user.id, role: "supervisor" });
    const probe = http.createServer();
    await new Promise<void>((r) => probe.listen(0, "127.0.0.1", () => r()));
    const port = (probe.address() as { port: number }).port;
    await new Promise((r) => probe.close(r));
    const child = spawn(process.execPath, [tsx, "server/index.ts"], {
      env: {
        ...process.env,
        NODE_ENV: "production",
        SESSION_SECRET: SECRET,
        APP_URL: "https://costumes.example.invalid",
        HOST: "127.0.0.1",
        PORT: String(port),
        JOBS_ENABLED: "false",
        LOG_LEVEL: "warn",
      },
      stdio: ["ignore", "pipe", "pipe"],
    });
    let output = "";
    child.stdout!.on("data", (c: Buffer) => (output += c.toString()));
    child.stderr!.on("data", (c: Buffer) => (output += c.toString()));
    try {
      const https = { "x-forwarded-proto": "https" };
      let health = { status: 0 };
      for (let i = 0; i < 600 && health.status !== 200; i++) {
        health = await get(port, "/api/health", https).catch(() => ({ status: 0 }));
        if (health.status !== 200) await new Promise((r) => setTimeout(r, 100));
      }
      expect(health.status, output).toBe(200);

      const csrf = await get(port, "/api/auth/csrf", https);
      const csrfCookie = (csrf.headers["set-cookie"] ?? []).join("\n");
      const token = (JSON.parse(csrf.text) as { token: string }).token;
      const login = await get(
        port,
        "/api/auth/login",
        { ...https, cookie: csrfCookie.split(";", 1)[0]!, "x-csrf-token": token },
        { email: user.email, password: TEST_PASSWORD },
      );
      const sessionCookie = (login.headers["set-cookie"] ?? []).find((c) => c.startsWith("seamscene.sid="))!;
      const outbox = await get(port, `/api/productions/${production.id}/outbox`, { ...https, cookie: sessionCookie.split(";", 1)[0]! });

      expect(csrf.headers["strict-transport-security"]).toMatch(/max-age=31536000/);
      expect(csrfCookie).toMatch(/; Secure/i);
      expect(login.status).toBe(200);
      expect(sessionCookie).toMatch(/; Secure/i);
      expect(outbox.status).toBe(404);
    } finally {
      child.kill("SIGTERM");
    }
  }, 90_000);
});
