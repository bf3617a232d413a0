// The device's offline store (IndexedDB through idb): the queue of entries and check-ins waiting to
// be sent, the offline pack of each account and production, and the account last signed in.
// Everything here belongs to one account (userId) and is deleted when that account signs out.
import { openDB, type DBSchema, type IDBPDatabase } from "idb";
import type { MeDto } from "@shared/schemas/auth";
import type { OfflinePackDto } from "@shared/schemas/offline";
import type { PhotoView } from "@shared/schemas/photos";

/** A photo reduced on the device, kept as bytes (Blobs do not survive every IndexedDB). */
export interface QueuedPhoto {
  bytes: ArrayBuffer;
  type: string;
  name: string;
  view: PhotoView;
  width: number;
  height: number;
}

/** What the queue sends: a continuity entry, or a check in / out by tag code. */
export type QueuedKind = "continuity" | "garment-scan";

export interface QueuedItem {
  /** Capture order on this device (oldest is sent first). */
  seq?: number;
  /** The id the server stores the record under once, however often it arrives. */
  clientId: string;
  userId: string;
  productionId: string;
  kind: QueuedKind;
  /** One line for the list: "Scene 12 · Maud Penhallow · 2 photos". */
  summary: string;
  /** When it was captured on this device (display only). */
  queuedAt: string;
  /** The request's fields. */
  payload: Record<string, unknown>;
  photos: QueuedPhoto[];
  /** Failed sends so far. */
  attempts: number;
  /** Not before this time (ms since epoch) — the backoff after a failed send. */
  nextAttemptAt: number;
  lastError: string | null;
  /** waiting: will be sent; held: the server refused it and a person must look (or cancel). */
  state: "waiting" | "held";
}

export interface SavedPack {
  key: string;
  userId: string;
  productionId: string;
  pack: OfflinePackDto;
}

export interface SavedAccount {
  userId: string;
  me: MeDto;
  /** When this device last saw the account signed in (ms since epoch). */
  seenAt: number;
}

interface OfflineSchema extends DBSchema {
  queue: { key: number; value: QueuedItem; indexes: { byClientId: string; byUser: string } };
  packs: { key: string; value: SavedPack; indexes: { byUser: string } };
  accounts: { key: string; value: SavedAccount };
}

export const OFFLINE_DB_NAME = "seamscene-offline";
let dbPromise: Promise<IDBPDatabase<OfflineSchema>> | null = null;

/** The open database (opened on first use). */
export function offlineDb(): Promise<IDBPDatabase<OfflineSchema>> {
  dbPromise ??= openDB<OfflineSchema>(OFFLINE_DB_NAME, 1, {
    upgrade(db) {
      const queue = db.createObjectStore("queue", { keyPath: "seq", autoIncrement: true });
      queue.createIndex("byClientId", "clientId", { unique: true });
      queue.createIndex("byUser", "userId");
      const packs = db.createObjectStore("packs", { keyPath: "key" });
      packs.createIndex("byUser", "userId");
      db.createObjectStore("accounts", { keyPath: "userId" });
    },
    // Another tab opened a newer version: let it upgrade.
    blocking() {
      void dbPromise?.then((d) => d.close());
      dbPromise = null;
    },
  });
  return dbPromise;
}

/** Closes the connection (tests delete the database between cases). */
export async function closeOfflineDb(): Promise<void> {
  const p = dbPromise;
  dbPromise = null;
  if (p) (await p).close();
}

/** The key of one account's pack for one production. */
export const packKey = (userId: string, productionId: string) => `${userId}:${productionId}`;
