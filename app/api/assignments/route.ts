import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { createAssignmentSchema } from "@/lib/board/schema";
import { createAssignment, findingsAfter } from "@/lib/assignments/data";

export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, createAssignmentSchema);
  await yardScope(user, "edit", { positionId: input.positionId });
  const result = await createAssignment(db(), user, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck }, 201);
});
