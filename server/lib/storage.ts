// Where photo (and later packet) files live: local disk by default, or S3-compatible object storage.
// Keys are relative paths ("photos/ab/<hash>/thumb.webp"); nothing outside this file knows the driver.
import fs from "node:fs";
import fsp from "node:fs/promises";
import path from "node:path";
import { Readable } from "node:stream";
import { randomUUID } from "node:crypto";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
  CreateBucketCommand,
  HeadBucketCommand,
} from "@aws-sdk/client-s3";
import { config } from "../config.js";
import { instanceTag } from "./instance.js";

/** A place to put, read and remove files by key. */
export interface Storage {
  readonly driver: "disk" | "s3";
  put(key: string, body: Buffer, contentType: string): Promise<void>;
  /** The whole file; throws StorageNotFoundError when missing. */
  get(key: string): Promise<Buffer>;
  /** A stream of the file; throws StorageNotFoundError when missing. */
  read(key: string): Promise<Readable>;
  exists(key: string): Promise<boolean>;
  /** Removes the file; a missing file is not an error. */
  delete(key: string): Promise<void>;
  /** Every stored file whose key starts with `prefix` (temporary files included), in no set order. */
  list(prefix?: string): Promise<StoredFileInfo[]>;
}

/** One stored file as a listing shows it. */
export interface StoredFileInfo {
  key: string;
  bytes: number;
  modifiedAt: Date;
}

/** Raised when a key has no file. */
export class StorageNotFoundError extends Error {
  constructor(key: string) {
    super(`No stored file at ${key}`);
    this.name = "StorageNotFoundError";
  }
}

function safeKey(key: string): string {
  // Keys are built by the server, but refuse traversal anyway.
  if (!key || key.startsWith("/") || key.split("/").some((p) => p === ".." || p === "")) throw new Error(`Invalid storage key: ${key}`);
  return key;
}

/** Files under a folder on local disk (default: the ignored .data/storage). */
export function createDiskStorage(root: string): Storage {
  const abs = (key: string) => path.join(path.resolve(root), safeKey(key));
  return {
    driver: "disk",
    async put(key, body) {
      const file = abs(key);
      await fsp.mkdir(path.dirname(file), { recursive: true });
      // Write then rename so a reader never sees half a file. The name says which process wrote it,
      // so the start-up sweep can remove what a killed process left.
      const tmp = `${file}.${instanceTag}.${randomUUID().slice(0, 8)}.tmp`;
      await fsp.writeFile(tmp, body);
      await fsp.rename(tmp, file);
    },
    async get(key) {
      try {
        return await fsp.readFile(abs(key));
      } catch (err) {
        if ((err as NodeJS.ErrnoException).code === "ENOENT") throw new StorageNotFoundError(key);
        throw err;
      }
    },
    async read(key) {
      const file = abs(key);
      if (!fs.existsSync(file)) throw new StorageNotFoundError(key);
      return fs.createReadStream(file);
    },
    async exists(key) {
      return fs.existsSync(abs(key));
    },
    async list(prefix = "") {
      const rootAbs = path.resolve(root);
      const out: StoredFileInfo[] = [];
      const walk = async (dir: string): Promise<void> => {
        let entries: fs.Dirent[];
        try {
          entries = await fsp.readdir(dir, { withFileTypes: true });
        } catch (err) {
          if ((err as NodeJS.ErrnoException).code === "ENOENT") return;
          throw err;
        }
        for (const e of entries) {
          const full = path.join(dir, e.name);
          if (e.isDirectory()) await walk(full);
          else if (e.isFile()) {
            const key = path.relative(rootAbs, full).split(path.sep).join("/");
            if (!key.startsWith(prefix)) continue;
            const st = await fsp.stat(full);
            out.push({ key, bytes: st.size, modifiedAt: st.mtime });
          }
        }
      };
      await walk(rootAbs);
      return out;
    },
    async delete(key) {
      await fsp.rm(abs(key), { force: true });
      // Tidy empty parent folders up to the root.
      let dir = path.dirname(abs(key));
      const rootAbs = path.resolve(root);
      while (dir.startsWith(rootAbs) && dir !== rootAbs) {
        try {
          await fsp.rmdir(dir);
        } catch {
          break;
        }
        dir = path.dirname(dir);
      }
    },
  };
}

