// In-app notices to one user (issue 18, point 13). Server only (Knex).
import "@/lib/server-only";
import type { Knex } from "knex";
import type { NoticeView } from "./model";

export async function addNotice(
  trx: Knex | Knex.Transaction,
  n: { organisationId: number; userId: number; kind: string; workOrderId?: number | null; overrideId?: number | null; title: string; body: string },
) {
  const [id] = await trx("notices").insert({
    organisation_id: n.organisationId,
    user_id: n.userId,
    kind: n.kind,
    work_order_id: n.workOrderId ?? null,
    override_id: n.overrideId ?? null,
    title: n.title.slice(0, 200),
    body: n.body.slice(0, 2000),
  });
  return id as number;
}

export async function unreadNotices(db: Knex, userId: number): Promise<number> {
  const row = await db("notices").where({ user_id: userId }).whereNull("read_at").count({ n: "*" }).first();
  return Number(row?.n ?? 0);
}

/** The user's notices, unread first, newest first (the last 50). */
export async function listNotices(db: Knex, userId: number): Promise<NoticeView[]> {
  const rows = await db("notices")
    .where({ user_id: userId })
    .orderByRaw("read_at IS NULL DESC")
    .orderBy("created_at", "desc")
    .orderBy("id", "desc")
    .limit(50);
  return rows.map((r: Record<string, any>) => ({
    id: r.id,
    kind: r.kind,
    title: r.title,
    body: r.body,
    workOrderId: r.work_order_id,
    createdAt: new Date(r.created_at).toISOString(),
    readAt: r.read_at ? new Date(r.read_at).toISOString() : null,
  }));
}

/** Marks the user's own notices read (the given ids, or all); returns how many changed. */
export async function markNoticesRead(db: Knex, userId: number, ids: number[] | "all"): Promise<number> {
  const q = db("notices").where({ user_id: userId }).whereNull("read_at");
  if (ids !== "all") q.whereIn("id", ids);
  return q.update({ read_at: new Date() });
}
