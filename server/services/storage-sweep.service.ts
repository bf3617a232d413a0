// At start-up: remove what a killed server left behind (upload temp files, half-written files,
// stored files no row refers to) and report rows whose file is missing. Files another live server
// is still writing are left alone: their names or pending_photo_files rows name a living writer.
import fsp from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { QueryTypes } from "sequelize";
import { sequelize } from "../db.js";
import { getStorage, type StoredFileInfo } from "../lib/storage.js";
import { instanceTag, parseInstanceTag, writerMayBeAlive } from "../lib/instance.js";
import { logger } from "../lib/logger.js";
import { uploadTempRoot } from "../middleware/upload.js";

export interface SweepReport {
  uploadTempFiles: number;
  partialFiles: number;
  unreferencedPhotoFiles: number;
  unreferencedPacketFiles: number;
  missingPhotoFiles: number;
  missingPacketFiles: number;
  stalePendingRows: number;
}

const HOUR = 3_600_000;

async function countFiles(dir: string): Promise<number> {
  let n = 0;
  for (const e of await fsp.readdir(dir, { withFileTypes: true }).catch(() => [])) {
    n += e.isDirectory() ? await countFiles(path.join(dir, e.name)) : 1;
  }
  return n;
}

/** Upload temp folders of processes that are gone ("<pid>-<instance>"), and the old shared /tmp folder. */
async function sweepUploadTemp(): Promise<number> {
  let removed = 0;
  const root = uploadTempRoot();
  for (const e of await fsp.readdir(root, { withFileTypes: true }).catch(() => [])) {
    const tag = parseInstanceTag(e.name);
    if (e.name === instanceTag || (tag && writerMayBeAlive(tag))) continue;
    const full = path.join(root, e.name);
    removed += e.isDirectory() ? await countFiles(full) : 1;
    await fsp.rm(full, { recursive: true, force: true });
  }
  // Earlier versions wrote to one shared folder in /tmp; other servers on the machine may still
  // use it, so only files untouched for an hour go.
  const legacy = path.join(os.tmpdir(), "seamscene-uploads");
  for (const e of await fsp.readdir(legacy, { withFileTypes: true }).catch(() => [])) {
    const full = path.join(legacy, e.name);
    const st = await fsp.stat(full).catch(() => null);
    if (st?.isFile() && Date.now() - st.mtimeMs > HOUR) {
      await fsp.rm(full, { force: true });
      removed++;
    }
  }
  return removed;
}

/** A ".tmp" file whose writer is gone (tagged names), or untouched for an hour (names without a tag). */
function isAbandonedPartial(f: StoredFileInfo): boolean {
  const tag = parseInstanceTag(path.posix.basename(f.key));
  if (tag) return !writerMayBeAlive(tag);
  return Date.now() - f.modifiedAt.getTime() > HOUR;
}

/**
 * Removes a packet ZIP no version refers to. The packet row is locked first (SKIP LOCKED): a publish
 * in progress holds that lock while it writes its ZIP, so such a ZIP is left for it.
 */
async function removeUnreferencedPacketZip(key: string): Promise<boolean> {
  const packetId = key.split("/")[2] ?? "";
  return sequelize.transaction(async (transaction) => {
    const isUuid = /^[0-9a-f-]{36}$/.test(packetId);
    if (isUuid) {
      const rows = await sequelize.query<{ id: string; zip_storage_key: string | null }>(
        `SELECT id, zip_storage_key FROM packets WHERE id = :id FOR UPDATE SKIP LOCKED`,
        {
          replacements: { id: packetId },
          type: QueryTypes.SELECT,
          transaction,
        },
      );
      if (!rows.length) {
        const exists = await sequelize.query(`SELECT 1 FROM packets WHERE id = :id`, {
          replacements: { id: packetId },
          type: QueryTypes.SELECT,
          transaction,
        });
        if (exists.length) return false; // locked: being published right now
      }
    }
    const referenced = await sequelize.query(`SELECT 1 FROM packets WHERE zip_storage_key = :key LIMIT 1`, {
      replacements: { key },
      type: QueryTypes.SELECT,
      transaction,
    });
    if (referenced.length) return false;
    await getStorage().delete(key);
    return true;
  });
}

/** Runs the sweep once; logs what it removed and which rows lack their files. */
export async function sweepStorage(): Promise<SweepReport> {
  const report: SweepReport = {
    uploadTempFiles: 0,
    partialFiles: 0,
    unreferencedPhotoFiles: 0,
    unreferencedPacketFiles: 0,
    missingPhotoFiles: 0,
    missingPacketFiles: 0,
    stalePendingRows: 0,
  };
  report.uploadTempFiles = await sweepUploadTemp();

  const storage = getStorage();
  // List first, then read the rows: a file listed here was written after its pending row (or its
  // packet lock) was taken, so the rows read afterwards show every file that is still wanted.
  const files = await storage.list();
  const photoRows = await sequelize.query<{ id: string; variants: Record<string, string> }>(`SELECT id, variants FROM photos`, {
    type: QueryTypes.SELECT,
  });
  const packetRows = await sequelize.query<{ id: string; zip_storage_key: string }>(
    `SELECT id, zip_storage_key FROM packets WHERE zip_storage_key IS NOT NULL`,
    { type: QueryTypes.SELECT },
  );
  const pending = await sequelize.query<{
    id: string;
    content_hash: string;
    host: string;
    pid: number;
    instance: string;
    created_at: Date;
  }>(`SELECT id, content_hash, host, pid, instance, created_at FROM pending_photo_files`, { type: QueryTypes.SELECT });
  const livePending = pending.filter((p) =>
    writerMayBeAlive({ host: p.host, pid: p.pid, instance: p.instance, startedAt: new Date(p.created_at) }),
  );
  const inProgress = new Set(livePending.map((p) => p.content_hash));
  const referenced = new Set<string>();
  for (const r of photoRows) for (const k of Object.values(r.variants ?? {})) if (typeof k === "string") referenced.add(k);
  for (const r of packetRows) referenced.add(r.zip_storage_key);

  const present = new Set<string>();
  for (const f of files) {
    if (f.key.endsWith(".tmp")) {
      if (isAbandonedPartial(f)) {
        await storage.delete(f.key);
        report.partialFiles++;
      }
      continue;
    }
    present.add(f.key);
    if (referenced.has(f.key)) continue;
    const [top, , third] = f.key.split("/");
    if (top === "photos" && third && !inProgress.has(third)) {
      await storage.delete(f.key);
      report.unreferencedPhotoFiles++;
    } else if (top === "packets" && f.key.endsWith(".zip")) {
      if (await removeUnreferencedPacketZip(f.key)) report.unreferencedPacketFiles++;
    }
  }

  for (const r of photoRows) {
    const missing = Object.values(r.variants ?? {}).filter((k) => typeof k === "string" && !present.has(k));
    if (missing.length) {
      report.missingPhotoFiles += missing.length;
      logger.warn({ photoId: r.id, missing }, "photo row without its file");
    }
  }
  for (const r of packetRows) {
    if (!present.has(r.zip_storage_key)) {
      report.missingPacketFiles++;
      logger.warn({ packetId: r.id, key: r.zip_storage_key }, "published packet without its ZIP");
    }
  }

  const stale = pending.filter((p) => !livePending.includes(p)).map((p) => p.id);
  if (stale.length) await sequelize.query(`DELETE FROM pending_photo_files WHERE id IN (:ids)`, { replacements: { ids: stale } });
  report.stalePendingRows = stale.length;
  logger.info({ ...report }, "storage sweep finished");
  return report;
}
