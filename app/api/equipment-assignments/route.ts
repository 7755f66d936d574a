import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { bookEquipment } from "@/lib/equipment/data";
import { equipmentAssignSchema } from "@/lib/equipment/model";
import { findingsAfterEquipment } from "@/lib/assignments/data-equipment-findings";

// POST: put a truck on a work order (the board's drop). 409 when it is on an overlapping
// order, 422 when it is out of service.
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, equipmentAssignSchema);
  await yardScope(user, "edit", { orderId: input.workOrderId });
  const result = await bookEquipment(db(), user, input);
  const recheck = await findingsAfterEquipment(db(), user.organisationId, result.orderIds, result.equipmentIds);
  return json({ ...result, recheck }, 201);
});
