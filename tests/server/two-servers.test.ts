/**
 * Two Seamscene server processes against one PostgreSQL and one S3 store (s3rver), behind a
 * round-robin proxy (http-proxy): what a department does through one server holds on the other —
 * the session and its CSRF token, the sign-in throttle, snags cached in memory after a write on the
 * other server, and a photo uploaded through one and served by the other.
 */
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import httpProxy from "http-proxy";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "../../server/db.js";
import { seedDemo } from "../../seeds/index.js";
import { SALTMARSH_ID, DEMO_PASSWORD } from "../../seeds/accounts.js";
import { resetDb } from "../setup/http.js";
import { childEnv, freePort, spawnTsx, waitFor, type Child } from "../setup/processes.js";
import { testToday } from "../setup/test-clock.js";

const LOGIN_MAX_FAILURES = 3;
let root: string;
let s3: S3rver;
let servers: Array<{ child: Child; url: string }> = [];
let proxyServer: http.Server;
let proxyUrl: string;
const hits = new Map<string, number>();

interface Session {
  cookie: string;
  csrf: string;
}

async function call(
  base: string,
  pathname: string,
  init: { method?: string; session?: Partial<Session>; body?: unknown; form?: FormData } = {},
) {
  const headers: Record<string, string> = {};
  if (init.session?.cookie) headers.cookie = init.session.cookie;
  if (init.session?.csrf) headers["x-csrf-token"] = init.session.csrf;
  if (init.body !== undefined) headers["content-type"] = "application/json";
  const res = await fetch(`${base}${pathname}`, {
    method: init.method ?? "GET",
    headers,
    body: init.form ?? (init.body !== undefined ? JSON.stringify(init.body) : undefined),
  });
  const buf = Buffer.from(await res.arrayBuffer());
  let body: any = null; // eslint-disable-line @typescript-eslint/no-explicit-any
  try {
    body = JSON.parse(buf.toString("utf8"));
  } catch {
    /* not JSON */
  }
  return { status: res.status, body, buf, setCookie: res.headers.getSetCookie() };
}

const cookieOf = (setCookie: string[], prev = "") => setCookie.map((c) => c.split(";")[0]).join("; ") || prev;

/** Signs in with each step on the next server in turn (csrf on one, sign-in on the other). */
async function signIn(bases: string[], email: string, password: string): Promise<Session> {
  const csrf = await call(bases[0]!, "/api/auth/csrf");
  const cookie = cookieOf(csrf.setCookie);
  const login = await call(bases[1 % bases.length]!, "/api/auth/login", {
    method: "POST",
    session: { cookie, csrf: csrf.body.token },
    body: { email, password },
  });
  expect(login.status).toBe(200);
  const signed = cookieOf(login.setCookie, cookie);
  const fresh = await call(bases[0]!, "/api/auth/csrf", { session: { cookie: signed } });
  return { cookie: signed, csrf: fresh.body.token };
}

beforeAll(async () => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-two-"));
  await resetDb();
  await seedDemo({ today: testToday() });
  s3 = new S3rver({
    port: 0,
    address: "127.0.0.1",
    silent: true,
    directory: path.join(root, "s3"),
    configureBuckets: [{ name: "seamscene-two" }],
  });
  const s3port = ((await s3.run()) as { port: number }).port;

  const databaseUrl = process.env.DATABASE_URL!;
  for (const name of ["a", "b"]) {
    const port = await freePort();
    const url = `http://127.0.0.1:${port}`;
    const child = spawnTsx(
      ["server/index.ts"],
      childEnv({
        NODE_ENV: "development",
        LOG_LEVEL: "warn",
        DATABASE_URL: databaseUrl,
        PORT: String(port),
        APP_URL: url,
        SESSION_SECRET: "two-servers-session-secret-0123456789",
        SMTP_HOST: "127.0.0.1",
        SMTP_PORT: String(await freePort()),
        STORAGE_DRIVER: "s3",
        S3_ENDPOINT: `http://127.0.0.1:${s3port}`,
        S3_BUCKET: "seamscene-two",
        DATA_DIR: path.join(root, `data-${name}`),
        JOBS_ENABLED: "false",
        LOGIN_MAX_FAILURES: String(LOGIN_MAX_FAILURES),
      }),
    );
    servers.push({ child, url });
  }
  for (const s of servers) {
    await waitFor("a server to answer", async () => s.child.alive() && (await call(s.url, "/api/health")).status === 200, 240_000).catch(
      (err: Error) => {
        throw new Error(`${err.message}\n${s.child.output()}`);
      },
    );
  }

  const proxy = httpProxy.createProxyServer({});
  let next = 0;
  proxyServer = http.createServer((req, res) => {
    const target = servers[next++ % servers.length]!.url;
    hits.set(target, (hits.get(target) ?? 0) + 1);
    proxy.web(req, res, { target }, (err) => {
      res.writeHead(502).end(String(err));
    });
  });
  await new Promise<void>((r) => proxyServer.listen(0, "127.0.0.1", r));
  proxyUrl = `http://127.0.0.1:${(proxyServer.address() as { port: number }).port}`;
}, 360_000);

