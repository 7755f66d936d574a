import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { respondSchema } from "@/lib/notify/schema";
import { assignmentOwner, respond } from "@/lib/assignments/data-responses";
import { idempotent } from "@/lib/offline/data";

// A lineworker answers their own assignment on the web (My week); texts use the same respond().
// With an Idempotency-Key (an answer given offline and queued on the phone), a resend gets the
// first answer again.
export const POST = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  return idempotent(req, user, async () => {
    const id = idParam((await ctx.params).id, "assignment");
    const input = await readJson(req, respondSchema);
    const workerId = user.workerId;
    if (!workerId) throw new ApiError(403, "Your sign-in is not linked to a worker; ask an admin.");
    const owner = await assignmentOwner(db(), id);
    if (!owner || owner.organisation_id !== user.organisationId) throw new ApiError(404, "No such assignment.");
    if (owner.worker_id !== workerId) throw new ApiError(403, "You can only answer your own assignments.");
    const result = await respond(db(), {
      assignmentId: id,
      workerId,
      answer: input.answer,
      reason: input.reason ?? null,
      channel: "web",
      actor: user,
    });
    return json(result);
  });
});
