import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { holdOrder, liftHold, loadBriefing } from "@/lib/briefings/data";
import { briefingHoldSchema, briefingLiftSchema } from "@/lib/briefings/model";
import { idempotent } from "@/lib/offline/data";

type P = { orderId: string };

// POST: the crew lead holds the order (usually a pole that failed its check): the briefing is
//   saved with the data given, the order goes on hold with the reason, the dispatcher is told
//   by text and e-mail (outbox). { version, data, reason }. With an Idempotency-Key (the
//   phone's offline queue), a resend gets the first answer and holds nothing twice.
// DELETE: a dispatcher or supervisor lifts a hold the briefing put on: the order returns to
//   its status before the hold and the lead briefs again (a new round). { note }.
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  return idempotent(req, user, async () => {
    const orderId = idParam((await ctx.params).orderId, "work order");
    const input = await readJson(req, briefingHoldSchema);
    const result = await holdOrder(db(), user, orderId, input);
    return json({ result, mode: "lead", me: user.workerId ?? null, ...(await loadBriefing(db(), user.organisationId, orderId)) });
  });
});

export const DELETE = handler<P>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const orderId = idParam((await ctx.params).orderId, "work order");
  const input = await readJson(req, briefingLiftSchema);
  await yardScope(user, "edit", { orderId });
  const result = await liftHold(db(), user, orderId, input);
  return json({ result, mode: "viewer", me: null, ...(await loadBriefing(db(), user.organisationId, orderId)) });
});
