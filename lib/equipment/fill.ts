// Fill open positions, trucks (issue 16): before the people are solved, each order the fill
// staffs whose work type needs a truck (bucket → bucket truck, digger_derrick → digger derrick)
// and has none gets an in-service truck of its own yard that the crew rules accept for it
// (EQUIPMENT: insulated and dielectric-tested for an aerial device on energized work) and that
// is on no overlapping order — neither a booked one nor another proposal of this fill. The
// choice goes into the fill's snapshot, so the people's solve sees the order with its truck
// (the driver's licence class follows the truck). A linear pass, well inside the time limit.
import { findingsForOrders } from "@/lib/rules/engine";
import type { DaySnapshot, WorkOrder } from "@/lib/rules/types";
import { REQUIRED_KIND, type Equipment, type EquipmentKind } from "./model";

export interface TruckProposal {
  orderId: string;
  equipmentId: string;
  unitNumber: string;
  name: string;
  kind: EquipmentKind;
  reason: string;
}

/** A booking that keeps a truck busy (epoch ms), from the database. */
export interface Busy {
  equipmentId: number;
  orderId: number;
  start: number;
  end: number;
}

/** The engine's own verdict on one truck for one order (EQUIPMENT only), on a one-order snapshot. */
function acceptedByRules(base: DaySnapshot, order: WorkOrder, e: Equipment): boolean {
  const snap: DaySnapshot = {
    timezone: base.timezone,
    policy: base.policy,
    workers: [],
    workOrders: [order],
    assignments: [],
    equipment: [{ id: String(e.id), name: `${e.unitNumber} ${e.name}`, kind: e.kind, insulated: e.insulated, dielectricTestedOn: e.dielectricTestedOn, licence: e.licence }],
    equipmentAssignments: [{ workOrderId: order.id, equipmentId: String(e.id) }],
  };
  return !findingsForOrders(snap, [order.id]).some((f) => f.rule === "EQUIPMENT" || f.rule === "EQUIPMENT_BOOKED");
}

export function proposeTrucks(input: {
  snapshot: DaySnapshot;
  /** The orders the fill staffs: id, yard and priority (1 highest). */
  orders: { id: string; yardId: string; priority: number; number: string }[];
  equipment: Equipment[];
  busy: Busy[];
}): TruckProposal[] {
  const ruleOrder = new Map(input.snapshot.workOrders.map((o) => [o.id, o]));
  const kindOf = new Map(input.equipment.map((e) => [e.id, e.kind]));
  const taken: Busy[] = [...input.busy];
  const out: TruckProposal[] = [];
  const orders = [...input.orders].sort((a, b) => a.priority - b.priority || a.number.localeCompare(b.number));
  for (const fo of orders) {
    const o = ruleOrder.get(fo.id);
    if (!o) continue;
    const need = REQUIRED_KIND[o.workType];
    if (!need) continue;
    const has = taken.some((b) => String(b.orderId) === o.id && kindOf.get(b.equipmentId) === need);
    if (has) continue;
    const free = (e: Equipment) => !taken.some((b) => b.equipmentId === e.id && String(b.orderId) !== o.id && b.start < o.end && b.end > o.start);
    const pick = input.equipment
      .filter((e) => e.kind === need && !e.outOfService && String(e.yardId) === fo.yardId && free(e))
      .sort((a, b) => a.unitNumber.localeCompare(b.unitNumber))
      .find((e) => acceptedByRules(input.snapshot, o, e));
    if (!pick) continue;
    taken.push({ equipmentId: pick.id, orderId: Number(o.id), start: o.start, end: o.end });
    out.push({
      orderId: o.id,
      equipmentId: String(pick.id),
      unitNumber: pick.unitNumber,
      name: pick.name,
      kind: pick.kind,
      reason: `${pick.unitNumber} is free all day${pick.insulated ? ", insulated" : ""}${pick.dielectricTestedOn ? `, dielectric-tested ${pick.dielectricTestedOn}` : ""}`,
    });
  }
  return out;
}

/** The proposals added to a snapshot's equipment assignments (a new snapshot; the input is left as it is). */
export function withTrucks(snapshot: DaySnapshot, trucks: TruckProposal[]): DaySnapshot {
  if (!trucks.length) return snapshot;
  return {
    ...snapshot,
    equipmentAssignments: [...(snapshot.equipmentAssignments ?? []), ...trucks.map((t) => ({ workOrderId: t.orderId, equipmentId: t.equipmentId }))],
  };
}
