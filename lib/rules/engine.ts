// The crew rules engine: a full check of a day, and an incremental engine for the board that
// re-evaluates only the orders a change can affect.

import { climbCert } from "./climb-cert";
import type { RuleCheck } from "./common";
import { crewMin } from "./crew-min";
import { doubleBooked } from "./double-booked";
import { equipmentRule } from "./equipment";
import { equipmentBooked } from "./equipment-booked";
import { firstAid } from "./first-aid";
import { inCharge } from "./in-charge";
import { locate } from "./locate";
import { observer } from "./observer";
import { operatorCert } from "./operator-cert";
import { qualified } from "./qualified";
import { rescue } from "./rescue";
import { rest } from "./rest";
import { rigging } from "./rigging";
import { rubberGoods } from "./rubber-goods";
import { SnapshotIndex } from "./snapshot-index";
import { applyEquipmentChange, isEquipmentChange, type EquipmentChange } from "./equipment-index";
import type { Assignment, DaySnapshot, Finding, Policy, RuleCode, WorkOrder } from "./types";
import { unavailable } from "./unavailable";

export { SnapshotIndex } from "./snapshot-index";
export type { EquipmentChange } from "./equipment-index";

export const RULES: ReadonlyArray<{ code: RuleCode; check: RuleCheck }> = [
  { code: "CREW_MIN", check: crewMin },
  { code: "OBSERVER", check: observer },
  { code: "RESCUE", check: rescue },
  { code: "CLIMB_CERT", check: climbCert },
  { code: "FIRST_AID", check: firstAid },
  { code: "QUALIFIED", check: qualified },
  { code: "OPERATOR_CERT", check: operatorCert },
  { code: "REST", check: rest },
  { code: "IN_CHARGE", check: inCharge },
  { code: "DOUBLE_BOOKED", check: doubleBooked },
  { code: "UNAVAILABLE", check: unavailable },
  { code: "RUBBER_GOODS", check: rubberGoods },
  { code: "EQUIPMENT", check: equipmentRule },
  { code: "EQUIPMENT_BOOKED", check: equipmentBooked },
  { code: "RIGGING", check: rigging },
  { code: "LOCATE", check: locate },
];

/** One drop on the board. A move is a remove of `from` plus an add of `to` (same or another worker/order). */
export type AssignmentChange =
  | { kind: "add"; assignment: Assignment }
  | { kind: "remove"; assignment: Assignment }
  | { kind: "move"; from: Assignment; to: Assignment }
  | EquipmentChange;

const cmp = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

/**
 * Output order: work order, then rule code, then worker (null first), all by plain string
 * comparison (not localeCompare, so it is the same in every locale); the message breaks the
 * remaining ties (two CREW_MIN requirements on one order) so the order is total.
 */
export function compareFindings(a: Finding, b: Finding): number {
  return (
    cmp(a.workOrderId, b.workOrderId) ||
    cmp(a.rule, b.rule) ||
    (a.workerId === b.workerId ? 0 : a.workerId === null ? -1 : b.workerId === null ? 1 : cmp(a.workerId, b.workerId)) ||
    cmp(a.message, b.message)
  );
}

/**
 * Policy levels may raise a rule to block; a lower level is ignored. The raised level is a
 * floor for every finding of the rule (so CLIMB_CERT: block also blocks the warning window and
 * CREW_MIN: block ignores the exceptions). Locked findings are always block.
 */
function applyLevel(f: Finding, policy: Policy): Finding {
  if (f.level === "block") return f;
  if (f.locked || policy.levels?.[f.rule] === "block") return { ...f, level: "block" };
  return f;
}

/** Findings of the given orders, grouped per order and sorted within each. */
function evaluate(ix: SnapshotIndex, orders: readonly WorkOrder[]): Map<string, Finding[]> {
  const byOrder = new Map<string, Finding[]>();
  for (const o of orders) byOrder.set(o.id, []);
  for (const rule of RULES) {
    for (const f of rule.check(orders, ix)) byOrder.get(f.workOrderId)!.push(applyLevel(f, ix.policy));
  }
  for (const list of byOrder.values()) list.sort(compareFindings);
  return byOrder;
}

