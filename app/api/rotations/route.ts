import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { yardScope } from "@/lib/auth/yard-scope";
import { requireRole } from "@/lib/auth/session";
import { createRotation, listRotations } from "@/lib/rotations/data";
import { rotationSchema } from "@/lib/rotations/model";

// GET: dispatcher, supervisor, hr, admin — each rotation with who is on call now and next.
export const GET = handler(async () => {
  const user = await requireRole("dispatcher", "supervisor", "hr", "admin");
  return json({ rotations: await listRotations(db(), user.organisationId) });
});

// POST: dispatcher, supervisor.
export const POST = handler(async (req) => {
  const user = await requireRole("dispatcher", "supervisor");
  const input = await readJson(req, rotationSchema);
  await yardScope(user, "edit", { yardId: input.yardId });
  const id = await db().transaction((trx) => createRotation(trx, user, input));
  const [rotation] = await listRotations(db(), user.organisationId, { id });
  return json(rotation, 201);
});
