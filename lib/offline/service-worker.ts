/**
 * Loamwork's service worker (built by app/serwist/[path]/route.ts with Serwist). It keeps the app's own
 * files (precache), the pages a user opened and the API reads behind them (network first: the copy on the
 * device is what was last synced), and the plan photos within PHOTO_BUDGET. Writes are never cached or
 * replayed here: the page's outbox (lib/offline/outbox.ts) owns them, so a write is sent exactly once.
 */
import {
  CacheableResponsePlugin,
  CacheFirst,
  ExpirationPlugin,
  NetworkFirst,
  NetworkOnly,
  Serwist,
  type PrecacheEntry,
  type RuntimeCaching,
} from "serwist";
import { CACHE, NETWORK_TIMEOUT_SECONDS, PHOTO_BUDGET } from "./cache-names";

type WorkerScope = { __SW_MANIFEST: (PrecacheEntry | string)[] | undefined; location: Location };
declare const self: WorkerScope;

const only200 = () => new CacheableResponsePlugin({ statuses: [200] });

/** A page this device has never opened cannot be shown offline: say so plainly (nothing here runs). */
const notOpenedYet = () =>
  new Response(
    `<!doctype html><html lang="en"><meta charset="utf-8"><meta name="viewport" content="width=device-width,initial-scale=1"><title>Not on this device · Loamwork</title>
<body style="font-family:Georgia,serif;background:#f7f2e8;color:#2e2116;padding:2rem;max-width:40rem">
<h1>Not on this device yet</h1><p>This page was not opened on this device while it had a connection, so there is no copy of it here.
Pages you opened before (the site, a trench plan, its context sheets and register) still open, and what you record is kept until it can be sent.</p>
<p><a href="/sites">Your sites</a></p></body></html>`,
    {
      status: 503,
      headers: {
        "content-type": "text/html; charset=utf-8",
        "content-security-policy": "default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'none'",
      },
    },
  );

const sameOrigin = (url: URL) => url.origin === self.location.origin;

const runtimeCaching: RuntimeCaching[] = [
  // Sign-in, sign-out and the session are never answered from a copy.
  { matcher: ({ url }) => sameOrigin(url) && url.pathname.startsWith("/api/auth"), handler: new NetworkOnly() },
  // The device's number blocks: a copy of an older list would make it drop blocks it holds (never cached).
  {
    matcher: ({ url }) => sameOrigin(url) && /^\/api\/sites\/[^/]+\/number-blocks(\/|$)/.test(url.pathname),
    handler: new NetworkOnly(),
  },
  // Plan photos: the image of a photo id never changes; kept within the budget, oldest dropped first.
  {
    matcher: ({ url, request }) =>
      sameOrigin(url) && request.method === "GET" && url.pathname.startsWith("/api/files/"),
    handler: new CacheFirst({
      cacheName: CACHE.photos,
      plugins: [
        only200(),
        new ExpirationPlugin({
          maxEntries: PHOTO_BUDGET.maxEntries,
          maxAgeSeconds: PHOTO_BUDGET.maxAgeDays * 86_400,
          purgeOnQuotaError: true,
        }),
      ],
    }),
  },
  // API reads behind the pages (finds of a plan, relations, photos list): the last answer when offline.
  {
    matcher: ({ url, request }) =>
      sameOrigin(url) &&
      request.method === "GET" &&
      url.pathname.startsWith("/api/") &&
      request.headers.get("accept") !== "text/event-stream",
    handler: new NetworkFirst({
      cacheName: CACHE.data,
      networkTimeoutSeconds: NETWORK_TIMEOUT_SECONDS,
      plugins: [only200()],
    }),
  },
  // Pages opened by the user: the page as last seen, with its own policy and nonce, when offline.
  {
    matcher: ({ request, url }) => sameOrigin(url) && request.mode === "navigate" && !url.pathname.startsWith("/api/"),
    handler: new NetworkFirst({
      cacheName: CACHE.pages,
      networkTimeoutSeconds: NETWORK_TIMEOUT_SECONDS,
      plugins: [only200(), { handlerDidError: async () => notOpenedYet() }],
    }),
  },
  // A client-side move's server payload is not kept: when it fails, the app loads the page itself (above).
];

const serwist = new Serwist({
  precacheEntries: self.__SW_MANIFEST,
  skipWaiting: true,
  clientsClaim: true,
  navigationPreload: false,
  runtimeCaching,
});

serwist.addEventListeners();
