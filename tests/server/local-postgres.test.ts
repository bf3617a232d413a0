/**
 * The private PostgreSQL cluster of `npm start` and the tests (scripts/lib/postgres.ts), checked on
 * real clusters in temporary folders, each on its own port (the shared test cluster is not touched).
 */
import { spawnSync } from "node:child_process";
import { createHash, createHmac } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, describe, expect, it } from "vitest";
import { CREDENTIALS_FILE, ensureLocalPostgres, pgBin, pgCtl, scramVerifier } from "../../scripts/lib/postgres.js";
import { childEnv, freePort, spawnTsx } from "../setup/processes.js";

const isRoot = process.getuid?.() === 0;
const tempRoots: string[] = [];
const clusters: string[] = [];

function tempDir(prefix: string): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  fs.chmodSync(dir, 0o755); // mkdtemp makes it private; the private case is tested on its own
  tempRoots.push(dir);
  return dir;
}

/** Runs a PostgreSQL program as the postgres user when we are root (like the code under test). */
function asPostgres(bin: string, args: string[]) {
  const res = isRoot
    ? spawnSync("runuser", ["-u", "postgres", "--", pgBin(bin), ...args], { encoding: "utf8", cwd: "/" })
    : spawnSync(pgBin(bin), args, { encoding: "utf8" });
  return { status: res.status, output: `${res.stdout}${res.stderr}` };
}

async function query(url: string, sql: string): Promise<Record<string, unknown>[]> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    return (await c.query(sql)).rows;
  } finally {
    await c.end();
  }
}

async function connectError(opts: pg.ClientConfig): Promise<string> {
  const c = new pg.Client(opts);
  try {
    await c.connect();
    await c.end();
    return "connected";
  } catch (err) {
    return (err as Error).message;
  }
}

const running = (dataDir: string) => pgCtl(dataDir, ["status"], { allowFail: true }).status === 0;

afterAll(() => {
  for (const dir of clusters) pgCtl(dir, ["-m", "immediate", "stop"], { allowFail: true });
  for (const dir of [...tempRoots, ...clusters.filter((d) => d.includes(`${path.sep}seamscene${path.sep}`))])
    fs.rmSync(dir, { recursive: true, force: true });
});

