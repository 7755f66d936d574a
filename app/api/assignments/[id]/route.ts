import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { moveAssignmentSchema, removeAssignmentSchema } from "@/lib/board/schema";
import { findingsAfter, moveAssignment, removeAssignment } from "@/lib/assignments/data";

export const PATCH = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "assignment");
  const input = await readJson(req, moveAssignmentSchema);
  await yardScope(user, "edit", { assignmentId: id, positionId: input.positionId });
  const result = await moveAssignment(db(), user, id, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck });
});

export const DELETE = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "assignment");
  const fromQuery = new URL(req.url).searchParams.get("version");
  const input = fromQuery !== null ? removeAssignmentSchema.parse({ version: fromQuery }) : await readJson(req, removeAssignmentSchema);
  await yardScope(user, "edit", { assignmentId: id });
  const result = await removeAssignment(db(), user, id, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck });
});
