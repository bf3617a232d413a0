import { Op } from "sequelize";
import { Membership, OutboxMessage, User } from "../models/index.js";
import type { PaginationQuery } from "@shared/schemas/common.js";
import { pageWindow } from "../lib/http.js";
import type { Actor } from "../middleware/require-auth.js";

/** Mail that never shows in any outbox: it signs someone in. */
const ACCOUNT_MAIL_KINDS = ["password_reset", "invitation"];

/**
 * The production's development outbox, newest first: only mail sent because of this production
 * and delivered only to its current members. Account mail (password resets, invitations with their
 * tokens) never shows: a supervisor of any production, even one they created themselves, would
 * otherwise read links that sign in as someone else.
 */
export async function listOutbox(actor: Actor, q: PaginationQuery) {
  const members = await Membership.findAll({
    where: { productionId: actor.productionId },
    include: [{ model: User, as: "user", attributes: ["email"] }],
  });
  const addresses = members.map((m) => m.user?.email.toLowerCase()).filter((a): a is string => !!a);
  return OutboxMessage.findAndCountAll({
    where: {
      productionId: actor.productionId,
      mailKind: { [Op.notIn]: ACCOUNT_MAIL_KINDS },
      // Every recipient must be a member (contained-by), and there must be at least one.
      deliveredTo: { [Op.contained]: addresses, [Op.ne]: [] },
    },
    order: [["receivedAt", "DESC"]],
    ...pageWindow(q),
  });
}
