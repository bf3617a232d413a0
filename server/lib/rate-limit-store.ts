import type { Store, Options, ClientRateLimitInfo } from "express-rate-limit";
import { sequelize } from "../db.js";
import { DatabaseUnavailableError } from "../errors.js";
import { isDatabaseUnavailable } from "./db-errors.js";

/** Runs a query; a database that is down becomes a 503 (express-rate-limit passes store errors on). */
async function run<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    if (isDatabaseUnavailable(err)) throw DatabaseUnavailableError();
    throw err;
  }
}

/**
 * express-rate-limit store kept in PostgreSQL, so several app servers share one count
 * (no per-process memory; see product.md "When one machine is not enough").
 */
export class PostgresRateLimitStore implements Store {
  windowMs = 60_000;
  prefix: string;
  localKeys = false;

  constructor(prefix: string) {
    this.prefix = prefix;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  private k(key: string) {
    return `${this.prefix}:${key}`.slice(0, 300);
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const [rows] = await run(() =>
      sequelize.query(`SELECT hits, reset_at FROM rate_limit_hits WHERE key = :key AND reset_at > now()`, {
        replacements: { key: this.k(key) },
      }),
    );
    const row = (rows as Array<{ hits: number; reset_at: Date }>)[0];
    return row ? { totalHits: row.hits, resetTime: new Date(row.reset_at) } : undefined;
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    const [rows] = await run(() =>
      sequelize.query(
        `INSERT INTO rate_limit_hits (key, hits, reset_at) VALUES (:key, 1, now() + (:ms || ' milliseconds')::interval)
       ON CONFLICT (key) DO UPDATE SET
         hits = CASE WHEN rate_limit_hits.reset_at <= now() THEN 1 ELSE rate_limit_hits.hits + 1 END,
         reset_at = CASE WHEN rate_limit_hits.reset_at <= now() THEN EXCLUDED.reset_at ELSE rate_limit_hits.reset_at END
       RETURNING hits, reset_at`,
        { replacements: { key: this.k(key), ms: String(this.windowMs) } },
      ),
    );
    const row = (rows as Array<{ hits: number; reset_at: Date }>)[0]!;
    return { totalHits: row.hits, resetTime: new Date(row.reset_at) };
  }

  async decrement(key: string): Promise<void> {
    await run(() =>
      sequelize.query(`UPDATE rate_limit_hits SET hits = GREATEST(hits - 1, 0) WHERE key = :key`, { replacements: { key: this.k(key) } }),
    );
  }

  async resetKey(key: string): Promise<void> {
    await run(() => sequelize.query(`DELETE FROM rate_limit_hits WHERE key = :key`, { replacements: { key: this.k(key) } }));
  }
}
