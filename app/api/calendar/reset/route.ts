import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { audit } from "@/lib/audit/data";
import { calendarUrlFor, newCalendarToken, setCalendarToken } from "@/lib/workers/data-calendar";
import { calendarResetSchema } from "@/lib/time-records/model";

// POST: a lineworker makes a new link for themself; hr and admin for anyone (workerId).
// The old link stops working at once.
export const POST = handler(async (req) => {
  const user = await requireRole("lineworker", "hr", "admin");
  const input = await readJson(req, calendarResetSchema);
  let workerId = input.workerId;
  if (user.role === "lineworker") {
    if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker.");
    if (workerId !== undefined && workerId !== user.workerId) throw new ApiError(403, "You can reset only your own calendar link.");
    workerId = user.workerId;
  }
  if (!workerId) throw new ApiError(422, "Name the worker.", { issues: [{ field: "workerId", message: "Name the worker." }] });
  const token = newCalendarToken();
  await db().transaction(async (trx) => {
    if (!(await setCalendarToken(trx, user.organisationId, workerId!, token))) throw new ApiError(404, "No such worker.");
    // The token itself is a secret: the audit row says that it changed, not what to.
    await audit(trx, user, user.organisationId, "calendar.reset", "worker", workerId!, {});
  });
  return json({ workerId, url: calendarUrlFor(token) });
});
