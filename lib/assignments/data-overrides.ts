import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import type { OverrideInput } from "@/lib/board/schema";
import { audit, type Actor } from "@/lib/audit/data";
import { crewHash } from "@/lib/board/data";
import { findingsAfter } from "./data";
import { withConflictRetry } from "@/lib/db";
import { bumpOrders } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";

/**
 * A supervisor accepts one block finding for the crew the order has now. The finding must
 * exist (checked by the engine, server-side) and must not be locked.
 */
export async function createOverride(db: Knex, user: Actor, input: OverrideInput) {
  const order = await db("work_orders").where({ id: input.workOrderId, organisation_id: user.organisationId }).first();
  if (!order) throw new ApiError(404, "No such work order.");
  const { findings } = await findingsAfter(db, user.organisationId, [order.id], []);
  const f = findings.find(
    (x) => x.workOrderId === String(order.id) && x.rule === input.rule && (x.workerId ?? null) === (input.workerId === null ? null : String(input.workerId)),
  );
  if (!f) {
    throw new ApiError(422, `Invalid rule: ${order.number} has no ${input.rule} finding${input.workerId ? " for that worker" : ""} now.`, {
      issues: [{ field: "rule", message: "No such finding on this order now" }],
    });
  }
  if (f.locked) {
    throw new ApiError(422, `Invalid rule: ${input.rule} here is locked and can never be overridden. ${f.message}`, {
      issues: [{ field: "rule", message: "Locked rule" }],
    });
  }
  if (f.level !== "block") {
    throw new ApiError(422, "Invalid rule: only block findings need an override.", { issues: [{ field: "rule", message: "Not a block" }] });
  }
  return withConflictRetry(() => db.transaction(async (trx) => {
    // The crew hash below relies on the order's lock: write it too (work_orders.booking_seq),
    // so a crew change committed on another Galera node at the same moment collides.
    await bumpOrders(trx, [order.id]);
    const seats = await trx("assignments").where({ work_order_id: order.id }).whereNotNull("holds_position").select("position_id", "worker_id");
    const hash = crewHash(seats.map((s) => ({ positionId: s.position_id, workerId: s.worker_id })));
    const [id] = await trx("overrides").insert({
      work_order_id: order.id,
      rule: input.rule,
      worker_id: input.workerId,
      reason: input.reason,
      crew_hash: hash,
      actor_user_id: user.id,
    });
    await audit(trx, user, user.organisationId, "override.create", "override", id, {
      order: order.number,
      rule: input.rule,
      workerId: input.workerId,
      reason: input.reason,
      finding: f.message,
    });
    await boardEvent(trx, { organisationId: user.organisationId, yardId: order.yard_id, day: order.work_date, kind: "override", payload: { orderId: order.id } });
    return { id, finding: f };
  }), "override");
}

/** An order's overrides that have not lapsed (rule and worker). */
export async function liveOverrides(db: Knex, orderId: number): Promise<{ rule: string; worker_id: number | null }[]> {
  return db("overrides").where({ work_order_id: orderId }).whereNull("lapsed_at").select("rule", "worker_id");
}
