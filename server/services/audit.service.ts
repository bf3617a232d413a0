import type { Transaction } from "sequelize";
import { AuditEvent } from "../models/index.js";

/** Records who changed what, inside the caller's transaction. */
export async function recordAudit(
  event: {
    productionId: string | null;
    actorId: string | null;
    action: string;
    entityType: string;
    entityId?: string | null;
    before?: unknown;
    after?: unknown;
  },
  transaction?: Transaction,
): Promise<void> {
  await AuditEvent.create(
    {
      productionId: event.productionId,
      actorId: event.actorId,
      action: event.action,
      entityType: event.entityType,
      entityId: event.entityId ?? null,
      before: event.before ?? null,
      after: event.after ?? null,
    },
    { transaction },
  );
}
