import { Router } from "express";
import { pipeline } from "node:stream/promises";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  createPacketInputSchema,
  listPacketsQuerySchema,
  packetOptionsQuerySchema,
  updatePacketInputSchema,
} from "@shared/schemas/packets.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { logger } from "../lib/logger.js";
import {
  createPacketDraft,
  deletePacketDraft,
  downloadPacket,
  getPacket,
  listPackets,
  markPacketReceived,
  packetOptions,
  publishPacket,
  publishProgress,
  updatePacketDraft,
} from "../services/packets.service.js";

const packetParams = z.object({ packetId: idSchema });

/** /api/productions/:productionId/packets — handoff packets; vfx users see only those published to them. */
export const packetsRouter = Router({ mergeParams: true });

packetsRouter.get("/", authorize("packet.read"), async (req, res) => {
  const q = listPacketsQuerySchema.parse(req.query);
  const rows = await listPackets(actorOf(req), q);
  res.json({ data: rows, pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

packetsRouter.get("/options", authorize("packet.prepare"), async (req, res) => {
  const { changeId } = packetOptionsQuerySchema.parse(req.query);
  res.json({ data: await packetOptions(actorOf(req), changeId) });
});

packetsRouter.post("/", authorize("packet.prepare"), async (req, res) => {
  const input = createPacketInputSchema.parse(req.body);
  res.status(201).json({ data: await createPacketDraft(actorOf(req), input) });
});

packetsRouter.get("/:packetId", authorize("packet.read"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  res.json({ data: await getPacket(actorOf(req), packetId) });
});

packetsRouter.patch("/:packetId", authorize("packet.prepare"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  const input = updatePacketInputSchema.parse(req.body);
  res.json({ data: await updatePacketDraft(actorOf(req), packetId, input) });
});

packetsRouter.delete("/:packetId", authorize("packet.prepare"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  await deletePacketDraft(actorOf(req), packetId);
  res.status(204).end();
});

packetsRouter.post("/:packetId/publish", authorize("packet.publish"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  res.json({ data: await publishPacket(actorOf(req), packetId) });
});

packetsRouter.get("/:packetId/publish-progress", authorize("packet.publish"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  res.json({ data: await publishProgress(actorOf(req), packetId) });
});

packetsRouter.post("/:packetId/received", authorize("packet.receive"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  res.json({ data: await markPacketReceived(actorOf(req), packetId) });
});

packetsRouter.get("/:packetId/download", authorize("packet.read"), async (req, res) => {
  const { packetId } = packetParams.parse(req.params);
  const dl = await downloadPacket(actorOf(req), packetId);
  res.setHeader("Content-Type", "application/zip");
  res.setHeader("Content-Disposition", `attachment; filename="${dl.fileName}"`);
  res.setHeader("Cache-Control", "private, no-store");
  // The length lets the client show download progress; the checksum lets it verify the file.
  if (dl.bytes !== null) res.setHeader("Content-Length", String(dl.bytes));
  if (dl.sha256) res.setHeader("X-Content-SHA256", dl.sha256);
  try {
    await pipeline(dl.stream, res);
  } catch (err) {
    // Headers are gone by now; the client sees a short file and its checksum will not match.
    logger.error({ err, packetId }, "packet download interrupted");
    res.destroy();
  }
});
