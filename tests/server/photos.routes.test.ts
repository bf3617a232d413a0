import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import sharp from "sharp";
import exifr from "exifr";
import S3rver from "s3rver";
import { createApp } from "../../server/app.js";
import { Photo, Production } from "../../server/models/index.js";
import { createDiskStorage, createS3Storage, getStorage, setStorage, type Storage } from "../../server/lib/storage.js";
import { Limits } from "../../shared/constants.js";
import { buildCharacter, buildMember, buildScene } from "../factories.js";
import { resetDb, signedInAgent, type TestAgent } from "../setup/http.js";

const app = createApp();
const fixture = (name: string) => path.resolve("tests/fixtures", name);
const tmpRoot = fs.mkdtempSync(path.join(os.tmpdir(), "seamscene-photos-"));
let s3server: S3rver;
let s3port = 0;

beforeAll(async () => {
  s3server = new S3rver({ port: 0, address: "127.0.0.1", silent: true, directory: path.join(tmpRoot, "s3") });
  s3port = (await s3server.run()).port;
});
afterAll(async () => {
  setStorage(undefined);
  await s3server?.close();
  fs.rmSync(tmpRoot, { recursive: true, force: true });
});

/** Every stored key across both drivers' roots: how we check "no file left behind". */
async function storedKeys(storage: Storage, hashes: string[]): Promise<string[]> {
  const out: string[] = [];
  for (const h of hashes)
    for (const f of ["full.jpg", "display.webp", "print.jpg", "thumb.webp"]) {
      const key = `photos/${h.slice(0, 2)}/${h}/${f}`;
      if (await storage.exists(key)) out.push(key);
    }
  return out;
}

async function diskFileCount(dir: string): Promise<number> {
  if (!fs.existsSync(dir)) return 0;
  return (fs.readdirSync(dir, { recursive: true }) as string[]).filter((f) => fs.statSync(path.join(dir, f)).isFile()).length;
}

const drivers: Array<[string, () => Storage]> = [
  ["disk", () => createDiskStorage(path.join(tmpRoot, "disk"))],
  [
    "s3",
    () =>
      createS3Storage({
        endpoint: `http://127.0.0.1:${s3port}`,
        region: "us-east-1",
        bucket: "photos-test",
        accessKeyId: "S3RVER",
        secretAccessKey: "S3RVER",
      }),
  ],
];

for (const [driverName, makeStorage] of drivers) {
  describe(`photos with the ${driverName} driver`, () => {
    let agent: TestAgent;
    let pid: string;
    let sceneId: string;

    beforeEach(async () => {
      await resetDb();
      setStorage(makeStorage());
      const { user, production } = await buildMember("supervisor");
      pid = production.id;
      sceneId = (await buildScene({ production })).id;
      agent = await signedInAgent(app, user.email);
    });

    const upload = (file: string | Buffer, name: string, fields: Record<string, string> = {}) => {
      const r = agent.agent
        .post(`/api/productions/${pid}/photos`)
        .set("X-CSRF-Token", agent.csrf)
        .field("ownerType", fields.ownerType ?? "scene")
        .field("ownerId", fields.ownerId ?? sceneId)
        .field("view", fields.view ?? "front");
      return Buffer.isBuffer(file)
        ? r.attach("file", file, { filename: name, contentType: name.endsWith(".png") ? "image/png" : "image/jpeg" })
        : r.attach("file", file, { filename: name, contentType: "image/jpeg" });
    };

    it("stores a JPEG with GPS tags with no metadata in any stored size, oriented upright", async () => {
      // Precondition: the fixture does carry GPS and orientation 6 (read with exifr).
      const src = await exifr.parse(fixture("gps-rotated.jpg"), { gps: true });
      expect(src.latitude).toBeCloseTo(50.15, 6);
      expect(src.Orientation).toBe("Rotate 90 CW");

      const res = await upload(fixture("gps-rotated.jpg"), "gps-rotated.jpg");

      expect(res.status, JSON.stringify(res.body)).toBe(201);
      // EXIF orientation 6 = rotate 90° clockwise (CIPA DC-008, Orientation tag), so 64×48 stored → 48×64 upright.
      expect(res.body.data).toMatchObject({ width: 48, height: 64, view: "front" });
      expect(res.body.data.contentHash).toMatch(/^[0-9a-f]{64}$/);
      for (const size of ["thumb", "display", "original"]) {
        const file = await agent
          .get(`/api/productions/${pid}/photos/${res.body.data.id}/file?size=${size}`)
          .buffer(true)
          .parse((r, cb) => {
            const chunks: Buffer[] = [];
            r.on("data", (c: Buffer) => chunks.push(c));
            r.on("end", () => cb(null, Buffer.concat(chunks)));
          });
        expect(file.status).toBe(200);
        const body = file.body as Buffer;
        const meta = await sharp(body).metadata();
        expect(meta.exif, size).toBeUndefined();
        expect(meta.xmp, size).toBeUndefined();
        expect(meta.orientation ?? 1, size).toBe(1);
        expect(meta.width! < meta.height!, size).toBe(true);
        const tags = await exifr.parse(body, { gps: true }).catch(() => undefined);
        expect(tags?.latitude, size).toBeUndefined();
      }
      // The print size is not served; reports embed it as stored, so it must be as clean as the rest.
      const hash = res.body.data.contentHash as string;
      const print = await getStorage().get(`photos/${hash.slice(0, 2)}/${hash}/print.jpg`);
      const printMeta = await sharp(print).metadata();
      expect(printMeta.format).toBe("jpeg");
      expect(printMeta.exif).toBeUndefined();
      expect(printMeta.orientation ?? 1).toBe(1);
      expect(printMeta.width! < printMeta.height!).toBe(true);
      expect((await exifr.parse(print, { gps: true }).catch(() => undefined))?.latitude).toBeUndefined();
    });

    it("stores the same image twice only once", async () => {
      const first = await upload(fixture("gps-rotated.jpg"), "a.jpg");
      const again = await upload(fixture("gps-rotated.jpg"), "b.jpg");
      const character = await buildCharacter({ production: (await Production.findByPk(pid))! });
      const other = await upload(fixture("gps-rotated.jpg"), "c.jpg", { ownerType: "character", ownerId: character.id });

      expect(first.status).toBe(201);
      expect(again.status).toBe(200);
      expect(again.body.data.id).toBe(first.body.data.id);
      expect(other.status).toBe(201);
      expect(await Photo.count()).toBe(2);
      expect(await storedKeys(getStorage(), [first.body.data.contentHash])).toHaveLength(4);
    });

    it("deleting one of two records showing an image keeps the files; deleting the last removes them", async () => {
      const character = await buildCharacter({ production: (await Production.findByPk(pid))! });
      const a = await upload(fixture("gps-rotated.jpg"), "a.jpg");
      const b = await upload(fixture("gps-rotated.jpg"), "b.jpg", { ownerType: "character", ownerId: character.id });
      const hash = a.body.data.contentHash as string;

      await agent.delete(`/api/productions/${pid}/photos/${a.body.data.id}`).expect(204);
      expect(await storedKeys(getStorage(), [hash])).toHaveLength(4);
      await agent.delete(`/api/productions/${pid}/photos/${b.body.data.id}`).expect(204);

      expect(await storedKeys(getStorage(), [hash])).toHaveLength(0);
      expect(await Photo.count()).toBe(0);
    });

    it("refuses a text file named .jpg with 400 and leaves nothing behind", async () => {
      const res = await upload(fixture("not-an-image.jpg"), "not-an-image.jpg");

      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: "validation_error", fields: { file: expect.any(String) } });
      expect(await Photo.count()).toBe(0);
      if (driverName === "disk") expect(await diskFileCount(path.join(tmpRoot, "disk", "photos"))).toBe(0);
    });

    it("refuses an image above the pixel limit with 413 and leaves nothing behind", async () => {
      // A flat-colour PNG compresses to a few kB but decodes to more pixels than the limit allows.
      const side = Math.ceil(Math.sqrt(Limits.photoMaxPixels)) + 10;
      const bomb = await sharp({ create: { width: side, height: side, channels: 3, background: "#C98B2B" } })
        .png({ compressionLevel: 9 })
        .toBuffer();
      expect(bomb.length).toBeLessThan(Limits.photoMaxBytes);

      const res = await upload(bomb, "bomb.png");

      expect(res.status).toBe(413);
      expect(res.body.error.code).toBe("payload_too_large");
      expect(await Photo.count()).toBe(0);
      if (driverName === "disk") expect(await diskFileCount(path.join(tmpRoot, "disk", "photos"))).toBe(0);
    });
  });
}

