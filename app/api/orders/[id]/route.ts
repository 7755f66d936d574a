import { z } from "zod";
import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson, readQuery } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { cancelOrder, getOrder, updateOrder } from "@/lib/orders/data";
import { orderPatchSchema } from "@/lib/orders/schema";

type Params = { id: string };

// Digits only: "0x1f", "1e3" or " 7" are not another spelling of a record.
const idOf = async (ctx: { params: Promise<Params> }) => idParam((await ctx.params).id, "work order");

export const GET = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor", "admin");
  const order = await getOrder(db(), user.organisationId, await idOf(ctx));
  if (!order) throw new ApiError(404, "No such work order.");
  return json(order);
});

// PATCH: dispatcher, supervisor. Needs the version last loaded; 409 with `current` when stale.
export const PATCH = handler<Params>(async (req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  const patch = await readJson(req, orderPatchSchema);
  await yardScope(user, "edit", { orderId: id, yardId: patch.yardId });
  const order = await db().transaction((trx) => updateOrder(trx, user, id, patch));
  return json(order);
});

// DELETE = cancel (the order and its history stay). ?version=N makes it a checked write.
export const DELETE = handler<Params>(async (req, ctx) => {
  const user = await requireRole("dispatcher", "supervisor");
  const id = await idOf(ctx);
  const { version } = readQuery(req, z.object({ version: z.coerce.number().int().positive().optional() }));
  await yardScope(user, "edit", { orderId: id });
  const order = await db().transaction((trx) => cancelOrder(trx, user, id, version));
  return json(order);
});
