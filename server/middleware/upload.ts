// multer writes uploads to a temp folder with server-chosen names; the service decides the rest.
import os from "node:os";
import path from "node:path";
import fs from "node:fs";
import { randomUUID } from "node:crypto";
import multer from "multer";
import type { RequestHandler } from "express";
import { Limits, photoUploadTypes } from "@shared/constants.js";
import { ValidationError } from "../errors.js";

const tmpDir = path.join(os.tmpdir(), "seamscene-uploads");

const storage = multer.diskStorage({
  destination: (_req, _file, cb) => {
    fs.mkdir(tmpDir, { recursive: true }, (err) => cb(err, tmpDir));
  },
  filename: (_req, _file, cb) => cb(null, randomUUID()),
});

/** Extension and declared type must both be on the allow-list; the content is checked later by sharp. */
function fileFilter(_req: unknown, file: Express.Multer.File, cb: multer.FileFilterCallback) {
  const ext = path.extname(file.originalname).slice(1).toLowerCase();
  const types = photoUploadTypes[ext];
  if (!types || !types.includes(file.mimetype.toLowerCase())) {
    return cb(ValidationError(`${file.fieldname}: only JPEG, PNG, WebP, AVIF or TIFF photos are accepted`, { [file.fieldname]: "is not an accepted image type" }));
  }
  cb(null, true);
}

const photoUpload = multer({ storage, fileFilter, limits: { fileSize: Limits.photoMaxBytes, files: Limits.photoMaxFiles, fields: 40, fieldSize: 64 * 1024 } });

/** One photo in the `file` field. */
export const uploadOnePhoto: RequestHandler = photoUpload.single("file");

/** Up to photoMaxFiles photos in the `photos` field (continuity capture). */
export const uploadPhotos: RequestHandler = photoUpload.array("photos", Limits.photoMaxFiles);

/** Removes temp files multer wrote for this request (after success or failure). */
export function cleanupUploads(files: Array<{ path: string }> | undefined): void {
  for (const f of files ?? []) fs.rm(f.path, { force: true }, () => undefined);
}
