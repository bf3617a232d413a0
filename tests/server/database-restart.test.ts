/**
 * The app survives PostgreSQL restarting under load: a real server process against its own cluster
 * (own folder and port; the shared test cluster is never stopped), `pg_ctl stop -m immediate` while
 * requests run, then start again. While the database is down: the process lives and answers 503;
 * afterwards it recovers by itself.
 */
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { ensureDatabase, ensureLocalPostgres, pgCtl, type LocalPostgres } from "../../scripts/lib/postgres.js";
import { hashPassword } from "../../server/auth/passwords.js";
import { childEnv, freePort, spawnTsx, waitFor, type Child } from "../setup/processes.js";

const EMAIL = "restart-check@test.invalid";
const PASSWORD = "correct-horse-battery";

let root: string;
let cluster: LocalPostgres;
let server: Child;
let base: string;

interface Session {
  cookie: string;
  csrf: string;
}

async function call(pathname: string, init: { method?: string; session?: Session; body?: unknown } = {}) {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (init.session) {
    headers.cookie = init.session.cookie;
    headers["x-csrf-token"] = init.session.csrf;
  }
  const res = await fetch(`${base}${pathname}`, {
    method: init.method ?? "GET",
    headers,
    body: init.body ? JSON.stringify(init.body) : undefined,
  });
  const text = await res.text();
  let body: unknown = text;
  try {
    body = JSON.parse(text);
  } catch {
    /* not JSON */
  }
  return {
    status: res.status,
    body: body as { error?: { code?: string; message?: string }; ok?: boolean; db?: string; token?: string },
    setCookie: res.headers.getSetCookie(),
  };
}

async function signIn(): Promise<Session> {
  const csrf = await call("/api/auth/csrf");
  const cookie = csrf.setCookie.map((c) => c.split(";")[0]).join("; ");
  const login = await call("/api/auth/login", {
    method: "POST",
    session: { cookie, csrf: csrf.body.token! },
    body: { email: EMAIL, password: PASSWORD },
  });
  expect(login.status).toBe(200);
  const signedCookie = login.setCookie.map((c) => c.split(";")[0]).join("; ") || cookie;
  const fresh = await call("/api/auth/csrf", { session: { cookie: signedCookie, csrf: "" } });
  return { cookie: signedCookie, csrf: fresh.body.token! };
}

beforeAll(async () => {
  root = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-restart-"));
  fs.chmodSync(root, 0o755);
  cluster = await ensureLocalPostgres({ dataDir: path.join(root, "pg"), port: await freePort(), durable: false });
  const databaseUrl = await ensureDatabase(cluster, "seamscene");
  const port = await freePort();
  base = `http://127.0.0.1:${port}`;
  server = spawnTsx(
    ["server/index.ts"],
    childEnv({
      NODE_ENV: "development",
      LOG_LEVEL: "warn",
      DATABASE_URL: databaseUrl,
      PORT: String(port),
      APP_URL: base,
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(await freePort()),
      STORAGE_DIR: path.join(root, "storage"),
      DATA_DIR: path.join(root, "data"),
      JOBS_ENABLED: "true",
    }),
  );
  await waitFor("the server to answer", async () => server.alive() && (await call("/api/health")).status === 200, 90_000).catch(
    (err: Error) => {
      throw new Error(`${err.message}\n${server.output()}`);
    },
  );
  const db = new pg.Client({ connectionString: databaseUrl });
  await db.connect();
  await db.query("INSERT INTO users (id, email, name, password_hash) VALUES (gen_random_uuid(), $1, 'Restart Check', $2)", [
    EMAIL,
    await hashPassword(PASSWORD),
  ]);
  await db.end();
}, 120_000);

afterAll(async () => {
  if (server?.alive()) {
    server.proc.kill("SIGTERM");
    await Promise.race([server.exited, new Promise((r) => setTimeout(r, 5000))]);
    if (server.alive()) server.proc.kill("SIGKILL");
  }
  cluster?.stop();
  if (root) fs.rmSync(root, { recursive: true, force: true });
});

