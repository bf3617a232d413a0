/**
 * The PostgreSQL job queue (pg-boss 10), started inside the server process. Features define jobs with
 * `defineJob`; `enqueue` sends to the queue when it runs, and otherwise (unit tests, scripts) runs the
 * handler inline once (its failure rejects), so tests call handlers directly instead of waiting for schedules.
 */
import PgBoss from "pg-boss";
import { config } from "../config.js";
import { logger } from "./logger.js";
import { isDatabaseUnavailable } from "./db-errors.js";

/** Attempt information a handler receives (retryCount counts earlier failures). */
export interface JobMeta {
  retryCount: number;
  retryLimit: number;
}

interface JobDef {
  handler: (data: Record<string, unknown>, meta: JobMeta) => Promise<void>;
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
  /** Cron expression (in config.TIME_ZONE) when the job runs on a schedule. */
  cron?: string;
}

const defs = new Map<string, JobDef>();
let boss: PgBoss | null = null;

/** Registers a job handler (call at module load of the owning service). */
export function defineJob<T extends Record<string, unknown>>(
  name: string,
  options: { retryLimit?: number; retryDelay?: number; retryBackoff?: boolean; cron?: string },
  handler: (data: T, meta: JobMeta) => Promise<void>,
): void {
  defs.set(name, {
    handler: handler as JobDef["handler"],
    retryLimit: options.retryLimit ?? 0,
    retryDelay: options.retryDelay ?? 30,
    retryBackoff: options.retryBackoff ?? false,
    cron: options.cron,
  });
}

/** Whether the queue is running in this process. */
export function jobsRunning(): boolean {
  return boss !== null;
}

/**
 * Queues a job; without a running queue, runs its handler once now, and an inline run's failure rejects so
 * the caller decides what it means (record it, tell the user, or fail the request) instead of losing it.
 * With `inlineInBackground` the inline run starts after the caller returns, so a request that must take
 * the same time whatever the job finds (password resets) does not wait for it even without the queue;
 * nobody awaits that run, so its failure is logged as an error.
 */
export async function enqueue(name: string, data: Record<string, unknown>, options: { inlineInBackground?: boolean } = {}): Promise<void> {
  const def = defs.get(name);
  if (!def) throw new Error(`unknown job "${name}"`);
  if (boss) {
    await boss.send(name, data, { retryLimit: def.retryLimit, retryDelay: def.retryDelay, retryBackoff: def.retryBackoff });
    return;
  }
  const run = () => def.handler(data, { retryCount: 0, retryLimit: 0 });
  if (options.inlineInBackground) {
    setImmediate(() => void run().catch((err) => logger.error({ err, job: name }, "background inline job failed")));
    return;
  }
  await run();
}

/** Runs a job's handler directly (tests), with the given attempt information; errors propagate. */
export async function runJobNow(
  name: string,
  data: Record<string, unknown>,
  meta: JobMeta = { retryCount: 0, retryLimit: 0 },
): Promise<void> {
  const def = defs.get(name);
  if (!def) throw new Error(`unknown job "${name}"`);
  await def.handler(data, meta);
}

/** Starts pg-boss: creates each queue, attaches workers and schedules. No-op when disabled or started. */
export async function startJobs(): Promise<void> {
  if (boss || !config.JOBS_ENABLED) return;
  const b = new PgBoss({ connectionString: config.DATABASE_URL, max: 4, application_name: "seamscene-jobs" });
  // pg-boss reports its pool's and loops' errors here (a listener must exist, or the process ends). While
  // PostgreSQL is down each poll fails; the queue carries on polling and resumes once it is back.
  b.on("error", (err) => {
    if (isDatabaseUnavailable(err)) logger.warn({ reason: err.message }, "job queue: database unavailable");
    else logger.error({ err }, "job queue error");
  });
  await b.start();
  for (const [name, def] of defs) {
    await b.createQueue(name, { name, retryLimit: def.retryLimit, retryDelay: def.retryDelay, retryBackoff: def.retryBackoff });
    await b.work<Record<string, unknown>>(name, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: 2 }, async ([job]) => {
      await def.handler(job.data, { retryCount: job.retryCount, retryLimit: job.retryLimit });
    });
    if (def.cron) await b.schedule(name, def.cron, {}, { tz: config.TIME_ZONE });
  }
  boss = b;
  logger.info({ queues: [...defs.keys()] }, "job queue started");
}

/** Stops pg-boss, letting running handlers finish briefly. */
export async function stopJobs(): Promise<void> {
  const b = boss;
  boss = null;
  if (b) await b.stop({ graceful: true, wait: true, timeout: 5000 });
}
