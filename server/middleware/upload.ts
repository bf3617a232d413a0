// multer writes uploads to a private temp folder with server-chosen names; the service decides the rest.
import path from "node:path";
import fs from "node:fs";
import { randomUUID } from "node:crypto";
import multer from "multer";
import type { RequestHandler } from "express";
import { Limits, photoUploadTypes } from "@shared/constants.js";
import { config } from "../config.js";
import { UnsupportedMediaTypeError } from "../errors.js";
import { instanceTag } from "../lib/instance.js";

/** Where every server process keeps its upload temp folders (mode 0700: photos carry GPS positions). */
export function uploadTempRoot(): string {
  return path.resolve(config.DATA_DIR, "tmp", "uploads");
}

/** This process's own folder, "<pid>-<instance>", so the start-up sweep knows whose leftovers are whose. */
export function uploadTempDir(): string {
  return path.join(uploadTempRoot(), instanceTag);
}

const storage = multer.diskStorage({
  destination: (_req, _file, cb) => {
    const dir = uploadTempDir();
    fs.mkdir(dir, { recursive: true, mode: 0o700 }, (err) => {
      if (err) return cb(err, dir);
      // mkdir's mode applies to new folders only; the data and tmp folders above must be private too.
      for (const d of [path.resolve(config.DATA_DIR, "tmp"), uploadTempRoot(), dir]) fs.chmodSync(d, 0o700);
      cb(null, dir);
    });
  },
  filename: (_req, _file, cb) => cb(null, randomUUID()),
});

/** Extension and declared type must both be on the allow-list; the content is checked later by sharp. */
function fileFilter(_req: unknown, file: Express.Multer.File, cb: multer.FileFilterCallback) {
  const ext = path.extname(file.originalname).slice(1).toLowerCase();
  const types = photoUploadTypes[ext];
  if (!types || !types.includes(file.mimetype.toLowerCase())) {
    return cb(
      UnsupportedMediaTypeError(`${file.fieldname}: only JPEG, PNG, WebP, AVIF or TIFF photos are accepted`, {
        [file.fieldname]: "is not an accepted image type",
      }),
    );
  }
  cb(null, true);
}

const photoUpload = multer({
  storage,
  fileFilter,
  limits: { fileSize: Limits.photoMaxBytes, files: Limits.photoMaxFiles, fields: 40, fieldSize: 64 * 1024 },
});

/** Removes the request's temp files when the response is over, whatever the outcome (error, abort). */
function removedWhenDone(mw: RequestHandler): RequestHandler {
  return (req, res, next) => {
    res.once("close", () => {
      const files = [...(req.file ? [req.file] : []), ...(Array.isArray(req.files) ? req.files : [])];
      cleanupUploads(files);
    });
    mw(req, res, next);
  };
}

/** One photo in the `file` field. */
export const uploadOnePhoto: RequestHandler = removedWhenDone(photoUpload.single("file"));

/** Up to photoMaxFiles photos in the `photos` field (continuity capture). */
export const uploadPhotos: RequestHandler = removedWhenDone(photoUpload.array("photos", Limits.photoMaxFiles));

/** Removes temp files multer wrote for this request (after success or failure). */
export function cleanupUploads(files: Array<{ path: string }> | undefined): void {
  for (const f of files ?? []) fs.rm(f.path, { force: true }, () => undefined);
}
