// Photos: hash, check and re-encode the upload, write the files, then commit the row. Files are
// keyed by content hash, so the same image is stored once however many records show it.
import { createHash, randomUUID } from "node:crypto";
import fsp from "node:fs/promises";
import type { Readable } from "node:stream";
import { Op, type Transaction } from "sequelize";
import { can } from "@shared/permissions.js";
import type { PhotoSize, PhotoView } from "@shared/schemas/photos.js";
import { sequelize } from "../db.js";
import { Photo, type PhotoVariants } from "../models/Photo.js";
import { ForbiddenError, HttpError, NotFoundError, PayloadTooLargeError, ValidationError } from "../errors.js";
import { ImageRejectedError, makeVariants } from "../lib/images.js";
import { getStorage, StorageNotFoundError } from "../lib/storage.js";
import { logger } from "../lib/logger.js";
import { instance } from "../lib/instance.js";
import { photoOwner, type PhotoOwnerType } from "./photo-owners.js";
import { recordAudit } from "./audit.service.js";
import type { Actor } from "../middleware/require-auth.js";

/** An uploaded file as multer left it in the temp folder. */
export interface UploadedFile {
  path: string;
  originalname: string;
  size: number;
}

/** Files written for one content hash, ready to link to rows. */
export interface StoredImage {
  contentHash: string;
  width: number;
  height: number;
  bytes: number;
  variants: PhotoVariants;
  /** Keys this call wrote (empty when the files were already stored). */
  written: string[];
  /** The pending_photo_files row that keeps the start-up sweep off these files until released. */
  pendingId: string;
}

function ownerOrThrow(ownerType: string): PhotoOwnerType {
  const def = photoOwner(ownerType);
  if (!def) throw ValidationError(`ownerType: unknown owner type ${ownerType}`, { ownerType: "is not a photo owner type" });
  return def;
}

/** Checks the actor may read or write photos of this owner type. */
export function assertPhotoAccess(actor: Actor, ownerType: string, mode: "read" | "write"): PhotoOwnerType {
  const def = ownerOrThrow(ownerType);
  if (!can(actor.role, "photo.read") || !can(actor.role, def[mode])) throw ForbiddenError();
  return def;
}

function keysFor(hash: string): PhotoVariants {
  const dir = `photos/${hash.slice(0, 2)}/${hash}`;
  return { original: `${dir}/full.jpg`, display: `${dir}/display.webp`, print: `${dir}/print.jpg`, thumb: `${dir}/thumb.webp` };
}

/**
 * Hashes and re-encodes an uploaded image and writes its sizes to storage (before any row exists).
 * Refuses non-images (400) and images over the pixel limit (413).
 */
export async function storeImage(file: UploadedFile | Buffer): Promise<StoredImage> {
  const buf = Buffer.isBuffer(file) ? file : await fsp.readFile(file.path);
  const contentHash = createHash("sha256").update(buf).digest("hex");
  let v;
  try {
    v = await makeVariants(buf);
  } catch (err) {
    if (err instanceof ImageRejectedError) {
      if (err.reason === "too_many_pixels") throw PayloadTooLargeError(err.message);
      throw ValidationError(`file: ${err.message}`, { file: "is not an image" });
    }
    throw err;
  }
  const keys = keysFor(contentHash);
  const storage = getStorage();
  const written: string[] = [];
  // Recorded before any file is written: until released, the start-up sweep of any server leaves
  // these files alone while this process lives, and removes them if it dies before the row exists.
  const pendingId = randomUUID();
  await sequelize.query(
    `INSERT INTO pending_photo_files (id, content_hash, host, pid, instance) VALUES (:id, :hash, :host, :pid, :instance)`,
    {
      replacements: { id: pendingId, hash: contentHash, host: instance.host, pid: instance.pid, instance: instance.id },
    },
  );
  try {
    for (const size of ["original", "display", "print", "thumb"] as const) {
      const key = keys[size]!;
      if (await storage.exists(key)) continue;
      await storage.put(key, v.files[size].body, v.files[size].contentType);
      written.push(key);
    }
  } catch (err) {
    await releaseStoredImages([{ pendingId }]);
    await removeUnreferencedFiles([contentHash]);
    throw err;
  }
  return { contentHash, width: v.width, height: v.height, bytes: buf.length, variants: keys, written, pendingId };
}

/** Ends the protection of storeImage's files (after their rows committed, or before removing them). */
export async function releaseStoredImages(stored: Array<Pick<StoredImage, "pendingId">>): Promise<void> {
  if (!stored.length) return;
  try {
    await sequelize.query(`DELETE FROM pending_photo_files WHERE id IN (:ids)`, { replacements: { ids: stored.map((s) => s.pendingId) } });
  } catch (err) {
    // The row outlives this process at worst; the next start-up sweep removes it.
    logger.warn({ err }, "could not release pending photo files");
  }
}

async function removeKeys(keys: string[]): Promise<void> {
  const storage = getStorage();
  for (const k of keys) {
    try {
      await storage.delete(k);
    } catch (err) {
      logger.warn({ err, key: k }, "could not remove a stored file");
    }
  }
}

/** Deletes a hash's files when no photo row refers to it any more and no upload of it is in progress. */
export async function removeUnreferencedFiles(hashes: string[]): Promise<void> {
  for (const hash of new Set(hashes)) {
    const still = await Photo.count({ where: { contentHash: hash } });
    const [pending] = await sequelize.query(`SELECT 1 FROM pending_photo_files WHERE content_hash = :hash LIMIT 1`, {
      replacements: { hash },
    });
    if (still === 0 && pending.length === 0) await removeKeys(Object.values(keysFor(hash)));
  }
}

