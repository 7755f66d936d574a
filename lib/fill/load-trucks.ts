// Trucks for Fill open positions (server side): the equipment and the bookings near the day,
// then the pure choice in ./fill.ts.
import type { Knex } from "knex";
import type { FillProblem } from "@/lib/fill/types";
import { listEquipment } from "@/lib/equipment/data";
import { proposeTrucks, withTrucks, type TruckProposal } from "@/lib/equipment/fill";

export async function fillTrucks(db: Knex, organisationId: number, problem: FillProblem): Promise<{ problem: FillProblem; trucks: TruckProposal[] }> {
  const ids = new Set(problem.orders.map((o) => o.id));
  const ruleOrders = problem.snapshot.workOrders.filter((o) => ids.has(o.id));
  if (!ruleOrders.length) return { problem, trucks: [] };
  const from = new Date(Math.min(...ruleOrders.map((o) => o.start)));
  const to = new Date(Math.max(...ruleOrders.map((o) => o.end)));
  const [equipment, rows] = await Promise.all([
    listEquipment(db, organisationId, { inService: true, withRigging: false }),
    db("equipment_assignments as ea")
      .join("work_orders as o", "o.id", "ea.work_order_id")
      .join("equipment as e", "e.id", "ea.equipment_id")
      .where("e.organisation_id", organisationId)
      .whereNot("o.status", "cancelled")
      .where("o.start_at", "<", to)
      .where("o.end_at", ">", from)
      .select("ea.equipment_id", "ea.work_order_id", "o.start_at", "o.end_at"),
  ]);
  const trucks = proposeTrucks({
    snapshot: problem.snapshot,
    orders: problem.orders.map((o) => ({ id: o.id, yardId: o.yardId, priority: o.priority, number: o.number })),
    equipment,
    busy: rows.map((r: Record<string, any>) => ({
      equipmentId: Number(r.equipment_id),
      orderId: Number(r.work_order_id),
      start: new Date(r.start_at).getTime(),
      end: new Date(r.end_at).getTime(),
    })),
  });
  return { problem: { ...problem, snapshot: withTrucks(problem.snapshot, trucks) }, trucks };
}
