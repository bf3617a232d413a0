import pino from "pino";
import { config } from "../config.js";

/** Structured logs (JSON lines). */
export const logger = pino({
  level: config.NODE_ENV === "test" ? "silent" : config.LOG_LEVEL,
  redact: ["req.headers.cookie", "req.headers['x-csrf-token']", "password", "*.password"],
});
