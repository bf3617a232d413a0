/**
 * Prepares the local services `npm start`, `npm run dev` and `npm run seed` need, before any server
 * module reads the environment: PostgreSQL (unless DATABASE_URL is set) and the SMTP fake settings.
 */
import path from "node:path";
import { ensureDatabase, ensureLocalPostgres, type LocalPostgres } from "./postgres.js";

export async function prepareLocalEnv(): Promise<{ pg?: LocalPostgres; startSmtpFake: boolean }> {
  let pg: LocalPostgres | undefined;
  if (!process.env.DATABASE_URL) {
    const dataDir = process.env.PGDATA_DIR ?? path.resolve(".data/pg");
    const port = Number(process.env.PGPORT ?? 5433);
    pg = await ensureLocalPostgres({ dataDir, port });
    if (pg.relocatedFrom) {
      console.log(
        `PostgreSQL keeps its data in ${pg.dataDir}: the postgres user cannot enter ${pg.relocatedFrom} (a parent folder is private).`,
      );
    }
    process.env.DATABASE_URL = await ensureDatabase(pg, process.env.PGDATABASE ?? "seamscene");
  }
  // Without a configured relay, mail goes to the local fake on loopback and shows in the outbox.
  const startSmtpFake = !process.env.SMTP_HOST;
  if (startSmtpFake) {
    process.env.SMTP_HOST = "127.0.0.1";
    process.env.SMTP_PORT ??= "2525";
    process.env.DEV_OUTBOX ??= "true";
  }
  return { pg, startSmtpFake };
}
