// `npm run bench:api`: Seamscene's signed-in endpoints against a bare Express server sending the same
// bytes, measured with autocannon in one run, the two sides alternating three times; then a soak at 64
// connections, the server's memory, and the 10× production (snags first load and from the cache, pages
// of the main lists; scripts/bench/scale.ts). The lists' query plans are checked by tests/server/list-plans.test.ts.
// Figures only: nothing here passes or fails a test. Options: --seconds N (each measurement, default 5),
// --soak N (default 60), --no-scale (skip the 10× part), --scale-only.
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import autocannon from "autocannon";
import { freshDatabase, seedDatabase, signIn, startBare, startSeamscene, type Running } from "./lib/processes.js";
import { runScaleBench } from "./scale.js";

const { values } = parseArgs({
  options: {
    seconds: { type: "string", default: "5" },
    soak: { type: "string", default: "60" },
    "no-scale": { type: "boolean", default: false },
    "scale-only": { type: "boolean", default: false },
  },
});
const SECONDS = Number(values.seconds);
const SOAK_SECONDS = Number(values.soak);
const CONNECTIONS = 50;
const SOAK_CONNECTIONS = 64;
const ROUNDS = 3;
const WORK_DIR = path.resolve(".data/bench");
const PASSWORD = "seamscene-demo";

interface Side {
  /** CPU ms of the server process per request, per round. */
  cpu: number[];
  rps: number[];
  p50: number[];
  p99: number[];
  errors: number;
}

function cannon(opts: autocannon.Options): Promise<autocannon.Result> {
  return new Promise((resolve, reject) => {
    autocannon(opts, (err, result) => (err ? reject(err) : resolve(result)));
  });
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s[(s.length - 1) >> 1]! + s[s.length >> 1]!) / 2 : NaN;
};
const fmt = (n: number, d = 0) => (Number.isFinite(n) ? n.toFixed(d) : "–");
const pct = (n: number) => `${fmt(n * 100)} %`;

async function measureRatios(app: Running, cookie: string, endpoints: Array<{ name: string; path: string; target: number }>) {
  const bodies: Record<string, string> = {};
  for (const e of endpoints) {
    const res = await fetch(app.url + e.path, { headers: { cookie } });
    if (!res.ok) throw new Error(`${e.name}: ${res.status} ${await res.text()}`);
    bodies[e.path] = await res.text();
  }
  const bare = await startBare(bodies, WORK_DIR);
  try {
    const sides = new Map(
      endpoints.map((e) => [
        e.path,
        { bare: { cpu: [], rps: [], p50: [], p99: [], errors: 0 } as Side, app: { cpu: [], rps: [], p50: [], p99: [], errors: 0 } as Side },
      ]),
    );
    const run = async (server: Running, p: string, side: Side, seconds: number, record = true) => {
      const cpuBefore = server.cpuMs();
      const r = await cannon({ url: server.url + p, connections: CONNECTIONS, duration: seconds, headers: { cookie } });
      if (!record) return;
      side.cpu.push((server.cpuMs() - cpuBefore) / Math.max(1, r.requests.total));
      side.rps.push(r.requests.average);
      side.p50.push(r.latency.p50);
      side.p99.push(r.latency.p99);
      side.errors += r.errors + r.timeouts + r.non2xx;
    };
    // Warm both (JIT, pools, caches) before measuring.
    for (const e of endpoints) {
      await run(bare, e.path, sides.get(e.path)!.bare, 2, false);
      await run(app, e.path, sides.get(e.path)!.app, 2, false);
    }
    for (let round = 0; round < ROUNDS; round++) {
      for (const e of endpoints) {
        const s = sides.get(e.path)!;
        // Alternate which side goes first so a drift in the machine's load does not favour one.
        const order: Array<[Running, Side]> =
          round % 2 === 0
            ? [
                [bare, s.bare],
                [app, s.app],
              ]
            : [
                [app, s.app],
                [bare, s.bare],
              ];
        for (const [server, side] of order) await run(server, e.path, side, SECONDS);
        process.stdout.write(".");
      }
    }
    process.stdout.write("\n");
    console.log(
      `\n${CONNECTIONS} connections, ${ROUNDS} alternating rounds of ${SECONDS} s per side (median of rounds; ratio = Seamscene / bare, summed over rounds)`,
    );
    console.log(
      `CPU ratio = the bare server's CPU time per request / Seamscene's (its own process, PostgreSQL not counted): what the ratio would be if the server alone were the limit. Load average now: ${os
        .loadavg()
        .map((x) => x.toFixed(1))
        .join(", ")} on ${os.cpus().length} cores.`,
    );
    console.log(
      [
        "endpoint".padEnd(34),
        "bytes".padStart(7),
        "bare req/s".padStart(11),
        "app req/s".padStart(10),
        "ratio".padStart(7),
        "target".padStart(7),
        "p50 ms".padStart(7),
        "p99 ms".padStart(7),
        "p99/p50".padStart(8),
        "errors".padStart(7),
        "CPU ms/req bare".padStart(16),
        "app".padStart(6),
        "CPU ratio".padStart(10),
      ].join(" "),
    );
    const summary: Array<{ name: string; ratio: number; target: number; p99overP50: number; errors: number }> = [];
    for (const e of endpoints) {
      const s = sides.get(e.path)!;
      const ratio = s.app.rps.reduce((a, b) => a + b, 0) / s.bare.rps.reduce((a, b) => a + b, 0);
      const p50 = median(s.app.p50);
      const p99 = median(s.app.p99);
      summary.push({ name: e.name, ratio, target: e.target, p99overP50: p99 / Math.max(p50, 1), errors: s.app.errors });
      console.log(
        [
          e.name.padEnd(34),
          String(Buffer.byteLength(bodies[e.path]!)).padStart(7),
          fmt(median(s.bare.rps)).padStart(11),
          fmt(median(s.app.rps)).padStart(10),
          pct(ratio).padStart(7),
          (e.target ? `≥ ${pct(e.target)}` : "").padStart(7),
          fmt(p50, 1).padStart(7),
          fmt(p99, 1).padStart(7),
          fmt(p99 / Math.max(p50, 1), 1).padStart(8),
          String(s.app.errors).padStart(7),
          fmt(median(s.bare.cpu), 2).padStart(16),
          fmt(median(s.app.cpu), 2).padStart(6),
          pct(median(s.bare.cpu) / median(s.app.cpu)).padStart(10),
        ].join(" "),
      );
    }
    return summary;
  } finally {
    await bare.stop();
  }
}

