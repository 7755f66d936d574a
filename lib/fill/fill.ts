// Fill open positions: an integer program over eligible worker–seat pairs, solved with HiGHS.
//
// Variables (all binary)
//   x[w,o,p]  worker w takes an open p seat on order o (only where the engine finds w eligible);
//   y[o]      order o is staffed whole (every open seat filled) — or left as it is for the dispatcher;
//   d[w,o]    w holds the lead and one other seat on o (the lead may double, nothing else may);
//   g[o]      CREW_MIN's "a journeyman or crew lead supervises the apprentice" branch;
//   z[a,b,o]  a and b, who worked on the same order yesterday, are both on o.
// With person(w,o) = Σ_p x[w,o,p] − d[w,o] (1 when w is on o, counted once):
//   seats        Σ_w x[w,o,p] = k[o,p]·y[o] for each open position p (k open seats of p);
//   one seat     Σ_{p≠lead} x[w,o,p] ≤ 1; d = x_lead ∧ (Σ_{p≠lead} x) (three rows);
//   overlap      Σ_{o∈C} person(w,o) ≤ 1 for every maximal set C of mutually overlapping orders;
//   rest         person(w,o1) + person(w,o2) ≤ 1 where two orders less than the minimum rest
//                apart span more than the maximum stretch;
//   min crew     people already there + Σ_w person(w,o) ≥ minCrew·y[o];
//   FIRST_AID    energized work with ≥ 2 on site: ≥ 2 with current first aid/CPR (a lone
//                person holding both seats of a two-seat order is exempt, as in the rule);
//   RESCUE       climbing: ≥ 1 person not climbing with pole-top rescue; bucket: ≥ 1 not aloft
//                (not in an aerial or climber seat, nor the lead when the order has no aerial
//                seat) with aerial-lift rescue; training valid on every day of the order;
//   OBSERVER     a new observer is never the operator or a climber (one-seat rule), so an open
//                observer seat filled meets it; an order without one that needs one is left open;
//   CREW_MIN     J+O ≥ 2 − 2g, J ≥ g, J+O+A ≥ 2 where the two-worker minimum applies (any work
//                but patrol, on or near parts above 600 V; CREW-CHECK.md Corrections 2)
//                (J journey-level, O operators holding qualified_electrical through the order's
//                last day, A apprentices; counted with those already there; Corrections 1);
//   apprentice   an apprentice only beside a journeyman or crew lead (any work: a house rule
//                stricter than QUALIFIED, which asks it of apprentices climbing energized work).
// Objective: objective.ts (two phases: priority first; then fairness, home yard, together).
//
// Big days (more than `exactUpTo` eligible pairs): the model holds every eligible pair, but
// HiGHS sees a restricted set of columns (column generation): a seeded shortlist, its LP
// relaxation solved (one live HiGHS model, warm-started), every left-out pair priced with the
// duals (reduced cost c − aᵀπ) and the improving ones added. A Lagrangian bound at each LP's
// duals holds for every pair, so the reported gap is for the whole model even when pricing is
// stopped by the time limit. The integer step is a dive: what the LP fills outright is kept and
// HiGHS solves the rest over the gathered columns. Phase 1 is solved to the exact staffing;
// on big days phase 2 keeps phase 1's orders (on small days any orders worth the same).
//
// Afterwards the engine re-checks the whole proposal; any block the model could not express
// (a rest stretch joined through time records, say) becomes a cut and the model is solved
// again, a bounded number of times; orders still blocked after that are left open.
//
// The pipeline, one module per step under steps/ (context.ts says what they share):
//   1. eligibility   steps/eligible.ts (who may sit where), steps/relations.ts (overlaps, rest, pairs, costs)
//   2. model         steps/build-model.ts, steps/crew-rows.ts
//   3. solve         steps/solve.ts: phases.ts, pricing.ts + bound.ts (column generation), seed.ts, recheck.ts
//   4. answer        steps/answer.ts, steps/reasons.ts
//   5. explain       steps/explain.ts
// `fill()` reports its step (and the gap while pricing) to `onProgress` and stops with
// FillCancelled when `signal` aborts (between solver rounds: a running HiGHS call ends first).

import { SnapshotIndex } from "@/lib/rules/engine";
import { EligibilityProbe } from "./eligibility";
import { staffValues } from "./objective";
import { answer } from "./steps/answer";
import { buildModel } from "./steps/build-model";
import { checkpoint, type FillRun } from "./steps/context";
import { explain } from "./steps/explain";
import { markEligible, openOrders, staticImpossibility } from "./steps/eligible";
import { maximalCliques, partnersOf, restPairsOf, seatCosts } from "./steps/relations";
import { nothingToSolve, solve } from "./steps/solve";
import { DEFAULT_SETTINGS, type FillProblem, type FillProgress, type FillResult, type FillSettings, type FillWorker } from "./types";

