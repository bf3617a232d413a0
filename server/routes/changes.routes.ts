import { Router } from "express";
import { z } from "zod";
import { idSchema } from "@shared/schemas/common.js";
import { changeApprovalInputSchema, changeInputSchema, listChangesQuerySchema, updateChangeInputSchema } from "@shared/schemas/changes.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { createChange, deleteChange, getChange, listChanges, setChangeApproval, updateChange } from "../services/changes.service.js";

const idParams = z.object({ id: idSchema });

/** /api/productions/:productionId/changes */
export const changesRouter = Router({ mergeParams: true });

changesRouter.get("/", authorize("change.read"), async (req, res) => {
  const q = listChangesQuerySchema.parse(req.query);
  const rows = await listChanges(actorOf(req), q);
  res.json({ data: rows, pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

changesRouter.get("/:id", authorize("change.read"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  res.json({ data: await getChange(actorOf(req), id) });
});

changesRouter.post("/", authorize("change.update"), async (req, res) => {
  const input = changeInputSchema.parse(req.body);
  res.status(201).json({ data: await createChange(actorOf(req), input) });
});

changesRouter.patch("/:id", authorize("change.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const input = updateChangeInputSchema.parse(req.body);
  res.json({ data: await updateChange(actorOf(req), id, input) });
});

changesRouter.put("/:id/approval", authorize("change.approve"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  const { approval } = changeApprovalInputSchema.parse(req.body);
  res.json({ data: await setChangeApproval(actorOf(req), id, approval) });
});

changesRouter.delete("/:id", authorize("change.update"), async (req, res) => {
  const { id } = idParams.parse(req.params);
  await deleteChange(actorOf(req), id);
  res.status(204).end();
});
