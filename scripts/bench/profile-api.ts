// CPU profile of the Seamscene server under load on one signed-in endpoint, summed per module
// (package or source folder). Run: npx tsx scripts/bench/profile-api.ts [garments|scenes|snags|health] [seconds]
import fs from "node:fs";
import path from "node:path";
import autocannon from "autocannon";
import { freshDatabase, seedDatabase, signIn, startSeamscene } from "./lib/processes.js";

const [which = "garments", secondsArg = "10"] = process.argv.slice(2);
const dir = path.resolve(".data/bench/profile");

interface Node {
  id: number;
  callFrame: { url: string; functionName: string };
  children?: number[];
}
interface Profile {
  nodes: Node[];
  samples: number[];
  timeDeltas: number[];
  startTime: number;
}

let topFunctions: Array<[string, number]> = [];

/** Self time per module: node_modules/<package>, or the project folder (server/, shared/…), or node internals. */
function summarise(profile: Profile, fromUs: number, toUs: number): Array<[string, number]> {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const self = new Map<number, number>();
  // Only samples taken while the load ran (V8's and hrtime's clocks are both the monotonic clock).
  let at = profile.startTime;
  profile.samples.forEach((id, i) => {
    at += profile.timeDeltas[i] ?? 0;
    if (at >= fromUs && at <= toUs) self.set(id, (self.get(id) ?? 0) + (profile.timeDeltas[i] ?? 0));
  });
  const out = new Map<string, number>();
  const fns = new Map<string, number>();
  let total = 0;
  for (const [id, t] of self) {
    const frame = byId.get(id)?.callFrame;
    const fnKey = `${frame?.functionName || "(anonymous)"} ${(frame?.url ?? "").replace(/^.*node_modules\//, "").replace(/^file:\/\/.*?\/(server|shared)\//, "$1/")}`;
    fns.set(fnKey, (fns.get(fnKey) ?? 0) + t);
    const url = byId.get(id)?.callFrame.url ?? "";
    const fn = byId.get(id)?.callFrame.functionName ?? "";
    const m = /node_modules\/((?:@[^/]+\/)?[^/]+)/.exec(url);
    const key = m
      ? m[1]!
      : url.includes("/server/")
        ? `server/${url.split("/server/")[1]!.split("/")[0]}`
        : url.includes("/shared/")
          ? "shared"
          : url.startsWith("node:")
            ? `${url.split("/").slice(0, 3).join("/")}`
            : fn
              ? `(${fn})`
              : "(other)";
    out.set(key, (out.get(key) ?? 0) + t);
    total += t;
  }
  topFunctions = [...fns].map(([k, t]) => [k, t / total] as [string, number]).sort((a, b) => b[1] - a[1]);
  return [...out].map(([k, t]) => [k, t / total] as [string, number]).sort((a, b) => b[1] - a[1]);
}

async function main() {
  fs.rmSync(dir, { recursive: true, force: true });
  const databaseUrl = await freshDatabase("seamscene_bench");
  seedDatabase(databaseUrl);
  const app = await startSeamscene({
    databaseUrl,
    logFile: path.join(dir, "server.log"),
    nodeArgs: ["--cpu-prof", `--cpu-prof-dir=${dir}`],
  });
  const { cookie, me } = await signIn(app.url, "supervisor@seamscene.test", "seamscene-demo");
  const pid = me.memberships.find((m) => m.title === "Saltmarsh Hollow")!.productionId;
  const paths: Record<string, string> = {
    garments: `/api/productions/${pid}/garments?pageSize=50`,
    scenes: `/api/productions/${pid}/scenes?pageSize=50`,
    snags: `/api/productions/${pid}/snags`,
    health: "/api/health",
  };
  const from = Number(process.hrtime.bigint() / 1000n);
  const result = await autocannon({ url: app.url + paths[which], connections: 50, duration: Number(secondsArg), headers: { cookie } });
  const to = Number(process.hrtime.bigint() / 1000n);
  console.log(`${which}: ${result.requests.average} req/s, p50 ${result.latency.p50} ms`);
  await app.stop();
  const file = fs.readdirSync(dir).find((f) => f.endsWith(".cpuprofile"));
  if (!file) throw new Error("no profile written");
  for (const [k, share] of summarise(JSON.parse(fs.readFileSync(path.join(dir, file), "utf8")) as Profile, from, to).slice(0, 25))
    console.log(`${(share * 100).toFixed(1).padStart(5)} %  ${k}`);
  console.log("\nTop functions (self time):");
  for (const [k, share] of topFunctions.slice(0, 30)) console.log(`${(share * 100).toFixed(1).padStart(5)} %  ${k}`);
}

main().then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