describe("photo upload limits and owners", () => {
  let agent: TestAgent;
  let pid: string;
  let sceneId: string;

  beforeEach(async () => {
    await resetDb();
    setStorage(createDiskStorage(path.join(tmpRoot, "disk2")));
    const { user, production } = await buildMember("supervisor");
    pid = production.id;
    sceneId = (await buildScene({ production })).id;
    agent = await signedInAgent(app, user.email);
  });

  it("refuses a file over the byte limit with 413", async () => {
    const big = Buffer.alloc(Limits.photoMaxBytes + 1024, 0xff);

    const res = await agent.agent
      .post(`/api/productions/${pid}/photos`)
      .set("X-CSRF-Token", agent.csrf)
      .field("ownerType", "scene")
      .field("ownerId", sceneId)
      .attach("file", big, { filename: "big.jpg", contentType: "image/jpeg" });

    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe("payload_too_large");
    expect(await Photo.count()).toBe(0);
  });

  it("refuses an extension outside the allow-list with 415 naming the field", async () => {
    const res = await agent.agent
      .post(`/api/productions/${pid}/photos`)
      .set("X-CSRF-Token", agent.csrf)
      .field("ownerType", "scene")
      .field("ownerId", sceneId)
      .attach("file", Buffer.from("x"), { filename: "notes.txt", contentType: "text/plain" });

    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe("unsupported_media_type");
    expect(res.body.error.fields).toEqual({ file: "File is not an accepted image type" });
    expect(await Photo.count()).toBe(0);
  });

  it("refuses an unknown owner type (400) and a missing owner (404)", async () => {
    const bad = await agent.agent
      .post(`/api/productions/${pid}/photos`)
      .set("X-CSRF-Token", agent.csrf)
      .field("ownerType", "spaceship")
      .field("ownerId", sceneId)
      .attach("file", fixture("gps-rotated.jpg"));
    const missing = await agent.agent
      .post(`/api/productions/${pid}/photos`)
      .set("X-CSRF-Token", agent.csrf)
      .field("ownerType", "scene")
      .field("ownerId", "00000000-0000-4000-8000-000000000000")
      .attach("file", fixture("gps-rotated.jpg"));

    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("ownerType");
    expect(missing.status).toBe(404);
    expect(await Photo.count()).toBe(0);
  });

  it("a set costumer may not read a performer's photos (personal data)", async () => {
    const { user } = await buildMember("set_costumer", { production: (await Production.findByPk(pid))! });
    const sc = await signedInAgent(app, user.email);

    const res = await sc.get(`/api/productions/${pid}/photos?ownerType=performer&ownerId=${sceneId}`);

    expect(res.status).toBe(403);
  });
});
