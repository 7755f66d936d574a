import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_OVERRIDE } from "@/lib/auth/roles";
import { overrideSchema } from "@/lib/validation/board";
import { createOverride } from "@/lib/data/overrides";

// Supervisors only: a dispatcher gets 403 ("This needs the supervisor role").
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_OVERRIDE);
  const input = await readJson(req, overrideSchema);
  const result = await createOverride(db(), user, input);
  return json(result, 201);
});
