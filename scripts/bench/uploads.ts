// Benchmark: does one heavy upload stall the server? The real server runs as its own process (tsx
// server/index.ts) against a private database "seamscene_bench_uploads"; this process polls
// GET /api/health one request after another and records each answer's time while the server reads
// a DXF with one 40,000-point outline, imports a DXF of 8 pieces × 5,000 points, and publishes a
// packet of 100 panels of 1,000 points each. Prints p50 / p99 / max per phase; asserts nothing.
import { spawn, type ChildProcess } from "node:child_process";
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { pathToFileURL } from "node:url";
import { dropDatabase, ensureDatabase, ensureLocalPostgres } from "../lib/postgres.js";

const DB = "seamscene_bench_uploads";
const TARGET_P99_MS = 100;

/** An outline of n points round an ellipse (a, b mm), centred at (cx, cy), as DXF LWPOLYLINE groups. */
function ellipseLwpolyline(n: number, a: number, b: number, cx = 0, cy = 0): string {
  const pts: string[] = [];
  for (let i = 0; i < n; i++) {
    const t = (2 * Math.PI * i) / n;
    pts.push(`10\n${(cx + a * Math.cos(t)).toFixed(4)}\n20\n${(cy + b * Math.sin(t)).toFixed(4)}`);
  }
  return `0\nLWPOLYLINE\n8\n0\n90\n${n}\n70\n1\n${pts.join("\n")}`;
}
const dxfFile = (...entities: string[]) =>
  `0\nSECTION\n2\nHEADER\n9\n$INSUNITS\n70\n4\n0\nENDSEC\n0\nSECTION\n2\nENTITIES\n${entities.join("\n")}\n0\nENDSEC\n0\nEOF\n`;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
  });
}

const pct = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)]! : NaN;
};

/** Polls /api/health back to back (5 ms apart) until stopped; returns each answer's time in ms. */
function pollHealth(base: string): { stop: () => Promise<number[]> } {
  const times: number[] = [];
  let running = true;
  const loop = (async () => {
    while (running) {
      const t0 = performance.now();
      const res = await fetch(`${base}/api/health`);
      await res.arrayBuffer();
      times.push(performance.now() - t0);
      await new Promise((r) => setTimeout(r, 5));
    }
  })();
  return {
    stop: async () => {
      running = false;
      await loop;
      return times;
    },
  };
}

/** A tiny cookie-keeping client with the CSRF header. */
function client(base: string) {
  const cookies = new Map<string, string>();
  let csrf = "";
  const send = async (method: string, url: string, body?: BodyInit, json = true) => {
    const headers: Record<string, string> = { cookie: [...cookies].map(([k, v]) => `${k}=${v}`).join("; ") };
    if (csrf) headers["x-csrf-token"] = csrf;
    if (body && json) headers["content-type"] = "application/json";
    const res = await fetch(`${base}${url}`, { method, headers, body });
    for (const c of res.headers.getSetCookie()) {
      const [kv] = c.split(";");
      const i = kv!.indexOf("=");
      cookies.set(kv!.slice(0, i), kv!.slice(i + 1));
    }
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  };
  return {
    async signIn(email: string, password: string) {
      csrf = (await send("GET", "/api/auth/csrf")).body.token;
      const r = await send("POST", "/api/auth/login", JSON.stringify({ email, password }));
      if (r.status !== 200) throw new Error(`sign-in failed: ${r.status}`);
      csrf = (await send("GET", "/api/auth/csrf")).body.token;
    },
    post: (url: string, body: unknown) => send("POST", url, JSON.stringify(body)),
    upload: (url: string, form: FormData) => send("POST", url, form, false),
  };
}

/** One measured phase: the work's time and the health answers meanwhile. */
interface Phase {
  name: string;
  workMs: number;
  outcome: string;
  health: number[];
}

function printPhase(p: Phase) {
  const h = p.health;
  console.log(
    `  ${p.name.padEnd(44)} ${p.outcome.padEnd(30)} ${p.workMs.toFixed(0).padStart(6)} ms | health n=${String(h.length).padStart(4)} p50 ${pct(h, 50).toFixed(1).padStart(6)} ms  p99 ${pct(h, 99).toFixed(1).padStart(6)} ms  max ${Math.max(
      ...h,
    )
      .toFixed(1)
      .padStart(6)} ms`,
  );
}

