import { Router } from "express";
import { sequelize } from "../db.js";

/**
 * GET /api/health: 200 `{ ok: true, db: "up" }`, or 503 `{ ok: false, db: "down" }` while PostgreSQL
 * is unreachable. Mounted before the session middleware, so it never waits on the session store.
 */
export const healthRouter = Router();

healthRouter.get("/health", async (_req, res) => {
  try {
    await sequelize.query("SELECT 1");
    res.json({ ok: true, db: "up" });
  } catch {
    res.status(503).set("Retry-After", "5").json({ ok: false, db: "down" });
  }
});
