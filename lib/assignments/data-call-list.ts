import "@/lib/server-only";
// The call list's reads (GET/POST /api/call-list): the seat someone is rung for, and whether a
// day has other placements not sent yet (then Send crews tells everyone together).
import type { Knex } from "knex";

export interface SeatWithOrder {
  id: number;
  position: string;
  order_id: number;
  organisation_id: number;
  yard_id: number;
  work_date: string;
  status: string;
  number: string;
}

/** A seat (positions row) with the order it is on, or null. Scope is the caller's check. */
export async function seatWithOrder(db: Knex, positionId: number): Promise<SeatWithOrder | null> {
  const seat = await db("positions as p")
    .join("work_orders as o", "o.id", "p.work_order_id")
    .where("p.id", positionId)
    .first("p.id", "p.position", "o.id as order_id", "o.organisation_id", "o.yard_id", "o.work_date", "o.status", "o.number");
  return (seat as SeatWithOrder | undefined) ?? null;
}

/** Live placements on the yard's day still in draft (not texted yet), other than `exceptAssignmentId`. */
export async function unsentPlacements(db: Knex, organisationId: number, yardId: number, day: string, exceptAssignmentId: number | null): Promise<number> {
  const waiting = await db("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .where({ "o.organisation_id": organisationId, "o.yard_id": yardId, "o.work_date": day })
    .whereNot("o.status", "cancelled")
    .whereNotNull("a.holds_position")
    .where("a.status", "draft")
    .whereNot("a.id", exceptAssignmentId ?? 0)
    .count({ n: "*" })
    .first();
  return Number(waiting?.n ?? 0);
}
