import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { sendCrewsSchema } from "@/lib/notify/schema";
import { sendCrews } from "@/lib/assignments/data-send";

export const dynamic = "force-dynamic";

// Send crews for one yard and day: 409 with the blocks while any remains unresolved.
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_DISPATCH);
  const input = await readJson(req, sendCrewsSchema);
  await yardScope(user, "edit", { yardCode: input.yard });
  return json(await sendCrews(db(), user, input));
});
