import { db, transact } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { createCallOut } from "@/lib/rotations/data";
import { callOutSchema } from "@/lib/rotations/model";

// POST: dispatcher, supervisor. Times are wall clock in the rotation's yard (or the worker's).
export const POST = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor");
  const input = await readJson(req, callOutSchema);
  await yardScope(user, "edit", { workerId: input.workerId, rotationId: input.rotationId });
  const result = await transact(db(), (trx) => createCallOut(trx, user, input), { isolationLevel: "repeatable read", what: "call-out" });
  return json(result, 201);
});
