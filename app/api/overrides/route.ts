import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_OVERRIDE } from "@/lib/users/roles";
import { overrideSchema } from "@/lib/board/schema";
import { createOverride } from "@/lib/assignments/data-overrides";

/** Rules no one may override (also locked in the engine). */
const NEVER_OVERRIDDEN = new Set<string>(["DOUBLE_BOOKED"]);

// Supervisors only: a dispatcher gets 403 ("This needs the supervisor role").
export const POST = handler(async (req) => {
  const user = await requireRole(...CAN_OVERRIDE);
  const input = await readJson(req, overrideSchema);
  await yardScope(user, "edit", { orderId: input.workOrderId });
  // A person cannot be in two places: DOUBLE_BOOKED is never overridden, whatever the engine
  // reports (CREW-CHECK.md; issue 15, finding 6).
  if (NEVER_OVERRIDDEN.has(input.rule)) {
    const message = `${input.rule} can never be overridden: one person cannot be on two crews at once. Move or restaff one of the orders.`;
    throw new ApiError(422, `Invalid rule: ${message}`, { issues: [{ field: "rule", message }] });
  }
  const result = await createOverride(db(), user, input);
  return json(result, 201);
});
