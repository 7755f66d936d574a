import { db } from "@/lib/db";
import { ApiError, handler, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { boardQuerySchema } from "@/lib/validation/board";
import { pickYard, tomorrowIn } from "@/lib/data/yards";
import { boardFor } from "@/lib/data/board-cache";

export const dynamic = "force-dynamic";

export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, boardQuerySchema);
  const { yard, yards } = await pickYard(db(), user.organisationId, q.yard, user.homeYardId);
  if (!yard || (q.yard && yard.code.toLowerCase() !== q.yard.toLowerCase())) {
    throw new ApiError(404, `No yard with code ${q.yard ?? "(none)"}.`);
  }
  const day = q.date ?? tomorrowIn(yard.timezone);
  const board = await boardFor(db(), { organisationId: user.organisationId, yard, yards, day });
  const headers: Record<string, string> = {
    "content-type": "application/json",
    "cache-control": "private, no-cache",
    etag: board.etag,
    vary: "cookie",
  };
  if (req.headers.get("if-none-match") === board.etag) return new Response(null, { status: 304, headers });
  return new Response(board.json, { status: 200, headers });
});
