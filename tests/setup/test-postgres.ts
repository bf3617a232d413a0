/** The test cluster: separate data folder and port, so demo data is never touched. */
import path from "node:path";
import { ensureLocalPostgres } from "../../scripts/lib/postgres.js";

export const TEST_PG_PORT = Number(process.env.TEST_PGPORT ?? 5434);
export const TEST_PG_DIR = path.resolve(process.env.TEST_PGDATA_DIR ?? ".data/pg-test");
export const TEMPLATE_DB = "seamscene_test_template";

export function testAdminUrl(): string {
  return `postgres://app@127.0.0.1:${TEST_PG_PORT}/postgres`;
}

export function startTestPostgres() {
  return ensureLocalPostgres({ dataDir: TEST_PG_DIR, port: TEST_PG_PORT });
}