describe("PostgreSQL restarting under load", () => {
  it("keeps the process alive, answers 503 while the database is down and recovers when it is back", async () => {
    const session = await signIn();
    expect((await call("/api/auth/me", { session })).status).toBe(200);

    type Seen = { phase: "up" | "down" | "back"; what: string; status: number; code?: string };
    const seen: Seen[] = [];
    let phase: Seen["phase"] = "up";
    let stop = false;
    let n = 0;
    // Every kind of database use: health, sessions (signed in and anonymous), the rate-limit store
    // (failed sign-ins), ordinary queries (productions list), and writes (a new production).
    const requests: Array<[string, () => ReturnType<typeof call>]> = [
      ["health", () => call("/api/health")],
      ["me", () => call("/api/auth/me", { session })],
      ["productions", () => call("/api/productions", { session })],
      ["csrf", () => call("/api/auth/csrf")],
      [
        "failed sign-in",
        () => call("/api/auth/login", { method: "POST", session, body: { email: `nobody-${n++}@test.invalid`, password: "wrong" } }),
      ],
      [
        "create",
        () =>
          call("/api/productions", {
            method: "POST",
            session,
            body: { title: `Restart ${n++}`, kind: "film", units: "cm", startsOn: "2030-09-01", endsOn: "2030-12-01" },
          }),
      ],
    ];
    const worker = async (offset: number) => {
      for (let i = offset; !stop; i++) {
        const [what, send] = requests[i % requests.length]!;
        const at = phase;
        try {
          const r = await send();
          seen.push({ phase: at, what, status: r.status, code: r.body?.error?.code });
        } catch (err) {
          seen.push({ phase: at, what, status: 0, code: (err as Error).message });
        }
      }
    };
    const load = Promise.all([0, 1, 2, 3, 4, 5].map(worker));

    await new Promise((r) => setTimeout(r, 2000));
    pgCtl(cluster.dataDir, ["-m", "immediate", "stop"]);
    phase = "down";
    await new Promise((r) => setTimeout(r, 4000));

    // Down: the process is alive and says so in the usual shapes.
    expect(server.alive(), server.output()).toBe(true);
    const health = await call("/api/health");
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ ok: false, db: "down" });
    const me = await call("/api/auth/me", { session });
    expect(me.status).toBe(503);
    expect(me.body.error?.code).toBe("database_unavailable");

    const again = await ensureLocalPostgres({ dataDir: cluster.dataDir, port: cluster.port, durable: false });
    expect(again.startedHere).toBe(true);
    phase = "back";
    // Back: the same session works again without a restart of the app.
    await waitFor(
      "the app to recover",
      async () => (await call("/api/health")).status === 200 && (await call("/api/auth/me", { session })).status === 200,
      60_000,
    );
    await new Promise((r) => setTimeout(r, 1500));
    stop = true;
    await load;

    expect(server.alive(), server.output()).toBe(true);
    const created = await call("/api/productions", {
      method: "POST",
      session,
      body: { title: "After the restart", kind: "film", units: "cm", startsOn: "2030-09-01", endsOn: "2030-12-01" },
    });
    expect(created.status).toBe(201);

    const down = seen.filter((s) => s.phase === "down");
    expect(down.length).toBeGreaterThan(20);
    // While down, every answer that needs the database is the 503 (the error shape, or health's own).
    // An anonymous CSRF token needs no database to be answered (its session, if any, is written after
    // the answer), so it may be a 200.
    const unexpected = down.filter(
      (s) => !(s.status === 503 && (s.code === "database_unavailable" || s.what === "health")) && !(s.what === "csrf" && s.status === 200),
    );
    expect(unexpected).toEqual([]);
    // No request anywhere in the run failed with a 500 or a dropped connection.
    expect(seen.filter((s) => s.status >= 500 && s.status !== 503)).toEqual([]);
    expect(seen.filter((s) => s.status === 0)).toEqual([]);
    expect(seen.filter((s) => s.phase === "up" && s.status === 200).length).toBeGreaterThan(5);
  }, 120_000);
});
