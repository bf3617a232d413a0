import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  addCopiesInputSchema,
  createGarmentInputSchema,
  garmentFiltersSchema,
  labelSheetQuerySchema,
  listGarmentsQuerySchema,
  moveGarmentsInputSchema,
  scanGarmentInputSchema,
  updateGarmentInputSchema,
} from "@shared/schemas/garments.js";
import type { Request } from "express";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { productionToday } from "../lib/clock.js";
import { sendList } from "../lib/http.js";
import { renderTagLabelsPdf } from "../lib/tag-labels.js";
import {
  addCopies,
  checkoutOptions,
  createGarments,
  findGarments,
  garmentsCsv,
  garmentFilterOptions,
  getGarmentDetail,
  listGarments,
  listOpenCheckouts,
  moveGarments,
  scanGarment,
  updateGarment,
} from "../services/garments.service.js";
import { presentCheckout, presentGarment, presentGarmentEvent, presentOpenCheckout } from "../presenters/garments.presenter.js";

const params = z.object({ garmentId: idSchema });

/** Today in the request's production (server clock), for "past due". */
const todayOf = (req: Request) => productionToday(req.production!);

/** /api/productions/:productionId/garments */
export const garmentsRouter = Router({ mergeParams: true });

garmentsRouter.get("/", authorize("garment.read"), async (req, res) => {
  const q = listGarmentsQuerySchema.parse(req.query);
  const { rows, count } = await listGarments(actorOf(req), q);
  const today = todayOf(req);
  sendList(
    res,
    rows.map((g) => presentGarment(g, today)),
    count,
    q,
  );
});

garmentsRouter.get("/filter-options", authorize("garment.read"), async (req, res) => {
  res.json({ data: await garmentFilterOptions(actorOf(req)) });
});

/** Who has what: open check-outs, soonest due first (also read by reports). */
garmentsRouter.get("/checkouts", authorize("garment.read"), async (req, res) => {
  const today = todayOf(req);
  res.json({ data: (await listOpenCheckouts(actorOf(req))).map((c) => presentOpenCheckout(c, today)) });
});

/** Members, performers and the days from today on, for the check-out form. */
garmentsRouter.get("/checkout-options", authorize("garment.move"), async (req, res) => {
  res.json({ data: await checkoutOptions(actorOf(req)) });
});

garmentsRouter.get("/export.csv", authorize("garment.read"), async (req, res) => {
  const f = garmentFiltersSchema.parse(req.query);
  const csv = await garmentsCsv(actorOf(req), f, req.production!.units);
  res.setHeader("Content-Type", "text/csv; charset=utf-8");
  res.setHeader("Content-Disposition", `attachment; filename="garments.csv"`);
  res.send(csv);
});

garmentsRouter.get("/labels.pdf", authorize("garment.read"), async (req, res) => {
  const { start, ...f } = labelSheetQuerySchema.parse(req.query);
  const rows = await findGarments(actorOf(req), f, 2000);
  const labels = rows.map((g) => ({
    tagCode: g.tagCode,
    name: g.name,
    detail: [g.sizeLabel && `size ${g.sizeLabel}`, g.copyNumber && `#${g.copyNumber}`, g.category].filter(Boolean).join(" · "),
  }));
  const pdf = await renderTagLabelsPdf(labels, req.production!.title, { start });
  res.setHeader("Content-Type", "application/pdf");
  res.setHeader("Content-Disposition", `inline; filename="tag-labels.pdf"`);
  res.send(pdf);
});

garmentsRouter.post("/", authorize("garment.update"), async (req, res) => {
  const input = createGarmentInputSchema.parse(req.body);
  const rows = await createGarments(actorOf(req), input);
  const today = todayOf(req);
  res.status(201).json({ data: rows.map((g) => presentGarment(g, today)) });
});

garmentsRouter.post("/moves", authorize("garment.move"), async (req, res) => {
  const input = moveGarmentsInputSchema.parse(req.body);
  const results = await moveGarments(actorOf(req), input);
  const today = todayOf(req);
  res.json({
    data: results.map((r) => ({ garment: presentGarment(r.garment, today), event: r.event ? presentGarmentEvent(r.event) : null })),
  });
});

garmentsRouter.post("/scan", authorize("garment.move"), async (req, res) => {
  const input = scanGarmentInputSchema.parse(req.body);
  const r = await scanGarment(actorOf(req), input);
  res.json({ data: { garment: presentGarment(r.garment, todayOf(req)), event: r.event ? presentGarmentEvent(r.event) : null } });
});

garmentsRouter.get("/:garmentId", authorize("garment.read"), async (req, res) => {
  const { garmentId } = params.parse(req.params);
  const d = await getGarmentDetail(actorOf(req), garmentId);
  const today = todayOf(req);
  res.json({
    data: {
      ...presentGarment(d.garment, today),
      history: d.history.map(presentGarmentEvent),
      checkouts: d.checkouts.map((c) => presentCheckout(c, today)),
      changes: d.changes,
      groupCopies: d.groupCopies.map((g) => ({
        id: g.id,
        tagCode: g.tagCode,
        copyNumber: g.copyNumber,
        status: g.status,
        distressStage: g.distressStage,
      })),
    },
  });
});

garmentsRouter.patch("/:garmentId", authorize("garment.update"), async (req, res) => {
  const { garmentId } = params.parse(req.params);
  const input = updateGarmentInputSchema.parse(req.body);
  res.json({ data: presentGarment(await updateGarment(actorOf(req), garmentId, input), todayOf(req)) });
});

garmentsRouter.post("/:garmentId/copies", authorize("garment.update"), async (req, res) => {
  const { garmentId } = params.parse(req.params);
  const input = addCopiesInputSchema.parse(req.body);
  const rows = await addCopies(actorOf(req), garmentId, input);
  const today = todayOf(req);
  res.status(201).json({ data: rows.map((g) => presentGarment(g, today)) });
});
