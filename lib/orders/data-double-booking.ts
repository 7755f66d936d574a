import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";

// DOUBLE_BOOKED on every path that changes an order's time or status (issue 15, finding 6).
// Placing a worker already checks their other orders (lib/assignments/data.ts); this is the
// other direction: moving an order's times, or bringing a cancelled order back, over another
// order of someone on its crew. Refused with 409 naming the other order; nothing is stored.
// DOUBLE_BOOKED cannot be overridden (CREW-CHECK.md: a person cannot be in two places).

/**
 * The order keeps its crew while its times become [startMs, endMs) and its status `status`:
 * refuse when a worker holding one of its positions holds a position on another order, not
 * cancelled, that overlaps. Locks the crew's worker rows (orders first, then workers: the
 * order every placement takes) so a concurrent placement cannot slip in between.
 */
export async function assertNoDoubleBooking(
  trx: Knex.Transaction,
  orderId: number,
  next: { startMs: number; endMs: number; status: string },
): Promise<void> {
  if (next.status === "cancelled") return;
  const crew = (await trx("assignments").where({ work_order_id: orderId }).whereNotNull("holds_position").pluck("worker_id")).map(Number);
  if (!crew.length) return;
  await trx("workers").whereIn("id", crew).orderBy("id").forUpdate().select("id");
  const clash = await trx("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("workers as w", "w.id", "a.worker_id")
    .whereIn("a.worker_id", crew)
    .whereNotNull("a.holds_position")
    .whereNot("o.id", orderId)
    .whereNot("o.status", "cancelled")
    .where("o.start_at", "<", new Date(next.endMs))
    .where("o.end_at", ">", new Date(next.startMs))
    .orderBy("o.start_at")
    .first("o.id", "o.number", "w.id as worker_id", "w.first_name", "w.last_name");
  if (clash) {
    const name = `${clash.first_name} ${clash.last_name}`;
    throw new ApiError(
      409,
      `${name} is already on ${clash.number} at that time (DOUBLE_BOOKED). Move or restaff one of the two orders first.`,
      { reason: "double_booked", rule: "DOUBLE_BOOKED", otherOrder: { id: Number(clash.id), number: clash.number }, workerId: Number(clash.worker_id) },
    );
  }
}
