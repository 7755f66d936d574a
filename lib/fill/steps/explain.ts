// Step 5, explain: for every seat left open, who the crew rules keep out and why; for every
// order left open, why in plain words (a static impossibility, a block the re-check kept, or
// what a one-order model says). Bounded in time: past its deadline an order gets the general
// reason.

import type { Position, RuleCode } from "@/lib/rules/types";
import { exclusionOf } from "../eligibility";
import { solveLp } from "../highs";
import { priorityOf } from "../objective";
import type { Candidate, OpenOrder, OpenSeat } from "../types";
import { categoryOf, summarise, type Category } from "../words";
import { buildModel } from "./build-model";
import { checkpoint, cmpStr, type Built, type Ctx, type FillRun, type Group } from "./context";
import type { Solved } from "./solve";

/** Whatever is left of the fill's time limit, and at least a second (fill.ts solverDeadline). */
export function explainDeadlineOf(run: Pick<FillRun, "t0" | "s">, now = performance.now()): number {
  return Math.max(now + 1000, run.t0 + run.s.timeLimitSeconds * 1000);
}

export async function explain(
  run: FillRun,
  solved: Solved,
  placedOn: Map<string, string[]>,
  deadline?: number,
): Promise<{ openOrders: OpenOrder[]; openSeats: OpenSeat[] }> {
  await checkpoint(run, "explain");
  const t = performance.now();
  const explainDeadline = deadline ?? explainDeadlineOf(run, t);
  const openOrders: OpenOrder[] = [];
  const openSeats: OpenSeat[] = [];
  const { rounds } = solved;
  for (const c of run.ctxs) {
    const o = c.fo.id;
    if (solved.staffed.has(o)) continue;
    for (const [p, seats] of c.open) {
      // Past the deadline (a slow machine, or hundreds of orders left open) the seat says so
      // instead of probing the whole pool for it.
      const info = performance.now() <= explainDeadline ? seatInfo(run, c, p) : unexplainedSeat(c, p);
      for (const positionId of seats) openSeats.push({ orderId: o, positionId, position: p, ...info });
    }
    if (c.impossible) {
      openOrders.push({ orderId: o, reason: c.impossible.reason, rule: c.impossible.rule });
      continue;
    }
    const problemsHere = solved.dropped.get(o);
    if (problemsHere) {
      const rules = [...new Set(problemsHere.map((f) => f.rule))];
      openOrders.push({
        orderId: o,
        reason: `The best crew found still had ${rules.join(", ")} after ${rounds} solve${rounds > 1 ? "s" : ""}: ${problemsHere[0].message}`,
        rule: rules[0],
      });
      continue;
    }
    openOrders.push({ orderId: o, ...(await explainOpen(run, c, placedOn, explainDeadline)) });
  }
  run.timings.explainMs = performance.now() - t;
  return { openOrders, openSeats };
}

/** Who is kept out of an open seat and why, closest first, and the counts by reason. */
/** An open seat not worked through in the time allowed: how many are eligible is known, who is kept out is not. */
export function unexplainedSeat(c: Ctx, p: Position): Omit<OpenSeat, "orderId" | "positionId" | "position"> {
  return { candidates: [], excludedCount: 0, eligibleCount: c.eligible.get(p)!.length, summary: "not worked out in the time allowed" };
}

export function seatInfo(run: FillRun, c: Ctx, p: Position) {
  const { pool, probe, ix, s } = run;
  const counts = new Map<Category, number>();
  const cands: Array<Candidate & { _n: number; _home: number; _ot: number }> = [];
  for (const w of pool) {
    if (c.existingIds.has(w.id)) continue;
    const ex = exclusionOf(probe.blocks(w.id, c.order, p));
    if (!ex) continue;
    const cat = categoryOf(ex.findings[0], p, ix.workers.get(w.id), c.order);
    counts.set(cat, (counts.get(cat) ?? 0) + 1);
    cands.push({
      workerId: w.id,
      name: w.name,
      excludedBy: ex.rules[0],
      rules: ex.rules,
      message: ex.findings[0].message,
      _n: ex.rules.length,
      _home: w.yardId === c.fo.yardId ? 0 : 1,
      _ot: w.overtimeHours,
    });
  }
  cands.sort((a, b) => a._n - b._n || a._home - b._home || a._ot - b._ot || a.name.localeCompare(b.name) || cmpStr(a.workerId, b.workerId));
  const eligibleCount = c.eligible.get(p)!.length;
  return {
    candidates: cands.slice(0, s.maxCandidates).map(({ _n, _home, _ot, ...rest }) => rest),
    excludedCount: cands.length,
    eligibleCount,
    summary: summarise(counts) || (eligibleCount ? "" : "no one in the pool"),
  };
}

