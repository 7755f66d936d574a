import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_EDIT_EQUIPMENT } from "@/lib/equipment/roles";
import { removeRigging } from "@/lib/equipment/data";

type P = { id: string; itemId: string };

export const DELETE = handler<P>(async (_req, ctx) => {
  const user = await requireRole(...CAN_EDIT_EQUIPMENT);
  const params = await ctx.params;
  const id = idParam(params.id, "equipment");
  const itemId = idParam(params.itemId, "rigging item");
  await yardScope(user, "edit", { equipmentId: id });
  await removeRigging(db(), user, id, itemId);
  return json({ deleted: itemId });
});
