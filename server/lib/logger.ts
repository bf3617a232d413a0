import pino from "pino";
import pretty from "pino-pretty";
import { config, type Config } from "../config.js";

/** One readable line per entry for people at a terminal (development); JSON lines for log collectors. */
export function logFormat(c: Pick<Config, "NODE_ENV">): "pretty" | "json" {
  return c.NODE_ENV === "development" ? "pretty" : "json";
}

interface LogSink {
  write(line: string): void;
}

function defaultSink(): LogSink {
  if (logFormat(config) === "pretty") {
    // A request line's message already says method, path, status and time; the fields stay in JSON only.
    return pretty({
      destination: 1,
      sync: true,
      colorize: process.stdout.isTTY,
      singleLine: true,
      translateTime: "SYS:HH:MM:ss",
      ignore: "pid,hostname,method,path,status,ms",
    });
  }
  return pino.destination({ dest: 1, sync: true });
}

let sink: LogSink = defaultSink();

/**
 * Structured logs for operators. Never cookies, tokens, passwords or personal data: request lines carry
 * only method, redacted path, status and time (server/middleware/request-log.ts), and the paths below
 * are censored should anything pass a whole request or headers anyway.
 */
export const logger = pino(
  {
    level: config.NODE_ENV === "test" ? "silent" : config.LOG_LEVEL,
    // Errors keep what an operator needs; database errors' SQL and bound values (addresses, token
    // hashes) stay out.
    serializers: {
      err: (e: unknown) => {
        const x = e as { name?: string; message?: string; code?: unknown; stack?: string; parent?: { code?: unknown } } | null;
        return x && typeof x === "object" ? { type: x.name, message: x.message, code: x.code ?? x.parent?.code, stack: x.stack } : e;
      },
    },
    redact: {
      paths: [
        "req.headers.cookie",
        "req.headers.authorization",
        "req.headers['x-csrf-token']",
        "res.headers['set-cookie']",
        "headers.cookie",
        "headers['set-cookie']",
        "password",
        "*.password",
        "token",
        "*.token",
      ],
      censor: "[redacted]",
    },
  },
  { write: (line: string) => sink.write(line) },
);

/** Sends log lines to `to` (tests capture them) until the returned function restores the previous sink. */
export function redirectLogs(to: LogSink): () => void {
  const previous = sink;
  sink = to;
  return () => {
    sink = previous;
  };
}
