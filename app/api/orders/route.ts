import { db } from "@/lib/db";
import { handler, json, readJson, readQuery } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { createOrder, getOrder, listOrders } from "@/lib/orders/data";
import { listYards } from "@/lib/yards/data";
import { listWorkTypes } from "@/lib/orders/data-work-types";
import { createSeries } from "@/lib/orders/data-series";
import { ensureOccurrences } from "@/lib/orders/data-occurrences";
import { orderInputSchema, orderQuerySchema } from "@/lib/orders/schema";

// GET: dispatcher, supervisor, admin (read). Filters: yard (code), from, to (YYYY-MM-DD, the
// yard-local work date), status (comma list), workType (id or code), q (text).
export const GET = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const f = readQuery(req, orderQuerySchema);
  const conn = db();
  const yards = await listYards(conn, user.organisationId);
  const picked = f.yard ? yards.filter((y) => y.code.toLowerCase() === f.yard!.toLowerCase()) : yards;
  if (f.yard && picked.length === 0) return json({ orders: [] });
  for (const y of picked) await ensureOccurrences(conn, user.organisationId, y.id, f.to ?? f.from ?? "0000-01-01");
  let workTypeId: number | undefined;
  if (f.workType) {
    const types = await listWorkTypes(conn, user.organisationId);
    const t = types.find((x) => String(x.id) === f.workType || x.code === f.workType);
    if (!t) return json({ orders: [] });
    workTypeId = t.id;
  }
  const orders = await listOrders(conn, user.organisationId, {
    yardIds: picked.map((y) => y.id),
    from: f.from,
    to: f.to,
    statuses: f.status ? f.status.split(",") : undefined,
    workTypeId,
    q: f.q,
    limit: f.limit,
  });
  return json({ orders });
});

// POST: dispatcher, supervisor. With `recurrence` it creates a series and its occurrences.
export const POST = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor");
  const input = await readJson(req, orderInputSchema);
  await yardScope(user, "edit", { yardId: input.yardId });
  const result = await db().transaction(async (trx) => {
    if (input.recurrence) {
      const s = await createSeries(trx, user, input);
      return { id: s.firstOrderId, seriesId: s.seriesId, created: s.created };
    }
    const o = await createOrder(trx, user, input);
    return { id: o.id, seriesId: null, created: 1 };
  });
  const order = result.id ? await getOrder(db(), user.organisationId, result.id) : null;
  return json({ ...result, order }, 201);
});
