import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { createType, listTypes } from "@/lib/credentials/data-qualification-types";
import { qualificationTypeCreateSchema } from "@/lib/credentials/qualification-types";

// GET: every signed-in role but lineworker. POST: hr, admin.
export const GET = handler(async () => {
  const user = await requireRole("hr", "admin", "supervisor", "dispatcher");
  return json({ types: await listTypes(db(), user.organisationId) });
});

export const POST = handler(async (req) => {
  const user = await requireRole("hr", "admin");
  const input = await readJson(req, qualificationTypeCreateSchema);
  return json({ type: await createType(db(), user, input) }, 201);
});
