import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { listOrders, parseJson, seriesView } from "@/lib/orders/data";
import { endSeries, seriesWithOrderIds, updateSeries } from "@/lib/orders/data-series";
import { seriesEditSchema } from "@/lib/orders/schema";

type Params = { id: string };

// Digits only: "0x1f", "1e3" or " 7" are not another spelling of a record.
const idOf = async (ctx: { params: Promise<Params> }) => idParam((await ctx.params).id, "series");

export const GET = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const id = await idOf(ctx);
  const found = await seriesWithOrderIds(db(), user.organisationId, id);
  if (!found) throw new ApiError(404, "No such series.");
  const { series: s, orderIds } = found;
  const occurrences = orderIds.length ? await listOrders(db(), user.organisationId, { ids: orderIds, limit: 1000 }) : [];
  return json({ ...seriesView(s), template: parseJson(s.template, {}), yardId: Number(s.yard_id), occurrences });
});

// PATCH: dispatcher, supervisor. Regenerates future untouched occurrences; reports what it kept.
export const PATCH = handler<Params>(async (req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  const input = await readJson(req, seriesEditSchema);
  await yardScope(user, "edit", { seriesId: id });
  const result = await db().transaction((trx) => updateSeries(trx, user, id, input));
  return json(result);
});

// DELETE: ends the series. Future untouched occurrences are removed; staffed ones stay.
export const DELETE = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  await yardScope(user, "edit", { seriesId: id });
  const result = await db().transaction((trx) => endSeries(trx, user, id));
  return json(result);
});
