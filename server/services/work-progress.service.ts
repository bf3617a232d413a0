// Progress of long work (packet building in the worker pool), kept in PostgreSQL so any app server
// can answer "how far is it?". Writes are throttled and never part of the work's own transaction.
import { sequelize } from "../db.js";
import { logger } from "../lib/logger.js";
import type { HeavyProgress } from "../workers/heavy-tasks.js";

/** Kinds of tracked work. */
export type WorkKind = "packet_publish";

/** How far a piece of work is. */
export interface WorkProgressDto {
  stage: string;
  done: number;
  total: number;
  updatedAt: string;
}

/** Least time between two progress writes, ms. */
const WRITE_EVERY_MS = 250;

/**
 * A progress recorder for one piece of work: call it with each progress message; it writes the
 * latest at most every 250 ms. `finish` removes the row.
 */
export function progressRecorder(
  productionId: string,
  subjectId: string,
  kind: WorkKind,
): { report: (p: HeavyProgress) => void; flushed: () => Promise<void>; finish: () => Promise<void> } {
  let lastWrite = 0;
  let writing: Promise<void> = Promise.resolve();
  let finished = false;
  const write = (p: HeavyProgress) => {
    writing = writing
      .then(async () => {
        if (finished) return;
        await sequelize.query(
          `INSERT INTO work_progress (subject_id, kind, production_id, stage, done, total, updated_at)
           VALUES (:subjectId, :kind, :productionId, :stage, :done, :total, now())
           ON CONFLICT (subject_id, kind) DO UPDATE SET stage = EXCLUDED.stage, done = EXCLUDED.done, total = EXCLUDED.total, updated_at = now()`,
          { replacements: { subjectId, kind, productionId, stage: p.stage.slice(0, 40), done: p.done, total: p.total } },
        );
      })
      .catch((err: unknown) => logger.warn({ err }, "could not record work progress"));
  };
  return {
    report(p) {
      const now = Date.now();
      if (now - lastWrite < WRITE_EVERY_MS) return;
      lastWrite = now;
      write(p);
    },
    /** Resolves when the writes so far are done. */
    flushed: () => writing,
    async finish() {
      await writing;
      finished = true;
      await sequelize
        .query(`DELETE FROM work_progress WHERE subject_id = :subjectId AND kind = :kind`, { replacements: { subjectId, kind } })
        .catch((err: unknown) => logger.warn({ err }, "could not clear work progress"));
    },
  };
}

/** The latest progress of a piece of work in this production, or null when none is running. */
export async function readProgress(productionId: string, subjectId: string, kind: WorkKind): Promise<WorkProgressDto | null> {
  const rows = (await sequelize.query(
    `SELECT stage, done, total, updated_at AS "updatedAt" FROM work_progress WHERE subject_id = :subjectId AND kind = :kind AND production_id = :productionId`,
    { replacements: { subjectId, kind, productionId }, type: "SELECT" },
  )) as Array<{ stage: string; done: number; total: number; updatedAt: Date }>;
  const r = rows[0];
  return r ? { stage: r.stage, done: r.done, total: r.total, updatedAt: new Date(r.updatedAt).toISOString() } : null;
}
