/**
 * Once per `vitest run` (server project): start the test cluster and build a template database with
 * every migration applied. Each worker then clones it (tests/setup/server-setup.ts).
 */
import { spawnSync } from "node:child_process";
import path from "node:path";
import type { TestProject } from "vitest/node";
import { dropDatabase, ensureDatabase } from "../../scripts/lib/postgres.js";
import { accessOf, startTestPostgres, TEMPLATE_DB, type TestPgAccess } from "./test-postgres.js";

declare module "vitest" {
  export interface ProvidedContext {
    testPg: TestPgAccess;
  }
}

export default async function globalSetup(project: TestProject) {
  const pg = await startTestPostgres();
  if (pg.relocatedFrom)
    console.log(`Test PostgreSQL keeps its data in ${pg.dataDir} (${pg.relocatedFrom} is not reachable by the postgres user).`);
  // Drop worker databases left by an earlier run, then rebuild the template from the migrations.
  const { default: pgLib } = await import("pg");
  const client = new pgLib.Client({ connectionString: pg.adminUrl });
  await client.connect();
  const { rows } = await client.query<{ datname: string }>("SELECT datname FROM pg_database WHERE datname LIKE 'seamscene_test%'");
  await client.end();
  for (const r of rows) await dropDatabase(pg.adminUrl, r.datname);
  const url = await ensureDatabase(pg, TEMPLATE_DB);
  // Migrate in a child process so this process never loads server modules with a fixed config.
  const res = spawnSync(process.execPath, [path.resolve("node_modules/tsx/dist/cli.mjs"), "scripts/migrate.ts"], {
    env: { ...process.env, DATABASE_URL: url, NODE_ENV: "test" },
    encoding: "utf8",
  });
  if (res.status !== 0) throw new Error(`Migrating the test template failed:\n${res.stdout}\n${res.stderr}`);
  project.provide("testPg", accessOf(pg));
}
