import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  appearanceInputSchema,
  breakdownImportInputSchema,
  listAppearancesQuerySchema,
  listScenesQuerySchema,
  listShootDaysQuerySchema,
  moveSceneInputSchema,
  sceneInputSchema,
  shootDayInputSchema,
  updateAppearanceInputSchema,
  updateSceneInputSchema,
  updateShootDayInputSchema,
} from "@shared/schemas/breakdown.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { sendList } from "../lib/http.js";
import { createScene, deleteScene, getSceneDetail, listScenes, updateScene } from "../services/scenes.service.js";
import {
  createShootDay,
  deleteShootDay,
  getShootDay,
  listShootDays,
  moveSceneToDay,
  updateShootDay,
} from "../services/shoot-days.service.js";
import { createAppearance, deleteAppearance, listAppearances, updateAppearance } from "../services/appearances.service.js";
import { breakdownTemplate, exportBreakdown, importBreakdown, previewBreakdownImport } from "../services/imports.service.js";
import { presentAppearance, presentScene } from "../presenters/breakdown.presenter.js";

const idParams = z.object({ id: idSchema });

/** /api/productions/:productionId/scenes */
export const scenesRouter = Router({ mergeParams: true });

scenesRouter.get("/", authorize("breakdown.read"), async (req, res) => {
  const q = listScenesQuerySchema.parse(req.query);
  const { rows, total } = await listScenes(actorOf(req), q);
  sendList(res, rows, total, q);
});

scenesRouter.get("/export", authorize("breakdown.read"), async (req, res) => {
  const csv = await exportBreakdown(actorOf(req));
  res.setHeader("Content-Type", "text/csv; charset=utf-8");
  res.setHeader(
    "Content-Disposition",
    `attachment; filename="breakdown-${req.production?.title.replace(/[^A-Za-z0-9]+/g, "-").toLowerCase() ?? "export"}.csv"`,
  );
  res.send(csv);
});

scenesRouter.get("/:id", authorize("breakdown.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getSceneDetail(actorOf(req), id) });
});

scenesRouter.post("/", authorize("breakdown.update"), async (req, res) => {
  const input = sceneInputSchema.parse(req.body);
  res.status(201).json({ data: presentScene(await createScene(actorOf(req), input)) });
});

scenesRouter.patch("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateSceneInputSchema.parse(req.body);
  res.json({ data: presentScene(await updateScene(actorOf(req), id, input)) });
});

scenesRouter.delete("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteScene(actorOf(req), id);
  res.status(204).end();
});

/** /api/productions/:productionId/shoot-days (performances too: kind=performance) */
export const shootDaysRouter = Router({ mergeParams: true });

shootDaysRouter.get("/", authorize("breakdown.read"), async (req, res) => {
  const q = listShootDaysQuerySchema.parse(req.query);
  const { rows, total } = await listShootDays(actorOf(req), q);
  sendList(res, rows, total, q);
});

shootDaysRouter.get("/:id", authorize("breakdown.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getShootDay(actorOf(req), id) });
});

shootDaysRouter.post("/", authorize("breakdown.update"), async (req, res) => {
  const input = shootDayInputSchema.parse(req.body);
  res.status(201).json({ data: await createShootDay(actorOf(req), input) });
});

shootDaysRouter.patch("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateShootDayInputSchema.parse(req.body);
  res.json({ data: await updateShootDay(actorOf(req), id, input) });
});

shootDaysRouter.post("/:id/move-scene", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = moveSceneInputSchema.parse(req.body);
  res.json({ data: await moveSceneToDay(actorOf(req), id, input) });
});

shootDaysRouter.delete("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteShootDay(actorOf(req), id);
  res.status(204).end();
});

/** /api/productions/:productionId/appearances */
export const appearancesRouter = Router({ mergeParams: true });

appearancesRouter.get("/", authorize("breakdown.read"), async (req, res) => {
  const q = listAppearancesQuerySchema.parse(req.query);
  const rows = await listAppearances(actorOf(req), q);
  res.json({ data: rows.map(presentAppearance), pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

appearancesRouter.post("/", authorize("breakdown.update"), async (req, res) => {
  const input = appearanceInputSchema.parse(req.body);
  res.status(201).json({ data: presentAppearance(await createAppearance(actorOf(req), input)) });
});

appearancesRouter.patch("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateAppearanceInputSchema.parse(req.body);
  res.json({ data: presentAppearance(await updateAppearance(actorOf(req), id, input)) });
});

appearancesRouter.delete("/:id", authorize("breakdown.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteAppearance(actorOf(req), id);
  res.status(204).end();
});

/** /api/productions/:productionId/imports — breakdown CSV: preview (nothing saved), then import. */
export const importsRouter = Router({ mergeParams: true });

importsRouter.get("/breakdown/template", authorize("breakdown.import"), async (req, res) => {
  const csv = await breakdownTemplate(actorOf(req));
  res.setHeader("Content-Type", "text/csv; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="breakdown-template.csv"`);
  res.send(csv);
});

importsRouter.post("/breakdown/preview", authorize("breakdown.import"), async (req, res) => {
  const input = breakdownImportInputSchema.parse(req.body);
  res.json({ data: await previewBreakdownImport(actorOf(req), input.csv) });
});

importsRouter.post("/breakdown", authorize("breakdown.import"), async (req, res) => {
  const input = breakdownImportInputSchema.parse(req.body);
  res.status(201).json({ data: await importBreakdown(actorOf(req), input.csv, input.fileName) });
});
