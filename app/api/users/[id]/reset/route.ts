import { db } from "@/lib/db";
import { handler, json } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { adminReset } from "@/lib/users/data";

// POST (admin): e-mails the user a one-time link to set a new password (stored hashed,
// expiring after an hour). The current password keeps working until the link is used.
export const POST = handler<{ id: string }>(async (_req, ctx) => {
  const user = await requireRole("admin");
  const id = idParam((await ctx.params).id, "user");
  return json(await adminReset(db(), user, id), 201);
});