afterAll(async () => {
  await new Promise((r) => proxyServer?.close(r));
  for (const s of servers) {
    s.child.proc.kill("SIGTERM");
    await Promise.race([s.child.exited, new Promise((r) => setTimeout(r, 10_000))]);
    if (s.child.alive()) s.child.proc.kill("SIGKILL");
  }
  servers = [];
  await s3?.close();
  fs.rmSync(root, { recursive: true, force: true });
}, 60_000);

describe("two servers behind a round-robin proxy", () => {
  it("signs in through one and works through the other, the CSRF token valid on both", async () => {
    const [a, b] = servers.map((s) => s.url) as [string, string];
    const session = await signIn([a, b], "supervisor@seamscene.test", DEMO_PASSWORD);

    const meOnA = await call(a, "/api/auth/me", { session });
    const meOnB = await call(b, "/api/auth/me", { session });
    // A write on each server with the token one of them issued.
    const onA = await call(a, `/api/productions/${SALTMARSH_ID}/garments`, {
      method: "POST",
      session,
      body: { name: "Proxy check coat A", category: "coat", source: "built" },
    });
    const onB = await call(b, `/api/productions/${SALTMARSH_ID}/garments`, {
      method: "POST",
      session,
      body: { name: "Proxy check coat B", category: "coat", source: "built" },
    });
    const viaProxy = await Promise.all(
      [1, 2, 3, 4].map(() => call(proxyUrl, `/api/productions/${SALTMARSH_ID}/garments?q=Proxy%20check`, { session })),
    );

    expect(meOnA.status).toBe(200);
    expect(meOnB.body.data.email).toBe("supervisor@seamscene.test");
    expect([onA.status, onB.status]).toEqual([201, 201]);
    expect(viaProxy.map((r) => r.body.data.map((g: { name: string }) => g.name).sort())).toEqual(
      Array(4).fill(["Proxy check coat A", "Proxy check coat B"]),
    );
    expect([...hits.values()]).toEqual([2, 2]); // the proxy sent two of the four to each server
  });

  it("clears the snags one server keeps in memory when the other writes", async () => {
    const [a, b] = servers.map((s) => s.url) as [string, string];
    const session = await signIn([b, a], "supervisor@seamscene.test", DEMO_PASSWORD);
    const before = await call(b, `/api/productions/${SALTMARSH_ID}/snags`, { session });
    await call(b, `/api/productions/${SALTMARSH_ID}/snags`, { session }); // now answered from B's memory
    const snag = before.body.data.snags[0] as { key: string };
    expect(snag).toBeDefined();

    const dismissed = await call(a, `/api/productions/${SALTMARSH_ID}/snags/dismissals`, {
      method: "POST",
      session,
      body: { snagKey: snag.key, reason: "Accepted by the designer" },
    });
    const after = await call(b, `/api/productions/${SALTMARSH_ID}/snags`, { session });

    expect(dismissed.status).toBe(201);
    expect(after.body.data.counts.dismissed).toBe(before.body.data.counts.dismissed + 1);
    expect(after.body.data.snags.map((s: { key: string }) => s.key)).not.toContain(snag.key);
  });

  it("serves a photo uploaded through one server from the other", async () => {
    const [a, b] = servers.map((s) => s.url) as [string, string];
    const session = await signIn([a, b], "supervisor@seamscene.test", DEMO_PASSWORD);
    const [scene] = await sequelize.query<{ id: string }>(`SELECT id FROM scenes WHERE production_id = :pid ORDER BY story_order LIMIT 1`, {
      replacements: { pid: SALTMARSH_ID },
      type: "SELECT" as never,
    });
    const form = new FormData();
    form.set("ownerType", "scene");
    form.set("ownerId", scene!.id);
    form.set("view", "front");
    form.set(
      "file",
      new Blob([fs.readFileSync(path.resolve("tests/fixtures/gps-rotated.jpg"))], { type: "image/jpeg" }),
      "gps-rotated.jpg",
    );

    const up = await call(a, `/api/productions/${SALTMARSH_ID}/photos`, { method: "POST", session, form });
    const file = await call(b, `/api/productions/${SALTMARSH_ID}/photos/${up.body?.data?.id}/file?size=thumb`, { session });

    expect(up.status).toBe(201);
    expect(file.status).toBe(200);
    // Stored sizes are WebP: a RIFF container whose form type is "WEBP" (RFC 9649, the WebP file header).
    expect(file.buf.subarray(0, 4).toString("latin1")).toBe("RIFF");
    expect(file.buf.subarray(8, 12).toString("latin1")).toBe("WEBP");
  });

  it("counts failed sign-ins across both servers", async () => {
    const [a, b] = servers.map((s) => s.url) as [string, string];
    const attempt = async (base: string) => {
      const csrf = await call(base, "/api/auth/csrf");
      return (
        await call(base, "/api/auth/login", {
          method: "POST",
          session: { cookie: cookieOf(csrf.setCookie), csrf: csrf.body.token },
          body: { email: "cutter@seamscene.test", password: "not-the-password" },
        })
      ).status;
    };

    const statuses: number[] = [];
    for (let i = 0; i < LOGIN_MAX_FAILURES; i++) statuses.push(await attempt(i % 2 ? b : a));
    const nextOnA = await attempt(a);
    const nextOnB = await attempt(b);

    expect(statuses).toEqual(Array(LOGIN_MAX_FAILURES).fill(401));
    expect([nextOnA, nextOnB]).toEqual([429, 429]);
  });
});
