/// <reference lib="webworker" />
// The service worker: the app shell from the precache (so the app opens without a signal) and the
// continuity thumbnails the page saved for offline. The API is never answered from here: every
// other request goes to the network as if there were no worker, so online users never see stale data.
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from "workbox-precaching";
import { NavigationRoute, registerRoute } from "workbox-routing";
import { OFFLINE_PHOTO_CACHE_PREFIX, isOfflineThumbnail } from "./lib/offline/photo-cache-names";

declare const self: ServiceWorkerGlobalScope;

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();

// Every page address of the client is the one index.html; /api is left to the network.
registerRoute(new NavigationRoute(createHandlerBoundToURL("/index.html"), { denylist: [/^\/api\//] }));

/** A thumbnail the page saved for offline, in any signed-in account's photo cache on this device. */
async function savedThumbnail(request: Request): Promise<Response | undefined> {
  for (const name of await caches.keys()) {
    if (!name.startsWith(OFFLINE_PHOTO_CACHE_PREFIX)) continue;
    const hit = await (await caches.open(name)).match(request);
    if (hit) return hit;
  }
  return undefined;
}

// Thumbnails: the network first (permissions and deletions apply as usual); the saved copy only
// when the network cannot be reached. Nothing is written to a cache here: the page decides what
// is saved for offline, and signing out deletes it.
registerRoute(
  ({ request, url }) => request.method === "GET" && isOfflineThumbnail(url),
  async ({ request }) => {
    try {
      return await fetch(request);
    } catch (err) {
      const saved = await savedThumbnail(request);
      if (saved) return saved;
      throw err;
    }
  },
);

// A new version waits until the person chooses to reload (nothing half-typed is lost).
self.addEventListener("message", (event) => {
  if ((event.data as { type?: string } | null)?.type === "SKIP_WAITING") void self.skipWaiting();
});
self.addEventListener("activate", (event) => event.waitUntil(self.clients.claim()));
