// Who this server process is, so that files it leaves behind when killed can be told apart from
// files another running server is still writing (names carry "<pid>-<instance>").
import os from "node:os";
import { randomUUID } from "node:crypto";

export const instance = {
  id: randomUUID().slice(0, 8),
  pid: process.pid,
  host: os.hostname(),
};

/** Goes into temporary file and folder names this process writes. */
export const instanceTag = `${instance.pid}-${instance.id}`;

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
}

/**
 * Whether the process that wrote something may still be writing it. Ours is; another live process
 * on this host is; a dead one, or an earlier life of our own pid (containers reuse pid 1), is not.
 * Another host's is trusted for `remoteGraceMs` after it started writing.
 */
export function writerMayBeAlive(
  w: { host?: string; pid: number; instance: string; startedAt?: Date },
  remoteGraceMs = 3_600_000,
): boolean {
  if (w.instance === instance.id && w.pid === instance.pid) return true;
  if (w.host && w.host !== instance.host) return !!w.startedAt && Date.now() - w.startedAt.getTime() < remoteGraceMs;
  return w.pid !== instance.pid && processAlive(w.pid);
}

/** Reads "<pid>-<instance>" back from a name; undefined for names without a tag. */
export function parseInstanceTag(name: string): { pid: number; instance: string } | undefined {
  const m = /(?:^|\.)(\d+)-([0-9a-f]{8})(?:\.|$)/.exec(name);
  return m ? { pid: Number(m[1]), instance: m[2]! } : undefined;
}
