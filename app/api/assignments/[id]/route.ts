import { z } from "zod";
import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { moveAssignmentSchema, removeAssignmentSchema } from "@/lib/validation/board";
import { findingsAfter, moveAssignment, removeAssignment } from "@/lib/data/assignments";

const idParam = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) });

export const PATCH = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const { id } = idParam.parse(await ctx.params);
  const input = await readJson(req, moveAssignmentSchema);
  const result = await moveAssignment(db(), user, id, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck });
});

export const DELETE = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const { id } = idParam.parse(await ctx.params);
  const fromQuery = new URL(req.url).searchParams.get("version");
  const input = fromQuery !== null ? removeAssignmentSchema.parse({ version: fromQuery }) : await readJson(req, removeAssignmentSchema);
  const result = await removeAssignment(db(), user, id, input);
  const recheck = await findingsAfter(db(), user.organisationId, result.orderIds, result.workerIds);
  return json({ ...result, recheck });
});
