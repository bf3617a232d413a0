import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import { createMeasurementSetInputSchema } from "@shared/schemas/measurements.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { createMeasurementSet, deleteMeasurementSet, getPerformerMeasurements } from "../services/measurements.service.js";
import { presentMeasurementSet } from "../presenters/measurements.presenter.js";
import { NotFoundError } from "../errors.js";

const params = z.object({ performerId: idSchema });
const setParams = z.object({ performerId: idSchema, setId: idSchema });

// A malformed performer id is an unknown performer, not a form error.
function performerIdOf(p: unknown): string {
  const r = params.safeParse(p);
  if (!r.success) throw NotFoundError("Performer not found.");
  return r.data.performerId;
}

/** /api/productions/:productionId/performers/:performerId/measurements (personal data: S, D, C only). */
export const measurementsRouter = Router({ mergeParams: true });

measurementsRouter.get("/", authorize("measurement.read"), async (req, res) => {
  res.json({ data: await getPerformerMeasurements(actorOf(req), performerIdOf(req.params)) });
});

measurementsRouter.post("/", authorize("measurement.update"), async (req, res) => {
  const performerId = performerIdOf(req.params);
  const input = createMeasurementSetInputSchema.parse(req.body);
  res.status(201).json({ data: presentMeasurementSet(await createMeasurementSet(actorOf(req), performerId, input)) });
});

measurementsRouter.delete("/:setId", authorize("measurement.update"), async (req, res) => {
  const r = setParams.safeParse(req.params);
  if (!r.success) throw NotFoundError("Measurement set not found.");
  await deleteMeasurementSet(actorOf(req), r.data.performerId, r.data.setId);
  res.status(204).end();
});
