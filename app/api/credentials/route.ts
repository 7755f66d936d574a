import { db } from "@/lib/db";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { requireRole, type SessionUser } from "@/lib/auth/session";
import { createCredential, listCredentials } from "@/lib/credentials/data";
import { credentialCreateSchema, credentialQuerySchema } from "@/lib/credentials/model";

/** A lineworker sees only their own worker's records. */
function ownWorkerOnly(user: SessionUser, workerId: number | undefined): number | undefined {
  if (user.role !== "lineworker") return workerId;
  if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker record.");
  if (workerId !== undefined && workerId !== user.workerId) throw new ApiError(403, "You can only see your own credentials.");
  return user.workerId;
}

// GET: hr, admin, supervisor (all); lineworker (own). Filters: view, yard, qualification, q, workerId.
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "admin", "supervisor", "lineworker");
  const f = readQuery(req, credentialQuerySchema);
  const workerId = ownWorkerOnly(user, f.workerId);
  const credentials = await listCredentials(db(), user.organisationId, { ...f, workerId });
  return json({ credentials });
});

// POST: hr, admin add or renew (current); a lineworker sends a renewal of their own (pending).
export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin", "lineworker");
  const input = await readJson(req, credentialCreateSchema);
  const credential = await createCredential(db(), user, input);
  return json({ credential }, 201);
});
