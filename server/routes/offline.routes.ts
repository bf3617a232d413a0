import { Router } from "express";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { offlinePack } from "../services/offline-pack.service.js";

/** /api/productions/:productionId/offline-pack */
export const offlineRouter = Router({ mergeParams: true });

/** What a phone keeps for a day without a signal; for the roles that log continuity on set. */
offlineRouter.get("/", authorize("continuity.log"), async (req, res) => {
  // Never stored by a browser or proxy cache: the phone keeps its own copy, per account.
  res.setHeader("Cache-Control", "no-store");
  res.json({ data: await offlinePack(actorOf(req), req.production!) });
});
