import { Router } from "express";
import {
  dismissSnagInputSchema,
  listSnagsQuerySchema,
  multiplesPlanParamsSchema,
  snagDismissalParamsSchema,
} from "@shared/schemas/snags.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { dismissSnag, listSnags, multiplesPlan, undoDismissal } from "../services/snags.service.js";

/**
 * /api/productions/:productionId/snags — computed conflicts, recomputed on the first read after a change
 * (server/services/snags.service.ts). Not paged: the screen groups and sorts all of it, and counts come with it.
 */
export const snagsRouter = Router({ mergeParams: true });

snagsRouter.get("/", authorize("snag.read"), async (req, res) => {
  const query = listSnagsQuerySchema.parse(req.query);
  res.json({ data: await listSnags(actorOf(req), query) });
});

snagsRouter.post("/dismissals", authorize("snag.dismiss"), async (req, res) => {
  const input = dismissSnagInputSchema.parse(req.body);
  res.status(201).json({ data: await dismissSnag(actorOf(req), input) });
});

snagsRouter.delete("/dismissals/:dismissalId", authorize("snag.dismiss"), async (req, res) => {
  const { dismissalId } = snagDismissalParamsSchema.parse(req.params);
  await undoDismissal(actorOf(req), dismissalId);
  res.status(204).end();
});

snagsRouter.get("/multiples/:groupId", authorize("snag.read"), async (req, res) => {
  const { groupId } = multiplesPlanParamsSchema.parse(req.params);
  res.json({ data: await multiplesPlan(actorOf(req), groupId) });
});
