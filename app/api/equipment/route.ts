import { db } from "@/lib/db";
import { handler, json, readJson, readQuery } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { ALL_SIGNED_IN, CAN_EDIT_EQUIPMENT } from "@/lib/equipment/roles";
import { createEquipment, listEquipment } from "@/lib/equipment/data";
import { equipmentCreateSchema, equipmentListQuerySchema } from "@/lib/equipment/model";

// GET: every signed-in role reads the register. POST: dispatcher, supervisor, admin.
export const GET = handler(async (req) => {
  const user = await requireRole(...ALL_SIGNED_IN);
  const q = readQuery(req, equipmentListQuerySchema);
  const equipment = await listEquipment(db(), user.organisationId, {
    yardCode: q.yard,
    kind: q.kind,
    inService: q.inService === undefined ? undefined : q.inService === "1",
  });
  return json({ equipment });
});

export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_EDIT_EQUIPMENT);
  const input = await readJson(req, equipmentCreateSchema);
  await yardScope(user, "edit", { yardId: input.yardId });
  return json({ equipment: await createEquipment(db(), user, input) }, 201);
});
