import { db } from "@/lib/db";
import { ApiError, handler, json, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_OVERRIDE } from "@/lib/users/roles";
import { queueQuerySchema } from "@/lib/queue/model";
import { queueYards, supervisorQueue } from "@/lib/queue/data";
import { yardNameByCode } from "@/lib/yards/data";

export const dynamic = "force-dynamic";

// Issue 18, point 13: the supervisor's queue — blocks waiting on a supervisor and lapsed
// overrides, in the supervisor's yards (all when none are assigned), plus their own notices.
export const GET = handler(async (req) => {
  const user = await requireRole(...CAN_OVERRIDE);
  const q = readQuery(req, queueQuerySchema);
  if (q.yard) {
    const mine = await queueYards(db(), user);
    if (!mine.some((y) => y.code.toLowerCase() === q.yard!.toLowerCase())) {
      const any = await yardNameByCode(db(), user.organisationId, q.yard);
      if (!any) throw new ApiError(404, `No yard with code ${q.yard}.`);
      throw new ApiError(403, `${any.name} is not one of your yards.`, { reason: "yard_scope" });
    }
  }
  return json(await supervisorQueue(db(), user, { yardCode: q.yard ?? null }));
});
