// The equipment part of a rule snapshot (server side). Kept apart from ./board.ts so that
// lib/board/data.ts can import it without an import cycle.
import "@/lib/server-only";
import type { Knex } from "knex";
import type { DaySnapshot, WorkOrder } from "@/lib/rules/types";
import { equipmentForSnapshot, listEquipment, type EquipmentBooking } from "./data";
import type { Equipment } from "./model";

type Q = Knex | Knex.Transaction;

/**
 * Adds the contract's `equipment` and `equipmentAssignments` to a snapshot (CREW-CHECK.md,
 * "Equipment, gear and field figures"): every piece of the organisation's equipment, the
 * bookings on the snapshot's orders, and the same trucks' bookings on other orders near the
 * window, whose orders join `workOrders` (so EQUIPMENT_BOOKED sees across yards and days).
 * Returns the same snapshot object.
 */
export async function attachEquipment<S extends DaySnapshot>(
  db: Q,
  organisationId: number,
  orderIds: number[],
  from: Date,
  to: Date,
  snapshot: S,
  loadOrders: (ids: number[]) => Promise<WorkOrder[]>,
): Promise<S> {
  const eq = await equipmentForSnapshot(db, organisationId, orderIds, { from, to });
  const have = new Set(snapshot.workOrders.map((o) => o.id));
  const missing = eq.contextOrderIds.filter((id) => !have.has(String(id)));
  if (missing.length) snapshot.workOrders.push(...(await loadOrders(missing)));
  snapshot.equipment = eq.equipment.map((e) => ({
    id: e.id,
    name: e.name,
    kind: e.kind,
    insulated: e.insulated,
    dielectricTestedOn: e.dielectricTestedOn ?? null,
    licence: e.licence ?? null,
  }));
  snapshot.equipmentAssignments = eq.equipmentAssignments;
  return snapshot;
}


export interface BoardEquipment {
  /** Every piece of the organisation's equipment (the pool filters by yard and kind). */
  equipment: Equipment[];
  /** Bookings on this board's orders. */
  equipmentBookings: EquipmentBooking[];
}

export async function boardEquipment(db: Q, organisationId: number, orderIds: number[]): Promise<BoardEquipment> {
  const [equipment, rows] = await Promise.all([
    listEquipment(db, organisationId),
    orderIds.length ? db("equipment_assignments").whereIn("work_order_id", orderIds).orderBy("id").select("id", "work_order_id", "equipment_id", "version") : [],
  ]);
  return {
    equipment,
    equipmentBookings: (rows as Record<string, number>[]).map((r) => ({
      id: Number(r.id),
      workOrderId: Number(r.work_order_id),
      equipmentId: Number(r.equipment_id),
      version: Number(r.version),
    })),
  };
}