function resolveOrders(ix: SnapshotIndex, orderIds: Iterable<string>): WorkOrder[] {
  const out: WorkOrder[] = [];
  for (const id of new Set(orderIds)) {
    const o = ix.orders.get(id);
    if (o) out.push(o);
  }
  return out.sort((a, b) => cmp(a.id, b.id));
}

function flatten(ix: SnapshotIndex, byOrder: Map<string, Finding[]>): Finding[] {
  const out: Finding[] = [];
  for (const id of ix.orderIds) {
    const list = byOrder.get(id);
    if (list) for (const f of list) out.push(f);
  }
  return out;
}

/** Findings for some orders only (unknown ids are ignored), sorted. */
export function findingsForOrders(source: DaySnapshot | SnapshotIndex, orderIds: Iterable<string>): Finding[] {
  const ix = source instanceof SnapshotIndex ? source : new SnapshotIndex(source);
  return flatten(ix, evaluate(ix, resolveOrders(ix, orderIds)));
}

/** Every finding of the day, sorted (see compareFindings). */
export function checkDay(snapshot: DaySnapshot): Finding[] {
  const ix = new SnapshotIndex(snapshot);
  return flatten(ix, evaluate(ix, [...ix.orders.values()]));
}

export interface RuleEngine {
  /** The current findings, sorted. */
  findings(): Finding[];
  /** Current findings of one order, sorted. */
  findingsFor(orderId: string): Finding[];
  /** Applies one change and returns the new full sorted findings. */
  apply(change: AssignmentChange): Finding[];
  /** The snapshot after the applied changes: a fresh assignments array; workers and orders are shared, read-only. */
  snapshot(): DaySnapshot;
  readonly index: SnapshotIndex;
}

/**
 * An engine holding a day's findings. apply() re-evaluates only the touched orders and the
 * other orders of the touched workers (before and after the change), because REST,
 * DOUBLE_BOOKED and UNAVAILABLE look across a worker's orders; every other rule reads one order.
 * The input snapshot is not mutated.
 */
export function createEngine(snapshot: DaySnapshot): RuleEngine {
  const ix = new SnapshotIndex(snapshot);
  const byOrder = evaluate(ix, [...ix.orders.values()]);
  let current = flatten(ix, byOrder);

  const check = (a: Assignment) => {
    if (!ix.orders.has(a.workOrderId)) throw new Error(`unknown work order ${JSON.stringify(a.workOrderId)}`);
    if (!ix.workers.has(a.workerId)) throw new Error(`unknown worker ${JSON.stringify(a.workerId)}`);
  };

  return {
    index: ix,
    findings: () => current.slice(),
    findingsFor: (orderId) => (byOrder.get(orderId) ?? []).slice(),
    snapshot: () => ({
      timezone: snapshot.timezone,
      policy: snapshot.policy,
      workers: snapshot.workers,
      workOrders: snapshot.workOrders,
      assignments: ix.allAssignments(),
      ...(snapshot.equipment !== undefined
        ? { equipment: snapshot.equipment, equipmentAssignments: ix.equipment.all(ix.orderIds) }
        : {}),
    }),
    apply(change) {
      if (isEquipmentChange(change)) {
        const affected = applyEquipmentChange(ix.equipment, ix.orders, change);
        for (const [id, list] of evaluate(ix, resolveOrders(ix, affected))) byOrder.set(id, list);
        current = flatten(ix, byOrder);
        return current.slice();
      }
      const touched = change.kind === "move" ? [change.from, change.to] : [change.assignment];
      for (const a of touched) check(a);
      const affected = new Set<string>();
      const note = () => {
        for (const a of touched) {
          affected.add(a.workOrderId);
          for (const id of ix.orderIdsOf(a.workerId)) affected.add(id);
        }
      };
      note();
      if (change.kind === "add") ix.add(change.assignment);
      else if (change.kind === "remove") ix.remove(change.assignment);
      else if (ix.remove(change.from)) ix.add(change.to);
      note();
      for (const [id, list] of evaluate(ix, resolveOrders(ix, affected))) byOrder.set(id, list);
      current = flatten(ix, byOrder);
      return current.slice();
    },
  };
}
