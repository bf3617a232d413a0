import { Router } from "express";
import { paginationQuerySchema } from "@shared/schemas/common.js";
import type { AuditEventDto } from "@shared/schemas/productions.js";
import { authorize, actorOf } from "../middleware/require-auth.js";
import { listAuditEvents } from "../services/audit-log.service.js";
import { sendList } from "../lib/http.js";

/** /api/productions/:productionId/audit — who changed what, when. */
export const auditRouter = Router({ mergeParams: true });

auditRouter.get("/", authorize("audit.read"), async (req, res) => {
  const q = paginationQuerySchema.parse(req.query);
  const { rows, count } = await listAuditEvents(actorOf(req), q);
  const data: AuditEventDto[] = rows.map(({ event, actorName, record }) => ({
    id: event.id,
    action: event.action,
    entityType: event.entityType,
    entityId: event.entityId,
    record,
    actorName,
    before: event.before,
    after: event.after,
    createdAt: event.createdAt.toISOString(),
  }));
  sendList(res, data, count, q);
});
