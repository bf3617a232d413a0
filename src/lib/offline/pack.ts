// Saving the offline pack: the data from the server, then the thumbnails of its continuity photos
// into this account's photo cache (the service worker answers from it without a signal).
import { api } from "@/lib/api-client";
import type { OfflinePackDto } from "@shared/schemas/offline";
import { offlinePhotoCacheName } from "./photo-cache-names";
import { packsOf, putPack } from "./store";

/** Thumbnail addresses a pack shows. */
export function packThumbnails(pack: OfflinePackDto): string[] {
  return [...new Set(pack.continuity.flatMap((e) => e.photos.map((p) => p.urls.thumb)))];
}

/** Keeps exactly the thumbnails of the account's packs in its photo cache (missing ones fetched). */
async function syncThumbnails(userId: string): Promise<void> {
  if (typeof caches === "undefined") return;
  const wanted = new Set((await packsOf(userId)).flatMap(packThumbnails));
  const cache = await caches.open(offlinePhotoCacheName(userId));
  const have = new Set((await cache.keys()).map((r) => new URL(r.url).pathname + new URL(r.url).search));
  for (const url of have) if (!wanted.has(url)) await cache.delete(url);
  for (const url of wanted) {
    if (have.has(url)) continue;
    try {
      const res = await fetch(url, { credentials: "same-origin" });
      if (res.ok) await cache.put(url, res);
    } catch {
      // No signal halfway: the next save fills the gap.
    }
  }
}

/** Fetches and keeps the offline pack of a production for the signed-in account. */
export async function saveOfflinePack(userId: string, productionId: string): Promise<OfflinePackDto> {
  const pack = await api.get<OfflinePackDto>(`/productions/${productionId}/offline-pack`);
  await putPack(userId, productionId, pack);
  await syncThumbnails(userId);
  return pack;
}
