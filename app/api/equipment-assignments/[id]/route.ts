import { db } from "@/lib/db";
import { handler, json, readQuery } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { unbookEquipment } from "@/lib/equipment/data";
import { equipmentUnassignSchema } from "@/lib/equipment/model";
import { findingsAfterEquipment } from "@/lib/equipment/board";

type P = { id: string };

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
