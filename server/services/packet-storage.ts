// Where built packet ZIPs live and where photo files are read from, behind one small interface, so
// the disk store here can be swapped for the shared photo storage driver (disk or S3) later.
import fs from "node:fs";
import path from "node:path";
import { createHash, randomUUID } from "node:crypto";
import { PassThrough, Transform, type Readable } from "node:stream";
import { pipeline } from "node:stream/promises";
import { config } from "../config.js";
import { getStorage } from "../lib/storage.js";
import { instanceTag } from "../lib/instance.js";

/** What the packet service needs from file storage. Keys are relative, forward-slash paths. */
export interface PacketFileStore {
  /** Writes a stream under key (atomically: readers never see half a file); returns its size and SHA-256. */
  write(key: string, source: Readable): Promise<{ bytes: number; sha256: string }>;
  /** Opens a stored file for reading. */
  read(key: string): Readable;
  /** Reads a whole stored file (photos). */
  readBuffer(key: string): Promise<Buffer>;
  exists(key: string): Promise<boolean>;
  remove(key: string): Promise<void>;
}

function safeJoin(root: string, key: string): string {
  const full = path.resolve(root, key);
  // Keys come from our own rows, but never let one climb out of the storage root.
  if (!full.startsWith(path.resolve(root) + path.sep)) throw new Error(`storage key outside the storage root: ${key}`);
  return full;
}

/** A PacketFileStore on the local disk under a root folder. */
export function diskStore(root: string): PacketFileStore {
  return {
    async write(key, source) {
      const target = safeJoin(root, key);
      await fs.promises.mkdir(path.dirname(target), { recursive: true });
      // The writer's tag lets the start-up sweep remove a half-written ZIP of a killed process.
      const tmp = `${target}.${instanceTag}.${randomUUID().slice(0, 8)}.tmp`;
      const hash = createHash("sha256");
      let bytes = 0;
      const tap = new Transform({
        transform(chunk: Buffer, _enc, cb) {
          hash.update(chunk);
          bytes += chunk.length;
          cb(null, chunk);
        },
      });
      try {
        await pipeline(source, tap, fs.createWriteStream(tmp));
        await fs.promises.rename(tmp, target);
      } catch (err) {
        await fs.promises.rm(tmp, { force: true });
        throw err;
      }
      return { bytes, sha256: hash.digest("hex") };
    },
    read: (key) => fs.createReadStream(safeJoin(root, key)),
    readBuffer: (key) => fs.promises.readFile(safeJoin(root, key)),
    exists: (key) =>
      fs.promises
        .access(safeJoin(root, key))
        .then(() => true)
        .catch(() => false),
    remove: (key) => fs.promises.rm(safeJoin(root, key), { force: true }),
  };
}

/**
 * A PacketFileStore on the shared storage driver (disk or S3, chosen by STORAGE_DRIVER), so packet
 * ZIPs and the photos they carry live where the photo pipeline keeps its files.
 */
export function sharedStorageStore(): PacketFileStore {
  return {
    async write(key, source) {
      const hash = createHash("sha256");
      const chunks: Buffer[] = [];
      for await (const chunk of source) {
        const b = Buffer.isBuffer(chunk) ? chunk : Buffer.from(chunk as Uint8Array);
        hash.update(b);
        chunks.push(b);
      }
      const body = Buffer.concat(chunks);
      await getStorage().put(key, body, key.endsWith(".zip") ? "application/zip" : "application/octet-stream");
      return { bytes: body.length, sha256: hash.digest("hex") };
    },
    read(key) {
      const out = new PassThrough();
      getStorage()
        .read(key)
        .then((r) => r.pipe(out))
        .catch((err: Error) => out.destroy(err));
      return out;
    },
    readBuffer: (key) => getStorage().get(key),
    exists: (key) => getStorage().exists(key),
    remove: (key) => getStorage().delete(key),
  };
}

let store: PacketFileStore = config.STORAGE_DRIVER === "s3" ? sharedStorageStore() : diskStore(path.resolve(config.STORAGE_DIR));

/** The store in use. */
export function packetStore(): PacketFileStore {
  return store;
}

/** Replaces the store (after merge: the shared storage driver; in tests: a temporary folder). */
export function setPacketStore(next: PacketFileStore): void {
  store = next;
}

/** Storage key of a packet version's ZIP. */
export function packetZipKey(packetId: string, version: number): string {
  return `packets/${packetId.slice(0, 2)}/${packetId}/v${version}.zip`;
}

/**
 * Storage key of a photo's file for the packet: the display variant when there is one, else the
 * original. Accepts variants stored as plain keys or as objects with a key or path.
 */
export function photoStorageKey(variants: Record<string, unknown> | null | undefined): string | null {
  if (!variants) return null;
  for (const name of ["display", "original", "full", "thumb"]) {
    const v = variants[name];
    if (typeof v === "string" && v) return v;
    if (v && typeof v === "object") {
      const o = v as { key?: unknown; path?: unknown };
      if (typeof o.key === "string") return o.key;
      if (typeof o.path === "string") return o.path;
    }
  }
  return null;
}
