// Between eligibility and the model: how the orders and people relate. Maximal sets of
// overlapping orders (one person, one place), order pairs too close for the rest rule,
// yesterday's pairs, and the cost of a person in a seat.

import type { SnapshotIndex } from "@/lib/rules/engine";
import type { Policy, Position } from "@/lib/rules/types";
import { leadSeatCost, placementCost } from "../objective";
import type { FillWorker } from "../types";
import { HOUR, type Ctx } from "./context";

/** Maximal sets of mutually overlapping orders (an interval graph's cliques: the orders running at some start time). */
export function maximalCliques(ctxs: readonly Ctx[]): Ctx[][] {
  const starts = [...new Set(ctxs.map((c) => c.order.start))].sort((a, b) => a - b);
  const sets = starts.map((t) => ctxs.filter((c) => c.order.start <= t && t < c.order.end));
  const asSets = sets.map((l) => new Set(l));
  const keep: Ctx[][] = [];
  for (let i = 0; i < sets.length; i++) {
    const a = sets[i];
    const sub = asSets.some((b, j) => j !== i && b.size > a.length && a.every((c) => b.has(c)));
    if (!sub && a.length) keep.push(a);
  }
  return keep;
}

/** Orders that do not overlap but are less than the minimum rest apart and together span more than the maximum stretch. */
export function restPairsOf(live: readonly Ctx[], policy: Pick<Policy, "minRestHours" | "maxShiftHours">): Array<[Ctx, Ctx]> {
  const restPairs: Array<[Ctx, Ctx]> = [];
  const gapMs = policy.minRestHours * HOUR;
  const maxMs = policy.maxShiftHours * HOUR;
  for (let i = 0; i < live.length; i++) {
    for (let j = i + 1; j < live.length; j++) {
      const a = live[i].order;
      const b = live[j].order;
      if (a.start < b.end && b.start < a.end) continue; // overlapping: the overlap rows
      const gap = a.end <= b.start ? b.start - a.end : a.start - b.end;
      if (gap < gapMs && Math.max(a.end, b.end) - Math.min(a.start, b.start) > maxMs) restPairs.push([live[i], live[j]]);
    }
  }
  return restPairs;
}

/** Each person's partners of yesterday (both ways, self-pairs left out). */
export function partnersOf(yesterdayPairs: ReadonlyArray<[string, string]>): Map<string, Set<string>> {
  const pairsOf = new Map<string, Set<string>>();
  for (const [a, b] of yesterdayPairs) {
    if (a === b) continue;
    if (!pairsOf.has(a)) pairsOf.set(a, new Set());
    if (!pairsOf.has(b)) pairsOf.set(b, new Set());
    pairsOf.get(a)!.add(b);
    pairsOf.get(b)!.add(a);
  }
  return pairsOf;
}

/** A seat's cost: the placement's (objective.ts), plus the lead seat's preference for crew leads (issue 18); cached per person and order. */
export function seatCosts(poolById: Map<string, FillWorker>, ix: SnapshotIndex, extraCost: Record<string, number> | undefined) {
  const costCache = new Map<string, number>();
  const costOf = (w: string, c: Ctx) => {
    const k = `${w}|${c.fo.id}`;
    let v = costCache.get(k);
    if (v === undefined) costCache.set(k, (v = placementCost(poolById.get(w)!, c.fo, extraCost)));
    return v;
  };
  return (w: string, c: Ctx, p: Position) => {
    if (p !== "lead") return costOf(w, c);
    const rw = ix.workers.get(w);
    return costOf(w, c) + leadSeatCost(poolById.get(w)!, c.order, (code) => (rw ? ix.holdsThrough(rw, code, c.order) : false));
  };
}
