import { z } from "zod";
import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/auth/roles";
import { resendAssignment } from "@/lib/notify/send";

const idParam = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) });

// Queues a fresh text and e-mail for one assignment already sent.
export const POST = handler<{ id: string }>(async (_req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const { id } = idParam.parse(await ctx.params);
  return json(await resendAssignment(db(), user, id), 201);
});
