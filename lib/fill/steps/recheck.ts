// The rule engine stays the judge: after each solve the whole proposal is re-checked with
// lib/rules; a block the model could not express becomes a cut (a row) and the model is solved
// again (solve.ts). Also: reading the proposal out of a solution, and adding a cut.

import { findingsForOrders, SnapshotIndex } from "@/lib/rules/engine";
import type { Assignment, Finding, Position } from "@/lib/rules/types";
import type { FillProblem } from "../types";
import { cmpStr, push, type Built, type Cut } from "./context";

/** The staffed orders of a solution and who sits where. */
export function extract(built: Built, v: Float64Array): Map<string, Assignment[]> {
  const out = new Map<string, Assignment[]>();
  for (const c of built.ctxs) {
    const o = c.fo.id;
    if (v[built.y.get(o)!] < 0.5) continue;
    const list: Assignment[] = [];
    for (const [w, ps] of c.cand) for (const p of ps) if (v[built.xOf(o, w, p)!] > 0.5) list.push({ workOrderId: o, workerId: w, position: p });
    out.set(o, list);
  }
  return out;
}

/** A cut as a row: at most `max` of its people (or seats) together. */
export function addCut(built: Built, cut: Cut) {
  const terms: Array<[number, number]> = [];
  for (const [w, o] of cut.people ?? []) terms.push(...built.person(o, w));
  for (const [o, w, p] of cut.seats ?? []) {
    const k = built.xOf(o, w, p);
    if (k !== undefined) terms.push([k, 1]);
  }
  if (terms.length) built.lp.row(terms, -Infinity, cut.max, true);
}

/** The engine's own verdict on the proposal: blocks it introduces, per order, and the cuts that forbid them. */
export function recheck(problem: FillProblem, ix: SnapshotIndex, proposal: Map<string, Assignment[]>) {
  const after = new SnapshotIndex(problem.snapshot);
  const newOn = new Map<string, Set<string>>(); // worker -> orders newly placed on
  for (const list of proposal.values()) {
    for (const a of list) {
      after.add(a);
      if (!newOn.has(a.workerId)) newOn.set(a.workerId, new Set());
      newOn.get(a.workerId)!.add(a.workOrderId);
    }
  }
  const ids = new Set<string>(proposal.keys());
  for (const w of newOn.keys()) for (const id of after.orderIdsOf(w)) ids.add(id);
  const before = findingsForOrders(problem.snapshot, ids);
  const beforeKeys = new Set(before.filter((f) => f.level === "block").map((f) => `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}`));
  const problems = new Map<string, Finding[]>();
  const carriedOut = new Map<string, Finding[]>();
  const cutsOut: Cut[] = [];
  const timeTrouble = new Set<string>();
  for (const f of findingsForOrders(after, ids)) {
    if (f.level !== "block") continue;
    // LOCATE is about the order's ticket, not its crew: no staffing fixes or breaks it. The same
    // for the order's truck and lift (EQUIPMENT, EQUIPMENT_BOOKED, RIGGING; issue 16): the
    // trucks are chosen before the people (lib/equipment/fill.ts), so a block left is carried.
    if (f.rule === "LOCATE" || f.rule === "EQUIPMENT" || f.rule === "EQUIPMENT_BOOKED" || f.rule === "RIGGING") {
      if (proposal.has(f.workOrderId)) push(carriedOut, f.workOrderId, f);
      continue;
    }
    const key = `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}`;
    const isNew = f.workerId !== null && newOn.get(f.workerId)?.has(f.workOrderId);
    if (proposal.has(f.workOrderId)) {
      if (f.workerId === null || isNew || !beforeKeys.has(key)) {
        if (f.workerId !== null && isNew && (f.rule === "REST" || f.rule === "DOUBLE_BOOKED" || f.rule === "UNAVAILABLE")) timeTrouble.add(f.workerId);
        else push(problems, f.workOrderId, f);
      } else {
        push(carriedOut, f.workOrderId, f);
      }
    } else if (!beforeKeys.has(key) && f.workerId !== null && newOn.has(f.workerId)) {
      timeTrouble.add(f.workerId);
    }
  }
  for (const w of timeTrouble) {
    const orders = [...(newOn.get(w) ?? [])].sort(cmpStr);
    const message = `${ix.workers.get(w)?.name ?? w} cannot take ${orders.length > 1 ? "all of these orders" : "this order"} and keep the rest rule.`;
    for (const o of orders) push(problems, o, { rule: "REST", level: "block", workOrderId: o, workerId: w, message, source: "re-check" });
    cutsOut.push({ key: `p:${w}:${orders.join(",")}`, people: orders.map((o) => [w, o] as [string, string]), max: orders.length - 1 });
  }
  for (const [o, fs] of problems) {
    if (fs.every((f) => f.source === "re-check")) continue;
    const seats = (proposal.get(o) ?? []).map((a) => [o, a.workerId, a.position] as [string, string, Position]).sort((p, q) => cmpStr(p.join("|"), q.join("|")));
    cutsOut.push({ key: `s:${seats.map((x2) => x2.join("|")).join(",")}`, seats, max: seats.length - 1 });
  }
  return { problems, carried: carriedOut, cuts: cutsOut };
}
