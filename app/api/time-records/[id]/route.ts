import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { handler, json } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { deleteRecord } from "@/lib/time-records/data";

type Params = { id: string };

// DELETE: a manual entry or a call-out entered by mistake. Dispatcher, supervisor, hr.
export const DELETE = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "hr");
  const id = idParam((await ctx.params).id, "time record");
  await yardScope(user, "edit", { timeRecordId: id });
  await db().transaction((trx) => deleteRecord(trx, user, id));
  return json({ deleted: id });
});
