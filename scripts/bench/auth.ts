// Benchmark for sign-in and password reset against a real server process (the thread-pool setting only
// means something in a process of its own):
//  1. password-reset answer time for an address with an account and one without (should match);
//  2. photo serving p50 idle and during a flood of sign-in attempts on 32 connections, once with the
//     settings `npm start` uses and once as before the fix (4 libuv threads, hashing not queued).
// Runs on a private database "seamscene_bench_auth" on the local cluster. Prints figures; asserts nothing.
import fs from "node:fs";
import http from "node:http";
import os from "node:os";
import path from "node:path";
import { randomBytes } from "node:crypto";
import { spawn, type ChildProcess } from "node:child_process";
import { performance } from "node:perf_hooks";
import { pathToFileURL } from "node:url";
import { dropDatabase, ensureDatabase, ensureLocalPostgres } from "../lib/postgres.js";
import { START_THREADPOOL_SIZE } from "../lib/threadpool.js";

const DB = "seamscene_bench_auth";
const FLOOD_CONNECTIONS = 32;
const PASSWORD = "bench-password-1234";

const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * p))]!;
const r1 = (x: number) => Math.round(x * 10) / 10;

interface Reply {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: string;
  ms: number;
}

function send(
  agent: http.Agent,
  port: number,
  method: string,
  urlPath: string,
  headers: Record<string, string> = {},
  body?: object,
): Promise<Reply> {
  return new Promise((resolve, reject) => {
    const payload = body ? JSON.stringify(body) : undefined;
    const t0 = performance.now();
    const req = http.request(
      {
        host: "127.0.0.1",
        port,
        method,
        path: urlPath,
        agent,
        headers: { ...headers, ...(payload ? { "content-type": "application/json", "content-length": Buffer.byteLength(payload) } : {}) },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on("data", (c: Buffer) => chunks.push(c));
        res.on("end", () =>
          resolve({
            status: res.statusCode ?? 0,
            headers: res.headers,
            body: Buffer.concat(chunks).toString("utf8"),
            ms: performance.now() - t0,
          }),
        );
      },
    );
    req.on("error", reject);
    if (payload) req.write(payload);
    req.end();
  });
}

/** name=value pairs of a response's cookies, joined for a Cookie header. */
function cookies(reply: Reply): string {
  return (reply.headers["set-cookie"] ?? []).map((c) => c.split(";", 1)[0]).join("; ");
}

const children = new Set<ChildProcess>();
// A bench stopped early must not leave a server behind.
process.once("exit", () => {
  for (const c of children) c.kill("SIGKILL");
});
for (const signal of ["SIGINT", "SIGTERM"] as const) process.once(signal, () => process.exit(1));

async function startServer(env: Record<string, string>, port: number): Promise<ChildProcess> {
  const child = spawn(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "server/index.ts"], {
    env: { ...process.env, ...env, PORT: String(port) },
    stdio: ["ignore", "ignore", "pipe"],
  });
  children.add(child);
  child.once("exit", () => children.delete(child));
  let stderr = "";
  child.stderr!.on("data", (c: Buffer) => (stderr += c.toString()));
  const agent = new http.Agent();
  for (let i = 0; i < 900; i++) {
    if (child.exitCode !== null) throw new Error(`bench server exited:\n${stderr}`);
    const ok = await send(agent, port, "GET", "/api/health").then(
      (r) => r.status === 200,
      () => false,
    );
    if (ok) return child;
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill();
  throw new Error(`bench server did not answer:\n${stderr}`);
}

async function stopServer(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null) return;
  const exited = new Promise((r) => child.once("exit", r));
  child.kill("SIGTERM");
  await Promise.race([exited, new Promise((r) => setTimeout(r, 8000))]);
  if (child.exitCode === null) child.kill("SIGKILL");
}

async function freePort(): Promise<number> {
  const srv = http.createServer();
  await new Promise<void>((r) => srv.listen(0, "127.0.0.1", () => r()));
  const port = (srv.address() as { port: number }).port;
  await new Promise((r) => srv.close(r));
  return port;
}

/** Figures from one flood run. */
interface FloodFigures {
  idleP50: number;
  floodP50: number;
  ratio: number;
  signInsPerSecond: number;
  signInP50: number;
  /** Photo requests during the flood that got no photo (e.g. 503 when the database pool was exhausted). */
  photoFailures: number;
  /** Sign-in attempts that got something other than 401. */
  signInFailures: number;
}

