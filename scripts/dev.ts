/** `npm run dev`: API server (restarts on change) plus Vite's hot-reloading client on :5173. */
import { spawn } from "node:child_process";
import path from "node:path";
import { prepareLocalEnv } from "./lib/local-env.js";
import { START_THREADPOOL_SIZE } from "./lib/threadpool.js";

async function main() {
  const local = await prepareLocalEnv();
  // The API process starts with its thread pool sized (read by Node before any of our code runs).
  const env = { ...process.env, DEV_SKIP_BUILD: "1", UV_THREADPOOL_SIZE: process.env.UV_THREADPOOL_SIZE ?? String(START_THREADPOOL_SIZE) };
  const api = spawn(
    process.execPath,
    [path.resolve("node_modules/tsx/dist/cli.mjs"), "watch", "--clear-screen=false", "scripts/dev-server.ts"],
    { stdio: "inherit", env },
  );
  const vite = spawn(process.execPath, [path.resolve("node_modules/vite/bin/vite.js")], { stdio: "inherit", env });
  const stop = () => {
    api.kill();
    vite.kill();
    local.pg?.stop();
    process.exit(0);
  };
  process.once("SIGINT", stop);
  process.once("SIGTERM", stop);
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
