// Who may sit where: for each open seat and each pool worker, place the worker alone (one add
// on the rule engine's own index), read the findings the engine's rules give that worker on
// that order, and take the add back. A worker is eligible when none of the per-worker rules
// blocks: CLIMB_CERT, QUALIFIED, OPERATOR_CERT, REST, UNAVAILABLE, DOUBLE_BOOKED (against the
// orders they are already on). Crew-level rules (CREW_MIN, FIRST_AID, RESCUE, OBSERVER) are
// the model's job.
//
// This is what engine.apply({kind: "add"}) then apply({kind: "remove"}) computes for that
// worker, without re-sorting the whole day's findings each time: the same rule functions
// (RULES from lib/rules/engine) on the same SnapshotIndex. It is fast because the per-worker
// rules read only a few facts of the order: the position rules the worker, the position, the
// start date, whether it is energized work and the licence class; the time rules the worker
// and the order's start and end. Results are cached on those keys, so a day with 400 orders
// costs a few probes per worker and time window, not one per seat.

import { RULES, SnapshotIndex } from "@/lib/rules/engine";
import { energizedAtLeast, ENERGIZED_WORK_KV } from "@/lib/rules/common";
import { orderLastDay } from "@/lib/rules/snapshot-index";
import { requiredLicenceOf } from "@/lib/rules/equipment";
import { EquipmentIndex } from "@/lib/rules/equipment-index";
import type { Assignment, DaySnapshot, EquipmentAssignment, Finding, Licence, Policy, Position, RuleCode, WorkOrder } from "@/lib/rules/types";

// RUBBER_GOODS is per worker too: a climber, aerial or lead seat on energized work needs gloves
// rated for the order's voltage and in test through its last day (issue 16), so Fill never
// proposes someone without them when gear is tracked.
export const POSITION_RULES: RuleCode[] = ["CLIMB_CERT", "QUALIFIED", "OPERATOR_CERT", "RUBBER_GOODS"];
export const TIME_RULES: RuleCode[] = ["UNAVAILABLE", "REST", "DOUBLE_BOOKED"];
/** The order exclusions are reported in: the lasting reasons first. */
export const PER_WORKER_RULES: RuleCode[] = [...POSITION_RULES, ...TIME_RULES];

const positionChecks = RULES.filter((r) => POSITION_RULES.includes(r.code));
const timeChecks = RULES.filter((r) => TIME_RULES.includes(r.code));

/** The engine's level floor (policy may raise a rule to block; locked findings always block). */
export function isBlock(f: Finding, policy: Policy): boolean {
  return f.level === "block" || Boolean(f.locked) || policy.levels?.[f.rule] === "block";
}

/**
 * Cache key parts of an order: what the position rules read (credentials must hold from the
 * first day to the last, CREW-CHECK.md Corrections 6, so both days are in the key).
 */
export function positionKey(order: WorkOrder, tz?: string, licence: Licence | null = order.driverLicence ?? "cdl_b"): string {
  const last = tz ? orderLastDay(order, tz) : order.endDate;
  // The voltage picks the glove class (RUBBER_GOODS); the licence is what the order's equipment
  // needs when the day tracks equipment (OPERATOR_CERT), else the order's own.
  return `${order.startDate}|${last}|${energizedAtLeast(order, ENERGIZED_WORK_KV) ? 1 : 0}|${licence ?? "none"}|${order.voltageKv}`;
}
export function timeKey(order: WorkOrder): string {
  return `${order.start}|${order.end}`;
}

const EMPTY: Finding[] = [];

/**
 * Probes run on crew-less copies of the orders (one per distinct time window and per distinct
 * date/energized/licence combination) added to a private SnapshotIndex of the day, so a probe
 * sees the worker's own orders, records and leave and nobody else's findings. The copies carry
 * the same start, end, date, work type, voltage and licence class as the orders they stand for.
 */
export class EligibilityProbe {
  readonly ix: SnapshotIndex;
  private readonly posOrder = new Map<string, WorkOrder>();
  private readonly timeOrder = new Map<string, WorkOrder>();
  private readonly posCache = new Map<string, Finding[]>();
  private readonly timeCache = new Map<string, Finding[]>();
  probes = 0;

  private readonly equipment: EquipmentIndex;
  private readonly timezone: string;

