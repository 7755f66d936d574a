import { db } from "@/lib/db";
import { handler, json, readJson, readQuery } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { hideForeignContacts } from "@/lib/auth/yard-scope";
import { createWorker, listWorkers } from "@/lib/workers/data";
import { workerQuerySchema, workerSchema } from "@/lib/workers/model";

// GET: the roster (hr, admin, dispatcher, supervisor). POST: a new worker (hr, admin).
export const GET = handler(async (req) => {
  const user = await requireRole("hr", "admin", "dispatcher", "supervisor");
  const q = readQuery(req, workerQuerySchema);
  const workers = await listWorkers(db(), user.organisationId, {
    q: q.q,
    yardCode: q.yard,
    activeOnly: q.active === "true",
  });
  // Contact details only for the reader's own yards (dispatchers); the roster itself is shared.
  const shown = await hideForeignContacts(user, q.active === "false" ? workers.filter((w) => !w.active) : workers);
  return json({ workers: shown });
});

export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin");
  const input = await readJson(req, workerSchema);
  const worker = await createWorker(db(), user, input);
  return json({ worker }, 201);
});
