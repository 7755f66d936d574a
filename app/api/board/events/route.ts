import { db } from "@/lib/db";
import { ApiError, handler, json, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { eventsQuerySchema } from "@/lib/board/schema";
import { eventsSince } from "@/lib/events/data";
import { pickYard } from "@/lib/yards/data";

export const dynamic = "force-dynamic";

// Boards poll this with the last cursor they saw; any instance answers from the shared table.
export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH, "admin");
  const q = readQuery(req, eventsQuerySchema);
  const { yard } = await pickYard(db(), user.organisationId, q.yard);
  if (!yard || yard.code.toLowerCase() !== q.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${q.yard}.`);
  return json(await eventsSince(db(), user.organisationId, q.after, yard.id, q.date));
});
