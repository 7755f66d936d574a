import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_EDIT_EQUIPMENT } from "@/lib/equipment/roles";
import { addRigging } from "@/lib/equipment/data";
import { riggingCreateSchema } from "@/lib/equipment/model";

type P = { id: string };

// POST: a rope block, hand line or sling the truck carries (dispatcher, supervisor, admin).
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole(...CAN_EDIT_EQUIPMENT);
  const id = idParam((await ctx.params).id, "equipment");
  const input = await readJson(req, riggingCreateSchema);
  await yardScope(user, "edit", { equipmentId: id });
  return json({ rigging: await addRigging(db(), user, id, input) }, 201);
});
