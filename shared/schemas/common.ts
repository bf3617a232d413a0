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

// Control characters (NUL, line breaks, escapes): never part of a name, and PostgreSQL refuses NUL.
const CONTROL_CHARACTER = /\p{Cc}/u;
// Characters that show nothing on their own: format characters (zero-width space and joiners, bidi
// marks), separators, combining marks without a base, and the blank letters of Hangul and Braille
// (Unicode general categories Cf, Z, Mn, Me, plus U+115F, U+1160, U+3164, U+FFA0, U+2800).
const INVISIBLE_CHARACTER = /[\p{Cf}\p{Z}\p{Mn}\p{Me}\u115F\u1160\u3164\uFFA0\u2800]/gu;

/** True when the text has at least one character a person can see. */
export function hasVisibleCharacter(text: string): boolean {
  return text.replace(INVISIBLE_CHARACTER, "").length > 0;
}

/**
 * Every name field (people, characters, garments, fabrics, panels, seams, productions): trimmed,
 * required, at most `max` characters, no control characters, not made only of invisible characters.
 * Joiners inside a name stay (some scripts and emoji need them).
 */
export function nameSchema(max: number) {
  return z
    .string({ message: "is required" })
    .trim()
    .min(1, "is required")
    .max(max, `must be at most ${max} characters`)
    .refine((s) => !CONTROL_CHARACTER.test(s), "must not contain control characters (such as NUL, tab or a line break)")
    .refine(hasVisibleCharacter, "must contain a visible character");
}

/**
 * A name read from a file (a DXF piece name): control characters dropped and spaces trimmed, so an
 * import keeps its pieces; `fallback` when nothing visible is left.
 */
export function nameFromFile(text: string, max: number, fallback: string): string {
  const cleaned = text.replace(new RegExp(CONTROL_CHARACTER.source, "gu"), " ").trim().slice(0, max).trim();
  return hasVisibleCharacter(cleaned) ? cleaned : fallback;
}

/** An optional name: empty or missing becomes null; otherwise the rules of nameSchema. */
export function optionalNameSchema(max: number) {
  return z
    .string()
    .trim()
    .max(max, `must be at most ${max} characters`)
    .refine((s) => !CONTROL_CHARACTER.test(s), "must not contain control characters (such as NUL, tab or a line break)")
    .refine((s) => s === "" || hasVisibleCharacter(s), "must contain a visible character")
    .nullish()
    .transform((v) => (v ? v : null));
}

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
