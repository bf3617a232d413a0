/**
 * Per test file, before any server module loads: point the app at this worker's own database
 * (cloned from the migrated template) and at a local SMTP fake on a free port.
 */
import path from "node:path";
import { afterAll, inject } from "vitest";
import { ensureDatabase } from "../../scripts/lib/postgres.js";
import { databaseAdmin, TEMPLATE_DB } from "./test-postgres.js";
import { TEST_CLOCK_AT } from "./test-clock.js";

const worker = process.env.VITEST_POOL_ID ?? process.env.VITEST_WORKER_ID ?? "1";
process.env.NODE_ENV = "test";
// The server's business clock starts at a pinned instant: tests never depend on today's date.
process.env.CLOCK_AT = TEST_CLOCK_AT;
process.env.DATABASE_URL = await ensureDatabase(databaseAdmin(inject("testPg")), `seamscene_test_w${worker}`, TEMPLATE_DB);
process.env.STORAGE_DIR = `.data/test-storage-w${worker}`;
process.env.DATA_DIR = path.resolve(`.data/test-data-w${worker}`);
process.env.SMTP_HOST = "127.0.0.1";
process.env.SMTP_PORT = "0";
process.env.DEV_OUTBOX = "true";
process.env.LOGIN_MAX_FAILURES ??= "5";

const { startSmtpFake } = await import("../../server/lib/smtp-fake.js");
const smtp = await startSmtpFake({ port: 0 });
process.env.SMTP_PORT = String(smtp.port);
// config.ts was not imported before this point, so it parses the port we just got.
const { config } = await import("../../server/config.js");
(config as { SMTP_PORT: number }).SMTP_PORT = smtp.port;

afterAll(async () => {
  await smtp.close();
  const { closeAppResources } = await import("../../server/app.js");
  await closeAppResources();
  const { sequelize } = await import("../../server/db.js");
  await sequelize.close();
});
