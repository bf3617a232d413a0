/**
 * `npm run backup` then `npm run restore` (the real scripts, as child processes): the demo data is
 * backed up from disk storage and restored into a fresh database with S3 storage (s3rver), then
 * every table's row count and every stored file's SHA-256 are compared with the original.
 */
import { createHash } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import S3rver from "s3rver";
import { afterAll, beforeAll, describe, expect, inject, it } from "vitest";
import { dropDatabase, ensureDatabase } from "../../scripts/lib/postgres.js";
import { createDiskStorage, createS3Storage, setStorage, type Storage } from "../../server/lib/storage.js";
import { diskStore, setPacketStore } from "../../server/services/packet-storage.js";
import { databaseAdmin } from "../setup/test-postgres.js";
import { resetDb } from "../setup/http.js";
import { childEnv, spawnTsx } from "../setup/processes.js";

const worker = process.env.VITEST_POOL_ID ?? process.env.VITEST_WORKER_ID ?? "1";
const restoredDb = `seamscene_test_restored_w${worker}`;
const root = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-backup-"));
const sourceDir = path.join(root, "source-storage");
let s3server: S3rver;
let s3port = 0;

beforeAll(async () => {
  s3server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: path.join(root, "s3") });
  s3port = ((await s3server.run()) as { port: number }).port;
});
afterAll(async () => {
  setStorage(undefined);
  await s3server?.close();
  await dropDatabase(inject("testPg").adminUrl, restoredDb);
  fs.rmSync(root, { recursive: true, force: true });
});

async function rowCounts(url: string): Promise<Record<string, number>> {
  const c = new pg.Client({ connectionString: url });
  await c.connect();
  try {
    const { rows } = await c.query<{ t: string }>(
      `SELECT format('%I.%I', schemaname, tablename) AS t FROM pg_tables WHERE schemaname NOT IN ('pg_catalog', 'information_schema') ORDER BY 1`,
    );
    const out: Record<string, number> = {};
    for (const r of rows) out[r.t] = Number((await c.query<{ n: string }>(`SELECT count(*) AS n FROM ${r.t}`)).rows[0]!.n);
    return out;
  } finally {
    await c.end();
  }
}

async function fileHashes(storage: Storage): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const f of await storage.list())
    out[f.key] = createHash("sha256")
      .update(await storage.get(f.key))
      .digest("hex");
  return out;
}

describe("backup and restore", () => {
  it("restores the demo into a fresh database and storage with the same rows and files", async () => {
    await resetDb();
    const source = createDiskStorage(sourceDir);
    setStorage(source);
    setPacketStore(diskStore(sourceDir));
    const { seedDemo } = await import("../../seeds/index.js");
    await seedDemo();

    const archive = path.join(root, "out", "demo.tar");
    const backup = spawnTsx(
      ["scripts/backup.ts", "--out", archive],
      childEnv({
        DATABASE_URL: process.env.DATABASE_URL,
        STORAGE_DRIVER: "disk",
        STORAGE_DIR: sourceDir,
        DATA_DIR: path.join(root, "data"),
      }),
    );
    expect(await backup.exited, backup.output()).toBe(0);
    expect(fs.statSync(archive).mode & 0o777).toBe(0o600);

    await dropDatabase(inject("testPg").adminUrl, restoredDb);
    const restoredUrl = await ensureDatabase(databaseAdmin(inject("testPg")), restoredDb);
    const bucket = "restored-demo";
    const s3env = {
      STORAGE_DRIVER: "s3",
      S3_ENDPOINT: `http://127.0.0.1:${s3port}`,
      S3_BUCKET: bucket,
      S3_ACCESS_KEY_ID: "S3RVER",
      S3_SECRET_ACCESS_KEY: "S3RVER",
      DATA_DIR: path.join(root, "data"),
    };
    const restore = spawnTsx(["scripts/restore.ts", archive], childEnv({ DATABASE_URL: restoredUrl, ...s3env }));
    expect(await restore.exited, restore.output()).toBe(0);

    const before = await rowCounts(process.env.DATABASE_URL!);
    const after = await rowCounts(restoredUrl);
    expect(Object.keys(before).length).toBeGreaterThan(20);
    expect(before["public.photos"]).toBeGreaterThan(0);
    expect(before["public.packets"]).toBeGreaterThan(0);
    expect(after).toEqual(before);

    const restoredStorage = createS3Storage({
      endpoint: s3env.S3_ENDPOINT,
      region: "us-east-1",
      bucket,
      accessKeyId: "S3RVER",
      secretAccessKey: "S3RVER",
    });
    const sourceFiles = await fileHashes(source);
    expect(Object.keys(sourceFiles).some((k) => k.startsWith("packets/"))).toBe(true);
    expect(Object.keys(sourceFiles).some((k) => k.startsWith("photos/"))).toBe(true);
    expect(await fileHashes(restoredStorage)).toEqual(sourceFiles);

    // A second restore into the now filled database is refused and changes nothing.
    const again = spawnTsx(["scripts/restore.ts", archive], childEnv({ DATABASE_URL: restoredUrl, ...s3env }));
    expect(await again.exited).not.toBe(0);
    expect(again.output()).toMatch(/not empty/);
    expect(await rowCounts(restoredUrl)).toEqual(before);

    // A damaged archive is refused before anything is written.
    const damaged = path.join(root, "out", "damaged.tar");
    const bytes = fs.readFileSync(archive);
    const at = bytes.indexOf(Buffer.from("files/photos/")) + 1024; // inside the first photo's data
    bytes[at] = bytes[at]! ^ 0xff;
    fs.writeFileSync(damaged, bytes);
    await dropDatabase(inject("testPg").adminUrl, restoredDb);
    const emptyUrl = await ensureDatabase(databaseAdmin(inject("testPg")), restoredDb);
    const refused = spawnTsx(
      ["scripts/restore.ts", damaged],
      childEnv({
        DATABASE_URL: emptyUrl,
        STORAGE_DRIVER: "disk",
        STORAGE_DIR: path.join(root, "empty-storage"),
        DATA_DIR: path.join(root, "data"),
      }),
    );
    expect(await refused.exited).not.toBe(0);
    expect(refused.output()).toMatch(/checksum does not match/);
    expect(await rowCounts(emptyUrl)).toEqual({});
    expect(fs.existsSync(path.join(root, "empty-storage"))).toBe(false);
  }, 300_000);
});
