import { z } from "zod";
import { Limits } from "../constants.js";
// Plain-words messages for every schema (side effect: configures zod once, on both sides).
import "./error-map.js";

/** A uuid path or body id. */
export const idSchema = z.uuid({ message: "must be a valid id" });

/** `?page=&pageSize=` on every list. */
export const paginationQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(Limits.pageSizeMax).default(Limits.pageSizeDefault),
});
export type PaginationQuery = z.infer<typeof paginationQuerySchema>;

export const productionParamsSchema = z.object({ productionId: idSchema });

/** A calendar day as YYYY-MM-DD. */
export const isoDateSchema = z.iso.date({ message: "must be a date as YYYY-MM-DD" });

export interface Pagination {
  page: number;
  pageSize: number;
  total: number;
}

/** The error body every failing API call returns. */
export interface ApiErrorBody {
  error: { code: string; message: string; fields?: Record<string, string> };
}
