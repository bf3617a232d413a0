// The queue of records captured on this device and not yet stored by the server. Oldest first;
// each item keeps its client id, so sending it twice stores it once.
import { offlineDb, type QueuedItem } from "./db";

type Listener = () => void;
const listeners = new Set<Listener>();
const CHANNEL = "seamscene-offline-queue";
let channel: BroadcastChannel | null = null;

function broadcast(): BroadcastChannel | null {
  if (typeof BroadcastChannel === "undefined") return null;
  if (!channel) {
    channel = new BroadcastChannel(CHANNEL);
    // Another tab changed the queue: refresh this one's view of it.
    channel.onmessage = () => listeners.forEach((l) => l());
  }
  return channel;
}

/** Calls `fn` whenever the queue changes (in this tab or another). Returns the unsubscribe. */
export function onQueueChange(fn: Listener): () => void {
  listeners.add(fn);
  broadcast();
  return () => listeners.delete(fn);
}

function changed(): void {
  listeners.forEach((l) => l());
  broadcast()?.postMessage("changed");
}

/** What a caller gives to queue a record; the queue adds order and retry bookkeeping. */
export type NewQueuedItem = Omit<QueuedItem, "seq" | "attempts" | "nextAttemptAt" | "lastError" | "state">;

/** Puts a record at the end of the queue (a second call with the same client id changes nothing). */
export async function enqueue(item: NewQueuedItem): Promise<QueuedItem> {
  const db = await offlineDb();
  const tx = db.transaction("queue", "readwrite");
  const existing = await tx.store.index("byClientId").get(item.clientId);
  if (existing) {
    await tx.done;
    return existing;
  }
  const full: QueuedItem = { ...item, attempts: 0, nextAttemptAt: 0, lastError: null, state: "waiting" };
  const seq = await tx.store.add(full);
  await tx.done;
  changed();
  return { ...full, seq };
}

/** One account's queued records, oldest first. */
export async function listQueue(userId: string): Promise<QueuedItem[]> {
  const db = await offlineDb();
  const items = await db.getAllFromIndex("queue", "byUser", userId);
  return items.sort((a, b) => (a.seq ?? 0) - (b.seq ?? 0));
}

/** One record by client id. */
export async function getQueued(clientId: string): Promise<QueuedItem | undefined> {
  return (await offlineDb()).getFromIndex("queue", "byClientId", clientId);
}

/** Writes back a record's retry bookkeeping (unless it was sent or cancelled meanwhile). */
export async function updateQueued(item: QueuedItem): Promise<void> {
  const db = await offlineDb();
  const tx = db.transaction("queue", "readwrite");
  const current = await tx.store.index("byClientId").get(item.clientId);
  if (current) await tx.store.put({ ...item, seq: current.seq });
  await tx.done;
  if (current) changed();
}

/** Removes a record: sent and stored by the server, or cancelled by the person. */
export async function removeQueued(clientId: string): Promise<boolean> {
  const db = await offlineDb();
  const tx = db.transaction("queue", "readwrite");
  const key = await tx.store.index("byClientId").getKey(clientId);
  if (key !== undefined) await tx.store.delete(key);
  await tx.done;
  if (key !== undefined) changed();
  return key !== undefined;
}

/** Puts a held record back in line, to be sent again now. */
export async function retryQueued(clientId: string): Promise<void> {
  const item = await getQueued(clientId);
  if (item) await updateQueued({ ...item, state: "waiting", nextAttemptAt: 0 });
}

/** Deletes every queued record of an account (signing out). */
export async function clearQueue(userId: string): Promise<number> {
  const db = await offlineDb();
  const tx = db.transaction("queue", "readwrite");
  const keys = await tx.store.index("byUser").getAllKeys(userId);
  for (const k of keys) await tx.store.delete(k);
  await tx.done;
  if (keys.length) changed();
  return keys.length;
}
