// CPU-heavy work that runs in worker threads, off the thread that answers requests: reading DXF
// uploads (parsing, curve flattening, outline checks) and building packet ZIPs (exporters, PDF, zlib).
// Inputs and results cross the thread boundary by structured clone; big buffers are transferred.
import type { MessagePort } from "node:worker_threads";
import { createHash } from "node:crypto";
import { DxfLimitError, readDxfPieces, type DxfImport, type DxfReadOptions } from "@shared/domain/panels/dxf.js";
import type { PacketContents } from "@shared/schemas/packets.js";
import { buildPacketFiles, zipPacketFiles, type PacketBuildMeta } from "../services/packet-zip.js";

/** Progress of a long task, posted on the port the caller passed. */
export interface HeavyProgress {
  stage: string;
  done: number;
  total: number;
}

/** A task's outcome: a value, or a refusal the caller turns into an HTTP error. */
export type HeavyResult<T> = { ok: true; value: T } | { ok: false; kind: "limit" | "unreadable"; message: string };

/** Text of an upload: UTF-8 when it is valid UTF-8, else Windows-1252 (older DXF files use the ANSI code page). */
function decodeDrawing(bytes: Uint8Array): string {
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    return new TextDecoder("windows-1252").decode(bytes);
  }
}

/** Reads pattern pieces from an uploaded DXF file. */
export function readDxf(input: { bytes: Uint8Array; options: DxfReadOptions }): HeavyResult<DxfImport> {
  try {
    return { ok: true, value: readDxfPieces(decodeDrawing(input.bytes), input.options) };
  } catch (err) {
    if (err instanceof DxfLimitError) return { ok: false, kind: "limit", message: err.message };
    return { ok: false, kind: "unreadable", message: err instanceof Error ? err.message : "parse error" };
  }
}

/** Builds every file of a packet and the ZIP of them; photos come in as bytes keyed by storage key. */
export async function buildPacketZip(input: {
  contents: PacketContents;
  meta: PacketBuildMeta;
  photos: Record<string, Uint8Array>;
  progress?: MessagePort;
}): Promise<{ zip: Uint8Array; sha256: string; bytes: number }> {
  const post = (p: HeavyProgress) => input.progress?.postMessage(p);
  const meta = { ...input.meta, publishedAt: new Date(input.meta.publishedAt) };
  const files = await buildPacketFiles(
    input.contents,
    meta,
    async (key) => {
      const b = input.photos[key];
      if (!b) throw new Error(`photo ${key} was not read`);
      return Buffer.from(b.buffer, b.byteOffset, b.byteLength);
    },
    (done, total) => post({ stage: "files", done, total }),
  );
  const chunks: Buffer[] = [];
  const hash = createHash("sha256");
  let last = 0;
  const stream = zipPacketFiles(files, {
    date: meta.publishedAt,
    onProgress: (p) => {
      // archiver reports often; a few updates a second are plenty.
      const now = Date.now();
      if (now - last > 100 || p.entriesDone === p.entriesTotal) {
        last = now;
        post({ stage: "zip", done: p.entriesDone, total: p.entriesTotal });
      }
    },
  });
  for await (const chunk of stream) {
    const b = chunk as Buffer;
    hash.update(b);
    chunks.push(b);
  }
  const zip = Buffer.concat(chunks);
  input.progress?.close();
  return { zip: new Uint8Array(zip.buffer, zip.byteOffset, zip.byteLength), sha256: hash.digest("hex"), bytes: zip.length };
}