describe("the private PostgreSQL cluster", () => {
  it("stores SCRAM verifiers that check the RFC 7677 worked example the way a server does", () => {
    // RFC 7677 §3: user "user", password "pencil", salt W22ZaJ0SNY7soEsUEjb6gQ==, 4096 iterations.
    const v = scramVerifier("pencil", Buffer.from("W22ZaJ0SNY7soEsUEjb6gQ==", "base64"), 4096);
    const m = /^SCRAM-SHA-256\$4096:W22ZaJ0SNY7soEsUEjb6gQ==\$([^:]+):(.+)$/.exec(v);
    expect(m).not.toBeNull();
    const storedKey = Buffer.from(m![1]!, "base64");
    const serverKey = Buffer.from(m![2]!, "base64");
    const nonce = "rOprNGfwEbeRWgbNEkqO%hvYDpWUa2RaTCAfuxFIlj)hNlF$k0";
    const authMessage = `n=user,r=rOprNGfwEbeRWgbNEkqO,r=${nonce},s=W22ZaJ0SNY7soEsUEjb6gQ==,i=4096,c=biws,r=${nonce}`;
    // The client's proof from the RFC verifies against StoredKey (RFC 5802 §3) ...
    const proof = Buffer.from("dHzbZapWIk4jUhN+Ute9ytag9zjfMHgsqmmiz7AndVQ=", "base64");
    const clientSignature = createHmac("sha256", storedKey).update(authMessage).digest();
    const clientKey = Buffer.from(proof.map((b, i) => b ^ clientSignature[i]!));
    expect(createHash("sha256").update(clientKey).digest().equals(storedKey)).toBe(true);
    // ... and ServerKey gives the RFC's server signature.
    expect(createHmac("sha256", serverKey).update(authMessage).digest("base64")).toBe("6rriTRBi23WpRR/wtup+mMhUZUn/dB5nLTJRsjl95G4=");
  });

  it("as npm start makes it: passwords for everyone, a non-superuser app role owning its database, fsync on, a 0600 password file, no socket", async () => {
    const dataDir = path.join(tempDir("seamscene-pg-start-"), "pg");
    clusters.push(dataDir);
    const port = await freePort();
    // npm start's own preparation (scripts/lib/local-env.ts), in a child process as `npm start` runs it.
    const code = `import(${JSON.stringify(path.resolve("scripts/lib/local-env.ts"))}).then(async (m) => { const l = await m.prepareLocalEnv(); console.log("RESULT " + JSON.stringify({ url: process.env.DATABASE_URL, dataDir: l.pg.dataDir, startedHere: l.pg.startedHere })); })`;
    const child = spawnTsx(
      ["-e", code],
      childEnv({ PGDATA_DIR: dataDir, PGPORT: String(port), DATABASE_URL: "", PGDATABASE: "seamscene" }),
    );
    expect(await child.exited, child.output()).toBe(0);
    const result = JSON.parse(child.output().split("RESULT ")[1]!.trim()) as { url: string; dataDir: string; startedHere: boolean };
    expect(result.startedHere).toBe(true);
    expect(result.dataDir).toBe(dataDir);

    const [me] = await query(
      result.url,
      "SELECT current_user AS role, (SELECT rolsuper FROM pg_roles WHERE rolname = current_user) AS super, (SELECT pg_get_userbyid(datdba) FROM pg_database WHERE datname = current_database()) AS owner, current_setting('fsync') AS fsync",
    );
    expect(me).toEqual({ role: "seamscene", super: false, owner: "seamscene", fsync: "on" });

    // The app's role cannot run programs as the postgres user.
    await expect(query(result.url, "COPY (SELECT 1) TO PROGRAM 'true'")).rejects.toThrow(
      /permission denied|must be superuser|privileges of the pg_execute_server_program/i,
    );

    // The password file: only its owner may read it.
    expect(fs.statSync(path.join(dataDir, CREDENTIALS_FILE)).mode & 0o777).toBe(0o600);
    expect(fs.readFileSync(path.join(dataDir, "pg_hba.conf"), "utf8")).not.toMatch(/^\s*[^#\s].*\btrust\b/m);

    // Without the password, or with a wrong one, nobody gets in: not the app's role, not the superuser.
    for (const user of ["seamscene", "seamscene_admin", "postgres"]) {
      expect(await connectError({ host: "127.0.0.1", port, user, password: "wrong-password", database: "postgres" })).toMatch(
        /password authentication failed/,
      );
    }
    // A local account with no password at all (psql, never prompting).
    const psqlArgs = ["-h", "127.0.0.1", "-p", String(port), "-U", "seamscene_admin", "-w", "-d", "postgres", "-c", "SELECT 1"];
    const psql = isRoot
      ? spawnSync("runuser", ["-u", "nobody", "--", pgBin("psql"), ...psqlArgs], {
          encoding: "utf8",
          cwd: "/",
          env: { PATH: process.env.PATH },
        })
      : spawnSync(pgBin("psql"), psqlArgs, { encoding: "utf8", env: { PATH: process.env.PATH, PGPASSFILE: "/dev/null" } });
    expect(psql.status).not.toBe(0);
    expect(psql.stderr).toMatch(/no password supplied|password authentication failed/);
    // No Unix socket in the shared /tmp (TCP on 127.0.0.1 only).
    expect(fs.existsSync(`/tmp/.s.PGSQL.${port}`)).toBe(false);
    expect(fs.readdirSync(dataDir).some((f) => f.startsWith(".s.PGSQL"))).toBe(false);
  });

  it("stops the server on exit only when this process started it", async () => {
    const dataDir = path.join(tempDir("seamscene-pg-owner-"), "pg");
    clusters.push(dataDir);
    const port = await freePort();
    const first = await ensureLocalPostgres({ dataDir, port, durable: false });
    expect(first.startedHere).toBe(true);
    // A second instance on the same port finds it running: its exit leaves the first one's database up.
    const second = await ensureLocalPostgres({ dataDir, port, durable: false });
    expect(second.startedHere).toBe(false);
    second.stop();
    expect(running(dataDir)).toBe(true);
    expect((await query(second.appUrl("postgres"), "SELECT 1 AS one"))[0]).toEqual({ one: 1 });
    first.stop();
    expect(running(dataDir)).toBe(false);
  });

  it("secures a cluster made by the earlier version (trust, superuser app) and keeps its data", async () => {
    const dataDir = path.join(tempDir("seamscene-pg-old-"), "pg");
    clusters.push(dataDir);
    const port = await freePort();
    // Exactly what the earlier version did: initdb with trust and superuser "app", fsync off, socket in /tmp.
    fs.mkdirSync(dataDir, { recursive: true });
    if (isRoot) spawnSync("chown", ["-R", "postgres:postgres", dataDir]);
    expect(asPostgres("initdb", ["-D", dataDir, "-A", "trust", "-U", "app", "-E", "UTF8", "--no-locale"]).status).toBe(0);
    expect(
      asPostgres("pg_ctl", [
        "-D",
        dataDir,
        "-w",
        "-l",
        path.join(dataDir, "server.log"),
        "-o",
        `-h 127.0.0.1 -p ${port} -k /tmp -c fsync=off`,
        "start",
      ]).status,
    ).toBe(0);
    const oldAdmin = { host: "127.0.0.1", port, user: "app" };
    const c = new pg.Client({ ...oldAdmin, database: "postgres" });
    await c.connect();
    await c.query("CREATE DATABASE seamscene");
    await c.end();
    const d = new pg.Client({ ...oldAdmin, database: "seamscene" });
    await d.connect();
    await d.query(`CREATE EXTENSION citext; CREATE TYPE "enum_garments_status" AS ENUM ('in_stock', 'on_set');
      CREATE TABLE garments (id serial PRIMARY KEY, name citext, status "enum_garments_status");
      INSERT INTO garments (name, status) VALUES ('Fisherman''s smock', 'on_set');
      CREATE FUNCTION refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN NEW; END $$;
      CREATE SCHEMA pgboss; CREATE TABLE pgboss.job (id bigint GENERATED ALWAYS AS IDENTITY, name text);`);
    await d.end();
    pgCtl(dataDir, ["-m", "fast", "stop"]);

    const secured = await ensureLocalPostgres({ dataDir, port, durable: false });
    const url = secured.appUrl("seamscene");
    // The data is there, and the app's role owns it all, so migrations (ALTER TABLE) keep working.
    expect(await query(url, "SELECT name, status FROM garments")).toEqual([{ name: "Fisherman's smock", status: "on_set" }]);
    await query(
      url,
      "ALTER TABLE garments ADD COLUMN notes text; ALTER TABLE pgboss.job ADD COLUMN data jsonb; ALTER TYPE enum_garments_status ADD VALUE 'cleaning'; CREATE OR REPLACE FUNCTION refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN RETURN OLD; END $$",
    );
    expect(await query(url, "SELECT current_user AS role, (SELECT rolsuper FROM pg_roles WHERE rolname = current_user) AS super")).toEqual([
      { role: "seamscene", super: false },
    ]);
    // The earlier superuser no longer gets in without a password.
    expect(await connectError({ ...oldAdmin, database: "postgres" })).not.toBe("connected");
    expect(await connectError({ ...oldAdmin, password: "wrong", database: "postgres" })).toMatch(/password authentication failed/);
    expect(fs.statSync(path.join(secured.dataDir, CREDENTIALS_FILE)).mode & 0o777).toBe(0o600);
    // A second start finds it secured and changes nothing.
    const again = await ensureLocalPostgres({ dataDir, port, durable: false });
    expect(again.app).toEqual(secured.app);
    secured.stop();
  });

  it.runIf(isRoot)("keeps the cluster where the postgres user can reach it when the checkout is under a private folder", async () => {
    const home = tempDir("seamscene-home-");
    fs.chmodSync(home, 0o700);
    const checkout = path.join(home, "clone");
    fs.mkdirSync(path.join(checkout, ".data"), { recursive: true });
    const wanted = path.join(checkout, ".data", "pg");
    const port = await freePort();
    const pgc = await ensureLocalPostgres({ dataDir: wanted, port, durable: false });
    clusters.push(pgc.dataDir);
    expect(pgc.relocatedFrom).toBe(wanted);
    expect(pgc.dataDir.startsWith(wanted)).toBe(false);
    expect(spawnSync("runuser", ["-u", "postgres", "--", "test", "-r", path.join(pgc.dataDir, "PG_VERSION")]).status).toBe(0);
    expect((await query(pgc.appUrl("postgres"), "SELECT 1 AS one"))[0]).toEqual({ one: 1 });
    // Nothing of the user's was changed or removed: the folder is still private and untouched.
    expect(fs.statSync(home).mode & 0o777).toBe(0o700);
    expect(fs.readdirSync(path.join(checkout, ".data"))).toEqual([]);
    // The next start finds the same cluster.
    const again = await ensureLocalPostgres({ dataDir: wanted, port, durable: false });
    expect(again.dataDir).toBe(pgc.dataDir);
    expect(again.startedHere).toBe(false);
    pgc.stop();
  });
});
