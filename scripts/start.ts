/**
 * `npm start`: starts PostgreSQL and the SMTP fake when needed, builds the client when it is
 * missing or older than its sources, migrates, loads the demo data into an empty database, serves.
 */
import { buildClientIfStale } from "./lib/client-build.js";
import { prepareLocalEnv } from "./lib/local-env.js";
import { startBanner } from "./lib/banner.js";

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
