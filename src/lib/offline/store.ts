// Reading and writing the offline packs and the remembered account (no network here).
import type { MeDto } from "@shared/schemas/auth";
import type { OfflinePackDto } from "@shared/schemas/offline";
import { offlineDb, packKey, type SavedAccount } from "./db";
import { offlinePhotoCacheName } from "./photo-cache-names";
import { clearQueue } from "./queue";

type Listener = () => void;
const packListeners = new Set<Listener>();

/** Calls `fn` when a pack is saved or deleted. */
export function onPackChange(fn: Listener): () => void {
  packListeners.add(fn);
  return () => packListeners.delete(fn);
}

/** Stores a pack for an account and production (replacing the older one). */
export async function putPack(userId: string, productionId: string, pack: OfflinePackDto): Promise<void> {
  await (await offlineDb()).put("packs", { key: packKey(userId, productionId), userId, productionId, pack });
  packListeners.forEach((l) => l());
}

/** The pack this device keeps for an account and production, if any. */
export async function getPack(userId: string, productionId: string): Promise<OfflinePackDto | undefined> {
  return (await (await offlineDb()).get("packs", packKey(userId, productionId)))?.pack;
}

/** Every pack of an account. */
export async function packsOf(userId: string): Promise<OfflinePackDto[]> {
  return (await (await offlineDb()).getAllFromIndex("packs", "byUser", userId)).map((p) => p.pack);
}

/** Remembers the signed-in account (so the app opens without a signal). */
export async function rememberAccount(me: MeDto, seenAt: number = Date.now()): Promise<void> {
  await (await offlineDb()).put("accounts", { userId: me.id, me, seenAt });
}

/** The account most recently signed in on this device. */
export async function lastAccount(): Promise<SavedAccount | undefined> {
  const all = await (await offlineDb()).getAll("accounts");
  return all.sort((a, b) => b.seenAt - a.seenAt)[0];
}

/**
 * Deletes everything this device keeps for an account: its queue, packs, the remembered account and
 * its saved thumbnails.
 * @returns how many queued records were deleted
 */
export async function forgetAccount(userId: string): Promise<number> {
  const dropped = await clearQueue(userId);
  const db = await offlineDb();
  const tx = db.transaction(["packs", "accounts"], "readwrite");
  for (const k of await tx.objectStore("packs").index("byUser").getAllKeys(userId)) await tx.objectStore("packs").delete(k);
  await tx.objectStore("accounts").delete(userId);
  await tx.done;
  if (typeof caches !== "undefined") await caches.delete(offlinePhotoCacheName(userId));
  packListeners.forEach((l) => l());
  return dropped;
}
