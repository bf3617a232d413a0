/**
 * Crash leftovers: the start-up sweep on both storage drivers, and a real server killed with
 * SIGKILL during uploads, restarted, leaving nothing behind.
 */
import { createHash, randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import S3rver from "s3rver";
import sharp from "sharp";
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { sequelize } from "../../server/db.js";
import { createDiskStorage, createS3Storage, setStorage, type Storage } from "../../server/lib/storage.js";
import { instanceTag } from "../../server/lib/instance.js";
import { sweepStorage } from "../../server/services/storage-sweep.service.js";
import { buildChange, buildCharacter, buildMember, buildProduction, buildUser, TEST_PASSWORD } from "../factories.js";
import { resetDb } from "../setup/http.js";
import { childEnv, freePort, spawnTsx, waitFor, type Child } from "../setup/processes.js";

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-sweep-"));
let s3server: S3rver;
let s3port = 0;

beforeAll(async () => {
  s3server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: path.join(tmpRoot, "s3") });
  s3port = ((await s3server.run()) as { port: number }).port;
});
afterAll(async () => {
  setStorage(undefined);
  await s3server?.close();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});
beforeEach(resetDb);

/** A process id that is surely not running (above Linux's pid_max default). */
const DEAD_PID = 4_194_999;
const deadTag = `${DEAD_PID}-deadbeef`;

async function photoKeys(storage: Storage, hash: string, withRow: boolean, productionId: string, ownerId: string) {
  const dir = `photos/${hash.slice(0, 2)}/${hash}`;
  const variants = { original: `${dir}/full.jpg`, display: `${dir}/display.webp`, thumb: `${dir}/thumb.webp` };
  for (const k of Object.values(variants)) await storage.put(k, Buffer.from(`${hash}:${k}`), "application/octet-stream");
  if (withRow) {
    await sequelize.query(
      `INSERT INTO photos (id, production_id, owner_type, owner_id, view, content_hash, width, height, bytes, variants, created_at, updated_at)
       VALUES (:id, :pid, 'character', :owner, 'front', :hash, 4, 4, 10, CAST(:variants AS jsonb), now(), now())`,
      { replacements: { id: randomUUID(), pid: productionId, owner: ownerId, hash, variants: JSON.stringify(variants) } },
    );
  }
  return Object.values(variants);
}

const hashOf = (s: string) => createHash("sha256").update(s).digest("hex");

const drivers: Array<[string, () => Storage]> = [
  ["disk", () => createDiskStorage(path.join(tmpRoot, `disk-${randomUUID()}`))],
  [
    "s3",
    () =>
      createS3Storage({
        endpoint: `http://127.0.0.1:${s3port}`,
        region: "us-east-1",
        bucket: `sweep-${randomUUID().slice(0, 8)}`,
        accessKeyId: "S3RVER",
        secretAccessKey: "S3RVER",
      }),
  ],
];

