// Child processes for the API benchmarks: a fresh database, a Seamscene server and the bare
// comparison server, each started and stopped by the bench itself.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { dropDatabase, ensureDatabase, ensureLocalPostgres, type DatabaseAdmin } from "../../lib/postgres.js";

export const tsxCli = path.resolve("node_modules/tsx/dist/cli.mjs");

/** Production mode refuses the public development secret, for the seed as for the server. */
const BENCH_SESSION_SECRET = "bench-session-secret-0123456789abcdef";

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

/** A fresh database `name` on the local cluster (PGPORT / PGDATA_DIR, as `npm start` uses), or on DATABASE_URL's server
 * (whose role must be allowed to create databases). */
export async function freshDatabase(name: string): Promise<string> {
  let admin: DatabaseAdmin;
  if (process.env.DATABASE_URL) {
    const url = new URL(process.env.DATABASE_URL);
    const onDatabase = (db: string) => Object.assign(new URL(url.href), { pathname: `/${db}` }).href;
    admin = {
      adminUrl: onDatabase("postgres"),
      app: { user: decodeURIComponent(url.username), password: decodeURIComponent(url.password) },
      appUrl: onDatabase,
    };
  } else {
    admin = await ensureLocalPostgres({
      dataDir: process.env.PGDATA_DIR ?? path.resolve(".data/pg"),
      port: Number(process.env.PGPORT ?? 5433),
    });
  }
  await dropDatabase(admin.adminUrl, name);
  return ensureDatabase(admin, name);
}

/** Each bench database keeps its photos apart: a server's start-up sweep removes files its own database does not know. */
function storageDirFor(databaseUrl: string): string {
  return path.join(".data/bench-storage", new URL(databaseUrl).pathname.replace(/^\//, ""));
}

/** Runs `npm run seed` (migrations and the demo, plus `extraArgs`) against a database; throws on failure. */
export function seedDatabase(databaseUrl: string, extraArgs: string[] = [], env: NodeJS.ProcessEnv = {}): string {
  const res = spawnSync(process.execPath, [tsxCli, "scripts/seed.ts", ...extraArgs], {
    env: {
      ...process.env,
      SESSION_SECRET: BENCH_SESSION_SECRET,
      STORAGE_DIR: storageDirFor(databaseUrl),
      ...env,
      DATABASE_URL: databaseUrl,
      NODE_ENV: "production",
      LOG_LEVEL: "warn",
    },
    encoding: "utf8",
  });
  if (res.status !== 0) throw new Error(`Seeding failed:\n${res.stdout}\n${res.stderr}`);
  return res.stdout.trim();
}

export interface Running {
  child: ChildProcess;
  url: string;
  /** Resident memory of the process now (MB), from /proc. */
  rssMb: () => number;
  /** CPU time the process has used so far (ms, user + system), from /proc. */
  cpuMs: () => number;
  stop: () => Promise<void>;
}

function rssOf(pid: number | undefined): number {
  if (!pid) return NaN;
  try {
    const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
    const kb = Number(/VmRSS:\s+(\d+)/.exec(status)?.[1]);
    return kb / 1024;
  } catch {
    return NaN;
  }
}

function cpuOf(pid: number | undefined): number {
  if (!pid) return NaN;
  try {
    // Fields after the command name: utime and stime are the 12th and 13th (clock ticks, 100 per second).
    const rest = fs.readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]!.split(" ");
    return (Number(rest[11]) + Number(rest[12])) * 10;
  } catch {
    return NaN;
  }
}

async function waitUntil(
  check: () => Promise<boolean>,
  child: ChildProcess,
  output: () => string,
  what: string,
  ms = 90_000,
): Promise<void> {
  const deadline = Date.now() + ms;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`${what} exited:\n${output()}`);
    if (await check().catch(() => false)) return;
    if (Date.now() > deadline) throw new Error(`${what} did not come up:\n${output()}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

function stopper(child: ChildProcess): () => Promise<void> {
  return () =>
    new Promise((resolve) => {
      if (child.exitCode !== null) return resolve();
      const t = setTimeout(() => child.kill("SIGKILL"), 5000);
      child.once("exit", () => {
        clearTimeout(t);
        resolve();
      });
      child.kill("SIGTERM");
    });
}

/**
 * Starts `server/index.ts` as a production server (no job queue unless asked), its log going to
 * `logFile` so writing it costs what it costs in production.
 */
export async function startSeamscene(opts: {
  databaseUrl: string;
  env?: NodeJS.ProcessEnv;
  logFile: string;
  nodeArgs?: string[];
}): Promise<Running> {
  const port = await freePort();
  fs.mkdirSync(path.dirname(opts.logFile), { recursive: true });
  const log = fs.openSync(opts.logFile, "w");
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    DATABASE_URL: opts.databaseUrl,
    PORT: String(port),
    APP_URL: `http://127.0.0.1:${port}`,
    SESSION_SECRET: BENCH_SESSION_SECRET,
    JOBS_ENABLED: "false",
    LOG_LEVEL: "info",
    STORAGE_DIR: storageDirFor(opts.databaseUrl),
    ...opts.env,
  };
  const child = spawn(process.execPath, [...(opts.nodeArgs ?? []), "--import", "tsx", "server/index.ts"], {
    env,
    stdio: ["ignore", log, log],
  });
  const url = `http://127.0.0.1:${port}`;
  await waitUntil(
    async () => (await fetch(`${url}/api/health`)).ok,
    child,
    () => fs.readFileSync(opts.logFile, "utf8").slice(-4000),
    "The Seamscene server",
  );
  fs.closeSync(log);
  return { child, url, rssMb: () => rssOf(child.pid), cpuMs: () => cpuOf(child.pid), stop: stopper(child) };
}

