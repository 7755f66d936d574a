import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { getCredential, patchCredential } from "@/lib/credentials/data";
import { credentialPatchSchema } from "@/lib/credentials/model";

type P = { id: string };

// GET: hr, admin, supervisor; a lineworker only their own.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "admin", "supervisor", "lineworker");
  const id = idParam((await ctx.params).id, "credential");
  const credential = await getCredential(db(), user.organisationId, id);
  if (!credential) throw new ApiError(404, "No such credential.");
  if (user.role === "lineworker" && credential.workerId !== user.workerId) {
    throw new ApiError(403, "You can only see your own credentials.");
  }
  return json({ credential });
});

// PATCH: hr, admin. { action: "verify", issuedOn?, expiresOn? } or { action: "reject", reason }.
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole("hr", "admin");
  const id = idParam((await ctx.params).id, "credential");
  const patch = await readJson(req, credentialPatchSchema);
  return json({ credential: await patchCredential(db(), user, id, patch) });
});
