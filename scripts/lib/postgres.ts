/**
 * Starts a private PostgreSQL cluster from Debian's `postgresql` package on 127.0.0.1.
 * Used by `npm start`, `npm run dev`, `npm run seed` and the test setup. `DATABASE_URL` bypasses it.
 */
import { execFileSync, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import path from "node:path";

export interface LocalPostgres {
  /** Connection string for the maintenance database `postgres`. */
  adminUrl: string;
  port: number;
  dataDir: string;
  /** Stops the cluster (fast shutdown). */
  stop: () => void;
}

function findBinDir(): string {
  const root = "/usr/lib/postgresql";
  if (fs.existsSync(root)) {
    const versions = fs
      .readdirSync(root)
      .filter((v) => fs.existsSync(path.join(root, v, "bin", "initdb")))
      .sort((a, b) => Number(b) - Number(a));
    if (versions[0]) return path.join(root, versions[0], "bin");
  }
  const isRoot = process.getuid?.() === 0;
  if (isRoot) {
    console.log("PostgreSQL server binaries are missing; installing Debian's postgresql package…");
    execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit" });
    execFileSync("apt-get", ["install", "-y", "-qq", "postgresql"], { stdio: "inherit", env: { ...process.env, DEBIAN_FRONTEND: "noninteractive" } });
    return findBinDir();
  }
  throw new Error(
    "PostgreSQL server binaries were not found in /usr/lib/postgresql/*/bin. Install them with:\n  sudo apt-get install -y postgresql\nor set DATABASE_URL to an existing server.",
  );
}

/** Runs a PostgreSQL tool, as the `postgres` user when we are root (initdb refuses root). */
function runPg(bin: string, args: string[], opts: { allowFail?: boolean } = {}): { status: number; output: string } {
  const isRoot = process.getuid?.() === 0;
  const cmd = isRoot ? "runuser" : bin;
  const fullArgs = isRoot ? ["-u", "postgres", "--", bin, ...args] : args;
  const res = spawnSync(cmd, fullArgs, { encoding: "utf8" });
  const output = `${res.stdout ?? ""}${res.stderr ?? ""}`;
  if (res.status !== 0 && !opts.allowFail) {
    throw new Error(`${path.basename(bin)} failed (${res.status}): ${output}`);
  }
  return { status: res.status ?? 1, output };
}

function portIsFree(port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const srv = net.createServer();
    srv.once("error", () => resolve(false));
    srv.listen(port, "127.0.0.1", () => srv.close(() => resolve(true)));
  });
}

/** Ensures a cluster exists in `dataDir` and is running on `port`; returns how to reach it. */
export async function ensureLocalPostgres(options: { dataDir: string; port: number }): Promise<LocalPostgres> {
  const binDir = findBinDir();
  const dataDir = path.resolve(options.dataDir);
  const isRoot = process.getuid?.() === 0;
  const pgVersionFile = path.join(dataDir, "PG_VERSION");
  if (!fs.existsSync(pgVersionFile)) {
    fs.mkdirSync(dataDir, { recursive: true });
    if (isRoot) execFileSync("chown", ["-R", "postgres:postgres", dataDir]);
    runPg(path.join(binDir, "initdb"), ["-D", dataDir, "-A", "trust", "-U", "app", "-E", "UTF8", "--no-locale"]);
  }
  const status = runPg(path.join(binDir, "pg_ctl"), ["-D", dataDir, "status"], { allowFail: true });
  if (status.status !== 0) {
    if (!(await portIsFree(options.port))) {
      throw new Error(`Port ${options.port} on 127.0.0.1 is taken; set PGPORT to another port.`);
    }
    const logFile = path.join(dataDir, "server.log");
    runPg(path.join(binDir, "pg_ctl"), [
      "-D", dataDir, "-w", "-t", "60", "-l", logFile,
      "-o", `-h 127.0.0.1 -p ${options.port} -k /tmp -c fsync=off -c max_connections=200`,
      "start",
    ]);
  }
  return {
    adminUrl: `postgres://app@127.0.0.1:${options.port}/postgres`,
    port: options.port,
    dataDir,
    stop: () => {
      runPg(path.join(binDir, "pg_ctl"), ["-D", dataDir, "-m", "fast", "stop"], { allowFail: true });
    },
  };
}

/** Creates a database when it does not exist yet. */
export async function ensureDatabase(adminUrl: string, name: string, template?: string): Promise<string> {
  const { default: pg } = await import("pg");
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const exists = await client.query("SELECT 1 FROM pg_database WHERE datname = $1", [name]);
    if (exists.rowCount === 0) {
      await client.query(`CREATE DATABASE "${name}"${template ? ` TEMPLATE "${template}"` : ""}`);
    }
  } finally {
    await client.end();
  }
  return adminUrl.replace(/\/postgres$/, `/${name}`);
}

/** Drops a database if it exists (used for fresh test databases). */
export async function dropDatabase(adminUrl: string, name: string): Promise<void> {
  const { default: pg } = await import("pg");
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    await client.query(`DROP DATABASE IF EXISTS "${name}" WITH (FORCE)`);
  } finally {
    await client.end();
  }
}
