// The service worker's precache (the app shell a phone keeps for working without a signal) and the
// JavaScript the first page load needs. Budget: precache ≤ 1.5 MB (issue 17).
import { execFileSync } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { gzipSync } from "node:zlib";
import { precacheOf, readViteManifest } from "../lib/precache.js";

export const PRECACHE_BUDGET_BYTES = 1.5 * 1024 * 1024;

const kb = (b: number) => `${(b / 1024).toFixed(1)} KiB`;

/** JS files of the entry and its static imports: what loads before the first screen shows. */
function initialJs(distDir: string): string[] {
  const m = readViteManifest(distDir);
  const out = new Set<string>();
  const walk = (key: string) => {
    const c = m[key];
    if (!c || out.has(c.file)) return;
    out.add(c.file);
    for (const k of c.imports ?? []) walk(k);
  };
  walk("index.html");
  return [...out].filter((f) => f.endsWith(".js"));
}

export function runOfflineBench(): void {
  const distDir = path.resolve("dist");
  console.log("Building the client (vite build)…");
  execFileSync(process.execPath, [path.resolve("node_modules/vite/bin/vite.js"), "build", "--logLevel", "error"], { stdio: "inherit" });
  const pre = precacheOf(distDir);
  const total = pre.reduce((s, f) => s + f.bytes, 0);
  console.log(
    `precache: ${pre.length} files, ${kb(total)} (${total} B); budget ${kb(PRECACHE_BUDGET_BYTES)}; ratio ${(total / PRECACHE_BUDGET_BYTES).toFixed(2)} ${total <= PRECACHE_BUDGET_BYTES ? "(within budget)" : "(OVER BUDGET)"}`,
  );
  for (const f of [...pre].sort((a, b) => b.bytes - a.bytes).slice(0, 5)) console.log(`  ${f.url.padEnd(48)} ${kb(f.bytes)}`);
  const js = initialJs(distDir);
  const raw = js.reduce((s, f) => s + fs.statSync(path.join(distDir, f)).size, 0);
  const gz = js.reduce((s, f) => s + gzipSync(fs.readFileSync(path.join(distDir, f))).length, 0);
  console.log(`initial JS: ${js.length} files, ${kb(raw)} raw, ${kb(gz)} gzip`);
}

if (import.meta.url === `file://${process.argv[1]}`) runOfflineBench();
