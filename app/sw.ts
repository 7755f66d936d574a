/// <reference lib="webworker" />
// Gaffline's service worker (issue 20), bundled by scripts/build-sw.ts after `next build` with
// esbuild and Serwist's injectManifest (Turbopack does not run @serwist/next's webpack plugin).
// All caching is Serwist's: the app shell (Next's hashed static files, the manifest, the icons
// and the /offline page) is precached; the lineworker's field pages (My week and the briefing
// of an order) are network-first, so each visit with signal refreshes the copy, and a phone
// without signal gets the last one. Nothing else is cached: API answers, other pages and every
// write go to the network. The pages warm this cache with Serwist's CACHE_URLS message; who owns
// it, and clearing it on sign-out or another sign-in, is in lib/offline/cache.ts.
import { CacheableResponsePlugin, ExpirationPlugin, NetworkFirst, NetworkOnly, Serwist, type PrecacheEntry, type SerwistGlobalConfig, type SerwistPlugin } from "serwist";
import { CACHE_PREFIX, CLEAR_MESSAGE, FIELD_CACHE, isFieldPage } from "../lib/offline/model";

declare global {
  interface WorkerGlobalScope extends SerwistGlobalConfig {
    __SW_MANIFEST: (PrecacheEntry | string)[] | undefined;
  }
}
declare const self: ServiceWorkerGlobalScope;

// Sign-out (lib/offline/cache.ts) sends CLEAR_FIELD_CACHE: the field cache is deleted, and a
// page fetched before that moment but answered after it is not written back (the generation
// it started in is over), so nothing of the signed-out user comes back.
// After a sign-out the cache also stays shut (nothing is written, even for a fetch that began
// after the clear while the old session cookie still answered) until a signed-in page asks the
// worker to keep its pages again (CACHE_URLS, sent by My week and the briefing after they
// claimed the cache for their user).
let generation = 0;
let shut = false;
const sameGeneration: SerwistPlugin = {
  requestWillFetch: async ({ request, state }) => {
    if (state) state.generation = generation;
    return request;
  },
  cacheWillUpdate: async ({ response, state }) => (shut || (state && state.generation !== generation) ? null : response),
};

const fieldPages = new NetworkFirst({
  cacheName: FIELD_CACHE,
  networkTimeoutSeconds: 8,
  plugins: [
    // Only a page the server answered for this sign-in: never a redirect (to /login or
    // /forbidden), an error page or an opaque answer.
    new CacheableResponsePlugin({ statuses: [200] }),
    { cacheWillUpdate: async ({ response }) => (response.redirected ? null : response) },
    sameGeneration,
    new ExpirationPlugin({ maxEntries: 40, maxAgeSeconds: 9 * 24 * 3600 }),
  ],
});

const serwist = new Serwist({
  cacheId: CACHE_PREFIX,
  precacheEntries: self.__SW_MANIFEST,
  skipWaiting: true,
  clientsClaim: true,
  navigationPreload: false,
  runtimeCaching: [
    {
      // The document of a field page (a navigation, or a CACHE_URLS warm-up), never the
      // router's RSC fetches (they vary by header).
      matcher: ({ request, url, sameOrigin }) =>
        sameOrigin && request.method === "GET" && isFieldPage(url.pathname) && !url.searchParams.has("_rsc") && request.headers.get("RSC") === null,
      handler: fieldPages,
    },
    {
      // Every other page goes to the network as without a worker; this route is here so that a
      // page the phone has no copy of, opened without signal, gets the offline page.
      matcher: ({ request, sameOrigin }) => sameOrigin && request.mode === "navigate",
      handler: new NetworkOnly(),
    },
  ],
  fallbacks: {
    entries: [{ url: "/offline", matcher: ({ request }) => request.destination === "document" }],
  },
});

self.addEventListener("message", (event) => {
  // Registered before Serwist's own listener, so the cache opens before its CACHE_URLS fetches start.
  if (event.data?.type === "CACHE_URLS") shut = false;
  if (event.data?.type !== CLEAR_MESSAGE) return;
  generation += 1;
  shut = true;
  event.waitUntil(caches.delete(FIELD_CACHE).then(() => event.ports[0]?.postMessage(true)));
});

serwist.addEventListeners();
