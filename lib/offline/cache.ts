// The service worker and the phone's offline data, in the browser only (issue 20). Serwist
// does the caching (app/sw.ts); this file registers the worker, asks it to fetch the pages to
// keep (Serwist's CACHE_URLS message), and keeps the copies to one user: the field cache is
// emptied when another user signs in on the phone, and everything of the user (field cache,
// queue) is deleted on sign-out. The precached app shell holds no one's data and stays.
import { CLEAR_MESSAGE, FIELD_CACHE } from "./model";
import { deleteQueueDatabase, getOwner, setOwner } from "./store";

/** Set by sign-out: a page on its way out must not reopen the field cache. */
let signingOut = false;

const supported = () => typeof navigator !== "undefined" && "serviceWorker" in navigator && typeof caches !== "undefined";

export async function registerWorker(): Promise<ServiceWorkerRegistration | null> {
  if (!supported()) return null;
  try {
    return await navigator.serviceWorker.register("/sw.js", { scope: "/" });
  } catch {
    return null; // no worker in this build (next dev): the pages run online only
  }
}

/** The field cache belongs to one user: another user's copies go before this one's are kept. */
export async function claimFieldCache(userId: number) {
  if (!supported()) return;
  const owner = await getOwner().catch(() => null);
  if (owner !== null && owner !== userId) await caches.delete(FIELD_CACHE);
  if (owner !== userId) await setOwner(userId);
}

/** Has the worker fetch and keep these pages (network-first: a fresh copy each time). */
export async function keepPages(urls: string[], timeoutMs = 15_000): Promise<boolean> {
  if (!supported() || urls.length === 0 || signingOut) return false;
  const reg = await Promise.race([navigator.serviceWorker.ready, new Promise<null>((r) => setTimeout(() => r(null), timeoutMs))]);
  const worker = reg?.active;
  if (!worker) return false;
  return new Promise<boolean>((resolve) => {
    const channel = new MessageChannel();
    const t = setTimeout(() => resolve(false), timeoutMs);
    channel.port1.onmessage = () => {
      clearTimeout(t);
      resolve(true);
    };
    worker.postMessage({ type: "CACHE_URLS", payload: { urlsToCache: urls } }, [channel.port2]);
  });
}

/** Posts a message to the active worker and waits for its answer (false after the timeout). */
async function ask(message: unknown, timeoutMs: number): Promise<boolean> {
  const reg = supported() ? await navigator.serviceWorker.getRegistration("/").catch(() => undefined) : undefined;
  const worker = reg?.active;
  if (!worker) return false;
  return new Promise<boolean>((resolve) => {
    const channel = new MessageChannel();
    const t = setTimeout(() => resolve(false), timeoutMs);
    channel.port1.onmessage = () => {
      clearTimeout(t);
      resolve(true);
    };
    worker.postMessage(message, [channel.port2]);
  });
}

/**
 * Sign-out: the worker drops the field cache and writes back nothing fetched before (see
 * app/sw.ts); then every cache but the app shell's precache, and the queue's database.
 */
export async function clearOfflineData() {
  // From here this page asks the worker to keep nothing more (the worker stays shut too).
  signingOut = true;
  await ask({ type: CLEAR_MESSAGE }, 3000).catch(() => false);
  if (typeof caches !== "undefined") {
    for (const name of await caches.keys()) {
      if (!name.includes("-precache-")) await caches.delete(name);
    }
  }
  if (typeof indexedDB !== "undefined") await deleteQueueDatabase().catch(() => {});
}
