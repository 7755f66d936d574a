// Offline field view (issue 20), client-safe: the names the service worker, the pages and the
// queue agree on, and the Idempotency-Key format the server checks (lib/offline/data.ts).

/** The Cache Storage cache that holds the signed-in lineworker's pages (My week, briefings). */
export const FIELD_CACHE = "gaffline-field";
/** The app shell precache and other Serwist caches all start with this prefix (cacheId). */
export const CACHE_PREFIX = "gaffline";
/** The message that has the service worker drop the field cache (sign-out). */
export const CLEAR_MESSAGE = "CLEAR_FIELD_CACHE";
/** The IndexedDB database of the phone's queue and its owner. */
export const QUEUE_DB = "gaffline-offline";

/** The request header that carries an action's idempotency key. */
export const IDEMPOTENCY_HEADER = "Idempotency-Key";
/** 16 to 64 characters of letters, digits, "-" and "_" (a UUID fits). */
export const IDEMPOTENCY_KEY_RE = /^[A-Za-z0-9_-]{16,64}$/;

/** The pages a lineworker can open without signal: My week and the briefing of an order. */
export const FIELD_PAGE_RE = /^\/(?:me|orders\/\d{1,10}\/briefing)\/?$/;

export function isFieldPage(pathname: string) {
  return FIELD_PAGE_RE.test(pathname);
}
