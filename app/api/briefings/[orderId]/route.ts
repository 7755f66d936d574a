import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { loadBriefing, modeFor, rebrief, saveBriefing } from "@/lib/briefings/data";
import { briefingPutSchema } from "@/lib/briefings/model";
import { idempotent } from "@/lib/offline/data";

type P = { orderId: string };

// GET: the order's briefing (current round, its acknowledgements, the crew).
//   lineworker on the order's crew (the lead edits, the rest acknowledge), dispatcher and
//   supervisor read. A lineworker not on the crew: 403.
// PUT: the crew lead only. { action: "save" | "complete", version, data } or
//   { action: "rebrief", version, reason } (a new round; acknowledgements start again).
//   A stale version: 409; completing with something missing: 422 naming each field.
//   With an Idempotency-Key (the phone's offline queue), a resend is answered, not run again.
export const GET = handler<P>(async (_req, ctx) => {
  const user = await requireRole("lineworker", "dispatcher", "supervisor");
  const orderId = idParam((await ctx.params).orderId, "work order");
  const view = await loadBriefing(db(), user.organisationId, orderId);
  if (!view) throw new ApiError(404, "No such work order.");
  const mode = modeFor(user, view);
  return json({ mode, me: user.workerId ?? null, ...view });
});

export const PUT = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  return idempotent(req, user, async () => {
    const orderId = idParam((await ctx.params).orderId, "work order");
    const input = await readJson(req, briefingPutSchema);
    const result =
      input.action === "rebrief"
        ? await rebrief(db(), user, orderId, input)
        : await saveBriefing(db(), user, orderId, input);
    const view = await loadBriefing(db(), user.organisationId, orderId);
    return json({ result, mode: "lead", me: user.workerId ?? null, ...view });
  });
});