for (const [name, make] of drivers) {
  describe(`start-up sweep (${name} driver)`, () => {
    afterEach(() => setStorage(undefined));

    it("removes unreferenced and half-written files, keeps what rows or live uploads need, reports missing files", async () => {
      const storage = make();
      setStorage(storage);
      const production = await buildProduction();
      const character = await buildCharacter({ production });
      const change = await buildChange(character);

      const kept = await photoKeys(storage, hashOf("kept"), true, production.id, character.id);
      const orphan = await photoKeys(storage, hashOf("orphan"), false, production.id, character.id);
      // An upload of this process still in progress (its pending row names us) ...
      const ours = await photoKeys(storage, hashOf("ours"), false, production.id, character.id);
      await sequelize.query(
        `INSERT INTO pending_photo_files (id, content_hash, host, pid, instance) VALUES (:id, :hash, :host, :pid, :inst)`,
        {
          replacements: { id: randomUUID(), hash: hashOf("ours"), host: os.hostname(), pid: process.pid, inst: instanceTag.split("-")[1] },
        },
      );
      // ... and one of a process that died before its row was written.
      const dead = await photoKeys(storage, hashOf("dead"), false, production.id, character.id);
      await sequelize.query(
        `INSERT INTO pending_photo_files (id, content_hash, host, pid, instance) VALUES (:id, :hash, :host, :pid, 'deadbeef')`,
        {
          replacements: { id: randomUUID(), hash: hashOf("dead"), host: os.hostname(), pid: DEAD_PID },
        },
      );
      // A publish killed mid-way: a half-written ZIP and a complete one that no version refers to.
      const draftId = randomUUID();
      await sequelize.query(
        `INSERT INTO packets (id, production_id, character_id, change_id, created_at, updated_at) VALUES (:id, :p, :c, :ch, now(), now())`,
        {
          replacements: { id: draftId, p: production.id, c: character.id, ch: change.id },
        },
      );
      const draftZip = `packets/${draftId.slice(0, 2)}/${draftId}/v1.zip`;
      await storage.put(draftZip, Buffer.from("PK complete but unreferenced"), "application/zip");
      const goneZip = `packets/ab/${randomUUID()}/v3.zip`;
      await storage.put(goneZip, Buffer.from("PK of a packet that no longer exists"), "application/zip");
      await storage.put(`${draftZip}.${deadTag}.1a2b3c4d.tmp`, Buffer.from("PK half"), "application/octet-stream");
      const ownPartial = `${draftZip}.${instanceTag}.5e6f7a8b.tmp`;
      await storage.put(ownPartial, Buffer.from("PK being written by us"), "application/octet-stream");
      // A photo row whose file is gone.
      await sequelize.query(
        `INSERT INTO photos (id, production_id, owner_type, owner_id, view, content_hash, width, height, bytes, variants, created_at, updated_at)
         VALUES (:id, :pid, 'character', :owner, 'front', :hash, 4, 4, 10, CAST(:variants AS jsonb), now(), now())`,
        {
          replacements: {
            id: randomUUID(),
            pid: production.id,
            owner: character.id,
            hash: hashOf("lost"),
            variants: JSON.stringify({ original: "photos/zz/lost/full.jpg" }),
          },
        },
      );

      // While another server publishes this packet (its row locked), its ZIP is left alone.
      const other = new pg.Client({ connectionString: process.env.DATABASE_URL });
      await other.connect();
      await other.query("BEGIN");
      await other.query("SELECT id FROM packets WHERE id = $1 FOR UPDATE", [draftId]);
      const first = await sweepStorage();
      await other.query("ROLLBACK");
      await other.end();
      expect(await storage.exists(draftZip)).toBe(true);

      const second = await sweepStorage();
      const left = new Set((await storage.list()).map((f) => f.key));
      for (const k of [...kept, ...ours, ownPartial]) expect(left.has(k), k).toBe(true);
      for (const k of [...orphan, ...dead, draftZip, goneZip]) expect(left.has(k), k).toBe(false);
      expect([...left].filter((k) => k.includes(deadTag))).toEqual([]);
      expect(first).toMatchObject({
        unreferencedPhotoFiles: 6,
        unreferencedPacketFiles: 1,
        partialFiles: 1,
        missingPhotoFiles: 1,
        stalePendingRows: 1,
      });
      expect(second).toMatchObject({ unreferencedPhotoFiles: 0, unreferencedPacketFiles: 1, partialFiles: 0 });
      const [rows] = await sequelize.query(`SELECT pid FROM pending_photo_files`);
      expect(rows).toEqual([{ pid: process.pid }]);
    });
  });
}

// ---------------------------------------------------------------------------------------------
// A real server killed during uploads.

async function noisyJpeg(seed: number): Promise<Buffer> {
  const w = 1600;
  const h = 1200;
  const raw = Buffer.alloc(w * h * 3);
  let x = seed * 2654435761;
  for (let i = 0; i < raw.length; i++) {
    x = (x * 1103515245 + 12345) >>> 0;
    raw[i] = x >>> 24;
  }
  return sharp(raw, { raw: { width: w, height: h, channels: 3 } })
    .jpeg({ quality: 90 })
    .toBuffer();
}

function filesUnder(dir: string): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.join(e.parentPath, e.name));
}

