// The fill's objective, lexicographic by weights, solved in two phases (preemptive goal
// programming):
//   phase 1 — staff orders by priority: one order of priority k outweighs every order of a
//             lower priority together (V_k = 1 + Σ_{j>k} n_j V_j), so priority 1 goes before 5;
//   phase 2 — with phase 1's staffing held (Σ V·y ≥ V*), place people by
//             fairness  : 100 per tenth of an hour of overtime in the last 28 days,
//             home yard : 10 when the worker's yard is not the order's (+ any extra cost),
//             together  : −3 for each pair who worked on the same order yesterday kept together,
//             doubling  : +1 when the lead also takes a second seat (so people double only
//                         when it gains something, not on a tie).
// One tenth of an hour of overtime outweighs the home-yard term of a placement and the home
// yard outweighs the pair bonuses of a placement (a person has at most three crewmates a day
// in practice), so every single swap between candidates follows the order of the criteria.
// Splitting the phases keeps the relative gap meaningful for the fairness terms.

import type { FillOrder, FillWorker } from "./types";

export const OVERTIME_WEIGHT = 100; // per 0.1 h
export const AWAY_WEIGHT = 10;
export const TOGETHER_BONUS = 3;
export const DOUBLE_PENALTY = 1;
/**
 * The lead seat (issue 18): someone who is not a crew lead costs as much as two hours of
 * overtime, so a rested crew lead goes to the lead seat before a journeyman unless fairness is
 * far apart; on energized digger-derrick work a lead without first aid/CPR, or without rescue
 * training, costs half an hour more each (common practice: the person in charge can act first).
 */
export const LEAD_NOT_CREW_LEAD = 2000;
export const LEAD_MISSING_AID = 500;

export function leadSeatCost(
  w: { classification: string },
  order: { workType: string; energized: boolean },
  holds: (code: string) => boolean,
): number {
  let c = w.classification === "crew_lead" ? 0 : LEAD_NOT_CREW_LEAD;
  if (order.workType === "digger_derrick" && order.energized) {
    if (!holds("first_aid_cpr")) c += LEAD_MISSING_AID;
    if (!holds("pole_top_rescue") && !holds("aerial_rescue")) c += LEAD_MISSING_AID;
  }
  return c;
}

export function priorityOf(o: Pick<FillOrder, "priority">): number {
  const p = Math.round(o.priority);
  return Number.isFinite(p) ? Math.min(5, Math.max(1, p)) : 3;
}

/** Staffing value per order id: strictly lexicographic by priority. */
export function staffValues(orders: ReadonlyArray<Pick<FillOrder, "id" | "priority">>): Map<string, number> {
  const n = [0, 0, 0, 0, 0, 0];
  for (const o of orders) n[priorityOf(o)]++;
  const v = [0, 0, 0, 0, 0, 0];
  for (let k = 5; k >= 1; k--) {
    let s = 1;
    for (let j = k + 1; j <= 5; j++) s += n[j] * v[j];
    v[k] = s;
  }
  return new Map(orders.map((o) => [o.id, v[priorityOf(o)]]));
}

export function overtimeTenths(w: Pick<FillWorker, "overtimeHours">): number {
  return Math.max(0, Math.round((w.overtimeHours || 0) * 10));
}

/** Phase-2 cost of one seat for a worker on an order (without the pair bonuses). */
export function placementCost(
  w: Pick<FillWorker, "id" | "overtimeHours" | "yardId">,
  o: Pick<FillOrder, "id" | "yardId">,
  extra?: Record<string, number>,
): number {
  return (
    OVERTIME_WEIGHT * overtimeTenths(w) +
    (w.yardId === o.yardId ? 0 : AWAY_WEIGHT) +
    Math.max(0, Math.round(extra?.[`${w.id}|${o.id}`] ?? 0))
  );
}
