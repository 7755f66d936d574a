import { db, transact } from "@/lib/db";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { createUnavailability, getUnavailability, listUnavailability } from "@/lib/leave/data";
import { unavailabilityQuerySchema, unavailabilitySchema } from "@/lib/leave/model";

// GET: hr, supervisor, dispatcher, admin see everyone; a lineworker sees only their own.
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "supervisor", "dispatcher", "admin", "lineworker");
  const f = readQuery(req, unavailabilityQuerySchema);
  if (user.role === "lineworker") {
    if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker.");
    if (f.workerId && f.workerId !== user.workerId) throw new ApiError(403, "You can see only your own entries.");
    f.workerId = user.workerId;
  }
  return json({ entries: await listUnavailability(db(), user.organisationId, f) });
});

// POST: hr or supervisor (approved at once); a lineworker asks for their own (requested).
// Overlapping requested/approved entries for one person: 409.
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "supervisor", "lineworker");
  const input = await readJson(req, unavailabilitySchema);
  const id = await transact(db(), (trx) => createUnavailability(trx, user, input), { isolationLevel: "repeatable read", what: "unavailability" });
  return json(await getUnavailability(db(), user.organisationId, id), 201);
});
