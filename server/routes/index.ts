import { Router } from "express";
import { requireAuth, loadProduction } from "../middleware/require-auth.js";
import { authRouter, invitationsPublicRouter } from "./auth.routes.js";
import { productionsRouter, productionRouter } from "./productions.routes.js";
import { membersRouter, invitationsRouter, outboxRouter } from "./members.routes.js";
import { auditRouter } from "./audit.routes.js";
import { scenesRouter, shootDaysRouter, appearancesRouter, importsRouter } from "./breakdown.routes.js";
import { charactersRouter, performersRouter } from "./cast.routes.js";
import { changesRouter } from "./changes.routes.js";
import { continuityRouter } from "./continuity.routes.js";
import { offlineRouter } from "./offline.routes.js";
import { photosRouter } from "./photos.routes.js";
import { garmentsRouter } from "./garments.routes.js";
import { fabricsRouter } from "./fabrics.routes.js";
import { measurementsRouter } from "./measurements.routes.js";
import { alterationsRouter, fittingsRouter, workroomRouter } from "./workroom.routes.js";
import { snagsRouter } from "./snags.routes.js";
import { doublesRouter, panelsRouter, seamsRouter } from "./doubles.routes.js";
import { packetsRouter } from "./packets.routes.js";
import { reportsRouter } from "./reports.routes.js";

/** Everything under /api. Feature routers mount on `production` (one production's records). */
export function buildApiRouter(): Router {
  const api = Router();

  api.use("/auth", authRouter);
  api.use("/invitations", invitationsPublicRouter);
  api.use("/productions", productionsRouter);

  // One production: non-members get 404, then each route checks the role's permission.
  const production = Router({ mergeParams: true });
  production.use(requireAuth, loadProduction);
  production.use("/members", membersRouter);
  production.use("/invitations", invitationsRouter);
  production.use("/outbox", outboxRouter);
  production.use("/audit", auditRouter);
  // Breakdown feature: scenes, shoot days, cast, changes, appearances, continuity, photos, imports.
  production.use("/scenes", scenesRouter);
  production.use("/shoot-days", shootDaysRouter);
  production.use("/appearances", appearancesRouter);
  production.use("/imports", importsRouter);
  production.use("/characters", charactersRouter);
  production.use("/performers/:performerId/measurements", measurementsRouter);
  production.use("/performers", performersRouter);
  production.use("/changes", changesRouter);
  production.use("/continuity", continuityRouter);
  // Offline on set: what a phone keeps for a day without a signal.
  production.use("/offline-pack", offlineRouter);
  production.use("/photos", photosRouter);
  // Wardrobe: garments, fabrics, and the measurements sub-resource of performers (mounted before any
  // performers router so /performers/:id/measurements always reaches it).
  production.use("/garments", garmentsRouter);
  production.use("/fabrics", fabricsRouter);
  // Workroom feature.
  production.use("/fittings", fittingsRouter);
  production.use("/alterations", alterationsRouter);
  production.use("/workroom", workroomRouter);
  production.use("/snags", snagsRouter);
  // Digital doubles
  production.use("/doubles", doublesRouter);
  production.use("/panels", panelsRouter);
  production.use("/seams", seamsRouter);
  production.use("/packets", packetsRouter);
  // Reports: continuity books, rack list, returns and wrap, budget.
  production.use("/reports", reportsRouter);
  production.use("/", productionRouter);
  api.use("/productions/:productionId", production);

  return api;
}
