import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  createFittingInputSchema,
  createTicketInputSchema,
  listEmailJobsQuerySchema,
  linkFittingItemInputSchema,
  listFittingsQuerySchema,
  listTicketsQuerySchema,
  planQuerySchema,
  ticketStatusInputSchema,
  updateFittingInputSchema,
  updateTicketInputSchema,
  upsertCapacityInputSchema,
  workroomSettingsInputSchema,
} from "@shared/schemas/workroom.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { createFitting, getFittingDetail, linkFittingItem, listFittings, updateFitting } from "../services/fittings.service.js";
import { getTicket, listTickets, presentTickets, raiseTicket, setTicketStatus, updateTicket } from "../services/alterations.service.js";
import { buildPlan, listCapacity, updateWorkroomSettings, upsertCapacity, workroomOptions } from "../services/workroom.service.js";
import { listEmailJobs, retryEmailJob } from "../services/workroom-mail.service.js";
import { presentEmailJob } from "../presenters/workroom.presenter.js";

const idParams = z.object({ id: idSchema });
const userParams = z.object({ userId: idSchema });
const listOf = <T>(data: T[]) => ({ data, pagination: { page: 1, pageSize: data.length, total: data.length } });

/** /api/productions/:productionId/fittings */
export const fittingsRouter = Router({ mergeParams: true });

fittingsRouter.get("/", authorize("fitting.read"), async (req, res) => {
  const q = listFittingsQuerySchema.parse(req.query);
  res.json(listOf(await listFittings(actorOf(req), q)));
});

fittingsRouter.post("/", authorize("fitting.update"), async (req, res) => {
  const input = createFittingInputSchema.parse(req.body);
  res.status(201).json({ data: await createFitting(actorOf(req), input) });
});

fittingsRouter.get("/:id", authorize("fitting.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getFittingDetail(actorOf(req), id) });
});

fittingsRouter.post("/:id/items/:changeItemId/garment", authorize("fitting.link_garment"), async (req, res) => {
  const { id, changeItemId } = z.object({ id: idSchema, changeItemId: idSchema }).parse(req.params);
  const input = linkFittingItemInputSchema.parse(req.body);
  res.json({ data: await linkFittingItem(actorOf(req), id, changeItemId, input) });
});

fittingsRouter.patch("/:id", authorize("fitting.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateFittingInputSchema.parse(req.body);
  res.json({ data: await updateFitting(actorOf(req), id, input) });
});

/** /api/productions/:productionId/alterations */
export const alterationsRouter = Router({ mergeParams: true });

alterationsRouter.get("/", authorize("alteration.read"), async (req, res) => {
  const q = listTicketsQuerySchema.parse(req.query);
  const actor = actorOf(req);
  res.json(listOf(await presentTickets(actor.productionId, await listTickets(actor, q))));
});

alterationsRouter.post("/", authorize("alteration.update"), async (req, res) => {
  const input = createTicketInputSchema.parse(req.body);
  const actor = actorOf(req);
  const [dto] = await presentTickets(actor.productionId, [await raiseTicket(actor, input)]);
  res.status(201).json({ data: dto });
});

alterationsRouter.get("/:id", authorize("alteration.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const actor = actorOf(req);
  const [dto] = await presentTickets(actor.productionId, [await getTicket(actor, id)]);
  res.json({ data: dto });
});

alterationsRouter.patch("/:id", authorize("alteration.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateTicketInputSchema.parse(req.body);
  const actor = actorOf(req);
  const [dto] = await presentTickets(actor.productionId, [await updateTicket(actor, id, input)]);
  res.json({ data: dto });
});

alterationsRouter.post("/:id/status", authorize("alteration.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const { status } = ticketStatusInputSchema.parse(req.body);
  const actor = actorOf(req);
  const [dto] = await presentTickets(actor.productionId, [await setTicketStatus(actor, id, status)]);
  res.json({ data: dto });
});

/** /api/productions/:productionId/workroom */
export const workroomRouter = Router({ mergeParams: true });

workroomRouter.get("/plan", authorize("alteration.read"), async (req, res) => {
  const { from } = planQuerySchema.parse(req.query);
  res.json({ data: await buildPlan(actorOf(req).productionId, from) });
});

workroomRouter.get("/options", authorize("fitting.read"), async (req, res) => {
  res.json({ data: await workroomOptions(actorOf(req)) });
});

workroomRouter.get("/capacity", authorize("alteration.read"), async (req, res) => {
  res.json(listOf(await listCapacity(actorOf(req))));
});

workroomRouter.put("/capacity/:userId", authorize("workroom.capacity"), async (req, res) => {
  const { userId } = userParams.parse(req.params);
  const input = upsertCapacityInputSchema.parse(req.body);
  res.json({ data: await upsertCapacity(actorOf(req), userId, input) });
});

workroomRouter.patch("/settings", authorize("workroom.capacity"), async (req, res) => {
  const input = workroomSettingsInputSchema.parse(req.body);
  res.json({ data: await updateWorkroomSettings(actorOf(req), input) });
});

workroomRouter.get("/email-jobs", authorize("workroom.mail"), async (req, res) => {
  const { status } = listEmailJobsQuerySchema.parse(req.query);
  res.json(listOf((await listEmailJobs(actorOf(req), status)).map(presentEmailJob)));
});

workroomRouter.post("/email-jobs/:id/retry", authorize("workroom.mail"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: presentEmailJob(await retryEmailJob(actorOf(req), id)) });
});
