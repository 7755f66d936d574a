import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { changeOwnPassword } from "@/lib/users/data";
import { passwordChangeSchema } from "@/lib/users/model";

// POST: any signed-in user changes their own password ({ currentPassword, newPassword }).
// Every session of theirs ends, this one included: they sign in again with the new one.
export const POST = handler(async (req) => {
  const user = await requireRole();
  const input = await readJson(req, passwordChangeSchema);
  return json(await changeOwnPassword(db(), user, input.currentPassword, input.newPassword));
});
