import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { idParam } from "@/lib/api/ids";
import { requireRole } from "@/lib/auth/session";
import { updateUser } from "@/lib/users/data";
import { userPatchSchema } from "@/lib/users/model";

// PATCH (admin): { role?, yardIds?, active?, workerId? }. A role change, new yards or a
// deactivation end the user's sessions at once; audited (user.role / user.deactivate /
// user.reactivate / user.update).
export const PATCH = handler<{ id: string }>(async (req, ctx) => {
  const user = await requireRole("admin");
  const id = idParam((await ctx.params).id, "user");
  const patch = await readJson(req, userPatchSchema);
  return json({ user: await updateUser(db(), user, id, patch) });
});