  constructor(snapshot: DaySnapshot, orders: readonly WorkOrder[]) {
    const copies: WorkOrder[] = [];
    this.timezone = snapshot.timezone;
    this.equipment = new EquipmentIndex(snapshot);
    // A position copy carries its order's equipment, so the driver's licence reads the same.
    const copyEquipment: EquipmentAssignment[] = [];
    for (const o of orders) {
      const pk = this.keyOf(o);
      if (!this.posOrder.has(pk)) {
        const copy = { ...o, id: `\u0000probe:p:${this.posOrder.size}` };
        this.posOrder.set(pk, copy);
        copies.push(copy);
        for (const e of this.equipment.of(o.id)) copyEquipment.push({ workOrderId: copy.id, equipmentId: e.id });
      }
      const tk = timeKey(o);
      if (!this.timeOrder.has(tk)) {
        const copy = { ...o, id: `\u0000probe:t:${this.timeOrder.size}` };
        this.timeOrder.set(tk, copy);
        copies.push(copy);
      }
    }
    this.ix = new SnapshotIndex({
      ...snapshot,
      workOrders: [...snapshot.workOrders, ...copies],
      ...(snapshot.equipment !== undefined ? { equipmentAssignments: [...(snapshot.equipmentAssignments ?? []), ...copyEquipment] } : {}),
    });
  }

  private readonly keys = new WeakMap<WorkOrder, string>();

  /**
   * The position-cache key of an order (its dates, energized, voltage and the driver's licence
   * it needs); remembered per order object (the last day is a time-zone conversion, not free).
   */
  keyOf(order: WorkOrder): string {
    let k = this.keys.get(order);
    if (k === undefined) this.keys.set(order, (k = positionKey(order, this.timezone, requiredLicenceOf(order, this.equipment))));
    return k;
  }

  private run(checks: typeof RULES, order: WorkOrder, a: Assignment, keep: (f: Finding) => boolean): Finding[] {
    this.probes++;
    this.ix.add(a);
    let out: Finding[] = EMPTY;
    try {
      for (const r of checks) {
        for (const f of r.check([order], this.ix)) {
          if (f.workerId === a.workerId && keep(f)) {
            if (out === EMPTY) out = [];
            out.push(f);
          }
        }
      }
    } finally {
      this.ix.remove(a);
    }
    return out;
  }

  /** Blocks of CLIMB_CERT, QUALIFIED and OPERATOR_CERT for the worker alone in the position on an order like this one. */
  positionBlocks(workerId: string, order: WorkOrder, position: Position, key = this.keyOf(order)): Finding[] {
    const k = `${workerId}|${position}|${key}`;
    let hit = this.posCache.get(k);
    if (hit) return hit;
    const worker = this.ix.workers.get(workerId);
    const probe = this.posOrder.get(key);
    if (!worker || !probe) return EMPTY;
    const policy = this.ix.policy;
    // An apprentice climbing or in the bucket needs a journeyman or crew lead beside them: a crew
    // condition the model states itself, so the unsupervised-apprentice QUALIFIED finding is not
    // an exclusion.
    const supervisedLater = worker.classification === "apprentice" && (position === "climber" || position === "aerial");
    hit = this.run(positionChecks, probe, { workOrderId: probe.id, workerId, position }, (f) => isBlock(f, policy) && !(supervisedLater && f.rule === "QUALIFIED"));
    this.posCache.set(k, hit);
    return hit;
  }

  /**
   * Blocks of UNAVAILABLE, REST and DOUBLE_BOOKED for the worker added to an order at this
   * order's time. Only meaningful for a worker not already on the order itself.
   */
  timeBlocks(workerId: string, order: WorkOrder, key = timeKey(order)): Finding[] {
    const k = `${workerId}|${key}`;
    let hit = this.timeCache.get(k);
    if (hit) return hit;
    const probe = this.timeOrder.get(key);
    if (!this.ix.workers.has(workerId) || !probe) return EMPTY;
    const policy = this.ix.policy;
    // The position does not matter to the time rules; "ground" raises nothing else.
    hit = this.run(timeChecks, probe, { workOrderId: probe.id, workerId, position: "ground" }, (f) => isBlock(f, policy));
    this.timeCache.set(k, hit);
    return hit;
  }

  /** Every per-worker block for the worker alone in the position on the order. */
  blocks(workerId: string, order: WorkOrder, position: Position): Finding[] {
    const p = this.positionBlocks(workerId, order, position);
    const t = this.timeBlocks(workerId, order);
    return p.length || t.length ? [...p, ...t] : EMPTY;
  }
}

export interface Exclusion {
  rules: RuleCode[];
  findings: Finding[];
}

/** The exclusion in report order, one finding per rule. */
export function exclusionOf(findings: readonly Finding[]): Exclusion | null {
  if (!findings.length) return null;
  const byRule = new Map<RuleCode, Finding>();
  for (const f of findings) if (!byRule.has(f.rule)) byRule.set(f.rule, f);
  const rules = PER_WORKER_RULES.filter((r) => byRule.has(r));
  return { rules, findings: rules.map((r) => byRule.get(r)!) };
}
