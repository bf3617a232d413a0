import { Router } from "express";
import { createProductionInputSchema, updateProductionInputSchema } from "@shared/schemas/productions.js";
import { requireAuth, authorize, actorOf } from "../middleware/require-auth.js";
import { createProduction, listProductionsForUser, rememberProduction, updateProduction } from "../services/productions.service.js";
import { presentProduction } from "../presenters/productions.presenter.js";

/** /api/productions — the list and creation; one production's own routes hang off productionRouter. */
export const productionsRouter = Router();

productionsRouter.get("/", requireAuth, async (req, res) => {
  const memberships = await listProductionsForUser(req.user!);
  const data = memberships.map((m) => presentProduction(m.production!, m.role));
  res.json({ data, pagination: { page: 1, pageSize: data.length, total: data.length } });
});

productionsRouter.post("/", requireAuth, async (req, res) => {
  const input = createProductionInputSchema.parse(req.body);
  const membership = await createProduction(req.user!, input);
  res.status(201).json({ data: presentProduction(membership.production!, membership.role) });
});

/** GET/PATCH of one production (mounted behind requireAuth + loadProduction in routes/index.ts). */
export const productionRouter = Router({ mergeParams: true });

productionRouter.get("/", authorize("production.read"), async (req, res) => {
  await rememberProduction(req.user!, req.production!.id);
  res.json({ data: presentProduction(req.production!, req.membership!.role) });
});

productionRouter.patch("/", authorize("production.update"), async (req, res) => {
  const input = updateProductionInputSchema.parse(req.body);
  const production = await updateProduction(actorOf(req), input);
  res.json({ data: presentProduction(production, req.membership!.role) });
});