/** Settings for the S3 driver. */
export interface S3StorageOptions {
  endpoint?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
}

/** Objects in an S3-compatible bucket (path-style addressing works with local S3 servers). */
export function createS3Storage(o: S3StorageOptions): Storage {
  const client = new S3Client({
    endpoint: o.endpoint,
    region: o.region,
    credentials: { accessKeyId: o.accessKeyId, secretAccessKey: o.secretAccessKey },
    forcePathStyle: true,
    // Newer SDKs add CRC checksums by default, which some S3-compatible servers reject.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  const isMissing = (err: unknown) => {
    const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
    return e?.name === "NoSuchKey" || e?.name === "NotFound" || e?.$metadata?.httpStatusCode === 404;
  };
  let bucketReady: Promise<void> | undefined;
  const ensureBucket = () =>
    (bucketReady ??= (async () => {
      try {
        await client.send(new HeadBucketCommand({ Bucket: o.bucket }));
      } catch (err) {
        if (!isMissing(err)) throw err;
        await client.send(new CreateBucketCommand({ Bucket: o.bucket }));
      }
    })().catch((err) => {
      bucketReady = undefined;
      throw err;
    }));
  const read = async (key: string): Promise<Readable> => {
    await ensureBucket();
    try {
      const res = await client.send(new GetObjectCommand({ Bucket: o.bucket, Key: safeKey(key) }));
      return res.Body as Readable;
    } catch (err) {
      if (isMissing(err)) throw new StorageNotFoundError(key);
      throw err;
    }
  };
  return {
    driver: "s3",
    async put(key, body, contentType) {
      await ensureBucket();
      await client.send(
        new PutObjectCommand({ Bucket: o.bucket, Key: safeKey(key), Body: body, ContentType: contentType, ContentLength: body.length }),
      );
    },
    read,
    async get(key) {
      const stream = await read(key);
      const chunks: Buffer[] = [];
      for await (const c of stream) chunks.push(Buffer.from(c as Uint8Array));
      return Buffer.concat(chunks);
    },
    async exists(key) {
      await ensureBucket();
      try {
        await client.send(new HeadObjectCommand({ Bucket: o.bucket, Key: safeKey(key) }));
        return true;
      } catch (err) {
        if (isMissing(err)) return false;
        throw err;
      }
    },
    async delete(key) {
      await ensureBucket();
      await client.send(new DeleteObjectCommand({ Bucket: o.bucket, Key: safeKey(key) }));
    },
    async list(prefix = "") {
      await ensureBucket();
      const out: StoredFileInfo[] = [];
      let token: string | undefined;
      do {
        const page = await client.send(
          new ListObjectsV2Command({ Bucket: o.bucket, Prefix: prefix || undefined, ContinuationToken: token }),
        );
        for (const obj of page.Contents ?? []) {
          if (obj.Key) out.push({ key: obj.Key, bytes: obj.Size ?? 0, modifiedAt: obj.LastModified ?? new Date(0) });
        }
        token = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (token);
      return out;
    },
  };
}

let current: Storage | undefined;

/** The storage chosen by STORAGE_DRIVER (disk, or s3 with the S3_* settings). */
export function getStorage(): Storage {
  if (current) return current;
  current =
    config.STORAGE_DRIVER === "s3"
      ? createS3Storage({
          endpoint: config.S3_ENDPOINT,
          region: config.S3_REGION,
          bucket: config.S3_BUCKET,
          accessKeyId: config.S3_ACCESS_KEY_ID,
          secretAccessKey: config.S3_SECRET_ACCESS_KEY,
        })
      : createDiskStorage(config.STORAGE_DIR);
  return current;
}

/** Replaces the storage (tests run the same checks against both drivers). */
export function setStorage(storage: Storage | undefined): void {
  current = storage;
}
