import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import {
  characterInputSchema,
  performerInputSchema,
  updateCharacterInputSchema,
  updatePerformerInputSchema,
} from "@shared/schemas/cast.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import {
  characterSchedule,
  createCharacter,
  createPerformer,
  deleteCharacter,
  deletePerformer,
  getPerformer,
  listCharacters,
  listPerformers,
  updateCharacter,
  updatePerformer,
} from "../services/cast.service.js";

const idParams = z.object({ id: idSchema });
const listed = <T>(rows: T[]) => ({ data: rows, pagination: { page: 1, pageSize: rows.length, total: rows.length } });

/** /api/productions/:productionId/characters */
export const charactersRouter = Router({ mergeParams: true });

charactersRouter.get("/", authorize("cast.read"), async (req, res) => {
  res.json(listed(await listCharacters(actorOf(req))));
});

/** Story order and shoot order; the breakdown readers (set costumers) need it too. */
charactersRouter.get("/:id/schedule", authorize("breakdown.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await characterSchedule(actorOf(req), id) });
});

charactersRouter.post("/", authorize("cast.update"), async (req, res) => {
  const input = characterInputSchema.parse(req.body);
  res.status(201).json({ data: await createCharacter(actorOf(req), input) });
});

charactersRouter.patch("/:id", authorize("cast.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateCharacterInputSchema.parse(req.body);
  res.json({ data: await updateCharacter(actorOf(req), id, input) });
});

charactersRouter.delete("/:id", authorize("cast.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteCharacter(actorOf(req), id);
  res.status(204).end();
});

/** /api/productions/:productionId/performers (name, contact, notes; measurements are Wardrobe's) */
export const performersRouter = Router({ mergeParams: true });

performersRouter.get("/", authorize("cast.read"), async (req, res) => {
  res.json(listed(await listPerformers(actorOf(req))));
});

performersRouter.get("/:id", authorize("cast.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getPerformer(actorOf(req), id) });
});

performersRouter.post("/", authorize("cast.update"), async (req, res) => {
  const input = performerInputSchema.parse(req.body);
  res.status(201).json({ data: await createPerformer(actorOf(req), input) });
});

performersRouter.patch("/:id", authorize("cast.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updatePerformerInputSchema.parse(req.body);
  res.json({ data: await updatePerformer(actorOf(req), id, input) });
});

performersRouter.delete("/:id", authorize("cast.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deletePerformer(actorOf(req), id);
  res.status(204).end();
});
