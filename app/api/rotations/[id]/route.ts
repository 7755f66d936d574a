import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { deleteRotation, listRotations, updateRotation } from "@/lib/rotations/data";
import { rotationPatchSchema } from "@/lib/rotations/model";

type Params = { id: string };
// Digits only: "0x1f", "1e3" or " 7" are not another spelling of a record.
const idOf = async (ctx: { params: Promise<Params> }) => idParam((await ctx.params).id, "rotation");

export const GET = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "hr", "admin");
  const [rotation] = await listRotations(db(), user.organisationId, { id: await idOf(ctx), periods: 12 });
  if (!rotation) throw new ApiError(404, "No such rotation.");
  return json(rotation);
});

// PATCH: dispatcher, supervisor; `version` required (409 with `current` when stale).
export const PATCH = handler<Params>(async (req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  const patch = await readJson(req, rotationPatchSchema);
  await yardScope(user, "edit", { rotationId: id, yardId: patch.yardId });
  await db().transaction((trx) => updateRotation(trx, user, id, patch));
  const [rotation] = await listRotations(db(), user.organisationId, { id });
  return json(rotation);
});

// DELETE: dispatcher, supervisor. Recorded call-outs keep their time records.
export const DELETE = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  await yardScope(user, "edit", { rotationId: id });
  await db().transaction((trx) => deleteRotation(trx, user, id));
  return json({ deleted: id });
});
