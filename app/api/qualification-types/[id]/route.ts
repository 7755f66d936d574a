import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { deleteType, listTypes, updateType } from "@/lib/credentials/data-qualification-types";
import { qualificationTypePatchSchema } from "@/lib/credentials/qualification-types";

type P = { id: string };

export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "admin", "supervisor", "dispatcher");
  const id = idParam((await ctx.params).id, "qualification");
  const type = (await listTypes(db(), user.organisationId)).find((t) => t.id === id);
  if (!type) throw new ApiError(404, "No such qualification.");
  return json({ type });
});

// PATCH: name, renewal period, warning window, evidence flag (hr, admin). Codes never change.
export const PATCH = handler<P>(async (req, ctx) => {
  const user = await requireRole("hr", "admin");
  const id = idParam((await ctx.params).id, "qualification");
  const patch = await readJson(req, qualificationTypePatchSchema);
  return json({ type: await updateType(db(), user, id, patch) });
});

// DELETE: only a type the crew rules do not read and no record uses (hr, admin).
export const DELETE = handler<P>(async (_req, ctx) => {
  const user = await requireRole("hr", "admin");
  const id = idParam((await ctx.params).id, "qualification");
  await deleteType(db(), user, id);
  return json({ deleted: id });
});
