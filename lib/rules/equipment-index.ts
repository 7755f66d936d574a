// The equipment side of a snapshot, indexed for the rules: which pieces sit on which order and
// which orders each piece is on. Like the people's assignments, only the equipment assignments
// change after construction (the board's drops). Pure, no I/O.

import type { DaySnapshot, Equipment, EquipmentAssignment } from "./types";

const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

export class EquipmentIndex {
  /** False when the snapshot has no `equipment` field: EQUIPMENT and EQUIPMENT_BOOKED then stay silent. */
  readonly tracked: boolean;
  readonly equipment = new Map<string, Equipment>();
  /** orderId -> equipment ids (insertion order, distinct). */
  private readonly byOrder = new Map<string, string[]>();
  /** equipmentId -> order ids (distinct). */
  private readonly byEquipment = new Map<string, Set<string>>();

  constructor(snapshot: Pick<DaySnapshot, "equipment" | "equipmentAssignments" | "workOrders">) {
    this.tracked = snapshot.equipment !== undefined;
    for (const e of snapshot.equipment ?? []) this.equipment.set(e.id, e);
    const orderIds = new Set(snapshot.workOrders.map((o) => o.id));
    for (const a of snapshot.equipmentAssignments ?? []) {
      // The input parser rejects dangling references; the index tolerates them by skipping.
      if (orderIds.has(a.workOrderId) && this.equipment.has(a.equipmentId)) this.add(a);
    }
  }

  /** Adds an assignment; false when the piece was already on the order (nothing changes). */
  add(a: EquipmentAssignment): boolean {
    let list = this.byOrder.get(a.workOrderId);
    if (!list) this.byOrder.set(a.workOrderId, (list = []));
    if (list.includes(a.equipmentId)) return false;
    list.push(a.equipmentId);
    let orders = this.byEquipment.get(a.equipmentId);
    if (!orders) this.byEquipment.set(a.equipmentId, (orders = new Set()));
    orders.add(a.workOrderId);
    return true;
  }

  /** Removes an assignment; false when there was none. */
  remove(a: EquipmentAssignment): boolean {
    const list = this.byOrder.get(a.workOrderId);
    const i = list?.indexOf(a.equipmentId) ?? -1;
    if (!list || i < 0) return false;
    list.splice(i, 1);
    this.byEquipment.get(a.equipmentId)?.delete(a.workOrderId);
    return true;
  }

  /** The pieces on an order, in assignment order. */
  of(orderId: string): Equipment[] {
    return (this.byOrder.get(orderId) ?? []).map((id) => this.equipment.get(id)!);
  }

  /** Ids of the orders a piece is on. */
  orderIdsOf(equipmentId: string): string[] {
    return [...(this.byEquipment.get(equipmentId) ?? [])];
  }

  /** Every current assignment, by order id then assignment order. */
  all(orderIds?: readonly string[]): EquipmentAssignment[] {
    const ids = orderIds ?? [...this.byOrder.keys()].sort(cmp);
    const out: EquipmentAssignment[] = [];
    for (const id of ids) for (const e of this.byOrder.get(id) ?? []) out.push({ workOrderId: id, equipmentId: e });
    return out;
  }
}

/** One equipment drop on the board. A move is a remove of `from` plus an add of `to`. */
export type EquipmentChange =
  | { kind: "add_equipment"; assignment: EquipmentAssignment }
  | { kind: "remove_equipment"; assignment: EquipmentAssignment }
  | { kind: "move_equipment"; from: EquipmentAssignment; to: EquipmentAssignment };

export function isEquipmentChange(change: { kind: string }): change is EquipmentChange {
  return change.kind === "add_equipment" || change.kind === "remove_equipment" || change.kind === "move_equipment";
}

/**
 * Applies an equipment change to the index and returns the orders whose findings it can
 * change: the touched orders and every other order the touched pieces are on, before and
 * after (EQUIPMENT_BOOKED looks across a piece's orders; EQUIPMENT, OPERATOR_CERT's licence and
 * the rest read one order). Throws on an unknown order or piece, like the people's drops.
 */
export function applyEquipmentChange(eq: EquipmentIndex, orderIds: ReadonlySet<string> | ReadonlyMap<string, unknown>, change: EquipmentChange): Set<string> {
  const touched = change.kind === "move_equipment" ? [change.from, change.to] : [change.assignment];
  for (const a of touched) {
    if (!orderIds.has(a.workOrderId)) throw new Error(`unknown work order ${JSON.stringify(a.workOrderId)}`);
    if (!eq.equipment.has(a.equipmentId)) throw new Error(`unknown equipment ${JSON.stringify(a.equipmentId)}`);
  }
  const affected = new Set<string>();
  const note = () => {
    for (const a of touched) {
      affected.add(a.workOrderId);
      for (const id of eq.orderIdsOf(a.equipmentId)) affected.add(id);
    }
  };
  note();
  if (change.kind === "add_equipment") eq.add(change.assignment);
  else if (change.kind === "remove_equipment") eq.remove(change.assignment);
  else if (eq.remove(change.from)) eq.add(change.to);
  note();
  return affected;
}
