import type { RequestHandler } from "express";
import { performance } from "node:perf_hooks";
import { logger } from "../lib/logger.js";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
// A path segment that looks like a secret: long and URL-safe base64 (our tokens are 43 characters).
const TOKEN_LIKE = /^[A-Za-z0-9_-]{24,}$/;
// Path segments that are always followed by a secret, whatever it looks like.
const TOKEN_AFTER = new Set(["invitations", "reset-password", "password-reset"]);
const NOT_TOKENS = new Set(["accept", "confirm"]);

/**
 * A request path fit for the log: no query string (filters can hold names) and every token-bearing
 * segment replaced by ":token". Ids (uuids) stay; they name records, not people.
 */
export function loggablePath(url: string): string {
  const path = url.split(/[?#]/, 1)[0] ?? "";
  const parts = path.split("/");
  return parts
    .map((seg, i) => {
      if (!seg || UUID.test(seg) || NOT_TOKENS.has(seg)) return seg;
      if (TOKEN_LIKE.test(seg) || TOKEN_AFTER.has(parts[i - 1] ?? "")) return ":token";
      return seg;
    })
    .join("/");
}

/** One short line per API request: method, path without tokens, status, milliseconds. Never headers or bodies. */
export const requestLog: RequestHandler = (req, res, next) => {
  const start = performance.now();
  res.once("finish", () => {
    const ms = Math.round(performance.now() - start);
    const path = loggablePath(req.originalUrl);
    logger[res.statusCode >= 500 ? "error" : "info"](
      { method: req.method, path, status: res.statusCode, ms },
      `${req.method} ${path} ${res.statusCode} ${ms}ms`,
    );
  });
  next();
};
