import type { Response } from "express";
import type { PaginationQuery } from "@shared/schemas/common.js";

/** limit/offset for a Sequelize findAndCountAll from ?page=&pageSize=. */
export function pageWindow(q: PaginationQuery): { limit: number; offset: number } {
  return { limit: q.pageSize, offset: (q.page - 1) * q.pageSize };
}

/** Writes `{ data, pagination }` for a list. */
export function sendList<T>(res: Response, data: T[], total: number, q: PaginationQuery): void {
  res.json({ data, pagination: { page: q.page, pageSize: q.pageSize, total } });
}
