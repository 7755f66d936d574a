import "@/lib/server-only";
import type { Knex } from "knex";
import type { PlacedElsewhere } from "@/lib/board/model";

/**
 * Workers held on another yard's orders that overlap this board's day (issue 18 point 15):
 * the pool shows them as placed there, not as free. One query; live seats only
 * (`holds_position` set), cancelled orders left out.
 */
export async function placedElsewhere(
  db: Knex | Knex.Transaction,
  organisationId: number,
  yardId: number,
  window: { start: number; end: number },
): Promise<PlacedElsewhere[]> {
  const rows = await db("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("yards as y", "y.id", "o.yard_id")
    .whereNotNull("a.holds_position")
    .where("o.organisation_id", organisationId)
    .whereNot("o.yard_id", yardId)
    .whereNot("o.status", "cancelled")
    .where("o.start_at", "<", new Date(window.end))
    .where("o.end_at", ">", new Date(window.start))
    .orderBy(["o.start_at", "o.number"])
    .select("a.worker_id", "o.id as order_id", "o.number", "o.start_at", "o.end_at", "y.code as yard_code", "y.name as yard_name");
  return rows.map((r) => ({
    workerId: Number(r.worker_id),
    orderId: Number(r.order_id),
    number: String(r.number),
    yardCode: String(r.yard_code),
    yardName: String(r.yard_name),
    start: new Date(r.start_at).toISOString(),
    end: new Date(r.end_at).toISOString(),
  }));
}
