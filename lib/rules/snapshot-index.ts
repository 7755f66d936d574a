// An indexed, mutable view of a DaySnapshot for the rules. Everything a rule looks up is a map
// hit or a binary search; nothing loops over workers x orders. Only assignments change after
// construction (the board's drops), so per-worker caches (credentials, rest stretches) stay
// valid and only the per-order crew cache is invalidated.

import { epochToZonedDate } from "./time";
import type { Assignment, DaySnapshot, Policy, Position, Worker, WorkOrder } from "./types";
import { EquipmentIndex } from "./equipment-index";

export interface Crew {
  order: WorkOrder;
  /** Distinct people on the order, sorted by id: one person counts once on site. */
  people: Worker[];
  /** Positions each person holds on this order. */
  positionsOf: Map<string, Set<Position>>;
  /** Distinct holders of each position, sorted by id. */
  holders: Map<Position, Worker[]>;
}

/** Time records merged into stretches of worked time (gaps shorter than the minimum rest joined). */
export interface Stretches {
  starts: number[];
  ends: number[];
}

interface WorkerCache {
  credentials?: Map<string, string | null>;
  stretches?: Stretches;
}

const byId = <T extends { id: string }>(a: T, b: T) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

export class SnapshotIndex {
  readonly timezone: string;
  readonly policy: Policy;
  readonly workers = new Map<string, Worker>();
  readonly orders = new Map<string, WorkOrder>();
  /** Order ids in plain string order: the output order of findings. */
  readonly orderIds: string[];
  private readonly byOrder = new Map<string, Assignment[]>();
  /** workerId -> orderId -> number of assignments (positions) the worker holds there. */
  private readonly byWorker = new Map<string, Map<string, number>>();
  private readonly crews = new Map<string, Crew>();
  private readonly workerCache = new Map<string, WorkerCache>();
  /** The day's equipment and equipment assignments (RULES-B: equipment, gear and field figures). */
  readonly equipment: EquipmentIndex;
  private readonly lastDays = new WeakMap<WorkOrder, string>();

