import { z } from "zod";
import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { markHandled } from "@/lib/data/messages";

const idParam = z.object({ id: z.coerce.number().int().positive() });
const body = z.object({ handled: z.literal(true, { error: "handled must be true" }) });

// A dispatcher marks an unmatched reply as dealt with (called back, answered by hand).
export const PATCH = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const { id } = idParam.parse(await ctx.params);
  await readJson(req, body);
  const r = await markHandled(db(), user, id);
  if (!r) throw new ApiError(404, "No such message.");
  return json(r);
});
