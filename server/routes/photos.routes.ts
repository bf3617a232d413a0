import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import { listPhotosQuerySchema, photoFileQuerySchema, uploadPhotoFieldsSchema } from "@shared/schemas/photos.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { cleanupUploads, uploadOnePhoto } from "../middleware/upload.js";
import { deletePhoto, listPhotos, openPhotoFile, uploadPhoto } from "../services/photos.service.js";
import { presentPhoto } from "../presenters/photos.presenter.js";

const photoParams = z.object({ photoId: idSchema });

/** /api/productions/:productionId/photos — one upload pipeline for every owner type. */
export const photosRouter = Router({ mergeParams: true });

photosRouter.get("/", authorize("photo.read"), async (req, res) => {
  const q = listPhotosQuerySchema.parse(req.query);
  const rows = await listPhotos(actorOf(req), q.ownerType, q.ownerId);
  res.json({ data: rows.map(presentPhoto), pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

photosRouter.post("/", authorize("photo.read"), uploadOnePhoto, async (req, res) => {
  try {
    const fields = uploadPhotoFieldsSchema.parse(req.body);
    const { photo, created } = await uploadPhoto(actorOf(req), req.file, fields);
    // 200 with the existing photo when the owner already holds this exact image.
    res.status(created ? 201 : 200).json({ data: presentPhoto(photo) });
  } finally {
    cleanupUploads(req.file ? [req.file] : undefined);
  }
});

photosRouter.get("/:photoId/file", authorize("photo.read"), async (req, res) => {
  const { photoId } = photoParams.parse(req.params);
  const { size } = photoFileQuerySchema.parse(req.query);
  const { stream, contentType, photo } = await openPhotoFile(actorOf(req), photoId, size);
  res.setHeader("Content-Type", contentType);
  // Content-addressed files never change; private because they need a session.
  res.setHeader("Cache-Control", "private, max-age=31536000, immutable");
  res.setHeader("ETag", `"${photo.contentHash}-${size}"`);
  await new Promise<void>((resolve, reject) => {
    stream.on("error", reject);
    res.on("finish", resolve);
    res.on("close", resolve);
    stream.pipe(res);
  });
});

photosRouter.delete("/:photoId", authorize("photo.read"), async (req, res) => {
  const { photoId } = photoParams.parse(req.params);
  await deletePhoto(actorOf(req), photoId);
  res.status(204).end();
});
