import { Router } from "express";
import { z } from "zod";
import { inviteMemberInputSchema, updateMemberInputSchema } from "@shared/schemas/members.js";
import { idSchema, paginationQuerySchema } from "@shared/schemas/common.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import {
  inviteMember,
  listInvitations,
  listMembers,
  removeMember,
  revokeInvitation,
  updateMemberRole,
} from "../services/members.service.js";
import { presentInvitation, presentMember, presentOutboxMessage } from "../presenters/members.presenter.js";
import { listOutbox } from "../services/outbox.service.js";
import { sendList } from "../lib/http.js";
import { NotFoundError } from "../errors.js";
import { outboxEnabled } from "../config.js";

const memberParams = z.object({ memberId: idSchema });
const invitationParams = z.object({ invitationId: idSchema });

/** /api/productions/:productionId/members */
export const membersRouter = Router({ mergeParams: true });

membersRouter.get("/", authorize("member.read"), async (req, res) => {
  const rows = await listMembers(actorOf(req));
  res.json({ data: rows.map(presentMember), pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

membersRouter.patch("/:memberId", authorize("member.update"), async (req, res) => {
  const { memberId } = memberParams.parse(req.params);
  const input = updateMemberInputSchema.parse(req.body);
  res.json({ data: presentMember(await updateMemberRole(actorOf(req), memberId, input)) });
});

membersRouter.delete("/:memberId", authorize("member.remove"), async (req, res) => {
  const { memberId } = memberParams.parse(req.params);
  await removeMember(actorOf(req), memberId);
  res.status(204).end();
});

/** /api/productions/:productionId/invitations */
export const invitationsRouter = Router({ mergeParams: true });

invitationsRouter.get("/", authorize("member.read"), async (req, res) => {
  const rows = await listInvitations(actorOf(req));
  res.json({ data: rows.map(presentInvitation), pagination: { page: 1, pageSize: rows.length, total: rows.length } });
});

invitationsRouter.post("/", authorize("member.invite"), async (req, res) => {
  const input = inviteMemberInputSchema.parse(req.body);
  res.status(201).json({ data: presentInvitation(await inviteMember(actorOf(req), input)) });
});

invitationsRouter.delete("/:invitationId", authorize("member.invite"), async (req, res) => {
  const { invitationId } = invitationParams.parse(req.params);
  await revokeInvitation(actorOf(req), invitationId);
  res.status(204).end();
});

/** /api/productions/:productionId/outbox — messages caught by the local SMTP fake (development only). */
export const outboxRouter = Router({ mergeParams: true });

// No outbox at all on a production server, whatever the role.
outboxRouter.use((_req, _res, next) => next(outboxEnabled() ? undefined : NotFoundError("The outbox exists only in development.")));

outboxRouter.get("/", authorize("outbox.read"), async (req, res) => {
  const q = paginationQuerySchema.parse(req.query);
  const { rows, count } = await listOutbox(actorOf(req), q);
  sendList(res, rows.map(presentOutboxMessage), count, q);
});
