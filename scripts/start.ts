/**
 * `npm start`: starts PostgreSQL and the SMTP fake when needed, builds the client when it is
 * missing or older than its sources, migrates, loads the demo data into an empty database, serves.
 */
import fs from "node:fs";
import path from "node:path";
import { execFileSync } from "node:child_process";
import { prepareLocalEnv } from "./lib/local-env.js";
import { startBanner } from "./lib/banner.js";

function newestMtime(p: string): number {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let max = st.mtimeMs;
  for (const e of fs.readdirSync(p)) max = Math.max(max, newestMtime(path.join(p, e)));
  return max;
}

function buildClientIfStale(): void {
  const built = path.resolve("dist/index.html");
  const builtAt = fs.existsSync(built) ? fs.statSync(built).mtimeMs : 0;
  const sourcesAt = Math.max(...["src", "shared", "index.html", "vite.config.ts", "package.json"].map((p) => newestMtime(path.resolve(p))));
  if (builtAt >= sourcesAt) return;
  console.log("Building the client…");
  execFileSync(process.execPath, [path.resolve("node_modules/vite/bin/vite.js"), "build", "--logLevel", "warn"], { stdio: "inherit" });
}

async function main() {
  const local = await prepareLocalEnv();
  buildClientIfStale();
  const { sequelize } = await import("../server/db.js");
  const { migrate } = await import("../server/migrator.js");
  await migrate(sequelize);
  if (local.startSmtpFake) {
    const { startSmtpFake } = await import("../server/lib/smtp-fake.js");
    await startSmtpFake({ port: Number(process.env.SMTP_PORT) });
  }
  const { seedIfEmpty, demoAccounts } = await import("../seeds/index.js");
  const seeded = await seedIfEmpty();
  const { startServer } = await import("../server/index.js");
  const { config } = await import("../server/config.js");
  await startServer();
  const url = `http://${config.HOST}:${config.PORT}`;
  const mailTo = local.startSmtpFake
    ? `the local SMTP fake on 127.0.0.1:${process.env.SMTP_PORT}${config.DEV_OUTBOX ? " (see Team → Outbox)" : ""}`
    : config.SMTP_HOST;
  const database = local.pg
    ? `PostgreSQL on 127.0.0.1:${local.pg.port}, data in ${local.pg.dataDir}${local.pg.startedHere ? "" : " (already running; left running on exit)"}`
    : undefined;
  for (const line of startBanner({ url, seeded, production: config.NODE_ENV === "production", database, mailTo, demoAccounts }))
    console.log(line);
  // Stops PostgreSQL only if this process started it (a second instance leaves the first one's alone).
  process.once("exit", () => local.pg?.stop());
}

main().catch((err) => {
  console.error(err instanceof Error ? err.message : err);
  process.exit(1);
});
