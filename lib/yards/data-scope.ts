import "@/lib/server-only";
import type { Knex } from "knex";

// Which yard a record belongs to, for the yard scope (lib/auth/yard-scope.ts). Each lookup is
// scoped to the organisation; an id of another organisation or none at all yields no yard.

export interface YardRefs {
  yardId?: number | null;
  yardCode?: string | null;
  orderId?: number | null;
  positionId?: number | null;
  assignmentId?: number | null;
  workerId?: number | null;
  rotationId?: number | null;
  seriesId?: number | null;
  timeRecordId?: number | null;
  inboundMessageId?: number | null;
  /** A truck or other unit of the equipment register (its home yard). */
  equipmentId?: number | null;
  /** A booking of equipment on an order (the order's yard). */
  equipmentAssignmentId?: number | null;
}

/** The yard ids of the given records (the yard itself, by code, of an order, a position, …). */
export async function yardIdsOfRecords(q: Knex, org: number, r: YardRefs): Promise<number[]> {
  const out: (number | null | undefined)[] = [r.yardId];
  const one = async (p: Promise<{ yard_id?: number | null } | undefined>) => out.push((await p)?.yard_id ?? null);
  if (r.yardCode) await one(q("yards").where({ organisation_id: org }).whereRaw("LOWER(code) = ?", [r.yardCode.toLowerCase()]).first("id as yard_id"));
  if (r.orderId) await one(q("work_orders").where({ id: r.orderId, organisation_id: org }).first("yard_id"));
  if (r.positionId)
    await one(q("positions as p").join("work_orders as o", "o.id", "p.work_order_id").where({ "p.id": r.positionId, "o.organisation_id": org }).first("o.yard_id"));
  if (r.assignmentId)
    await one(q("assignments as a").join("work_orders as o", "o.id", "a.work_order_id").where({ "a.id": r.assignmentId, "o.organisation_id": org }).first("o.yard_id"));
  if (r.workerId) await one(q("workers").where({ id: r.workerId, organisation_id: org }).first("yard_id"));
  if (r.rotationId) await one(q("rotations").where({ id: r.rotationId, organisation_id: org }).first("yard_id"));
  if (r.seriesId) await one(q("order_series").where({ id: r.seriesId, organisation_id: org }).first("yard_id"));
  if (r.timeRecordId)
    await one(q("time_records as t").join("workers as w", "w.id", "t.worker_id").where({ "t.id": r.timeRecordId, "w.organisation_id": org }).first("w.yard_id"));
  if (r.inboundMessageId)
    await one(q("inbound_messages as m").join("workers as w", "w.id", "m.worker_id").where({ "m.id": r.inboundMessageId, "w.organisation_id": org }).first("w.yard_id"));
  if (r.equipmentId) await one(q("equipment").where({ id: r.equipmentId, organisation_id: org }).first("yard_id"));
  if (r.equipmentAssignmentId)
    await one(q("equipment_assignments as e").join("work_orders as o", "o.id", "e.work_order_id").where({ "e.id": r.equipmentAssignmentId, "o.organisation_id": org }).first("o.yard_id"));
  return out.filter((v): v is number => v !== null && v !== undefined).map(Number);
}
