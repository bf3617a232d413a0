import { OutboxMessage } from "../models/index.js";
import type { PaginationQuery } from "@shared/schemas/common.js";
import { pageWindow } from "../lib/http.js";

/** Newest messages caught by the local SMTP fake. Development-only, so not scoped to a production. */
export async function listOutbox(q: PaginationQuery) {
  return OutboxMessage.findAndCountAll({ order: [["receivedAt", "DESC"]], ...pageWindow(q) });
}
