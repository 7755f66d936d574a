import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { loadBriefing, modeFor } from "@/lib/briefings/data";
import { confirmLiftPlan } from "@/lib/gear/data";
import { liftFiguresFor } from "@/lib/gear/figures";
import { liftConfirmSchema } from "@/lib/gear/lift";

type P = { orderId: string };

// POST: the crew lead on the order confirms its lift plan in the briefing, with the weight
// read off the nameplate on site. { version, siteWeightLb }. A stale version 409.
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  const orderId = idParam((await ctx.params).orderId, "work order");
  const view = await loadBriefing(db(), user.organisationId, orderId);
  if (!view) throw new ApiError(404, "No such work order.");
  if (modeFor(user, view) !== "lead") throw new ApiError(403, "Only the crew lead on this order confirms the lift plan.");
  const body = await readJson(req, liftConfirmSchema);
  const plan = await confirmLiftPlan(db(), user, orderId, body);
  return json({ plan, figures: liftFiguresFor(plan) });
});
