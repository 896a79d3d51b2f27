/**
 * The service worker's caches, named once for the worker and the page (sign-out empties them, the storage
 * panel sizes them). Pages and data hold what one user opened, so they go when that user signs out; the
 * app's own files (precache) are the same for everyone and stay.
 */
export const CACHE = {
  pages: "loamwork-pages",
  data: "loamwork-data",
  photos: "loamwork-photos",
} as const;

/** Caches that hold a user's records: emptied on sign-out. */
export const userCaches = [CACHE.pages, CACHE.data, CACHE.photos] as const;

/** The photo underlay's budget on a device: at most this many photo images, each kept at most this long. */
export const PHOTO_BUDGET = { maxEntries: 24, maxAgeDays: 30 } as const;

/** How long a page or API read waits for the network before the copy on the device is shown. */
export const NETWORK_TIMEOUT_SECONDS = 4;

/** The service worker's address (app/serwist/[path]/route.ts builds it) and the scope it controls. */
export const SERVICE_WORKER_URL = "/serwist/sw.js";
