import { db, transact } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { deleteUnavailability, getUnavailability, updateUnavailability } from "@/lib/leave/data";
import { unavailabilityPatchSchema } from "@/lib/leave/model";

type Params = { id: string };
// Digits only: "0x1f", "1e3" or " 7" are not another spelling of a record.
const idOf = async (ctx: { params: Promise<Params> }) => idParam((await ctx.params).id, "entry");

export const GET = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("hr", "supervisor", "dispatcher", "admin", "lineworker");
  const entry = await getUnavailability(db(), user.organisationId, await idOf(ctx));
  if (!entry || (user.role === "lineworker" && entry.workerId !== user.workerId)) throw new ApiError(404, "No such entry.");
  return json(entry);
});

// PATCH: a supervisor approves or refuses (status); hr or a supervisor corrects dates, kind, note.
export const PATCH = handler<Params>(async (req, ctx) => {
  const user = await requireRole("supervisor", "hr");
  const id = await idOf(ctx);
  const patch = await readJson(req, unavailabilityPatchSchema);
  await transact(db(), (trx) => updateUnavailability(trx, user, id, patch), { isolationLevel: "repeatable read", what: "unavailability" });
  return json(await getUnavailability(db(), user.organisationId, id));
});

// DELETE: hr or a supervisor removes; a lineworker withdraws their own pending request.
export const DELETE = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("supervisor", "hr", "lineworker");
  const id = await idOf(ctx);
  await db().transaction((trx) => deleteUnavailability(trx, user, id));
  return json({ deleted: id });
});
