// Telling "the database is not reachable" apart from every other error, for a 503 instead of a 500.
import { ConnectionError as SequelizeConnectionError } from "sequelize";
import { config } from "../config.js";

/**
 * SQLSTATE classes and codes meaning the server is going away, starting or unreachable:
 * 08 connection exception, 57P01 admin shutdown, 57P02 crash shutdown, 57P03 cannot connect now,
 * 53300 too many connections (PostgreSQL documentation, Appendix A "Error Codes").
 */
const UNAVAILABLE_SQLSTATES = new Set(["57P01", "57P02", "57P03", "53300"]);
/** Socket errors that count only when they concern the database's own address. */
const SOCKET_CODES = new Set(["ECONNREFUSED", "ECONNRESET", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "ENETUNREACH", "ENOTFOUND", "EAI_AGAIN"]);
/** What node-postgres says when a connection dies or cannot be made. */
const PG_MESSAGES =
  /^(Connection terminated|Client has encountered a connection error|Client was closed and is not queryable|timeout exceeded when trying to connect|Connection terminated due to connection timeout)/;

const dbPort = (() => {
  try {
    return Number(new URL(config.DATABASE_URL).port || 5432);
  } catch {
    return 5432;
  }
})();

/** Whether an error (or what it wraps) means the database is down or unreachable right now. */
export function isDatabaseUnavailable(err: unknown): boolean {
  const seen = new Set<unknown>();
  let e = err as { code?: unknown; port?: unknown; message?: unknown; parent?: unknown; original?: unknown; cause?: unknown } | undefined;
  while (e && typeof e === "object" && !seen.has(e)) {
    seen.add(e);
    if (e instanceof SequelizeConnectionError) return true;
    const code = typeof e.code === "string" ? e.code : "";
    if (UNAVAILABLE_SQLSTATES.has(code) || code.startsWith("08")) return true;
    if (SOCKET_CODES.has(code) && (e.port === undefined || Number(e.port) === dbPort)) return true;
    if (typeof e.message === "string" && PG_MESSAGES.test(e.message)) return true;
    e = (e.parent ?? e.original ?? e.cause) as typeof e;
  }
  return false;
}
