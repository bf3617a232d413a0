import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import { continuityEntryInputSchema, listContinuityQuerySchema, updateContinuityEntryInputSchema } from "@shared/schemas/continuity.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { cleanupUploads, uploadPhotos } from "../middleware/upload.js";
import {
  continuityTimeline,
  createContinuityEntry,
  deleteContinuityEntry,
  getContinuityEntry,
  listContinuity,
  updateContinuityEntry,
} from "../services/continuity.service.js";

const idParams = z.object({ id: idSchema });
const characterParams = z.object({ characterId: idSchema });

/** /api/productions/:productionId/continuity */
export const continuityRouter = Router({ mergeParams: true });

continuityRouter.get("/", authorize("continuity.read"), async (req, res) => {
  const q = listContinuityQuerySchema.parse(req.query);
  const rows = await listContinuity(actorOf(req), q);
  res.json({ data: rows, pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

continuityRouter.get("/timeline/:characterId", authorize("continuity.read"), async (req, res) => {
  const { characterId } = characterParams.parse(req.params);
  res.json({ data: await continuityTimeline(actorOf(req), characterId) });
});

continuityRouter.get("/:id", authorize("continuity.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getContinuityEntry(actorOf(req), id) });
});

/**
 * Multipart: the entry's fields plus up to 8 `photos` with a `views` value per photo. JSON works too.
 * 201 with the new entry; 200 with the stored one when its `clientId` was sent before.
 */
continuityRouter.post("/", authorize("continuity.log"), uploadPhotos, async (req, res) => {
  const files = (req.files as Express.Multer.File[] | undefined) ?? [];
  try {
    const input = continuityEntryInputSchema.parse(req.body ?? {});
    const { entry, replayed } = await createContinuityEntry(actorOf(req), input, files);
    res.status(replayed ? 200 : 201).json({ data: entry });
  } finally {
    cleanupUploads(files);
  }
});

continuityRouter.patch("/:id", authorize("continuity.log"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateContinuityEntryInputSchema.parse(req.body);
  res.json({ data: await updateContinuityEntry(actorOf(req), id, input) });
});

continuityRouter.delete("/:id", authorize("continuity.log"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteContinuityEntry(actorOf(req), id);
  res.status(204).end();
});
