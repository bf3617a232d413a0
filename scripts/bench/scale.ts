// The 10× production (4,000 scenes, 900 shoot days, 30,000 garments; `npm run seed -- --scale 10`)
// through a production server: snags on the first read after start (computed) and then from the
// cache, and pages of the main lists. Figures only; run as part of `npm run bench:api`.
import path from "node:path";
import { launchBrowser } from "../lib/chromium.js";
import { buildClientIfStale } from "../lib/client-build.js";
import { freshDatabase, seedDatabase, signIn, startSeamscene } from "./lib/processes.js";

const PASSWORD = "seamscene-demo";

async function timed(url: string, cookie: string): Promise<{ ms: number; bytes: number }> {
  const started = performance.now();
  const res = await fetch(url, { headers: { cookie, "accept-encoding": "identity" } });
  const body = await res.arrayBuffer();
  const ms = performance.now() - started;
  if (!res.ok) throw new Error(`${url}: ${res.status} ${Buffer.from(body).toString("utf8").slice(0, 300)}`);
  return { ms, bytes: body.byteLength };
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return (s[(s.length - 1) >> 1]! + s[s.length >> 1]!) / 2;
};

/** In the page: scroll the table 96 px per animation frame (a brisk flick, about 5,800 px a second at 60 fps). */
const SCROLL_AND_TIME = `(async () => {
  const scroller = document.querySelector("table")?.closest(".overflow-auto");
  if (!scroller) throw new Error("no scrolling breakdown table");
  const frames = [];
  let last = performance.now();
  await new Promise((done) => {
    const step = (t) => {
      frames.push(t - last);
      last = t;
      scroller.scrollTop += 96;
      if (frames.length < 300 && scroller.scrollTop + scroller.clientHeight < scroller.scrollHeight) requestAnimationFrame(step);
      else done();
    };
    requestAnimationFrame(step);
  });
  return { frames: frames.slice(1), height: scroller.scrollHeight };
})()`;

/**
 * Scrolls the breakdown table (every scene of the production) in Chromium, a fixed distance per
 * animation frame, and reads the intervals between frames: 60 fps is 16.7 ms a frame.
 */
export async function breakdownFrameTimes(appUrl: string, productionId: string): Promise<string> {
  const browser = await launchBrowser();
  try {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } });
    await page.goto(`${appUrl}/login`);
    await page.getByLabel("E-mail").fill("supervisor@seamscene.test");
    await page.getByLabel("Password").fill(PASSWORD);
    await page.getByRole("button", { name: "Sign in" }).click();
    await page.waitForURL((u) => !u.pathname.startsWith("/login"));
    await page.goto(`${appUrl}/p/${productionId}/breakdown`);
    await page.locator("table tbody tr").first().waitFor({ timeout: 120_000 });
    // A string, not a function: tsx would wrap a function's inner helpers in a name-keeping call the page lacks.
    const r = (await page.evaluate(SCROLL_AND_TIME)) as { frames: number[]; height: number };
    const sorted = [...r.frames].sort((a, b) => a - b);
    const q = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor(p * sorted.length))]!;
    const total = r.frames.reduce((a, b) => a + b, 0);
    const slow = r.frames.filter((f) => f > 1000 / 50).length;
    return (
      `${r.frames.length} frames over ${(r.height / 1000).toFixed(0)} k px of table: ${((r.frames.length * 1000) / total).toFixed(1)} fps, ` +
      `frame median ${q(0.5).toFixed(1)} ms, p95 ${q(0.95).toFixed(1)} ms, max ${sorted[sorted.length - 1]!.toFixed(1)} ms, ` +
      `${slow} frames over 20 ms (target 60 fps)`
    );
  } finally {
    await browser.close();
  }
}

export async function runScaleBench(dir: string): Promise<void> {
  buildClientIfStale();
  console.log("\n10× production: preparing a fresh database (demo + `--scale 10`)…");
  const databaseUrl = await freshDatabase("seamscene_bench_scale");
  const seedOut = seedDatabase(databaseUrl, ["--scale", "10"]);
  console.log(`  ${seedOut.split("\n").find((l) => l.startsWith("Tidewater")) ?? seedOut}`);
  const app = await startSeamscene({ databaseUrl, logFile: path.join(dir, "server-scale.log") });
  try {
    const { cookie, me } = await signIn(app.url, "supervisor@seamscene.test", PASSWORD);
    const pid = me.memberships.find((m) => m.title.startsWith("Tidewater Reach"))?.productionId;
    if (!pid) throw new Error("The 10× production is missing");
    const base = `${app.url}/api/productions/${pid}`;

    const first = await timed(`${base}/snags`, cookie);
    const cached: number[] = [];
    for (let i = 0; i < 5; i++) cached.push((await timed(`${base}/snags`, cookie)).ms);
    console.log(
      `  snags, first read after start (computed): ${first.ms.toFixed(0)} ms for ${(first.bytes / 1e6).toFixed(1)} MB (target ≤ 2000 ms) ${first.ms <= 2000 ? "met" : "NOT met"}`,
    );
    console.log(`  snags, from the cache: median ${median(cached).toFixed(0)} ms of 5 reads`);

    const pages: Array<[string, string]> = [
      ["garments, page 1 of 50", "/garments?pageSize=50"],
      ["garments, page 400 of 50 by name", "/garments?pageSize=50&page=400&sort=name"],
      ["garments, search", "/garments?pageSize=50&q=waistcoat%2012"],
      ["scenes, page 1 of 50", "/scenes?pageSize=50"],
      ["scenes, page 60 of 50", "/scenes?pageSize=50&page=60"],
    ];
    for (const [name, p] of pages) {
      await timed(base + p, cookie);
      const ms: number[] = [];
      let bytes = 0;
      for (let i = 0; i < 5; i++) {
        const r = await timed(base + p, cookie);
        ms.push(r.ms);
        bytes = r.bytes;
      }
      console.log(`  ${name.padEnd(34)} median ${median(ms).toFixed(0).padStart(4)} ms of 5 (${bytes} bytes)`);
    }
    console.log(`  server RSS after the 10× reads: ${app.rssMb().toFixed(0)} MB`);
    console.log(`  breakdown table in Chromium (4,000 scenes, 1280 × 900): ${await breakdownFrameTimes(app.url, pid)}`);
  } finally {
    await app.stop();
  }
}
