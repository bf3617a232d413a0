// Builds the client with Vite when dist/ is missing or older than its sources (`npm start`, the benches).
import fs from "node:fs";
import path from "node:path";
import { execFileSync } from "node:child_process";

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const e of fs.readdirSync(p)) max = Math.max(max, newestMtime(path.join(p, e)));
  return max;
}

export function buildClientIfStale(): void {
  const built = path.resolve("dist/index.html");
  const builtAt = fs.existsSync(built) ? fs.statSync(built).mtimeMs : 0;
  const sourcesAt = Math.max(...["src", "shared", "index.html", "vite.config.ts", "package.json"].map((p) => newestMtime(path.resolve(p))));
  if (builtAt >= sourcesAt) return;
  console.log("Building the client…");
  execFileSync(process.execPath, [path.resolve("node_modules/vite/bin/vite.js"), "build", "--logLevel", "warn"], { stdio: "inherit" });
}
