import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { startWork } from "@/lib/briefings/data";
import { startSchema } from "@/lib/briefings/model";

type P = { orderId: string };

// POST: the crew lead marks the work (the climb) started: actual_start_at = now, status
// in_progress. 409 while the order is on hold, before the briefing is complete, while the
// pole check has no pass (or a failure not dealt with), or while a crew member has not
// acknowledged. { round }.
export const POST = handler<P>(async (req, ctx) => {
  const user = await requireRole("lineworker");
  const orderId = idParam((await ctx.params).orderId, "work order");
  const input = await readJson(req, startSchema);
  return json(await startWork(db(), user, orderId, input));
});
