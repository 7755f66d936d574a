import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { getGear, patchGear } from "@/lib/gear/data";
import { gearPatchSchema } from "@/lib/gear/model";

type P = { id: string };

// GET: hr, admin, dispatcher, supervisor; a lineworker only their own.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "admin", "dispatcher", "supervisor", "lineworker");
  const id = idParam((await ctx.params).id, "item");
  const item = await getGear(db(), user.organisationId, id);
  if (!item) throw new ApiError(404, "No such item.");
  if (user.role === "lineworker" && item.workerId !== user.workerId) throw new ApiError(403, "You can only see your own rubber goods.");
  return json({ item });
});

// PATCH: hr, admin. { version, testedOn?, class?, size?, serial?, issuedOn?, retiredOn?, note? }; stale version 409.
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole("hr", "admin");
  const id = idParam((await ctx.params).id, "item");
  const patch = await readJson(req, gearPatchSchema);
  return json({ item: await patchGear(db(), user, id, patch) });
});