async function soak(app: Running, cookie: string, paths: string[]) {
  const r = await cannon({
    url: app.url,
    connections: SOAK_CONNECTIONS,
    duration: SOAK_SECONDS,
    headers: { cookie },
    requests: paths.map((p) => ({ method: "GET", path: p })),
  });
  return {
    rps: r.requests.average,
    total: r.requests.total,
    errors: r.errors,
    timeouts: r.timeouts,
    non2xx: r.non2xx,
    p50: r.latency.p50,
    p99: r.latency.p99,
  };
}

async function main() {
  fs.mkdirSync(WORK_DIR, { recursive: true });
  if (!values["scale-only"]) {
    console.log("Preparing a fresh database with the demo data…");
    const databaseUrl = await freshDatabase("seamscene_bench");
    seedDatabase(databaseUrl);
    const app = await startSeamscene({ databaseUrl, logFile: path.join(WORK_DIR, "server.log") });
    try {
      const { cookie, me } = await signIn(app.url, "supervisor@seamscene.test", PASSWORD);
      const pid = me.memberships.find((m) => m.title === "Saltmarsh Hollow")?.productionId;
      if (!pid) throw new Error("The demo production is missing");
      const base = `/api/productions/${pid}`;
      const endpoints = [
        { name: "garments list (50 rows)", path: `${base}/garments?pageSize=50`, target: 0.4 },
        { name: "scenes list (50 rows)", path: `${base}/scenes?pageSize=50`, target: 0.4 },
        { name: "snags list", path: `${base}/snags`, target: 0.4 },
        { name: "/api/health with a session", path: "/api/health", target: 0.6 },
        { name: "/api/auth/me (session + user)", path: "/api/auth/me", target: 0 },
      ];
      console.log(`Seamscene at ${app.url} (NODE_ENV=production, log to .data/bench/server.log); measuring…`);
      const summary = await measureRatios(app, cookie, endpoints);
      console.log(`\nSoak: ${SOAK_CONNECTIONS} connections for ${SOAK_SECONDS} s over the same endpoints, round robin…`);
      const s = await soak(
        app,
        cookie,
        endpoints.map((e) => e.path),
      );
      const rss = app.rssMb();
      console.log(
        `  ${s.total} requests, ${fmt(s.rps)} req/s, p50 ${s.p50} ms, p99 ${s.p99} ms; errors ${s.errors}, timeouts ${s.timeouts}, non-2xx ${s.non2xx}`,
      );
      console.log(`  server RSS after the run: ${fmt(rss)} MB (target ≤ 300 MB)`);
      console.log("\nAgainst the targets:");
      for (const x of summary) {
        if (x.target)
          console.log(
            `  ${x.name}: ${pct(x.ratio)} of bare Express (target ≥ ${pct(x.target)}) ${x.ratio >= x.target ? "met" : "NOT met"}`,
          );
        console.log(`  ${x.name}: p99 = ${fmt(x.p99overP50, 1)} × p50 (target ≤ 5) ${x.p99overP50 <= 5 ? "met" : "NOT met"}`);
      }
      const soakErrors = s.errors + s.timeouts + s.non2xx;
      console.log(`  soak at ${SOAK_CONNECTIONS} connections: ${soakErrors} errors (target 0) ${soakErrors === 0 ? "met" : "NOT met"}`);
      console.log(`  RSS ${fmt(rss)} MB (target ≤ 300) ${rss <= 300 ? "met" : "NOT met"}`);
    } finally {
      await app.stop();
    }
  }
  if (!values["no-scale"]) await runScaleBench(WORK_DIR);
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
