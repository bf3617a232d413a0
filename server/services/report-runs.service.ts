// Long report exports: every continuity book of a production in one ZIP. The request only records a
// run and queues it; the job writes the books one at a time into a streamed ZIP on the shared storage
// and counts its progress in the run's row, which the screen polls (any server can answer).
import { createRequire } from "node:module";
import { PassThrough } from "node:stream";
import type { Archiver, ArchiverOptions } from "archiver";
import { Op, QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { ReportRun } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { defineJob, enqueue } from "../lib/jobs.js";
import { logger } from "../lib/logger.js";
import { clock } from "../lib/clock.js";
import { packetStore } from "./packet-storage.js";
import { recordAudit } from "./audit.service.js";
import { bookFileName, continuityBookModel, loadBookContext, writeContinuityBook } from "./reports-continuity.service.js";
import type { Actor } from "../middleware/require-auth.js";
import type { BookPhotoSize, ReportRunDto } from "@shared/schemas/reports.js";

const archiver = createRequire(import.meta.url)("archiver") as (format: "zip", options?: ArchiverOptions) => Archiver;

const BOOKS_JOB = "reports.continuity-books";
/** A run whose row has not moved for this long was cut off (a server stopped mid-run). */
const STALE_MS = 10 * 60 * 1000;
/** Finished runs kept per production; older files are removed when a new run starts. */
const KEEP_RUNS = 3;

/** Storage key of a run's ZIP. */
export function reportRunKey(productionId: string, runId: string): string {
  return `reports/${productionId.slice(0, 2)}/${productionId}/${runId}.zip`;
}

/** Run → wire shape; a run that stopped moving long ago shows as failed. */
export function presentReportRun(r: ReportRun): ReportRunDto {
  const stale = (r.status === "queued" || r.status === "running") && Date.now() - r.updatedAt.getTime() > STALE_MS;
  return {
    id: r.id,
    kind: r.kind,
    status: stale ? "failed" : r.status,
    done: r.done,
    total: r.total,
    bytes: r.bytes,
    fileUrl: r.status === "done" ? `/api/productions/${r.productionId}/reports/runs/${r.id}/file` : null,
    error: stale ? "The export stopped before it finished; start it again." : r.error,
    createdAt: r.createdAt.toISOString(),
    finishedAt: r.finishedAt ? r.finishedAt.toISOString() : null,
  };
}

/** Characters that get a book: everyone who plays in at least one scene, in cast order. */
async function bookCharacters(productionId: string): Promise<Array<{ id: string; name: string }>> {
  return sequelize.query<{ id: string; name: string }>(
    `SELECT c.id, c.name FROM characters c WHERE c.production_id = :pid AND EXISTS (SELECT 1 FROM appearances a WHERE a.character_id = c.id) ORDER BY c.sort_order, c.name`,
    { replacements: { pid: productionId }, type: QueryTypes.SELECT },
  );
}

/** Removes all but the newest finished runs of a production (rows and files). */
async function pruneRuns(productionId: string): Promise<void> {
  const old = await ReportRun.findAll({
    where: { productionId, status: { [Op.in]: ["done", "failed"] } },
    order: [["createdAt", "DESC"]],
    offset: KEEP_RUNS,
  });
  for (const r of old) {
    if (r.storageKey)
      await packetStore()
        .remove(r.storageKey)
        .catch((err) => logger.warn({ err }, "could not remove an old report file"));
    await r.destroy();
  }
}

/**
 * Starts the "every continuity book" export, or returns the one already under way for this production.
 */
export async function startContinuityBooksRun(actor: Actor, input: { photos: BookPhotoSize }): Promise<ReportRun> {
  const running = await ReportRun.findOne({
    where: { productionId: actor.productionId, kind: "continuity_books", status: { [Op.in]: ["queued", "running"] } },
    order: [["createdAt", "DESC"]],
  });
  if (running && Date.now() - running.updatedAt.getTime() <= STALE_MS) return running;
  await pruneRuns(actor.productionId);
  const total = (await bookCharacters(actor.productionId)).length;
  const run = await sequelize.transaction(async (transaction) => {
    const r = await ReportRun.create(
      {
        productionId: actor.productionId,
        kind: "continuity_books",
        total,
        options: { photos: input.photos },
        storageKey: null,
        bytes: null,
        error: null,
        requestedBy: actor.user.id,
        finishedAt: null,
      },
      { transaction },
    );
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "report.continuity_books",
        entityType: "report_run",
        entityId: r.id,
        after: { total, photos: input.photos },
      },
      transaction,
    );
    return r;
  });
  await enqueue(BOOKS_JOB, { runId: run.id });
  return (await ReportRun.findByPk(run.id))!;
}

/** Writes every book into one ZIP, counting progress in the run's row. */
export async function buildContinuityBooks(runId: string): Promise<void> {
  const run = await ReportRun.findByPk(runId);
  if (!run || run.status !== "queued") return;
  await run.update({ status: "running" });
  const key = reportRunKey(run.productionId, run.id);
  const photoSize = (run.options.photos === "display" ? "display" : "thumb") as BookPhotoSize;
  // PDFs are compressed already: store them, which is fast and hardly larger.
  const archive = archiver("zip", { store: true });
  const written = packetStore().write(key, archive);
  // A failed write must not leave the loop waiting on a stream nobody reads.
  written.catch(() => archive.abort());
  try {
    const ctx = await loadBookContext(run.productionId);
    const characters = await bookCharacters(run.productionId);
    await run.update({ total: characters.length });
    for (const [i, c] of characters.entries()) {
      const model = await continuityBookModel(ctx, c.id, { photoSize });
      const entry = new PassThrough();
      archive.append(entry, { name: `${String(i + 1).padStart(2, "0")}-${bookFileName(model)}`, date: clock.now() });
      await writeContinuityBook(model, entry, photoSize);
      await run.update({ done: i + 1 });
    }
    await archive.finalize();
    const { bytes } = await written;
    await run.update({ status: "done", storageKey: key, bytes, finishedAt: clock.now() });
  } catch (err) {
    archive.abort();
    await written.catch(() => undefined);
    await packetStore()
      .remove(key)
      .catch(() => undefined);
    logger.error({ err, runId }, "continuity books export failed");
    await run.update({ status: "failed", error: "The export failed; try again, or download the books one by one." });
  }
}

defineJob<{ runId: string }>(BOOKS_JOB, { retryLimit: 0 }, async ({ runId }) => buildContinuityBooks(runId));

/** One run of the actor's production. */
export async function getReportRun(actor: Actor, runId: string): Promise<ReportRun> {
  const run = await ReportRun.findOne({ where: { id: runId, productionId: actor.productionId } });
  if (!run) throw NotFoundError("Export not found.");
  return run;
}

/** The newest run of a kind, if any. */
export async function latestReportRun(actor: Actor, kind: ReportRun["kind"]): Promise<ReportRun | null> {
  return ReportRun.findOne({ where: { productionId: actor.productionId, kind }, order: [["createdAt", "DESC"]] });
}

/** Opens a finished run's file. */
export async function openReportRunFile(actor: Actor, runId: string): Promise<{ run: ReportRun; stream: NodeJS.ReadableStream }> {
  const run = await getReportRun(actor, runId);
  if (run.status !== "done" || !run.storageKey) throw NotFoundError("The export has no file yet.");
  return { run, stream: packetStore().read(run.storageKey) };
}
