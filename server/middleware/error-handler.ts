import type { ErrorRequestHandler, RequestHandler } from "express";
import { ZodError } from "zod";
import {
  BaseError,
  UniqueConstraintError,
  ValidationError as SequelizeValidationError,
  ForeignKeyConstraintError,
  EmptyResultError,
  DatabaseError,
} from "sequelize";
import multer from "multer";
import { DatabaseUnavailableError, HttpError } from "../errors.js";
import { isDatabaseUnavailable } from "../lib/db-errors.js";
import { logger } from "../lib/logger.js";
import { fieldSentences, issuesToFieldSentences, plainMessage } from "@shared/field-messages.js";
import { loggablePath } from "./request-log.js";

function zodToHttp(err: ZodError): HttpError {
  const fields = issuesToFieldSentences(err.issues);
  return new HttpError(400, "validation_error", Object.values(fields)[0] ?? "The input is not valid.", fields);
}

/** Field names and predicates in the person's words ("Name is required"), whoever threw the error. */
function inPlainWords(e: HttpError): HttpError {
  if (e.status >= 500) return e;
  return new HttpError(e.status, e.code, plainMessage(e.message), e.fields ? fieldSentences(e.fields) : undefined);
}

function camel(s: string): string {
  return s.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase());
}

/** Maps any thrown error onto one HttpError. */
export function toHttpError(err: unknown): HttpError {
  if (err instanceof HttpError) return err;
  // PostgreSQL restarting or unreachable: a 503 the client can retry, not a 500.
  if (isDatabaseUnavailable(err)) return DatabaseUnavailableError();
  if (err instanceof ZodError) return zodToHttp(err);
  if (err instanceof UniqueConstraintError) {
    const fields: Record<string, string> = {};
    for (const e of err.errors ?? []) if (e.path) fields[camel(e.path)] = "is already in use";
    const first = Object.keys(fields)[0];
    return new HttpError(409, "conflict", first ? `${first}: is already in use` : "That record already exists.", fields);
  }
  if (err instanceof SequelizeValidationError) {
    const fields: Record<string, string> = {};
    for (const e of err.errors) if (e.path && !fields[e.path]) fields[e.path] = e.message;
    const first = Object.entries(fields)[0];
    return new HttpError(400, "validation_error", first ? `${first[0]}: ${first[1]}` : err.message, fields);
  }
  if (err instanceof ForeignKeyConstraintError) return new HttpError(409, "conflict", "A linked record does not exist or is still in use.");
  if (err instanceof EmptyResultError) return new HttpError(404, "not_found", "Not found.");
  if (err instanceof DatabaseError && (err.parent as { code?: string })?.code === "23514") {
    return new HttpError(400, "validation_error", "A value is outside its allowed range.");
  }
  if (err instanceof DatabaseError && (err.parent as { code?: string })?.code === "22P02") {
    return new HttpError(400, "validation_error", "A value has the wrong form.");
  }
  if (err instanceof multer.MulterError) {
    if (err.code === "LIMIT_FILE_SIZE")
      return new HttpError(413, "payload_too_large", "The file is larger than the upload limit.", {
        [err.field ?? "file"]: "larger than the upload limit",
      });
    if (err.code === "LIMIT_FILE_COUNT" || err.code === "LIMIT_UNEXPECTED_FILE")
      return new HttpError(400, "validation_error", "Too many files or an unexpected file field.", { [err.field ?? "file"]: err.message });
    return new HttpError(400, "validation_error", err.message);
  }
  const e = err as { type?: string; status?: number; expose?: boolean; message?: string };
  if (e?.type === "entity.parse.failed") return new HttpError(400, "validation_error", "The request body is not valid JSON.");
  if (e?.type === "entity.too.large") return new HttpError(413, "payload_too_large", "The request body is too large.");
  if (e?.status === 403 && e?.message?.toLowerCase().includes("csrf"))
    return new HttpError(403, "csrf_invalid", "The form expired; reload the page and try again.");
  if (typeof e?.status === "number" && e.status >= 400 && e.status < 500 && e.expose)
    return new HttpError(e.status, "bad_request", e.message ?? "Bad request.");
  void BaseError;
  return new HttpError(500, "internal_error", "Something went wrong on the server. The error was logged.");
}

/** The one place error responses are written. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  const httpError = inPlainWords(toHttpError(err));
  if (res.headersSent) {
    // Too late for an error response: e.g. the session store failed to save after the answer went out
    // (express-session saves while the body is written). Log it; cut the connection only if the
    // body is still unfinished, so the client does not wait for ever.
    logger.warn(
      { method: req.method, path: loggablePath(req.originalUrl), reason: (err as Error)?.message, code: httpError.code },
      "error after the response was sent",
    );
    if (!res.writableEnded) req.socket?.destroy();
    return;
  }
  if (httpError.code === "database_unavailable")
    logger.warn({ method: req.method, path: loggablePath(req.originalUrl), reason: (err as Error)?.message }, "database unavailable");
  else if (httpError.status >= 500) logger.error({ err, method: req.method, path: loggablePath(req.originalUrl) }, "request failed");
  if (httpError.status === 503) res.set("Retry-After", "5");
  res.status(httpError.status).json({
    error: { code: httpError.code, message: httpError.message, ...(httpError.fields ? { fields: httpError.fields } : {}) },
  });
};

/** 404 for unknown API paths, in the same shape. */
export const apiNotFound: RequestHandler = (_req, _res, next) => {
  next(new HttpError(404, "not_found", "No such API route."));
};
