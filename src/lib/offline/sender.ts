// Sends an account's queued records, oldest first. A record the server could not be reached for
// waits (with backoff) and keeps the ones behind it waiting, so they arrive in the order captured;
// a record the server refused is held for the person to look at and the rest go on.
import { ApiError } from "@/lib/api-client";
import { retryDelayMs } from "./backoff";
import type { QueuedItem } from "./db";
import { listQueue, removeQueued, updateQueued } from "./queue";

/** Sends one record; resolves with the server's answer, throws ApiError or a network TypeError. */
export type Transport = (item: QueuedItem) => Promise<unknown>;

export interface SentRecord {
  clientId: string;
  productionId: string;
  kind: QueuedItem["kind"];
  /** The stored record as the server answered (the same for a repeat). */
  data: unknown;
}

export interface SendReport {
  sent: SentRecord[];
  /** Client ids the server refused this round (now held). */
  held: string[];
  /** The session ended: nothing more is sent until the person signs in again. */
  signInNeeded: boolean;
  /** When the first record still waiting may be tried again (null: nothing waits on a timer). */
  nextAttemptAt: number | null;
}

/** What to do after a failed send. */
export function classifyFailure(err: unknown): "retry" | "held" | "signin" {
  if (err instanceof ApiError) {
    if (err.status === 401) return "signin";
    // No answer, a timeout, too many requests or a server fault: the same request may work later.
    if (err.status === 0 || err.status === 408 || err.status === 429 || err.status >= 500) return "retry";
    return "held";
  }
  // fetch() rejects with a TypeError when the network cannot be reached.
  return "retry";
}

function messageOf(err: unknown): string {
  if (err instanceof ApiError) return err.message;
  if (err instanceof Error) return `No connection (${err.message}).`;
  return String(err);
}

export interface SendOptions {
  /** Before this user's records nobody else's are touched. */
  userId: string;
  transport: Transport;
  now?: () => number;
  random?: () => number;
  /** Ignore the backoff wait (the connection just came back, or the person pressed Send now). */
  force?: boolean;
  /** Told which record is on its way (null when done). */
  onSending?: (clientId: string | null) => void;
}

/** One pass over the queue: sends what may be sent now, records failures, reports what happened. */
export async function sendWaiting(o: SendOptions): Promise<SendReport> {
  const now = o.now ?? Date.now;
  const report: SendReport = { sent: [], held: [], signInNeeded: false, nextAttemptAt: null };
  const items = await listQueue(o.userId);
  try {
    for (const item of items) {
      if (item.state === "held") continue;
      if (!o.force && item.nextAttemptAt > now()) {
        report.nextAttemptAt = item.nextAttemptAt;
        break;
      }
      o.onSending?.(item.clientId);
      try {
        const data = await o.transport(item);
        await removeQueued(item.clientId);
        report.sent.push({ clientId: item.clientId, productionId: item.productionId, kind: item.kind, data });
      } catch (err) {
        const what = classifyFailure(err);
        if (what === "signin") {
          await updateQueued({ ...item, lastError: "Sign in again to send this." });
          report.signInNeeded = true;
          break;
        }
        if (what === "held") {
          await updateQueued({ ...item, state: "held", lastError: messageOf(err) });
          report.held.push(item.clientId);
          continue;
        }
        const attempts = item.attempts + 1;
        const next = now() + retryDelayMs(attempts, o.random);
        await updateQueued({ ...item, attempts, nextAttemptAt: next, lastError: messageOf(err) });
        report.nextAttemptAt = next;
        break;
      }
    }
  } finally {
    o.onSending?.(null);
  }
  return report;
}
