import { db } from "@/lib/db";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { audit } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { listWorkTypes, saveTemplate } from "@/lib/orders/data-work-types";
import { crewTemplatesSchema } from "@/lib/orders/schema";

// GET: everyone who builds or reads orders and crews.
export const GET = handler(async () => {
  const user = await requireRole("admin", "dispatcher", "supervisor", "hr");
  return json({ workTypes: await listWorkTypes(db(), user.organisationId) });
});

// PUT: admin saves several crew templates at once.
export const PUT = handler(async (req) => {
  const user = await requireRole("admin");
  const input = await readJson(req, crewTemplatesSchema);
  const saved = await db().transaction(async (trx) => {
    const known = new Map((await listWorkTypes(trx, user.organisationId)).map((t) => [t.id, t]));
    for (const [i, t] of input.workTypes.entries()) {
      if (!known.has(t.id)) throw new ApiError(422, "That work type does not exist.", { issues: [{ field: `workTypes.${i}.id`, message: "That work type does not exist." }] });
    }
    for (const t of input.workTypes) {
      await saveTemplate(trx, t.id, t);
      const before = known.get(t.id)!;
      await audit(trx, user, user.organisationId, "work_type.update", "work_type", t.id, {
        from: { name: before.name, minCrew: before.minCrew, digs: before.digs, positions: before.positions },
        to: { name: t.name, minCrew: t.minCrew, digs: t.digs, positions: t.positions },
      });
    }
    await boardEvent(trx, { organisationId: user.organisationId, kind: "order", payload: { workTypes: input.workTypes.map((t) => t.id) } });
    return listWorkTypes(trx, user.organisationId);
  });
  return json({ workTypes: saved });
});
