/**
 * End-to-end tests: a real server (`npm start`'s script) on a free port with a fresh database holding
 * the demo data, and the SMTP fake; tests drive Debian's Chromium against it.
 */
import { spawn, type ChildProcess } from "node:child_process";
import net from "node:net";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { dropDatabase, ensureDatabase } from "../../scripts/lib/postgres.js";
import { startTestPostgres } from "./test-postgres.js";
import { TEST_CLOCK_AT, testToday } from "./test-clock.js";

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const port = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(port));
    });
  });
}

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    databaseUrl: string;
    /** The day the server's clock reads and the demo is anchored to (yyyy-MM-dd). */
    today: string;
    /** The instant the server's clock started at. */
    clockAt: string;
  }
}

let child: ChildProcess | undefined;

export default async function setup(project: TestProject) {
  const pg = await startTestPostgres();
  await dropDatabase(pg.adminUrl, "seamscene_e2e");
  const databaseUrl = await ensureDatabase(pg, "seamscene_e2e");
  const port = await freePort();
  const smtpPort = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    DATABASE_URL: databaseUrl,
    PORT: String(port),
    SMTP_PORT: String(smtpPort),
    NODE_ENV: "development",
    LOG_LEVEL: "warn",
    STORAGE_DIR: ".data/e2e-storage",
    DATA_DIR: ".data/e2e-data",
    APP_URL: `http://127.0.0.1:${port}`,
    CLOCK_AT: TEST_CLOCK_AT,
  };
  delete env.SMTP_HOST;
  child = spawn(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "scripts/start.ts"], {
    env,
    stdio: ["ignore", "pipe", "pipe"],
  });
  let output = "";
  child.stdout?.on("data", (d) => (output += d));
  child.stderr?.on("data", (d) => (output += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  // Generous: on a loaded machine the first start also builds the client.
  const deadline = Date.now() + 360_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`The e2e server exited:\n${output}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) break;
    } catch {
      /* not up yet */
    }
    if (Date.now() > deadline) throw new Error(`The e2e server did not come up:\n${output}`);
    await new Promise((r) => setTimeout(r, 300));
  }
  project.provide("baseUrl", baseUrl);
  project.provide("databaseUrl", databaseUrl);
  project.provide("today", testToday());
  project.provide("clockAt", TEST_CLOCK_AT);
  return async () => {
    child?.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 300));
  };
}
