import "@/lib/server-only";
import type { Knex } from "knex";

export interface Actor {
  id: number;
  organisationId: number;
}

/** Appends one row to the audit log, inside the caller's transaction when given one. */
export async function audit(
  q: Knex | Knex.Transaction,
  actor: Actor | null,
  organisationId: number,
  action: string,
  entity: string,
  entityId: string | number | null,
  detail?: Record<string, unknown>,
) {
  await q("audit_log").insert({
    organisation_id: organisationId,
    actor_user_id: actor?.id ?? null,
    action,
    entity,
    entity_id: entityId === null ? null : String(entityId),
    detail: detail ? JSON.stringify(detail) : null,
  });
}

export interface AuditFilter {
  organisationId: number;
  action?: string;
  entity?: string;
  actorUserId?: number;
  from?: Date;
  to?: Date;
  limit?: number;
}

export async function listAudit(db: Knex, f: AuditFilter) {
  const q = db("audit_log as a")
    .leftJoin("users as u", "u.id", "a.actor_user_id")
    .where("a.organisation_id", f.organisationId)
    .select("a.*", "u.name as actor_name", "u.role as actor_role")
    .orderBy("a.id", "desc")
    .limit(Math.min(f.limit ?? 200, 1000));
  if (f.action) q.where("a.action", f.action);
  if (f.entity) q.where("a.entity", f.entity);
  if (f.actorUserId) q.where("a.actor_user_id", f.actorUserId);
  if (f.from) q.where("a.created_at", ">=", f.from);
  if (f.to) q.where("a.created_at", "<", f.to);
  return q;
}

/** What the audit page's filters offer: the actions that occur, and the people who can act. */
export async function auditFilterChoices(db: Knex, organisationId: number) {
  const [actions, people] = await Promise.all([
    db("audit_log").where({ organisation_id: organisationId }).distinct("action").orderBy("action"),
    db("users").where({ organisation_id: organisationId }).orderBy("name").select("id", "name"),
  ]);
  return {
    actions: actions.map((a: { action: string }) => ({ action: String(a.action) })),
    people: people.map((p: { id: number; name: string }) => ({ id: Number(p.id), name: p.name })),
  };
}