/** Starts the bare Express server answering each path with the given body. */
export async function startBare(bodies: Record<string, string>, dir: string): Promise<Running> {
  const port = await freePort();
  fs.mkdirSync(dir, { recursive: true });
  const file = path.join(dir, "bare-bodies.json");
  fs.writeFileSync(file, JSON.stringify(bodies));
  const child = spawn(process.execPath, ["--import", "tsx", "scripts/bench/bare-server.ts", file, String(port)], {
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  child.stdout?.on("data", (d) => (out += d));
  child.stderr?.on("data", (d) => (out += d));
  const url = `http://127.0.0.1:${port}`;
  await waitUntil(
    async () => out.includes("ready"),
    child,
    () => out,
    "The bare server",
  );
  return { child, url, rssMb: () => rssOf(child.pid), cpuMs: () => cpuOf(child.pid), stop: stopper(child) };
}

/** Signs in through the API (CSRF token first) and returns the session cookie and a CSRF token for writes. */
export async function signIn(
  url: string,
  email: string,
  password: string,
): Promise<{ cookie: string; csrf: string; me: { memberships: Array<{ productionId: string; title: string }> } }> {
  const cookieOf = (res: Response, prev = "") => {
    const set = res.headers.getSetCookie();
    const jar = new Map(prev ? prev.split("; ").map((c) => c.split("=", 2) as [string, string]) : []);
    for (const c of set) {
      const [pair] = c.split(";");
      const i = pair!.indexOf("=");
      jar.set(pair!.slice(0, i), pair!.slice(i + 1));
    }
    return [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  };
  let res = await fetch(`${url}/api/auth/csrf`);
  let cookie = cookieOf(res);
  const { token } = (await res.json()) as { token: string };
  res = await fetch(`${url}/api/auth/login`, {
    method: "POST",
    headers: { "content-type": "application/json", "x-csrf-token": token, cookie },
    body: JSON.stringify({ email, password }),
  });
  if (!res.ok) throw new Error(`Sign-in failed: ${res.status} ${await res.text()}`);
  cookie = cookieOf(res, cookie);
  const me = ((await res.json()) as { data: { memberships: Array<{ productionId: string; title: string }> } }).data;
  res = await fetch(`${url}/api/auth/csrf`, { headers: { cookie } });
  cookie = cookieOf(res, cookie);
  const { token: csrf } = (await res.json()) as { token: string };
  return { cookie, csrf, me };
}
