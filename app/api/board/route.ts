import { db } from "@/lib/db";
import { ApiError, handler, readQuery } from "@/lib/api/http";
import { createHash } from "node:crypto";
import { contactYards, requireRole, type SessionUser } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { boardQuerySchema } from "@/lib/validation/board";
import { pickYard, tomorrowIn } from "@/lib/data/yards";
import { boardFor } from "@/lib/data/board-cache";

export const dynamic = "force-dynamic";

async function withoutForeignContacts(user: SessionUser, board: { json: string; etag: string }) {
  const yards = await contactYards(user);
  if (yards === "all") return board;
  const data = JSON.parse(board.json) as { pool?: { yardId: number; phone: string | null }[] };
  for (const p of data.pool ?? []) if (!yards.includes(Number(p.yardId))) p.phone = null;
  const etag = `"${createHash("sha1").update(`${board.etag}|${yards.join(",")}`).digest("base64url")}"`;
  return { json: JSON.stringify(data), etag };
}

export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, boardQuerySchema);
  const { yard, yards } = await pickYard(db(), user.organisationId, q.yard, user.homeYardId);
  if (!yard || (q.yard && yard.code.toLowerCase() !== q.yard.toLowerCase())) {
    throw new ApiError(404, `No yard with code ${q.yard ?? "(none)"}.`);
  }
  const day = q.date ?? tomorrowIn(yard.timezone);
  const built = await boardFor(db(), { organisationId: user.organisationId, yard, yards, day });
  // Any yard's board may be read (to borrow a crew), but phone numbers only of workers of the
  // reader's own yards (issue 15, finding 9): the shared, cached board is narrowed per reader.
  const board = await withoutForeignContacts(user, built);
  const headers: Record<string, string> = {
    "content-type": "application/json",
    "cache-control": "private, no-cache",
    etag: board.etag,
    vary: "cookie",
  };
  if (req.headers.get("if-none-match") === board.etag) return new Response(null, { status: 304, headers });
  return new Response(board.json, { status: 200, headers });
});
