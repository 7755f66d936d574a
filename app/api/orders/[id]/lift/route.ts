import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { yardScope } from "@/lib/auth/yard-scope";
import { deleteLiftPlan, getLiftPlan, putLiftPlan, riggingChoices } from "@/lib/gear/data";
import { liftFiguresFor } from "@/lib/gear/figures";
import { liftPlanSchema } from "@/lib/gear/lift";

type P = { id: string };

// GET: dispatcher, supervisor, admin. The order's lift plan (null when none), its figures
//   (lead-line pull, block load, sling leg load) and the rigging its booked truck carries.
// PUT: dispatcher, supervisor, admin save it (zod: weight > 0, parts of line >= 1, sling angle
//   1-90 from the horizontal, 422 naming the field, nothing stored); a stale version 409.
// DELETE: dispatcher, supervisor, admin remove it.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const orderId = idParam((await ctx.params).id, "work order");
  await yardScope(user, "read", { orderId });
  const plan = await getLiftPlan(db(), user.organisationId, orderId);
  return json({ plan, figures: plan ? liftFiguresFor(plan) : null, rigging: await riggingChoices(db(), orderId) });
});

export const PUT = handler<P>(async (req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const orderId = idParam((await ctx.params).id, "work order");
  const body = await readJson(req, liftPlanSchema);
  await yardScope(user, "edit", { orderId });
  const plan = await putLiftPlan(db(), user, orderId, body);
  return json({ plan, figures: liftFiguresFor(plan) });
});

export const DELETE = handler<P>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const orderId = idParam((await ctx.params).id, "work order");
  await yardScope(user, "edit", { orderId });
  await deleteLiftPlan(db(), user, orderId);
  return json({ ok: true });
});