/** Runs the phases against a server process and prints the figures. */
export async function runUploadsBench(): Promise<Phase[]> {
  const pg = await ensureLocalPostgres({
    dataDir: process.env.PGDATA_DIR ?? path.resolve(".data/pg"),
    port: Number(process.env.PGPORT ?? 5433),
  });
  await dropDatabase(pg.adminUrl, DB);
  const databaseUrl = await ensureDatabase(pg, DB);
  process.env.DATABASE_URL = databaseUrl;
  process.env.NODE_ENV = "test";
  process.env.LOG_LEVEL = "silent";
  const storageDir = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-bench-uploads-"));

  const { sequelize } = await import("../../server/db.js");
  const { migrate } = await import("../../server/migrator.js");
  await migrate(sequelize);
  const { User, Production, Membership, Panel } = await import("../../server/models/index.js");
  const { hashPassword } = await import("../../server/auth/passwords.js");
  const { startSmtpFake } = await import("../../server/lib/smtp-fake.js");
  const smtp = await startSmtpFake({ port: 0 });

  // Data: a supervisor, a vfx recipient, one change with 4 garments and 100 panels of 1,000 points.
  const password = "bench-password-1234";
  const sup = await User.create({
    email: "bench-sup@bench.invalid",
    name: "Bench Supervisor",
    passwordHash: await hashPassword(password),
    isActive: true,
    lastProductionId: null,
  });
  const vfx = await User.create({
    email: "bench-vfx@bench.invalid",
    name: "Bench Artist",
    passwordHash: await hashPassword(password),
    isActive: true,
    lastProductionId: null,
  });
  const prod = await Production.create({ title: "Bench production", kind: "film", startsOn: null, endsOn: null, createdBy: null });
  await Membership.create({ productionId: prod.id, userId: sup.id, role: "supervisor" });
  await Membership.create({ productionId: prod.id, userId: vfx.id, role: "vfx" });
  const insert = async (table: string, row: Record<string, unknown>) => {
    const id = randomUUID();
    const cols = Object.keys(row);
    await sequelize.query(`INSERT INTO ${table} (id, ${cols.join(", ")}) VALUES (:id, ${cols.map((c) => `:${c}`).join(", ")})`, {
      replacements: { id, ...row },
    });
    return id;
  };
  const performerId = await insert("performers", { production_id: prod.id, name: "Bench Performer" });
  const characterId = await insert("characters", { production_id: prod.id, name: "Bench Character", performer_id: performerId });
  const changeId = await insert("changes", { production_id: prod.id, character_id: characterId, number: 1, description: "Bench change" });
  const garmentIds: string[] = [];
  for (let g = 0; g < 4; g++) {
    const gid = await insert("garments", {
      production_id: prod.id,
      tag_code: `BN${g}${randomUUID().slice(0, 4)}`,
      name: `Garment ${g + 1}`,
      category: "coat",
      source: "built",
    });
    await insert("change_items", { production_id: prod.id, change_id: changeId, label: `Item ${g + 1}`, garment_id: gid, sort_order: g });
    garmentIds.push(gid);
  }
  const panelPoints = 1000;
  await Panel.bulkCreate(
    Array.from({ length: 100 }, (_, i) => ({
      productionId: prod.id,
      garmentId: garmentIds[i % 4]!,
      name: `Piece ${i + 1}`,
      outline: Array.from({ length: panelPoints }, (_, k) => {
        const t = (2 * Math.PI * k) / panelPoints;
        return [Math.round(300 * Math.cos(t) * 1000) / 1000, Math.round(450 * Math.sin(t) * 1000) / 1000] as [number, number];
      }),
      grainline: [
        [0, -300],
        [0, 300],
      ] as [[number, number], [number, number]],
      notches: [],
      seamAllowanceMm: 15,
      cutCount: 2,
      mirrored: i % 2 === 0,
      grainMode: "straight" as const,
      fabricId: null,
      source: "drawn" as const,
      sortOrder: i,
    })),
  );
  await sequelize.close();

  // The server, as its own process.
  const port = await freePort();
  const server: ChildProcess = spawn(
    process.execPath,
    [
      ...(process.env.BENCH_CPU_PROF ? ["--cpu-prof", `--cpu-prof-dir=${process.env.BENCH_CPU_PROF}`] : []),
      "--import",
      "tsx",
      "server/index.ts",
    ],
    {
      env: {
        ...process.env,
        PORT: String(port),
        HOST: "127.0.0.1",
        DATABASE_URL: databaseUrl,
        NODE_ENV: "test",
        LOG_LEVEL: "silent",
        JOBS_ENABLED: "false",
        STORAGE_DRIVER: "disk",
        STORAGE_DIR: storageDir,
        SMTP_HOST: "127.0.0.1",
        SMTP_PORT: String(smtp.port),
      },
      stdio: ["ignore", "inherit", "inherit"],
    },
  );
  const base = `http://127.0.0.1:${port}`;
  const phases: Phase[] = [];
  try {
    for (let i = 0; ; i++) {
      try {
        if ((await fetch(`${base}/api/health`)).ok) break;
      } catch {
        // not listening yet
      }
      if (i > 300) throw new Error("the server did not start");
      await new Promise((r) => setTimeout(r, 200));
    }
    const api = client(base);
    await api.signIn(sup.email, password);
    const p = `/api/productions/${prod.id}`;

    const measure = async (name: string, work: () => Promise<string>) => {
      const poll = pollHealth(base);
      await new Promise((r) => setTimeout(r, 200));
      const t0 = performance.now();
      const outcome = await work();
      const workMs = performance.now() - t0;
      await new Promise((r) => setTimeout(r, 200));
      phases.push({ name, workMs, outcome, health: await poll.stop() });
      printPhase(phases[phases.length - 1]!);
    };
    const dxfForm = (text: string, fields: Record<string, string>) => {
      const form = new FormData();
      for (const [k, v] of Object.entries(fields)) form.append(k, v);
      form.append("file", new Blob([text]), "bench.dxf");
      return form;
    };

    console.log(
      `server process on :${port}; worker threads ${process.env.WORKER_THREADS ?? "default"}; target: health p99 under ${TARGET_P99_MS} ms while heavy work runs`,
    );
    await measure("idle", async () => {
      await new Promise((r) => setTimeout(r, 1500));
      return "—";
    });
    // Warm the worker pool once (its first start loads the TypeScript sources), as a running server would be.
    await api.upload(`${p}/panels/dxf-preview`, dxfForm(dxfFile(ellipseLwpolyline(100, 100, 100)), {}));
    const one = dxfFile(ellipseLwpolyline(40_000, 300, 450));
    await measure(`DXF: one 40,000-point outline (${(one.length / 1e6).toFixed(1)} MB)`, async () => {
      const r = await api.upload(`${p}/panels/dxf-import`, dxfForm(one, { garmentId: garmentIds[0]! }));
      return `${r.status} ${r.body?.error?.code ?? ""}`.trim();
    });
    const eight = dxfFile(...Array.from({ length: 8 }, (_, i) => ellipseLwpolyline(5000, 200, 300, i * 500, 0)));
    await measure(`DXF: 8 pieces × 5,000 points (${(eight.length / 1e6).toFixed(1)} MB)`, async () => {
      const r = await api.upload(`${p}/panels/dxf-import`, dxfForm(eight, { garmentId: garmentIds[1]! }));
      return `${r.status}, ${r.body?.data?.panels?.length ?? 0} pieces imported`;
    });
    const draft = await api.post(`${p}/packets`, { changeId, garmentIds, recipientUserIds: [vfx.id] });
    if (draft.status !== 201) throw new Error(`draft: ${draft.status} ${JSON.stringify(draft.body)}`);
    await measure(`packet: 100 panels × ${panelPoints.toLocaleString("en-GB")} points, published`, async () => {
      const r = await api.post(`${p}/packets/${draft.body.data.id}/publish`, {});
      return `${r.status}, ZIP ${((r.body?.data?.zipBytes ?? 0) / 1e6).toFixed(1)} MB`;
    });
    const heavy = phases.slice(1).flatMap((x) => x.health);
    const p99 = pct(heavy, 99);
    console.log(
      `  health p99 over all heavy phases: ${p99.toFixed(1)} ms (target < ${TARGET_P99_MS} ms: ${p99 < TARGET_P99_MS ? "met" : "NOT met"}); ratio to idle p99 ${(p99 / pct(phases[0]!.health, 99)).toFixed(2)}`,
    );
  } finally {
    server.kill("SIGTERM");
    await new Promise((r) => server.once("exit", r));
    await smtp.close();
    fs.rmSync(storageDir, { recursive: true, force: true });
    await dropDatabase(pg.adminUrl, DB);
  }
  return phases;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runUploadsBench();
}
