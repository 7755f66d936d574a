import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { hideForeignContacts } from "@/lib/auth/yard-scope";
import { getWorker, updateWorker } from "@/lib/workers/data";
import { workerPatchSchema } from "@/lib/workers/model";

type P = { id: string };

// GET: hr, admin, dispatcher, supervisor; a lineworker only their own record.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "admin", "dispatcher", "supervisor", "lineworker");
  const id = idParam((await ctx.params).id, "worker");
  if (user.role === "lineworker" && user.workerId !== id) throw new ApiError(403, "You can only open your own record.");
  const worker = await getWorker(db(), user.organisationId, id);
  if (!worker) throw new ApiError(404, "No such worker.");
  const [shown] = await hideForeignContacts(user, [worker]);
  return json({ worker: shown });
});

// PATCH: hr, admin; `version` must be the one the editor loaded (409 with the current record otherwise).
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole("hr", "admin");
  const id = idParam((await ctx.params).id, "worker");
  const patch = await readJson(req, workerPatchSchema);
  const worker = await updateWorker(db(), user, id, patch);
  return json({ worker });
});