/**
 * Creates (or finds) the row linking stored files to an owner, inside the caller's transaction.
 * Returns `created: false` when the owner already holds this exact image.
 */
export async function linkPhoto(
  actor: Actor,
  stored: StoredImage,
  owner: { ownerType: string; ownerId: string; view: PhotoView; caption: string | null; originalName: string | null },
  transaction: Transaction,
): Promise<{ photo: Photo; created: boolean }> {
  const existing = await Photo.findOne({
    where: { productionId: actor.productionId, ownerType: owner.ownerType, ownerId: owner.ownerId, contentHash: stored.contentHash },
    transaction,
  });
  if (existing) return { photo: existing, created: false };
  const photo = await Photo.create(
    {
      productionId: actor.productionId,
      ownerType: owner.ownerType,
      ownerId: owner.ownerId,
      view: owner.view,
      caption: owner.caption,
      contentHash: stored.contentHash,
      originalName: owner.originalName?.slice(0, 255) ?? null,
      width: stored.width,
      height: stored.height,
      bytes: stored.bytes,
      variants: stored.variants,
      uploadedBy: actor.user.id,
    },
    { transaction },
  );
  await recordAudit(
    {
      productionId: actor.productionId,
      actorId: actor.user.id,
      action: "photo.create",
      entityType: "photo",
      entityId: photo.id,
      after: { ownerType: owner.ownerType, ownerId: owner.ownerId, contentHash: stored.contentHash },
    },
    transaction,
  );
  return { photo, created: true };
}

/** Uploads one photo for an owner. Files first, then the row; files are removed if the row fails. */
export async function uploadPhoto(
  actor: Actor,
  file: UploadedFile | undefined,
  input: { ownerType: string; ownerId: string; view: PhotoView; caption: string | null },
): Promise<{ photo: Photo; created: boolean }> {
  const def = assertPhotoAccess(actor, input.ownerType, "write");
  if (!file) throw ValidationError("file: a photo is required", { file: "is required" });
  if (!(await def.exists(actor.productionId, input.ownerId))) throw NotFoundError("The record for this photo does not exist.");
  const stored = await storeImage(file);
  try {
    return await sequelize.transaction(async (transaction) => {
      if (!(await def.exists(actor.productionId, input.ownerId, transaction)))
        throw NotFoundError("The record for this photo does not exist.");
      return linkPhoto(actor, stored, { ...input, originalName: file.originalname }, transaction);
    });
  } catch (err) {
    await releaseStoredImages([stored]);
    await removeUnreferencedFiles([stored.contentHash]);
    throw err;
  } finally {
    await releaseStoredImages([stored]);
  }
}

/** Photos of one owner, oldest first. */
export async function listPhotos(actor: Actor, ownerType: string, ownerId: string): Promise<Photo[]> {
  assertPhotoAccess(actor, ownerType, "read");
  return Photo.findAll({
    where: { productionId: actor.productionId, ownerType, ownerId },
    order: [
      ["createdAt", "ASC"],
      ["id", "ASC"],
    ],
  });
}

/** Photos of many owners of one type (timelines), oldest first. */
export async function photosForOwners(
  productionId: string,
  ownerType: string,
  ownerIds: string[],
  transaction?: Transaction,
): Promise<Photo[]> {
  if (!ownerIds.length) return [];
  return Photo.findAll({
    where: { productionId, ownerType, ownerId: { [Op.in]: ownerIds } },
    order: [
      ["createdAt", "ASC"],
      ["id", "ASC"],
    ],
    transaction,
  });
}

/** Opens one stored size of a photo the actor may see. */
export async function openPhotoFile(
  actor: Actor,
  photoId: string,
  size: PhotoSize,
): Promise<{ stream: Readable; contentType: string; photo: Photo }> {
  const photo = await Photo.findOne({ where: { id: photoId, productionId: actor.productionId } });
  if (!photo) throw NotFoundError("Photo not found.");
  assertPhotoAccess(actor, photo.ownerType, "read");
  try {
    const stream = await getStorage().read(photo.variants[size]);
    return { stream, contentType: size === "original" ? "image/jpeg" : "image/webp", photo };
  } catch (err) {
    if (err instanceof StorageNotFoundError) throw new HttpError(404, "not_found", "The photo file is missing from storage.");
    throw err;
  }
}

/** Deletes a photo row, then its files if nothing else shows the same image. */
export async function deletePhoto(actor: Actor, photoId: string): Promise<void> {
  const photo = await Photo.findOne({ where: { id: photoId, productionId: actor.productionId } });
  if (!photo) throw NotFoundError("Photo not found.");
  assertPhotoAccess(actor, photo.ownerType, "write");
  await sequelize.transaction(async (transaction) => {
    await photo.destroy({ transaction });
    await recordAudit(
      {
        productionId: actor.productionId,
        actorId: actor.user.id,
        action: "photo.delete",
        entityType: "photo",
        entityId: photo.id,
        before: { ownerType: photo.ownerType, ownerId: photo.ownerId, contentHash: photo.contentHash },
      },
      transaction,
    );
  });
  await removeUnreferencedFiles([photo.contentHash]);
}

/** Deletes every photo of some owners (inside a transaction) and returns the hashes to tidy after commit. */
export async function deletePhotosOfOwners(
  productionId: string,
  ownerType: string,
  ownerIds: string[],
  transaction: Transaction,
): Promise<string[]> {
  if (!ownerIds.length) return [];
  const photos = await Photo.findAll({ where: { productionId, ownerType, ownerId: { [Op.in]: ownerIds } }, transaction });
  if (photos.length) await Photo.destroy({ where: { id: { [Op.in]: photos.map((p) => p.id) } }, transaction });
  return photos.map((p) => p.contentHash);
}
