import { readFile } from "node:fs/promises";
import path from "node:path";

// GET /sw.js: the service worker scripts/build-sw.ts built into this build's directory
// (<distDir>/sw/sw.js). Public: a signed-out phone still has to be able to update or remove it.
// No cache, so a new build's worker is picked up on the next visit. 404 when no worker was
// built (next dev, or a build without the step): the pages then simply run online.
export const dynamic = "force-dynamic";

export async function GET() {
  const file = path.join(process.cwd(), process.env.NEXT_DIST_DIR || ".next", "sw", "sw.js");
  let body: Buffer;
  try {
    body = await readFile(file);
  } catch {
    return new Response("No service worker in this build.", { status: 404, headers: { "content-type": "text/plain; charset=utf-8" } });
  }
  return new Response(new Uint8Array(body), {
    headers: {
      "content-type": "application/javascript; charset=utf-8",
      "cache-control": "no-cache, no-store, must-revalidate",
      "service-worker-allowed": "/",
    },
  });
}