/**
 * Why an order the solve left open is open: could it be staffed alone (then who took its
 * people), else which crew condition, switched off, would let it be staffed.
 */
async function explainOpen(run: FillRun, c: Ctx, placedOn: Map<string, string[]>, explainDeadline: number): Promise<{ reason: string; rule: RuleCode | null }> {
  const s = run.s;
  const numberOf = (id: string) => run.ctxById.get(id)?.fo.number ?? id;
  const feasible = (built: Built) => feasibleAlone(built, explainDeadline);
  if (!s.explain || performance.now() > explainDeadline) {
    return { reason: "Not staffed: its eligible people are needed on higher-priority or overlapping orders, or no crew of them meets the crew rules.", rule: null };
  }
  // Could it be staffed if it were the only order of the day?
  const alone = await feasible(buildModel(run, [c], { force: true, pairs: false }));
  if (alone) {
    const people = new Set<string>();
    for (const [w, ps] of c.cand) for (const p of ps) if (alone.v[alone.built.xOf(c.fo.id, w, p)!] > 0.5) people.add(w);
    const elsewhere = new Map<string, number>();
    for (const w of people) for (const o2 of placedOn.get(w) ?? []) if (o2 !== c.fo.id) elsewhere.set(o2, priorityOf(run.ctxById.get(o2)!.fo));
    if (elsewhere.size) {
      const list = [...elsewhere.entries()].sort((a, b) => a[1] - b[1] || cmpStr(numberOf(a[0]), numberOf(b[0]))).slice(0, 4);
      return {
        reason: `Could be staffed on its own, but the people it needs are proposed for ${list.map(([id, p]) => `${numberOf(id)} (P${p})`).join(", ")}${elsewhere.size > 4 ? " and others" : ""}, which weigh more.`,
        rule: null,
      };
    }
    return {
      reason: "Could be staffed on its own, but not together with the orders that weigh more: the people it needs are wanted there or are too close to their other work for the rest rule.",
      rule: null,
    };
  }
  const tries: Array<[Group, RuleCode | null, string]> = [
    ["FIRST_AID", "FIRST_AID", "Not enough eligible people with current first aid/CPR: energized work with two or more on site needs two trained on the order."],
    [
      "RESCUE",
      "RESCUE",
      c.order.workType === "bucket"
        ? "No eligible person on the ground (not aloft) holds aerial-lift rescue training (lower controls)."
        : "No eligible person other than the climber holds pole-top rescue training.",
    ],
    ["CREW_MIN", "CREW_MIN", "Not enough eligible qualified workers: work on or near parts above 600 V needs two on site (journeymen, crew leads, supervised apprentices, or operators who hold the qualified-electrical credential)."],
    ["APPRENTICE", "QUALIFIED", "The eligible people for some positions are apprentices, and no journeyman or crew lead is eligible to work beside them."],
    ["MIN_CREW", "CREW_MIN", `Needs ${c.order.minCrew ?? 0} people on site, and there are not that many different eligible people for its positions.`],
    ["ONE_SEAT", null, "The same few people are the only ones eligible for several of its positions; one person cannot take two of them."],
  ];
  for (const [g, rule, reason] of tries) {
    if (await feasible(buildModel(run, [c], { force: true, pairs: false, disabled: new Set([g]) }))) return { reason, rule };
  }
  return { reason: "No crew of eligible people meets the crew rules together for this order.", rule: null };
}

/** Feasibility of a one-order model (forced staffed), every column in. */
async function feasibleAlone(built: Built, explainDeadline: number): Promise<{ built: Built; v: Float64Array } | null> {
  const r = await solveLp(built.lp, new Float64Array(built.lp.numCols), {
    timeLimitSeconds: Math.min(1, Math.max(0.1, (explainDeadline - performance.now()) / 1000)),
    gap: 0,
  });
  return r.feasible && r.values ? { built, v: r.values } : null;
}
