// The same storage checks against both drivers: local disk and S3 (s3rver on loopback).
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import S3rver from "s3rver";
import { createDiskStorage, createS3Storage, StorageNotFoundError, type Storage } from "../../server/lib/storage.js";

const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-storage-"));
let s3server: S3rver;
let s3port = 0;

beforeAll(async () => {
  s3server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: path.join(tmpRoot, "s3") });
  const addr = (await s3server.run()) as { port: number };
  s3port = addr.port;
});
afterAll(async () => {
  await s3server?.close();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

const drivers: Array<[string, () => Storage]> = [
  ["disk", () => createDiskStorage(path.join(tmpRoot, "disk"))],
  [
    "s3",
    () =>
      createS3Storage({
        endpoint: `http://127.0.0.1:${s3port}`,
        region: "us-east-1",
        bucket: "seamscene-test",
        accessKeyId: "S3RVER",
        secretAccessKey: "S3RVER",
      }),
  ],
];

for (const [name, make] of drivers) {
  describe(`storage driver: ${name}`, () => {
    it("puts, reads back byte for byte, reports existence and deletes", async () => {
      const storage = make();
      const body = Buffer.from(Array.from({ length: 70_000 }, (_, i) => i % 251));
      const key = "photos/ab/abc123/thumb.webp";

      await storage.put(key, body, "image/webp");

      expect(await storage.exists(key)).toBe(true);
      expect((await storage.get(key)).equals(body)).toBe(true);
      const chunks: Buffer[] = [];
      for await (const c of await storage.read(key)) chunks.push(Buffer.from(c as Uint8Array));
      expect(Buffer.concat(chunks).equals(body)).toBe(true);
      await storage.delete(key);
      expect(await storage.exists(key)).toBe(false);
    });

    it("throws StorageNotFoundError for a missing key and deletes a missing key quietly", async () => {
      const storage = make();

      await expect(storage.get("photos/zz/missing/full.jpg")).rejects.toBeInstanceOf(StorageNotFoundError);
      await expect(storage.read("photos/zz/missing/full.jpg")).rejects.toBeInstanceOf(StorageNotFoundError);
      await expect(storage.delete("photos/zz/missing/full.jpg")).resolves.toBeUndefined();
    });

    it("refuses keys that climb out of the root", async () => {
      const storage = make();

      await expect(storage.put("../escape.txt", Buffer.from("x"), "text/plain")).rejects.toThrow(/Invalid storage key/);
      await expect(storage.put("/abs.txt", Buffer.from("x"), "text/plain")).rejects.toThrow(/Invalid storage key/);
    });
  });
}
