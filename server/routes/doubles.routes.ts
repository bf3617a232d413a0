import { Router } from "express";
import multer from "multer";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  createPanelInputSchema,
  createSeamInputSchema,
  dxfImportFieldsSchema,
  dxfPreviewFieldsSchema,
  listPanelsQuerySchema,
  markerInputSchema,
  markerQuerySchema,
  physicsQuerySchema,
  updatePanelInputSchema,
  updateSeamInputSchema,
} from "@shared/schemas/doubles.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { UnsupportedMediaTypeError, ValidationError } from "../errors.js";
import {
  createPanel,
  deletePanel,
  DXF_MAX_BYTES,
  garmentFabricOf,
  getPanel,
  importDxfPanels,
  listDoublesChanges,
  listFabricOptions,
  listPanels,
  readDxfUpload,
  updatePanel,
} from "../services/panels.service.js";
import { createSeam, deleteSeam, listSeams, updateSeam } from "../services/seams.service.js";
import { computeMarker, fabricPhysics, getMarker } from "../services/yardage.service.js";
import { presentPanel } from "../presenters/panels.presenter.js";

const panelParams = z.object({ panelId: idSchema });
const seamParams = z.object({ seamId: idSchema });
const list = <T>(data: T[]) => ({ data, pagination: { page: 1, pageSize: data.length, total: data.length } });

// DXF files are small text; keep them in memory and refuse anything not named .dxf.
const dxfUpload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: DXF_MAX_BYTES, files: 1 },
  fileFilter: (_req, file, cb) => {
    if (/\.dxf$/i.test(file.originalname)) cb(null, true);
    else cb(UnsupportedMediaTypeError("file: choose a .dxf file", { file: "choose a .dxf file" }));
  },
}).single("file");

function requireFile(file: Express.Multer.File | undefined): Buffer {
  if (!file) throw ValidationError("file: choose a DXF file", { file: "choose a DXF file" });
  return file.buffer;
}

/** /api/productions/:productionId/doubles — the screen's lookups, yardage and fabric physics. */
export const doublesRouter = Router({ mergeParams: true });

doublesRouter.get("/changes", authorize("panel.read"), async (req, res) => {
  res.json(list(await listDoublesChanges(actorOf(req))));
});

doublesRouter.get("/fabrics", authorize("panel.read"), async (req, res) => {
  res.json(list(await listFabricOptions(actorOf(req))));
});

doublesRouter.get("/physics", authorize("panel.read"), async (req, res) => {
  const q = physicsQuerySchema.parse(req.query);
  res.json(list(await fabricPhysics(actorOf(req), q)));
});

doublesRouter.get("/markers", authorize("panel.read"), async (req, res) => {
  const q = markerQuerySchema.parse(req.query);
  res.json({ data: await getMarker(actorOf(req), q) });
});

doublesRouter.post("/markers", authorize("panel.update"), async (req, res) => {
  const input = markerInputSchema.parse(req.body);
  res.status(201).json({ data: await computeMarker(actorOf(req), input) });
});

/** /api/productions/:productionId/panels */
export const panelsRouter = Router({ mergeParams: true });

panelsRouter.get("/", authorize("panel.read"), async (req, res) => {
  const q = listPanelsQuerySchema.parse(req.query);
  const { panels, garmentFabric } = await listPanels(actorOf(req), q);
  res.json(list(panels.map((p) => presentPanel(p, garmentFabric.get(p.garmentId) ?? null))));
});

panelsRouter.post("/", authorize("panel.update"), async (req, res) => {
  const input = createPanelInputSchema.parse(req.body);
  const actor = actorOf(req);
  const panel = await createPanel(actor, input);
  res.status(201).json({ data: presentPanel(panel, await garmentFabricOf(actor, panel.garmentId)) });
});

panelsRouter.post("/dxf-preview", authorize("panel.update"), dxfUpload, async (req, res) => {
  const buffer = requireFile(req.file);
  const fields = dxfPreviewFieldsSchema.parse(req.body);
  res.json({ data: await readDxfUpload(buffer, fields) });
});

panelsRouter.post("/dxf-import", authorize("panel.update"), dxfUpload, async (req, res) => {
  const buffer = requireFile(req.file);
  const fields = dxfImportFieldsSchema.parse(req.body);
  const actor = actorOf(req);
  const { panels, warnings, skipped } = await importDxfPanels(actor, fields, buffer);
  const fabric = await garmentFabricOf(actor, fields.garmentId);
  res.status(201).json({ data: { panels: panels.map((p) => presentPanel(p, fabric)), warnings, skipped } });
});

panelsRouter.get("/:panelId", authorize("panel.read"), async (req, res) => {
  const { panelId } = panelParams.parse(req.params);
  const actor = actorOf(req);
  const panel = await getPanel(actor, panelId);
  res.json({ data: presentPanel(panel, await garmentFabricOf(actor, panel.garmentId)) });
});

panelsRouter.patch("/:panelId", authorize("panel.update"), async (req, res) => {
  const { panelId } = panelParams.parse(req.params);
  const input = updatePanelInputSchema.parse(req.body);
  const actor = actorOf(req);
  const panel = await updatePanel(actor, panelId, input);
  res.json({ data: presentPanel(panel, await garmentFabricOf(actor, panel.garmentId)) });
});

panelsRouter.delete("/:panelId", authorize("panel.update"), async (req, res) => {
  const { panelId } = panelParams.parse(req.params);
  await deletePanel(actorOf(req), panelId);
  res.status(204).end();
});

/** /api/productions/:productionId/seams */
export const seamsRouter = Router({ mergeParams: true });

seamsRouter.get("/", authorize("panel.read"), async (req, res) => {
  const q = listPanelsQuerySchema.parse(req.query);
  res.json(list(await listSeams(actorOf(req), q)));
});

seamsRouter.post("/", authorize("panel.update"), async (req, res) => {
  const input = createSeamInputSchema.parse(req.body);
  res.status(201).json({ data: await createSeam(actorOf(req), input) });
});

seamsRouter.patch("/:seamId", authorize("panel.update"), async (req, res) => {
  const { seamId } = seamParams.parse(req.params);
  const input = updateSeamInputSchema.parse(req.body);
  res.json({ data: await updateSeam(actorOf(req), seamId, input) });
});

seamsRouter.delete("/:seamId", authorize("panel.update"), async (req, res) => {
  const { seamId } = seamParams.parse(req.params);
  await deleteSeam(actorOf(req), seamId);
  res.status(204).end();
});
