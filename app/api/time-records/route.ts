import { db, transact } from "@/lib/db";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { createManualRecord, workerWeek } from "@/lib/time-records/data";
import { manualTimeRecordSchema, timeQuerySchema } from "@/lib/time-records/model";

// GET ?workerId=&week=YYYY-MM-DD: one worker's week with daily and weekly totals and overtime.
// Dispatcher, supervisor, hr, admin: anyone; a lineworker: only themself.
export const GET = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor", "hr", "admin", "lineworker");
  const q = readQuery(req, timeQuerySchema);
  let workerId = q.workerId;
  if (user.role === "lineworker") {
    if (!user.workerId) throw new ApiError(403, "Your sign-in is not linked to a worker.");
    if (workerId !== undefined && workerId !== user.workerId) throw new ApiError(403, "You can see only your own time.");
    workerId = user.workerId;
  }
  if (!workerId) throw new ApiError(422, "Name the worker.", { issues: [{ field: "workerId", message: "Name the worker." }] });
  const week = await workerWeek(db(), user.organisationId, workerId, q.week);
  if (!week) throw new ApiError(404, "No such worker.");
  return json(week);
});

// POST: a manual entry with a reason. Dispatcher, supervisor, hr.
export const POST = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor", "hr");
  const input = await readJson(req, manualTimeRecordSchema);
  await yardScope(user, "edit", { workerId: input.workerId });
  const id = await transact(db(), (trx) => createManualRecord(trx, user, input), { isolationLevel: "repeatable read", what: "time record" });
  return json({ id }, 201);
});
