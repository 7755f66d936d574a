// The server's re-check after an equipment booking (server side).
import "@/lib/server-only";
import type { Knex } from "knex";
import { findingsAfter } from "@/lib/assignments/data";

/** The server's re-check after an equipment write: the touched orders and the truck's other orders near them. */
export async function findingsAfterEquipment(db: Knex, organisationId: number, orderIds: number[], equipmentIds: number[]) {
  const others = equipmentIds.length
    ? ((await db("equipment_assignments as ea")
        .join("work_orders as o", "o.id", "ea.work_order_id")
        .join("work_orders as t", (j) => j.on("t.start_at", "<", "o.end_at").andOn("t.end_at", ">", "o.start_at"))
        .whereIn("ea.equipment_id", equipmentIds)
        .whereIn("t.id", orderIds)
        .whereNot("o.status", "cancelled")
        .distinct("o.id")
        .pluck("o.id")) as number[])
    : [];
  return findingsAfter(db, organisationId, [...new Set([...orderIds, ...others])], []);
}