  constructor(snapshot: DaySnapshot) {
    this.timezone = snapshot.timezone;
    this.policy = snapshot.policy;
    for (const w of snapshot.workers) this.workers.set(w.id, w);
    for (const o of snapshot.workOrders) this.orders.set(o.id, o);
    this.orderIds = [...this.orders.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    this.equipment = new EquipmentIndex(snapshot);
    for (const a of snapshot.assignments) {
      // The input parser rejects dangling references; the engine tolerates them by skipping.
      if (this.orders.has(a.workOrderId) && this.workers.has(a.workerId)) this.add(a);
    }
  }

  has(a: Pick<Assignment, "workOrderId" | "workerId">): boolean {
    return this.orders.has(a.workOrderId) && this.workers.has(a.workerId);
  }

  add(a: Assignment): void {
    let list = this.byOrder.get(a.workOrderId);
    if (!list) this.byOrder.set(a.workOrderId, (list = []));
    list.push({ workOrderId: a.workOrderId, workerId: a.workerId, position: a.position });
    let orders = this.byWorker.get(a.workerId);
    if (!orders) this.byWorker.set(a.workerId, (orders = new Map()));
    orders.set(a.workOrderId, (orders.get(a.workOrderId) ?? 0) + 1);
    this.crews.delete(a.workOrderId);
  }

  /** Removes one matching assignment; false when there was none. */
  remove(a: Assignment): boolean {
    const list = this.byOrder.get(a.workOrderId);
    const i = list?.findIndex((x) => x.workerId === a.workerId && x.position === a.position) ?? -1;
    if (!list || i < 0) return false;
    list.splice(i, 1);
    const orders = this.byWorker.get(a.workerId)!;
    const n = orders.get(a.workOrderId)! - 1;
    if (n === 0) orders.delete(a.workOrderId);
    else orders.set(a.workOrderId, n);
    this.crews.delete(a.workOrderId);
    return true;
  }

  assignmentsOf(orderId: string): readonly Assignment[] {
    return this.byOrder.get(orderId) ?? [];
  }

  /** All current assignments, in order-id then insertion order. */
  allAssignments(): Assignment[] {
    const out: Assignment[] = [];
    for (const id of this.orderIds) for (const a of this.byOrder.get(id) ?? []) out.push({ ...a });
    return out;
  }

  /** Ids of the orders a worker is assigned to. */
  orderIdsOf(workerId: string): string[] {
    const orders = this.byWorker.get(workerId);
    return orders ? [...orders.keys()] : [];
  }

  ordersOf(workerId: string): WorkOrder[] {
    return this.orderIdsOf(workerId).map((id) => this.orders.get(id)!);
  }

  crew(orderId: string): Crew {
    let crew = this.crews.get(orderId);
    if (crew) return crew;
    const positionsOf = new Map<string, Set<Position>>();
    const holderIds = new Map<Position, Set<string>>();
    for (const a of this.assignmentsOf(orderId)) {
      let ps = positionsOf.get(a.workerId);
      if (!ps) positionsOf.set(a.workerId, (ps = new Set()));
      ps.add(a.position);
      let hs = holderIds.get(a.position);
      if (!hs) holderIds.set(a.position, (hs = new Set()));
      hs.add(a.workerId);
    }
    const people = [...positionsOf.keys()].map((id) => this.workers.get(id)!).sort(byId);
    const holders = new Map<Position, Worker[]>();
    for (const [p, ids] of holderIds) holders.set(p, [...ids].map((id) => this.workers.get(id)!).sort(byId));
    crew = { order: this.orders.get(orderId)!, people, positionsOf, holders };
    this.crews.set(orderId, crew);
    return crew;
  }

  private cacheOf(workerId: string): WorkerCache {
    let c = this.workerCache.get(workerId);
    if (!c) this.workerCache.set(workerId, (c = {}));
    return c;
  }

  /**
   * The latest expiry of a credential type the worker holds: null = never expires,
   * undefined = not held at all.
   */
  expiryOf(worker: Worker, type: string): string | null | undefined {
    const cache = this.cacheOf(worker.id);
    if (!cache.credentials) {
      const m = new Map<string, string | null>();
      for (const c of worker.credentials) {
        const prev = m.get(c.type);
        if (prev === null) continue;
        if (c.expiresOn === null || prev === undefined || c.expiresOn > prev) m.set(c.type, c.expiresOn);
      }
      cache.credentials = m;
    }
    return cache.credentials.get(type);
  }

  /** Whether the worker holds the credential valid on date ("YYYY-MM-DD"; expiresOn is the last valid day). */
  holdsOn(worker: Worker, type: string, date: string): boolean {
    const exp = this.expiryOf(worker, type);
    return exp === null || (exp !== undefined && exp >= date);
  }

  /**
   * The order's last day in the snapshot's zone: the date of its last worked instant, so an
   * order ending at midnight ends on the day before (Corrections 6: credentials must be valid
   * on every day the order spans, its last day included).
   */
  lastDay(order: WorkOrder): string {
    let d = this.lastDays.get(order);
    if (d === undefined) {
      d = orderLastDay(order, this.timezone);
      this.lastDays.set(order, d);
    }
    return d;
  }

  /** Whether the worker holds the credential valid on every day of the order (first to last). */
  holdsThrough(worker: Worker, type: string, order: WorkOrder): boolean {
    return this.holdsOn(worker, type, order.startDate) && this.holdsOn(worker, type, this.lastDay(order));
  }

  /** The worker's time records merged with the policy's minimum rest, sorted and disjoint. */
  recordStretches(worker: Worker): Stretches {
    const cache = this.cacheOf(worker.id);
    if (!cache.stretches) {
      const gap = this.policy.minRestHours * 3_600_000;
      let recs = worker.timeRecords;
      for (let i = 1; i < recs.length; i++) {
        if (recs[i].start < recs[i - 1].start) {
          recs = [...recs].sort((a, b) => a.start - b.start);
          break;
        }
      }
      const starts: number[] = [];
      const ends: number[] = [];
      let last = -1;
      for (const r of recs) {
        if (last >= 0 && r.start - ends[last] < gap) {
          if (r.end > ends[last]) ends[last] = r.end;
        } else {
          starts.push(r.start);
          ends.push(r.end);
          last++;
        }
      }
      cache.stretches = { starts, ends };
    }
    return cache.stretches;
  }
}

/**
 * An order's last day in zone `tz`: the date of its last worked instant (an order ending at
 * midnight ends on the day before). Same as SnapshotIndex.lastDay, for callers without an index.
 */
export function orderLastDay(order: WorkOrder, tz: string): string {
  const d = order.end > order.start ? epochToZonedDate(order.end - 1, tz) : order.startDate;
  return d < order.startDate ? order.startDate : d;
}

/** First index i with arr[i] > value (arr ascending). */
export function upperBound(arr: ArrayLike<number>, value: number): number {
  let lo = 0;
  let hi = arr.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (arr[mid] <= value) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}
