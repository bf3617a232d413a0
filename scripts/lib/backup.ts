/**
 * `npm run backup` and `npm run restore FILE`: one tar archive holding the database (pg_dump's custom
 * format), every stored file (photos, packet ZIPs) from the disk or S3 driver, and manifest.json with
 * each part's SHA-256. Restore checks every checksum before it writes anything, and only restores
 * into an empty database and an empty storage.
 */
import { spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { pipeline } from "node:stream/promises";
import tar from "tar-stream";
import { pgBin } from "./postgres.js";

export const BACKUP_FORMAT = "seamscene-backup";
export const BACKUP_VERSION = 1;

export interface BackupManifest {
  format: typeof BACKUP_FORMAT;
  version: number;
  createdAt: string;
  /** Newest migration applied when the backup was taken. */
  schema: string | null;
  database: { path: string; bytes: number; sha256: string };
  files: Array<{ key: string; path: string; bytes: number; sha256: string }>;
}

/** What the scripts hand in: the database, the storage, and a private folder to work in. */
export interface BackupContext {
  databaseUrl: string;
  storage: import("../../server/lib/storage.js").Storage;
  workDir: string;
  log: (line: string) => void;
}

/** libpq environment for pg_dump / pg_restore, so the password never shows in the process list. */
function pgEnv(databaseUrl: string): NodeJS.ProcessEnv {
  const u = new URL(databaseUrl);
  return {
    ...process.env,
    PGHOST: u.hostname || "127.0.0.1",
    PGPORT: u.port || "5432",
    PGUSER: decodeURIComponent(u.username),
    PGPASSWORD: decodeURIComponent(u.password),
    PGDATABASE: decodeURIComponent(u.pathname.slice(1)),
  };
}

function run(bin: string, args: string[], env: NodeJS.ProcessEnv): string {
  const res = spawnSync(pgBin(bin), args, { env, encoding: "utf8", maxBuffer: 64 * 1024 * 1024 });
  if (res.status !== 0) throw new Error(`${bin} failed: ${(res.stderr || res.stdout || "").trim()}`);
  return res.stdout;
}

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

function privateDir(parent: string, name: string): string {
  fs.mkdirSync(parent, { recursive: true, mode: 0o700 });
  const dir = fs.mkdtempSync(path.join(parent, name));
  fs.chmodSync(dir, 0o700);
  return dir;
}

async function query<T>(databaseUrl: string, sql: string): Promise<T[]> {
  const { default: pg } = await import("pg");
  const c = new pg.Client({ connectionString: databaseUrl });
  await c.connect();
  try {
    return (await c.query(sql)).rows as T[];
  } finally {
    await c.end();
  }
}

/** Writes the archive to `outFile` (mode 0600: it holds personal data); returns its manifest. */
export async function createBackup(ctx: BackupContext, outFile: string): Promise<BackupManifest> {
  const work = privateDir(ctx.workDir, "backup-");
  try {
    const dumpFile = path.join(work, "database.dump");
    ctx.log("Dumping the database…");
    run("pg_dump", ["--format=custom", "--no-owner", "--no-privileges", "--file", dumpFile], pgEnv(ctx.databaseUrl));
    const dump = fs.readFileSync(dumpFile);
    const [latest] = await query<{ name: string }>(ctx.databaseUrl, `SELECT name FROM schema_migrations ORDER BY name DESC LIMIT 1`).catch(
      () => [],
    );

    const manifest: BackupManifest = {
      format: BACKUP_FORMAT,
      version: BACKUP_VERSION,
      createdAt: new Date().toISOString(),
      schema: latest?.name ?? null,
      database: { path: "database.dump", bytes: dump.length, sha256: sha256(dump) },
      files: [],
    };
    fs.mkdirSync(path.dirname(path.resolve(outFile)), { recursive: true });
    const pack = tar.pack();
    const written = pipeline(pack, fs.createWriteStream(outFile, { mode: 0o600 }));
    const add = (name: string, body: Buffer) =>
      new Promise<void>((resolve, reject) =>
        pack.entry({ name, size: body.length, mode: 0o600 }, body, (err) => (err ? reject(err) : resolve())),
      );
    await add("database.dump", dump);

    const keys = (await ctx.storage.list())
      .map((f) => f.key)
      .filter((k) => !k.endsWith(".tmp"))
      .sort();
    ctx.log(`Adding ${keys.length} stored files…`);
    for (const key of keys) {
      const body = await ctx.storage.get(key);
      const entry = `files/${key}`;
      await add(entry, body);
      manifest.files.push({ key, path: entry, bytes: body.length, sha256: sha256(body) });
    }
    await add("manifest.json", Buffer.from(JSON.stringify(manifest, null, 2)));
    pack.finalize();
    await written;
    fs.chmodSync(outFile, 0o600);
    return manifest;
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}

/** Unpacks an archive into a private folder and checks it against its manifest. */
async function unpackVerified(file: string, work: string): Promise<BackupManifest> {
  const extract = tar.extract();
  const seen = new Set<string>();
  extract.on("entry", (header, stream, next) => {
    const name = path.posix.normalize(header.name);
    if (header.type !== "file" || name.startsWith("../") || path.posix.isAbsolute(name)) {
      stream.resume();
      stream.on("end", next);
      return;
    }
    const target = path.join(work, ...name.split("/"));
    fs.mkdirSync(path.dirname(target), { recursive: true });
    seen.add(name);
    pipeline(stream, fs.createWriteStream(target, { mode: 0o600 })).then(() => next(), next);
  });
  await pipeline(fs.createReadStream(file), extract);

  if (!seen.has("manifest.json")) throw new Error(`${file} is not a Seamscene backup (no manifest.json).`);
  const manifest = JSON.parse(fs.readFileSync(path.join(work, "manifest.json"), "utf8")) as BackupManifest;
  if (manifest.format !== BACKUP_FORMAT || manifest.version !== BACKUP_VERSION)
    throw new Error(`${file}: unknown backup format ${manifest.format} ${manifest.version}.`);
  const problems: string[] = [];
  const check = (p: string, bytes: number, sum: string) => {
    const full = path.join(work, ...p.split("/"));
    if (!fs.existsSync(full)) return problems.push(`${p}: missing`);
    const body = fs.readFileSync(full);
    if (body.length !== bytes || sha256(body) !== sum) problems.push(`${p}: checksum does not match`);
  };
  check(manifest.database.path, manifest.database.bytes, manifest.database.sha256);
  for (const f of manifest.files) check(f.path, f.bytes, f.sha256);
  const listed = new Set(["manifest.json", manifest.database.path, ...manifest.files.map((f) => f.path)]);
  for (const name of seen) if (!listed.has(name)) problems.push(`${name}: not in the manifest`);
  if (problems.length) throw new Error(`The backup is damaged; nothing was restored:\n  ${problems.slice(0, 20).join("\n  ")}`);
  return manifest;
}

const contentTypes: Record<string, string> = {
  ".jpg": "image/jpeg",
  ".jpeg": "image/jpeg",
  ".webp": "image/webp",
  ".png": "image/png",
  ".zip": "application/zip",
  ".pdf": "application/pdf",
};

/**
 * Restores an archive into an empty database and an empty storage. Everything is checked first;
 * the database is restored in one transaction, then the files are written.
 */
export async function restoreBackup(ctx: BackupContext, file: string): Promise<BackupManifest> {
  const [{ n }] = await query<{ n: string }>(
    ctx.databaseUrl,
    `SELECT count(*) AS n FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema')`,
  );
  if (Number(n) > 0) {
    throw new Error(
      `The database ${new URL(ctx.databaseUrl).pathname.slice(1)} is not empty (${n} tables); restore only goes into an empty one.\n` +
        `Point DATABASE_URL at a new database, or for the private cluster choose a new one with PGDATABASE=<name>.`,
    );
  }
  const existing = (await ctx.storage.list()).length;
  if (existing > 0)
    throw new Error(
      `The storage already holds ${existing} files; restore only goes into an empty storage (set STORAGE_DIR or S3_BUCKET to an empty one).`,
    );

  const work = privateDir(ctx.workDir, "restore-");
  try {
    ctx.log("Checking the archive…");
    const manifest = await unpackVerified(file, work);
    ctx.log("Restoring the database…");
    const env = pgEnv(ctx.databaseUrl);
    const dump = path.join(work, manifest.database.path);
    // The app's role owns what it restores; extension comments belong to the superuser, so skip them.
    const list = run("pg_restore", ["--list", dump], env)
      .split("\n")
      .filter((l) => !/ COMMENT - EXTENSION /.test(l))
      .join("\n");
    const listFile = path.join(work, "restore.list");
    fs.writeFileSync(listFile, list, { mode: 0o600 });
    run(
      "pg_restore",
      [
        "--no-owner",
        "--no-privileges",
        "--exit-on-error",
        "--single-transaction",
        "--use-list",
        listFile,
        "--dbname",
        env.PGDATABASE!,
        dump,
      ],
      env,
    );
    ctx.log(`Restoring ${manifest.files.length} stored files…`);
    for (const f of manifest.files) {
      const body = fs.readFileSync(path.join(work, ...f.path.split("/")));
      await ctx.storage.put(f.key, body, contentTypes[path.extname(f.key).toLowerCase()] ?? "application/octet-stream");
    }
    return manifest;
  } finally {
    fs.rmSync(work, { recursive: true, force: true });
  }
}
