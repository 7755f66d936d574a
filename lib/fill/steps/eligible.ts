// Step 1, eligibility: the orders with open seats, and for each open position the pool
// workers the rule engine lets sit there alone (lib/fill/eligibility.ts probes), and the orders
// that no crew can staff whatever the solver does (staticImpossibility).

import { HIGH_VOLTAGE_KV, isClimbingWork, onOrNearAbove } from "@/lib/rules/common";
import type { SnapshotIndex } from "@/lib/rules/engine";
import type { Position, RuleCode } from "@/lib/rules/types";
import type { EligibilityProbe } from "../eligibility";
import { timeKey } from "../eligibility";
import type { FillOrder, FillWorker } from "../types";
import { POSITION_WORD } from "../words";
import { cmpStr, push, type Ctx } from "./context";

/** The orders with at least one open seat, each with its open seats and its people already there. */
export function openOrders(fillable: readonly FillOrder[], ix: SnapshotIndex, values: Map<string, number>): Ctx[] {
  const ctxs: Ctx[] = [];
  for (const fo of fillable) {
    const order = ix.orders.get(fo.id)!;
    const crew = ix.crew(fo.id);
    const open = new Map<Position, string[]>();
    for (const seat of fo.seats) if (seat.workerId === null) push(open, seat.position, seat.positionId);
    for (const list of open.values()) list.sort(cmpStr);
    const openCount = [...open.values()].reduce((n, l) => n + l.length, 0);
    if (openCount === 0) continue;
    ctxs.push({
      fo,
      order,
      existing: crew.people.slice(),
      existingIds: new Set(crew.people.map((w) => w.id)),
      open,
      openCount,
      eligible: new Map([...open.keys()].map((p) => [p, [] as string[]])),
      cand: new Map(),
      value: values.get(fo.id) ?? 1,
      impossible: null,
    });
  }
  return ctxs;
}

/**
 * Fills each order's `eligible` and `cand` from the probes and returns the number of eligible
 * (worker, order, position) pairs. Certain blocks skip the probe: another order overlapping in
 * time (DOUBLE_BOOKED) or leave over it (UNAVAILABLE) always block, at any policy. Everything
 * else asks the rules, cached per time window and per position key.
 */
export function markEligible(ctxs: readonly Ctx[], pool: readonly FillWorker[], ix: SnapshotIndex, probe: EligibilityProbe): number {
  const posKeys = ctxs.map((c) => [...c.open.keys()].map((p) => [p, `${p}|${probe.keyOf(c.order)}`] as const));
  const timeKeys = ctxs.map((c) => timeKey(c.order));
  let eligiblePairs = 0;
  for (const w of pool) {
    const rw = ix.workers.get(w.id)!;
    const busy = ix.ordersOf(w.id);
    const away = rw.unavailable;
    const timeOk = new Map<string, boolean>();
    const posOk = new Map<string, boolean>();
    for (let i = 0; i < ctxs.length; i++) {
      const c = ctxs[i];
      if (c.existingIds.has(w.id)) continue;
      const tk = timeKeys[i];
      let ok = timeOk.get(tk);
      if (ok === undefined) {
        const { start, end } = c.order;
        ok =
          !busy.some((o) => o.start < end && start < o.end) &&
          !away.some((u) => u.start < end && start < u.end) &&
          probe.timeBlocks(w.id, c.order, tk).length === 0;
        timeOk.set(tk, ok);
      }
      if (!ok) continue;
      let got: Position[] | null = null;
      for (const [p, pk] of posKeys[i]) {
        let pok = posOk.get(pk);
        if (pok === undefined) posOk.set(pk, (pok = probe.positionBlocks(w.id, c.order, p, pk.slice(p.length + 1)).length === 0));
        if (!pok) continue;
        c.eligible.get(p)!.push(w.id);
        (got ??= []).push(p);
        eligiblePairs++;
      }
      if (got) c.cand.set(w.id, got);
    }
  }
  return eligiblePairs;
}

/** Why no crew can staff the order, whoever is chosen (too few eligible, a missing seat), or null. */
export function staticImpossibility(c: Ctx, ix: SnapshotIndex): { reason: string; rule: RuleCode | null } | null {
  const order = c.order;
  for (const [p, seats] of c.open) {
    const n = c.eligible.get(p)!.length;
    if (n < seats.length) {
      return {
        reason:
          n === 0 ? `No one in the pool is eligible for the ${POSITION_WORD[p]} position.` : `Only ${n} eligible for ${seats.length} ${POSITION_WORD[p]} positions.`,
        rule: null,
      };
    }
  }
  if (order.minCrew !== null && c.existing.length + c.openCount < order.minCrew) {
    return {
      reason: `Needs at least ${order.minCrew} people on site but has only ${c.existing.length + c.openCount} position${c.existing.length + c.openCount === 1 ? "" : "s"}; add a position to the order.`,
      rule: "CREW_MIN",
    };
  }
  const positionsOf = ix.crew(c.fo.id).positionsOf;
  const observers = c.existing.filter((w) => positionsOf.get(w.id)?.has("observer"));
  if (order.workType === "digger_derrick" && onOrNearAbove(order, HIGH_VOLTAGE_KV) && !c.open.has("observer") && !observers.some((w) => !positionsOf.get(w.id)!.has("operator"))) {
    return { reason: "A digger derrick on or near parts above 600 V needs an observer who is not the operator, and the order has no open observer position.", rule: "OBSERVER" };
  }
  // IN_CHARGE blocks (Corrections 5): two or more on site need someone in the lead position.
  if (c.existing.length + c.openCount >= 2 && !c.open.has("lead") && !c.existing.some((w) => positionsOf.get(w.id)?.has("lead"))) {
    return { reason: "Two or more people on site need a lead (the employee in charge, who holds the job briefing), and the order has no lead position; add one to the order.", rule: "IN_CHARGE" };
  }
  const hasClimber = c.open.has("climber") || c.existing.some((w) => positionsOf.get(w.id)?.has("climber"));
  if (isClimbingWork(order, hasClimber) && !c.open.has("observer") && !observers.some((w) => !positionsOf.get(w.id)!.has("climber"))) {
    return { reason: "Climbing work needs a ground observer who is not climbing, and the order has no open observer position.", rule: "OBSERVER" };
  }
  return null;
}
