import { db } from "@/lib/db";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { createGear, listGear } from "@/lib/gear/data";
import { gearCreateSchema, gearQuerySchema } from "@/lib/gear/model";

// GET: hr, admin, dispatcher, supervisor (all); a lineworker only their own worker's items.
//   Filters: view (all = in service, due, overdue, retired), yard, workerId, q.
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "admin", "dispatcher", "supervisor", "lineworker");
  const f = readQuery(req, gearQuerySchema);
  if (user.role === "lineworker") {
    if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker record.");
    if (f.workerId !== undefined && f.workerId !== user.workerId) throw new ApiError(403, "You can only see your own rubber goods.");
    f.workerId = user.workerId;
  }
  return json({ gear: await listGear(db(), user.organisationId, f) });
});

// POST: hr, admin record a pair of gloves or sleeves (class, size, serial, last electrical test).
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin");
  const input = await readJson(req, gearCreateSchema);
  return json({ item: await createGear(db(), user, input) }, 201);
});
