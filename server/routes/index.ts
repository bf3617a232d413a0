import { Router } from "express";
import { sequelize } from "../db.js";
import { requireAuth, loadProduction } from "../middleware/require-auth.js";
import { authRouter, invitationsPublicRouter } from "./auth.routes.js";
import { productionsRouter, productionRouter } from "./productions.routes.js";
import { membersRouter, invitationsRouter, outboxRouter } from "./members.routes.js";
import { doublesRouter, panelsRouter, seamsRouter } from "./doubles.routes.js";
import { packetsRouter } from "./packets.routes.js";

/** Everything under /api. Feature routers mount on `production` (one production's records). */
export function buildApiRouter(): Router {
  const api = Router();

  api.get("/health", async (_req, res) => {
    try {
      await sequelize.query("SELECT 1");
      res.json({ ok: true, db: "up" });
    } catch {
      res.status(503).json({ ok: false, db: "down" });
    }
  });

  api.use("/auth", authRouter);
  api.use("/invitations", invitationsPublicRouter);
  api.use("/productions", productionsRouter);

  // One production: non-members get 404, then each route checks the role's permission.
  const production = Router({ mergeParams: true });
  production.use(requireAuth, loadProduction);
  production.use("/members", membersRouter);
  production.use("/invitations", invitationsRouter);
  production.use("/outbox", outboxRouter);
  // Digital doubles
  production.use("/doubles", doublesRouter);
  production.use("/panels", panelsRouter);
  production.use("/seams", seamsRouter);
  production.use("/packets", packetsRouter);
  production.use("/", productionRouter);
  api.use("/productions/:productionId", production);

  return api;
}
