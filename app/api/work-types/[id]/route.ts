import { db } from "@/lib/db";
import { idParam } from "@/lib/api/ids";
import { ApiError, handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { audit } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { getWorkType, saveTemplate } from "@/lib/orders/data-work-types";
import { crewTemplateSchema } from "@/lib/orders/schema";

type Params = { id: string };

export const GET = handler<Params>(async (_req, ctx) => {
  const user = await requireRole("admin", "dispatcher", "supervisor", "hr");
  const t = await getWorkType(db(), user.organisationId, idParam((await ctx.params).id, "work type"));
  if (!t) throw new ApiError(404, "No such work type.");
  return json(t);
});

// PUT: admin. The template needs exactly one lead position.
export const PUT = handler<Params>(async (req, ctx) => {
  const user = await requireRole("admin");
  const id = idParam((await ctx.params).id, "work type");
  const input = await readJson(req, crewTemplateSchema);
  const saved = await db().transaction(async (trx) => {
    const before = await getWorkType(trx, user.organisationId, id);
    if (!before) throw new ApiError(404, "No such work type.");
    await saveTemplate(trx, id, input);
    await audit(trx, user, user.organisationId, "work_type.update", "work_type", id, {
      from: { name: before.name, minCrew: before.minCrew, digs: before.digs, positions: before.positions },
      to: input,
    });
    await boardEvent(trx, { organisationId: user.organisationId, kind: "order", payload: { workTypes: [id] } });
    return getWorkType(trx, user.organisationId, id);
  });
  return json(saved);
});
