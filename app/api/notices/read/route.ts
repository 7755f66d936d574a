import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { ROLES } from "@/lib/users/roles";
import { noticesReadSchema } from "@/lib/queue/model";
import { markNoticesRead, unreadNotices } from "@/lib/notices/data";

// Marks the caller's own in-app notices read (issue 18, point 13). Only rows of the caller
// change (user_id = the session's user), so there is no yard to check and nothing to audit.
export const POST = handler(async (req) => {
  const user = await requireRole(...ROLES);
  const input = await readJson(req, noticesReadSchema);
  const marked = await markNoticesRead(db(), user.id, input.ids);
  return json({ marked, unread: await unreadNotices(db(), user.id) });
});
