import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { ALL_SIGNED_IN, CAN_EDIT_EQUIPMENT } from "@/lib/equipment/roles";
import { getEquipment, updateEquipment } from "@/lib/equipment/data";
import { equipmentPatchSchema } from "@/lib/equipment/model";

type P = { id: string };

export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole(...ALL_SIGNED_IN);
  const id = idParam((await ctx.params).id, "equipment");
  return json({ equipment: await getEquipment(db(), user.organisationId, id) });
});

// PATCH: any field, with the version read (409 when stale); out of service needs a reason.
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole(...CAN_EDIT_EQUIPMENT);
  const id = idParam((await ctx.params).id, "equipment");
  const patch = await readJson(req, equipmentPatchSchema);
  await yardScope(user, "edit", { equipmentId: id, yardId: (patch as { yardId?: number }).yardId });
  return json({ equipment: await updateEquipment(db(), user, id, patch) });
});