async function photoFlood(port: number, email: string, photoUrl: string): Promise<FloodFigures> {
  const one = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const csrf = await send(one, port, "GET", "/api/auth/csrf");
  const anonCookie = cookies(csrf);
  const token = (JSON.parse(csrf.body) as { token: string }).token;
  const login = await send(
    one,
    port,
    "POST",
    "/api/auth/login",
    { cookie: anonCookie, "x-csrf-token": token },
    { email, password: PASSWORD },
  );
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status} ${login.body}`);
  const session = cookies(login);
  let photoFailures = 0;
  const photo = async (failuresAllowed = false) => {
    const r = await send(one, port, "GET", photoUrl, { cookie: session });
    if (r.status !== 200) {
      if (!failuresAllowed) throw new Error(`photo answered ${r.status}`);
      photoFailures++;
    }
    return r.ms;
  };
  const progress = (what: string) => process.stderr.write(`  … ${what}\n`);
  for (let i = 0; i < 10; i++) await photo(); // warm up
  progress("photos idle");
  const idle: number[] = [];
  for (let i = 0; i < 60; i++) idle.push(await photo());

  // The flood: wrong passwords for a real account on 32 connections (limits raised for the bench, as
  // from many addresses); each attempt costs one password hash.
  const floodAgent = new http.Agent({ keepAlive: true, maxSockets: FLOOD_CONNECTIONS });
  let running = true;
  const signIns: number[] = [];
  let signInFailures = 0;
  const loops = Array.from({ length: FLOOD_CONNECTIONS }, async () => {
    while (running) {
      const r = await send(
        floodAgent,
        port,
        "POST",
        "/api/auth/login",
        { cookie: anonCookie, "x-csrf-token": token },
        { email, password: "wrong-password-x" },
      );
      // A refused attempt (503 when the server is overwhelmed) is counted, not fatal: it is what the bench shows.
      if (r.status !== 401) signInFailures++;
      else signIns.push(r.ms);
    }
  });
  await new Promise((r) => setTimeout(r, 1500)); // let the queue fill
  progress("photos during the flood");
  const t0 = performance.now();
  const during: number[] = [];
  // Up to 40 photos, or as many as 20 s allow (at least 5): before the fix each can take seconds.
  while (during.length < 40 && (during.length < 5 || performance.now() - t0 < 20_000)) during.push(await photo(true));
  const seconds = (performance.now() - t0) / 1000;
  const countDuring = signIns.length;
  running = false;
  progress("waiting for the flood to drain");
  await Promise.all(loops);
  floodAgent.destroy();
  one.destroy();
  const idleP50 = pct(idle, 0.5);
  const floodP50 = pct(during, 0.5);
  return {
    idleP50,
    floodP50,
    ratio: floodP50 / idleP50,
    signInsPerSecond: countDuring / Math.max(seconds, 0.001),
    signInP50: signIns.length ? pct(signIns, 0.5) : NaN,
    photoFailures,
    signInFailures,
  };
}

/** Runs both measurements and prints them. */
export async function runAuthBench(): Promise<{
  reset: { knownP50: number; unknownP50: number };
  fixed: FloodFigures;
  before: FloodFigures;
}> {
  const pg = await ensureLocalPostgres({
    dataDir: process.env.PGDATA_DIR ?? path.resolve(".data/pg"),
    port: Number(process.env.PGPORT ?? 5433),
  });
  await dropDatabase(pg.adminUrl, DB);
  const databaseUrl = await ensureDatabase(pg, DB);
  const storageDir = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-bench-auth-"));
  Object.assign(process.env, {
    DATABASE_URL: databaseUrl,
    NODE_ENV: "test",
    LOG_LEVEL: "silent",
    STORAGE_DIR: storageDir,
    STORAGE_DRIVER: "disk",
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: "0",
  });

  // Data, made in this process: an account, a production and one stored photo.
  const { sequelize } = await import("../../server/db.js");
  const { migrate } = await import("../../server/migrator.js");
  await migrate(sequelize);
  const { startSmtpFake } = await import("../../server/lib/smtp-fake.js");
  const smtp = await startSmtpFake({ port: 0 });
  const { createApp, closeAppResources } = await import("../../server/app.js");
  const { Production, Membership, User } = await import("../../server/models/index.js");
  const { hashPassword } = await import("../../server/auth/passwords.js");
  const { default: request } = await import("supertest");
  const sharp = (await import("sharp")).default;
  const user = await User.create({
    email: "bench@bench.invalid",
    name: "Bench",
    passwordHash: await hashPassword(PASSWORD),
    isActive: true,
    lastProductionId: null,
  });
  const p = await Production.create({ title: "Bench photos", kind: "film", startsOn: null, endsOn: null, createdBy: null });
  await Membership.create({ productionId: p.id, userId: user.id, role: "supervisor" });
  const app = createApp();
  const agent = request.agent(app);
  const tok = async () => (await agent.get("/api/auth/csrf")).body.token as string;
  const first = await tok();
  await agent.post("/api/auth/login").set("X-CSRF-Token", first).send({ email: user.email, password: PASSWORD }).expect(200);
  const csrf = await tok();
  const [scene] = await sequelize.query<{ id: string }>(
    `INSERT INTO scenes (id, production_id, number, story_order) VALUES (gen_random_uuid(), :pid, '1', 1) RETURNING id`,
    { replacements: { pid: p.id }, type: (await import("sequelize")).QueryTypes.SELECT },
  );
  const jpeg = await sharp({ create: { width: 1600, height: 1200, channels: 3, background: { r: 180, g: 150, b: 120 } } })
    .jpeg({ quality: 85 })
    .toBuffer();
  const uploaded = await agent
    .post(`/api/productions/${p.id}/photos`)
    .set("X-CSRF-Token", csrf)
    .field("ownerType", "scene")
    .field("ownerId", scene!.id)
    .field("view", "front")
    .attach("file", jpeg, { filename: "frame.jpg", contentType: "image/jpeg" })
    .expect(201);
  const photoUrl = `/api/productions/${p.id}/photos/${uploaded.body.data.id as string}/file?size=display`;

  const serverEnv = {
    NODE_ENV: "production",
    SESSION_SECRET: randomBytes(32).toString("base64"),
    HOST: "127.0.0.1",
    LOG_LEVEL: "warn",
    SMTP_PORT: String(smtp.port),
    LOGIN_MAX_FAILURES: "1000000000",
    LOGIN_MAX_FAILURES_PER_CLIENT: "1000000000",
  };

  // 1. Password reset: the answer for an address with an account and for one without.
  const port = await freePort();
  let child = await startServer(
    { ...serverEnv, APP_URL: `http://127.0.0.1:${port}`, UV_THREADPOOL_SIZE: String(START_THREADPOOL_SIZE) },
    port,
  );
  const a = new http.Agent({ keepAlive: true, maxSockets: 1 });
  const c = await send(a, port, "GET", "/api/auth/csrf");
  const resetHeaders = { cookie: cookies(c), "x-csrf-token": (JSON.parse(c.body) as { token: string }).token };
  const known: number[] = [];
  const unknown: number[] = [];
  for (let i = 0; i < 25; i++) {
    for (const [email, into] of [
      [user.email, known],
      [`nobody${i}@bench.invalid`, unknown],
    ] as const) {
      // The reset limiter allows 5 an hour per address; the bench clears it.
      await sequelize.query("DELETE FROM rate_limit_hits");
      const r = await send(a, port, "POST", "/api/auth/password-reset", resetHeaders, { email });
      if (r.status !== 202) throw new Error(`reset answered ${r.status}: ${r.body}`);
      if (i >= 5) into.push(r.ms); // the first five warm up
    }
  }
  a.destroy();
  const reset = { knownP50: r1(pct(known, 0.5)), unknownP50: r1(pct(unknown, 0.5)) };
  console.log(
    `Password reset answer, p50 of ${known.length}: address with an account ${reset.knownP50} ms, without ${reset.unknownP50} ms (ratio ${(reset.knownP50 / reset.unknownP50).toFixed(2)}; the e-mail goes through the job queue)`,
  );

  const line = (label: string, f: FloodFigures) =>
    `${label}: photo p50 idle ${r1(f.idleP50)} ms, during a ${FLOOD_CONNECTIONS}-connection sign-in flood ${r1(f.floodP50)} ms → ${f.ratio.toFixed(1)}× (target ≤ 3×); ` +
    `sign-ins ${Math.round(f.signInsPerSecond)}/s, p50 ${Math.round(f.signInP50)} ms; refused: ${f.photoFailures} photos, ${f.signInFailures} sign-ins`;

  // 2. Photo serving during a sign-in flood, as `npm start` runs it.
  const fixed = await photoFlood(port, user.email, photoUrl);
  await stopServer(child);
  console.log(line(`As npm start runs it (UV_THREADPOOL_SIZE=${START_THREADPOOL_SIZE}, hashes queued)`, fixed));
  // The same before the fix: Node's default 4 threads and every hash at once.
  const port2 = await freePort();
  child = await startServer({ ...serverEnv, APP_URL: `http://127.0.0.1:${port2}`, UV_THREADPOOL_SIZE: "4", HASH_CONCURRENCY: "64" }, port2);
  const before = await photoFlood(port2, user.email, photoUrl);
  await stopServer(child);
  console.log(line("Before the fix (4 threads, hashes unqueued)", before));
  console.log(`Machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, Node ${process.version}`);

  await closeAppResources();
  await smtp.close();
  await sequelize.close();
  await dropDatabase(pg.adminUrl, DB);
  fs.rmSync(storageDir, { recursive: true, force: true });
  return { reset, fixed, before };
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  await runAuthBench().catch((err: unknown) => {
    console.error(err);
    process.exit(1);
  });
}
