import { z } from "zod";
import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { yardScope } from "@/lib/auth/yard-scope";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { markHandled } from "@/lib/messages/data";

const body = z.object({ handled: z.literal(true, { error: "handled must be true" }) });

// A dispatcher marks an unmatched reply as dealt with (called back, answered by hand).
export const PATCH = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "message");
  await readJson(req, body);
  await yardScope(user, "contact", { inboundMessageId: id });
  const r = await markHandled(db(), user, id);
  if (!r) throw new ApiError(404, "No such message.");
  return json(r);
});
