import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { acknowledge } from "@/lib/briefings/data";
import { ackSchema } from "@/lib/briefings/model";
import { idempotent } from "@/lib/offline/data";

type P = { orderId: string };

// POST: a crew member on this order acknowledges the completed briefing (current round) with
// their gear check. { round, gearCheck }. The crew lead may add { workerId } to record a
// member's acknowledgement given in person (marked as such). Not on the crew: 403; the lead
// started a new round meanwhile: 409; a second acknowledgement changes nothing (200).
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  // Idempotency-Key (the phone's offline queue): a resend gets the first answer again.
  return idempotent(req, user, async () => {
    const orderId = idParam((await ctx.params).orderId, "work order");
    const input = await readJson(req, ackSchema);
    const result = await acknowledge(db(), user, orderId, input);
    return json(result, result.unchanged ? 200 : 201);
  });
});
