import { db } from "@/lib/db";
import { handler, json, readQuery } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { moveEquipment, unbookEquipment } from "@/lib/equipment/data";
import { equipmentMoveSchema, equipmentUnassignSchema } from "@/lib/equipment/model";
import { readJson } from "@/lib/api/http";
import { findingsAfterEquipment } from "@/lib/assignments/data-equipment-findings";

type P = { id: string };

// PATCH { workOrderId, version }: move the booked truck to another order (one transaction).
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "equipment booking");
  const input = await readJson(req, equipmentMoveSchema);
  await yardScope(user, "edit", { equipmentAssignmentId: id, orderId: input.workOrderId });
  const result = await moveEquipment(db(), user, id, input);
  const recheck = await findingsAfterEquipment(db(), user.organisationId, result.orderIds, result.equipmentIds);
  return json({ ...result, recheck });
});

// DELETE ?version=N: take the truck off its order.
export const DELETE = handler<P>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "equipment booking");
  await yardScope(user, "edit", { equipmentAssignmentId: id });
  const input = readQuery(req, equipmentUnassignSchema);
  const result = await unbookEquipment(db(), user, id, input);
  const recheck = await findingsAfterEquipment(db(), user.organisationId, result.orderIds, result.equipmentIds);
  return json({ ...result, recheck });
});