export { FillCancelled } from "./steps/context";

export interface FillHooks {
  /** Aborting stops the fill at its next step or solver round (it then throws FillCancelled). */
  signal?: AbortSignal;
  onProgress?: (p: FillProgress) => void;
}

export async function fill(problem: FillProblem, settingsIn: Partial<FillSettings> = {}, hooks: FillHooks = {}): Promise<FillResult> {
  const t0 = performance.now();
  const run = createRun(problem, settingsIn, hooks, t0);
  await checkpoint(run, "eligibility");
  runEligibility(run);

  await checkpoint(run, "model");
  let t = performance.now();
  const full = run.live.length ? buildModel(run, run.live, { pairs: true }) : null;
  run.timings.modelMs += performance.now() - t;
  run.deadline = solverDeadline(run);

  const solved = full ? await solve(run, full) : nothingToSolve(run);
  const { proposals, staffedOut, staffing, cost, placedOn } = answer(run, solved, full);
  const { openOrders: open, openSeats } = await explain(run, solved, placedOn);
  return {
    proposals,
    staffed: staffedOut,
    open: openSeats,
    openOrders: open,
    status: solved.status,
    optimal: solved.optimal,
    gap: solved.worstGap,
    objective: { staffing, cost },
    solveMs: Math.round(performance.now() - t0),
    timings: roundTimings(run.timings),
    size: {
      ...solved.size,
      eligiblePairs: run.eligiblePairs,
      modelledPairs: solved.modelledPairs,
      rounds: solved.rounds,
      dropped: solved.dropped.size,
      pricingRounds: solved.pricingRounds,
      complete: solved.modelledPairs === run.eligiblePairs,
      pricingConverged: solved.pricingConverged,
    },
    settings: { timeLimitSeconds: run.s.timeLimitSeconds, gap: run.s.gap },
  };
}

/** The run's shared state: the engine's index, the pool, the orders with open seats (not yet probed). */
export function createRun(problem: FillProblem, settingsIn: Partial<FillSettings> = {}, hooks: FillHooks = {}, t0 = performance.now()): FillRun {
  const s = { ...DEFAULT_SETTINGS, ...settingsIn };
  const ix = new SnapshotIndex(problem.snapshot);
  const pool = problem.workers.filter((w) => ix.workers.has(w.id));
  const poolById = new Map<string, FillWorker>(pool.map((w) => [w.id, w]));
  const fillable = problem.orders.filter((o) => ix.orders.has(o.id));
  const probe = new EligibilityProbe(problem.snapshot, fillable.map((o) => ix.orders.get(o.id)!));
  const ctxs = openOrders(fillable, ix, staffValues(fillable));
  return {
    problem,
    s,
    ix,
    pool,
    poolById,
    probe,
    ctxs,
    ctxById: new Map(ctxs.map((c) => [c.fo.id, c])),
    eligiblePairs: 0,
    live: [],
    cliques: [],
    restPairs: [],
    pairsOf: partnersOf(problem.yesterdayPairs),
    seatCostOf: seatCosts(poolById, ix, problem.extraCost),
    timings: { eligibilityMs: 0, modelMs: 0, solverMs: 0, recheckMs: 0, explainMs: 0 },
    t0,
    deadline: Infinity,
    signal: hooks.signal,
    onProgress: hooks.onProgress,
  };
}

/** Step 1: who may sit where, the orders no crew can staff, and how the rest relate. */
export function runEligibility(run: FillRun) {
  run.eligiblePairs = markEligible(run.ctxs, run.pool, run.ix, run.probe);
  for (const c of run.ctxs) c.impossible = staticImpossibility(c, run.ix);
  run.timings.eligibilityMs = performance.now() - run.t0; // with the index and the probe's copies
  run.live = run.ctxs.filter((c) => !c.impossible);
  run.cliques = maximalCliques(run.live);
  run.restPairs = restPairsOf(run.live, run.ix.policy);
}

/**
 * The time limit is the whole fill's (issue 19): the solver stops early enough to leave the
 * explanations their share (15 %, at most 2 s), but always gets at least half the limit after
 * the model is built, so a slow start (a loaded machine) cannot leave it too little time to find
 * any answer (measured at load 30 with 30 %: 3 s, no answer at all).
 */
export function solverDeadline(run: Pick<FillRun, "t0" | "s">, now = performance.now()): number {
  const limitMs = run.s.timeLimitSeconds * 1000;
  const explainShare = Math.min(2000, 0.15 * limitMs);
  return Math.max(now + 0.5 * limitMs, run.t0 + limitMs - explainShare);
}

function roundTimings<T extends Record<string, number>>(t: T): T {
  return Object.fromEntries(Object.entries(t).map(([k, v]) => [k, Math.round(v * 10) / 10])) as T;
}
