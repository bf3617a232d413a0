import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import { createFabricInputSchema, createFabricTestInputSchema, updateFabricInputSchema } from "@shared/schemas/fabrics.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import {
  addFabricTest,
  createFabric,
  deleteFabric,
  deleteFabricTest,
  getFabricDetail,
  listFabrics,
  updateFabric,
} from "../services/fabrics.service.js";
import { presentFabric, presentFabricTest } from "../presenters/fabrics.presenter.js";

const params = z.object({ fabricId: idSchema });
const testParams = z.object({ fabricId: idSchema, testId: idSchema });

/** /api/productions/:productionId/fabrics */
export const fabricsRouter = Router({ mergeParams: true });

fabricsRouter.get("/", authorize("fabric.read"), async (req, res) => {
  const rows = await listFabrics(actorOf(req));
  res.json({ data: rows.map((f) => presentFabric(f)), pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

fabricsRouter.post("/", authorize("fabric.update"), async (req, res) => {
  const input = createFabricInputSchema.parse(req.body);
  res.status(201).json({ data: presentFabric(await createFabric(actorOf(req), input)) });
});

fabricsRouter.get("/:fabricId", authorize("fabric.read"), async (req, res) => {
  const { fabricId } = params.parse(req.params);
  const d = await getFabricDetail(actorOf(req), fabricId);
  res.json({ data: { ...presentFabric(d.fabric), tests: d.tests.map(presentFabricTest), simulation: d.simulation } });
});

fabricsRouter.patch("/:fabricId", authorize("fabric.update"), async (req, res) => {
  const { fabricId } = params.parse(req.params);
  const input = updateFabricInputSchema.parse(req.body);
  res.json({ data: presentFabric(await updateFabric(actorOf(req), fabricId, input)) });
});

fabricsRouter.delete("/:fabricId", authorize("fabric.update"), async (req, res) => {
  const { fabricId } = params.parse(req.params);
  await deleteFabric(actorOf(req), fabricId);
  res.status(204).end();
});

fabricsRouter.post("/:fabricId/tests", authorize("fabric.update"), async (req, res) => {
  const { fabricId } = params.parse(req.params);
  const input = createFabricTestInputSchema.parse(req.body);
  res.status(201).json({ data: presentFabricTest(await addFabricTest(actorOf(req), fabricId, input)) });
});

fabricsRouter.delete("/:fabricId/tests/:testId", authorize("fabric.update"), async (req, res) => {
  const { fabricId, testId } = testParams.parse(req.params);
  await deleteFabricTest(actorOf(req), fabricId, testId);
  res.status(204).end();
});
