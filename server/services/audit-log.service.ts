import { AuditEvent, User } from "../models/index.js";
import type { PaginationQuery } from "@shared/schemas/common.js";
import type { Actor } from "../middleware/require-auth.js";
import { pageWindow } from "../lib/http.js";

/** The production's audit trail, newest first, with the actor's name. */
export async function listAuditEvents(actor: Actor, q: PaginationQuery) {
  const { rows, count } = await AuditEvent.findAndCountAll({ where: { productionId: actor.productionId }, order: [["createdAt", "DESC"]], ...pageWindow(q) });
  const actorIds = [...new Set(rows.map((r) => r.actorId).filter((x): x is string => Boolean(x)))];
  const users = actorIds.length ? await User.findAll({ where: { id: actorIds }, attributes: ["id", "name"] }) : [];
  const names = new Map(users.map((u) => [u.id, u.name]));
  return { count, rows: rows.map((r) => ({ event: r, actorName: r.actorId ? (names.get(r.actorId) ?? null) : null })) };
}
