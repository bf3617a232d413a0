// Benchmark for the breakdown: a 2,000-row CSV import (one request, one transaction) and the upload
// of a 12-megapixel JPEG (hash, auto-orient, strip metadata, three sizes, store, row). Runs the real
// app in process against a private database "seamscene_bench" on the local cluster. Prints figures;
// asserts nothing.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { pathToFileURL } from "node:url";
import { dropDatabase, ensureDatabase, ensureLocalPostgres } from "../lib/postgres.js";

const RUNS = 3;

function csv(n: number): string {
  const lines = ["scene,set,int_ext,time_of_day,story_day,story_order,pages,running_minutes,synopsis,shoot_day,shoot_date,shoot_position"];
  for (let i = 1; i <= n; i++) {
    const day = Math.ceil(i / 6);
    const date = new Date(Date.UTC(2031, 0, 1) + (day - 1) * 86_400_000).toISOString().slice(0, 10);
    lines.push(
      [
        i,
        `Set ${i % 25}`,
        i % 3 ? "EXT" : "INT",
        "DAY",
        1 + Math.floor(((i - 1) * 40) / n),
        i,
        `${i % 3} ${1 + (i % 7)}/8`,
        "",
        `"Invented scene ${i}, for timing"`,
        day,
        date,
        ((i - 1) % 6) + 1,
      ].join(","),
    );
  }
  return lines.join("\n");
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/** Figures from one run. */
export interface BreakdownBenchResult {
  importRows: number;
  importMsMedian: number;
  importMsAll: number[];
  uploadMegapixels: number;
  uploadBytes: number;
  uploadMsMedian: number;
  uploadMsAll: number[];
}

/** Runs both measurements and prints them. */
export async function runBreakdownBench(): Promise<BreakdownBenchResult> {
  const pg = await ensureLocalPostgres({
    dataDir: process.env.PGDATA_DIR ?? path.resolve(".data/pg"),
    port: Number(process.env.PGPORT ?? 5433),
  });
  await dropDatabase(pg.adminUrl, "seamscene_bench");
  process.env.DATABASE_URL = await ensureDatabase(pg, "seamscene_bench");
  process.env.NODE_ENV = "test";
  process.env.LOG_LEVEL = "silent";
  const storageDir = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-bench-"));
  process.env.STORAGE_DIR = storageDir;
  process.env.STORAGE_DRIVER = "disk";

  const { sequelize } = await import("../../server/db.js");
  const { migrate } = await import("../../server/migrator.js");
  await migrate(sequelize);
  const { createApp, closeAppResources } = await import("../../server/app.js");
  const { Production, Membership, User } = await import("../../server/models/index.js");
  const { hashPassword } = await import("../../server/auth/passwords.js");
  const { default: request } = await import("supertest");
  const sharp = (await import("sharp")).default;

  const app = createApp();
  const password = "bench-password-1234";
  const user = await User.create({
    email: "bench@bench.invalid",
    name: "Bench",
    passwordHash: await hashPassword(password),
    isActive: true,
    lastProductionId: null,
  });
  const agent = request.agent(app);
  const token = async () => (await agent.get("/api/auth/csrf")).body.token as string;
  // The agent attaches cookies when a request is created, so fetch the token first.
  const loginToken = await token();
  await agent.post("/api/auth/login").set("X-CSRF-Token", loginToken).send({ email: user.email, password }).expect(200);
  const csrf = await token();

  const rows = 2000;
  const file = csv(rows);
  const importMs: number[] = [];
  for (let r = 0; r < RUNS; r++) {
    // A fresh production each run: every row is an insert, as in a first import.
    const p = await Production.create({ title: `Bench ${r}`, kind: "film", startsOn: null, endsOn: null, createdBy: null });
    await Membership.create({ productionId: p.id, userId: user.id, role: "supervisor" });
    const t0 = performance.now();
    await agent.post(`/api/productions/${p.id}/imports/breakdown`).set("X-CSRF-Token", csrf).send({ csv: file }).expect(201);
    importMs.push(performance.now() - t0);
  }

  // 4000 × 3000 = 12 MP, with noise so the JPEG has realistic entropy, EXIF orientation and GPS.
  const width = 4000;
  const height = 3000;
  const noise = Buffer.alloc(width * height * 3);
  let seed = 12345;
  for (let i = 0; i < noise.length; i++) {
    seed = (seed * 1103515245 + 12345) & 0x7fffffff;
    noise[i] = (seed >> 16) & 0xff;
  }
  const jpegs: Buffer[] = [];
  for (let r = 0; r < RUNS; r++) {
    noise[r] = r; // a different image each run, so none is a duplicate
    jpegs.push(
      await sharp(noise, { raw: { width, height, channels: 3 } })
        .blur(1.2)
        .jpeg({ quality: 90 })
        .withExif({
          IFD0: { Make: "BenchCam" },
          IFD3: { GPSLatitudeRef: "N", GPSLatitude: "50/1 9/1 0/1", GPSLongitudeRef: "W", GPSLongitude: "5/1 4/1 0/1" },
        })
        .withMetadata({ orientation: 6 })
        .toBuffer(),
    );
  }
  const p = await Production.create({ title: "Bench photos", kind: "film", startsOn: null, endsOn: null, createdBy: null });
  await Membership.create({ productionId: p.id, userId: user.id, role: "supervisor" });
  const [scene] = await sequelize.query<{ id: string }>(
    `INSERT INTO scenes (id, production_id, number, story_order) VALUES (gen_random_uuid(), :pid, '1', 1) RETURNING id`,
    { replacements: { pid: p.id }, type: (await import("sequelize")).QueryTypes.SELECT },
  );
  const uploadMs: number[] = [];
  for (const jpeg of jpegs) {
    const t0 = performance.now();
    await agent
      .post(`/api/productions/${p.id}/photos`)
      .set("X-CSRF-Token", csrf)
      .field("ownerType", "scene")
      .field("ownerId", scene!.id)
      .field("view", "front")
      .attach("file", jpeg, { filename: "frame.jpg", contentType: "image/jpeg" })
      .expect(201);
    uploadMs.push(performance.now() - t0);
  }

  const result: BreakdownBenchResult = {
    importRows: rows,
    importMsMedian: Math.round(median(importMs)),
    importMsAll: importMs.map(Math.round),
    uploadMegapixels: (width * height) / 1e6,
    uploadBytes: jpegs[0]!.length,
    uploadMsMedian: Math.round(median(uploadMs)),
    uploadMsAll: uploadMs.map(Math.round),
  };
  console.log(
    `CSV import, ${rows} rows (scenes + ${Math.ceil(rows / 6)} shoot days), one request: median ${result.importMsMedian} ms (runs: ${result.importMsAll.join(", ")} ms)`,
  );
  console.log(
    `Photo upload, ${result.uploadMegapixels} MP JPEG (${(result.uploadBytes / 1e6).toFixed(1)} MB) → full JPEG + display/thumb WebP, stored: median ${result.uploadMsMedian} ms (runs: ${result.uploadMsAll.join(", ")} ms)`,
  );
  console.log(`Machine: ${os.cpus().length} × ${os.cpus()[0]?.model ?? "cpu"}, Node ${process.version}`);

  await closeAppResources();
  await sequelize.close();
  await dropDatabase(pg.adminUrl, "seamscene_bench");
  fs.rmSync(storageDir, { recursive: true, force: true });
  return result;
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  await runBreakdownBench();
}
