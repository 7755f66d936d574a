import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { handler, json } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { CAN_DISPATCH } from "@/lib/users/roles";
import { resendAssignment } from "@/lib/assignments/data-send";

// Queues a fresh text and e-mail for one assignment already sent.
export const POST = handler<{ id: string }>(async (_req, ctx) => {
  const user = await requireRole(...CAN_DISPATCH);
  const id = idParam((await ctx.params).id, "assignment");
  await yardScope(user, "edit", { assignmentId: id });
  return json(await resendAssignment(db(), user, id), 201);
});
