import { db } from "@/lib/db";
import { ApiError, handler, json } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { deleteRecord } from "@/lib/data/time-records";

type Params = { id: string };

// DELETE: a manual entry or a call-out entered by mistake. Dispatcher, supervisor, hr.
export const DELETE = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "hr");
  const id = Number((await ctx.params).id);
  if (!Number.isInteger(id) || id <= 0) throw new ApiError(404, "No such time record.");
  await db().transaction((trx) => deleteRecord(trx, user, id));
  return json({ deleted: id });
});
