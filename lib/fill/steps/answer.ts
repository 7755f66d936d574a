// Step 4, the answer: a proposal per filled seat (with its reasons, reasons.ts), the staffed
// orders with the blocks they carry, and the objective's two figures as placed.

import type { Assignment, Position } from "@/lib/rules/types";
import { DOUBLE_PENALTY, TOGETHER_BONUS } from "../objective";
import type { Proposal, StaffedOrder } from "../types";
import { cmpStr, push, type Built, type FillRun, type Group } from "./context";
import { reasonsFor } from "./reasons";
import type { Solved } from "./solve";

export interface Answer {
  proposals: Proposal[];
  staffedOut: StaffedOrder[];
  /** Priority-weighted orders staffed. */
  staffing: number;
  /** Fairness, home yard and togetherness cost of the placements. */
  cost: number;
  /** worker -> orders newly placed on. */
  placedOn: Map<string, string[]>;
}

export function answer(run: FillRun, solved: Solved, built: Built | null): Answer {
  const { staffed, carried } = solved;
  const proposals: Proposal[] = [];
  const staffedOut: StaffedOrder[] = [];
  let cost = 0;
  let staffing = 0;
  const placedOn = new Map<string, string[]>();
  for (const [o, list] of staffed) for (const a of list) push(placedOn, a.workerId, o);
  for (const c of run.ctxs) {
    const o = c.fo.id;
    const list = staffed.get(o);
    if (!list) continue;
    staffing += c.value;
    staffedOut.push({ orderId: o, carried: carried.get(o) ?? [] });
    const byPos = new Map<Position, string[]>();
    for (const a of list) push(byPos, a.position, a.workerId);
    const seatsOf = new Map<string, number>();
    for (const a of list) seatsOf.set(a.workerId, (seatsOf.get(a.workerId) ?? 0) + 1);
    for (const n of seatsOf.values()) if (n > 1) cost += DOUBLE_PENALTY;
    const needs = built?.needs.get(o) ?? new Set<Group>();
    for (const [p, seats] of c.open) {
      const ws = (byPos.get(p) ?? []).sort(cmpStr);
      seats.forEach((positionId, i) => {
        const w = ws[i];
        if (!w) return;
        const fw = run.poolById.get(w)!;
        cost += run.seatCostOf(w, c, p);
        proposals.push({ orderId: o, positionId, position: p, workerId: w, workerName: fw.name, reasons: reasonsFor(run, c, p, fw, list, needs) });
      });
    }
  }
  cost -= TOGETHER_BONUS * pairsKept(run, staffed);
  return { proposals, staffedOut, staffing, cost, placedOn };
}

/** Pairs of yesterday on one order after the fill, each pair once per order, with at least one of the two newly placed. */
function pairsKept(run: FillRun, staffed: Map<string, Assignment[]>): number {
  let kept = 0;
  for (const [o, list] of staffed) {
    const c = run.ctxById.get(o)!;
    const people = new Set([...c.existingIds, ...list.map((a) => a.workerId)]);
    const counted = new Set<string>();
    for (const w of new Set(list.map((a) => a.workerId))) {
      for (const v of run.pairsOf.get(w) ?? []) {
        if (!people.has(v)) continue;
        const k = w < v ? `${w}|${v}` : `${v}|${w}`;
        if (counted.has(k)) continue;
        counted.add(k);
        kept++;
      }
    }
  }
  return kept;
}