describe("a server killed during uploads", () => {
  let server: Child | undefined;
  afterEach(() => {
    if (server?.alive()) server.proc.kill("SIGKILL");
  });

  it("leaves no temp file, half-written file or file without a row after it restarts", async () => {
    const root = fs.mkdtempSync(path.join(tmpRoot, "kill-"));
    const storageDir = path.join(root, "storage");
    const dataDir = path.join(root, "data");
    const user = await buildUser({ email: `kill-${randomUUID().slice(0, 6)}@test.invalid` });
    const { production } = await buildMember("designer", { user });
    const character = await buildCharacter({ production });
    const port = await freePort();
    const base = `http://127.0.0.1:${port}`;
    const env = childEnv({
      NODE_ENV: "development",
      LOG_LEVEL: "info",
      DATABASE_URL: process.env.DATABASE_URL,
      PORT: String(port),
      APP_URL: base,
      STORAGE_DRIVER: "disk",
      STORAGE_DIR: storageDir,
      DATA_DIR: dataDir,
      JOBS_ENABLED: "false",
      SMTP_HOST: "127.0.0.1",
      SMTP_PORT: String(await freePort()),
    });
    const start = async () => {
      const child = spawnTsx(["server/index.ts"], env);
      await waitFor("the server", async () => child.alive() && (await fetch(`${base}/api/health`)).ok, 90_000).catch((err: Error) => {
        throw new Error(`${err.message}\n${child.output()}`);
      });
      return child;
    };
    server = await start();

    // Sign in.
    const csrf1 = await fetch(`${base}/api/auth/csrf`);
    let cookie = csrf1.headers
      .getSetCookie()
      .map((c) => c.split(";")[0])
      .join("; ");
    const login = await fetch(`${base}/api/auth/login`, {
      method: "POST",
      headers: { "content-type": "application/json", cookie, "x-csrf-token": ((await csrf1.json()) as { token: string }).token },
      body: JSON.stringify({ email: user.email, password: TEST_PASSWORD }),
    });
    expect(login.status).toBe(200);
    cookie =
      login.headers
        .getSetCookie()
        .map((c) => c.split(";")[0])
        .join("; ") || cookie;
    const token = ((await (await fetch(`${base}/api/auth/csrf`, { headers: { cookie } })).json()) as { token: string }).token;

    // Uploads in parallel until the kill.
    const images = await Promise.all([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12].map(noisyJpeg));
    let ok = 0;
    let killed = false;
    const upload = async (img: Buffer, i: number) => {
      const form = new FormData();
      form.set("ownerType", "character");
      form.set("ownerId", character.id);
      form.set("view", "front");
      form.set("file", new Blob([new Uint8Array(img)], { type: "image/jpeg" }), `look-${i}.jpg`);
      try {
        const res = await fetch(`${base}/api/productions/${production.id}/photos`, {
          method: "POST",
          headers: { cookie, "x-csrf-token": token },
          body: form,
        });
        if (res.status === 201) ok++;
      } catch {
        if (!killed) throw new Error("an upload failed before the kill");
      }
    };
    const lanes = [0, 1, 2, 3].map(async (lane) => {
      for (let i = lane; i < images.length && !killed; i += 4) await upload(images[i]!, i);
    });
    await waitFor("a first upload to finish", () => ok >= 1, 60_000, 20);
    // Let the next uploads get under way (files being written), then kill without warning.
    await waitFor("uploads in flight", () => filesUnder(dataDir).length > 0, 20_000, 5);
    killed = true;
    server.proc.kill("SIGKILL");
    await server.exited;
    await Promise.all(lanes);

    // Leftovers of the kill, plus ones planted to be sure there is something to sweep: another dead
    // process's temp upload and half-written stored file.
    fs.mkdirSync(path.join(uploadTempRootOf(dataDir), deadTag), { recursive: true });
    fs.writeFileSync(path.join(uploadTempRootOf(dataDir), deadTag, "original-with-gps"), "x");
    fs.mkdirSync(path.join(storageDir, "photos", "zz"), { recursive: true });
    fs.writeFileSync(path.join(storageDir, "photos", "zz", `half.jpg.${deadTag}.0000aaaa.tmp`), "x");
    expect(filesUnder(dataDir).length).toBeGreaterThan(0);

    server = await start();
    await waitFor("the sweep", () => server!.output().includes("storage sweep finished"), 60_000).catch((err: Error) => {
      throw new Error(`${err.message}\n${server!.output().slice(-3000)}`);
    });

    // No temp uploads anywhere (the new process's own folder holds nothing).
    expect(filesUnder(dataDir)).toEqual([]);
    expect(fs.statSync(uploadTempRootOf(dataDir)).mode & 0o777).toBe(0o700);
    // Every stored file has its row, every row its files, and nothing half-written is left.
    const stored = filesUnder(storageDir).map((f) => path.relative(storageDir, f).split(path.sep).join("/"));
    expect(stored.filter((k) => k.endsWith(".tmp"))).toEqual([]);
    const [rows] = await sequelize.query(`SELECT variants FROM photos WHERE production_id = :p`, { replacements: { p: production.id } });
    const wanted = new Set((rows as Array<{ variants: Record<string, string> }>).flatMap((r) => Object.values(r.variants)));
    expect(rows.length).toBeGreaterThanOrEqual(ok);
    expect(stored.sort()).toEqual([...wanted].sort());
    const [pending] = await sequelize.query(`SELECT 1 FROM pending_photo_files`);
    expect(pending).toEqual([]);
    server.proc.kill("SIGTERM");
    await server.exited;
  }, 180_000);
});

/** The upload temp root of a server started with DATA_DIR=dataDir (server/middleware/upload.ts). */
function uploadTempRootOf(dataDir: string): string {
  return path.join(dataDir, "tmp", "uploads");
}
