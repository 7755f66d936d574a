import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { createUser, listUsers } from "@/lib/users/data";
import { userCreateSchema } from "@/lib/users/model";

// GET: every sign-in of the organisation (admin). POST: a new sign-in (admin) — role, yards
// for a dispatcher, the worker for a lineworker; the person gets an e-mailed link to set
// their password. Audited.
export const GET = handler(async () => {
  const user = await requireRole("admin");
  return json({ users: await listUsers(db(), user.organisationId) });
});

export const POST = handler(async (req) => {
  const user = await requireRole("admin");
  const input = await readJson(req, userCreateSchema);
  return json({ user: await createUser(db(), user, input) }, 201);
});
