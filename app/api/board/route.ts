import { db } from "@/lib/db";
import { ApiError, handler, json, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { boardQuerySchema } from "@/lib/validation/board";
import { pickYard, tomorrowIn } from "@/lib/data/yards";
import { loadBoard } from "@/lib/data/board";
import { markOnCall, prepareBoardDay } from "@/lib/board/extras";

export const dynamic = "force-dynamic";

export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, boardQuerySchema);
  const { yard, yards } = await pickYard(db(), user.organisationId, q.yard, user.homeYardId);
  if (!yard || (q.yard && yard.code.toLowerCase() !== q.yard.toLowerCase())) {
    throw new ApiError(404, `No yard with code ${q.yard ?? "(none)"}.`);
  }
  const day = q.date ?? tomorrowIn(yard.timezone);
  await prepareBoardDay(db(), user.organisationId, yard.id, day);
  const payload = await loadBoard(db(), { organisationId: user.organisationId, yard, yards, day });
  await markOnCall(db(), payload);
  return json(payload);
});
