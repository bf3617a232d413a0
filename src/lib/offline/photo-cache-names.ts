// Shared by the page and the service worker: where saved thumbnails live and which requests they answer.

/** Cache Storage names of saved thumbnails start with this, then the account's user id. */
export const OFFLINE_PHOTO_CACHE_PREFIX = "seamscene-offline-photos-";

/** The cache holding one account's saved thumbnails (deleted when that account signs out). */
export function offlinePhotoCacheName(userId: string): string {
  return `${OFFLINE_PHOTO_CACHE_PREFIX}${userId}`;
}

const THUMB_PATH = /^\/api\/productions\/[0-9a-f-]{36}\/photos\/[0-9a-f-]{36}\/file$/i;

/** True for the thumbnail address of a stored photo (`…/photos/:id/file?size=thumb`). */
export function isOfflineThumbnail(url: URL): boolean {
  return THUMB_PATH.test(url.pathname) && url.searchParams.get("size") === "thumb";
}
