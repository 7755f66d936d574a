import { db } from "@/lib/db";
import { handler, json, readJson } from "@/lib/api/http";
import { requireRole } from "@/lib/auth/session";
import { getPolicy, savePolicy } from "@/lib/policies/data";
import { policySchema } from "@/lib/policies/model";
import { audit } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";

export const GET = handler(async () => {
  const user = await requireRole("admin", "dispatcher", "supervisor", "hr");
  const { rules: _rules, ...policy } = await getPolicy(db(), user.organisationId);
  return json(policy);
});

export const PUT = handler(async (req) => {
  const user = await requireRole("admin");
  const input = await readJson(req, policySchema);
  await db().transaction(async (trx) => {
    await savePolicy(trx, user.organisationId, input);
    await audit(trx, user, user.organisationId, "policy.update", "policy", user.organisationId, input);
    await boardEvent(trx, { organisationId: user.organisationId, kind: "order", payload: { policy: true } });
  });
  return json(input);
});
