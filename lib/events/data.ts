import "@/lib/server-only";
import type { Knex } from "knex";

// Board events: a table every app instance reads, so a change made through one instance
// reaches boards served by another. Boards poll with a cursor (the last id they saw).

export type BoardEventKind =
  | "assignment"
  | "override"
  | "send"
  | "reply"
  | "credential"
  | "order"
  | "worker"
  | "availability"
  | "briefing"
  | "equipment";

export interface BoardEventInput {
  organisationId: number;
  yardId?: number | null;
  day?: string | null; // YYYY-MM-DD; null = affects every day (e.g. a credential renewal)
  kind: BoardEventKind;
  payload?: Record<string, unknown>;
}

export async function boardEvent(q: Knex | Knex.Transaction, e: BoardEventInput) {
  await q("board_events").insert({
    organisation_id: e.organisationId,
    yard_id: e.yardId ?? null,
    day: e.day ?? null,
    kind: e.kind,
    payload: e.payload ? JSON.stringify(e.payload) : null,
  });
}

export async function latestEventId(db: Knex, organisationId: number): Promise<number> {
  const row = await db("board_events").where({ organisation_id: organisationId }).max({ id: "id" }).first();
  return Number(row?.id ?? 0);
}

/** Events after the cursor that concern this yard and day (or every day). */
export async function eventsSince(db: Knex, organisationId: number, after: number, yardId: number, day: string) {
  const rows = await db("board_events")
    .where("organisation_id", organisationId)
    .where("id", ">", after)
    .andWhere((w) => w.whereNull("yard_id").orWhere("yard_id", yardId))
    .andWhere((w) => w.whereNull("day").orWhere("day", day))
    .orderBy("id")
    .limit(200)
    .select("id", "kind", "payload", "created_at");
  // Advance past other yards' events too, so the next poll does not scan them again.
  const latest = rows.length === 200 ? Number(rows[rows.length - 1].id) : Math.max(after, await latestEventId(db, organisationId));
  const cursor = latest;
  return { events: rows.map((r) => ({ ...r, id: Number(r.id), payload: parsePayload(r.payload) })), cursor };
}

function parsePayload(p: unknown) {
  if (typeof p === "string") {
    try {
      return JSON.parse(p);
    } catch {
      return null;
    }
  }
  return p ?? null;
}

/** The organisation's newest board_events id (0 when it has none): where a new stream starts. */
export async function lastEventId(q: Knex | Knex.Transaction, organisationId: number): Promise<number> {
  return Number((await q("board_events").where({ organisation_id: organisationId }).max({ id: "id" }).first())?.id ?? 0);
}
