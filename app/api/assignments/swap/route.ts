import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { yardScope } from "@/lib/auth/yard-scope";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { swapAssignmentsSchema } from "@/lib/board/schema";
import { findingsAfter, swapAssignments } from "@/lib/assignments/data";

// POST: dispatcher, supervisor. { a: { id, version }, b: { id, version } }: the two workers
// trade seats in one transaction (the locked write path of a move); 409 when either changed.
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, swapAssignmentsSchema);
  // Both seats' yards: a dispatcher swaps only inside the yards they may change.
  await yardScope(user, "edit", { assignmentId: input.a.id });
  await yardScope(user, "edit", { assignmentId: input.b.id });
  const result = await swapAssignments(db(), user, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck });
});
