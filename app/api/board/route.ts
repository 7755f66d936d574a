import { gzipSync } from "node:zlib";
import { z } from "zod";
import { db } from "@/lib/db";
import { ApiError, handler, readQuery } from "@/lib/api/http";
import { contactYards, requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { boardQuerySchema } from "@/lib/board/schema";
import { pickYard } from "@/lib/yards/data";
import { tomorrowIn } from "@/lib/time/days";
import { boardAnswer } from "@/lib/board/data-serve";

export const dynamic = "force-dynamic";

// Issue 19: `since` (the version the browser holds, from the x-board-version header of an
// earlier answer) with its `cursor` asks for a patch (lib/board/patch.ts) instead of the board.
const querySchema = boardQuerySchema
  .extend({
    since: z.string().trim().regex(/^[A-Za-z0-9_-]{1,64}$/, "since must be a board version from x-board-version").optional(),
    cursor: z.coerce.number({ error: "cursor must be a number" }).int().min(0).optional(),
  })
  .refine((q) => (q.since === undefined) === (q.cursor === undefined), { path: ["cursor"], message: "since and cursor go together" });

/**
 * The client asks for pre-compressed answers with `x-board-gzip: 1` (and accepts gzip): then
 * next.config.mjs marks the response as gzip-encoded for this path, so every answer of this
 * route, errors included, must be gzip bytes. Without the header Next compresses as usual.
 */
const wantsGzip = (req: Request) => req.headers.get("x-board-gzip") === "1" && /gzip/i.test(req.headers.get("accept-encoding") ?? "");

const answer = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, querySchema);
  const { yard, yards } = await pickYard(db(), user.organisationId, q.yard, user.homeYardId);
  if (!yard || (q.yard && yard.code.toLowerCase() !== q.yard.toLowerCase())) {
    throw new ApiError(404, `No yard with code ${q.yard ?? "(none)"}.`);
  }
  const day = q.date ?? tomorrowIn(yard.timezone);
  // Any yard's board may be read (to borrow a crew), but phone numbers only of workers of the
  // reader's own yards (issue 15, finding 9): each reader group gets its own narrowed version,
  // serialised and compressed once per change (lib/board/data-serve.ts).
  const readers = await contactYards(user);
  const since = q.since !== undefined && q.cursor !== undefined ? { version: q.since, cursor: q.cursor } : undefined;
  const answer = await boardAnswer(db(), { organisationId: user.organisationId, yard, yards, day }, readers, since);
  const etag = `"${answer.kind === "patch" ? `${q.since}>` : ""}${answer.version}"`;
  const headers: Record<string, string> = {
    "content-type": "application/json",
    "cache-control": "private, no-cache",
    etag,
    vary: "cookie, accept-encoding, x-board-gzip",
    "x-board-version": answer.version,
    "x-board-answer": answer.kind === "patch" ? "patch" : `full; ${answer.reason}`,
  };
  if (req.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  if (wantsGzip(req)) return new Response(new Uint8Array(answer.body.gzip()), { status: 200, headers: { ...headers, "x-board-encoded": "gzip" } });
  return new Response(answer.body.json, { status: 200, headers });
});

export async function GET(req: Request, ctx: { params: Promise<Record<string, string>> }) {
  const res = await answer(req, ctx);
  if (!wantsGzip(req) || res.headers.get("x-board-encoded") || res.status === 304) return res;
  // An error answer (401, 404, 422…) for a client that asked for gzip: compressed here.
  const headers = new Headers(res.headers);
  headers.delete("content-length");
  return new Response(new Uint8Array(gzipSync(Buffer.from(await res.arrayBuffer()))), { status: res.status, headers });
}
