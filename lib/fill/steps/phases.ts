// The two phases of one solve. Phase 1 staffs orders by priority, to the exact staffing.
// Phase 2 keeps that staffing (on big days phase 1's very orders; on small days any orders worth
// the same) and places people as fairly as possible (overtime, home yard, yesterday's pairs).
// On big days each phase is column generation (pricing.ts) and then a dive: what the LP fills
// outright is held and HiGHS settles the rest over the gathered columns.

import { solveLp, type SolveOutcome } from "../highs";
import { TOGETHER_BONUS } from "../objective";
import { checkpoint, relGap, remaining, X, type Built, type FillRun } from "./context";
import { integral, type Columns } from "./columns";
import type { Generated, Pricing } from "./pricing";
import { seedFairness } from "./seed";

export interface SolveState {
  run: FillRun;
  full: Built;
  cs: Columns;
  pr: Pricing;
}

export function debugSolve(st: SolveState, label: string, r: SolveOutcome, bound: number | null) {
  if (r.status === "Time limit reached") st.pr.timeHit = true;
  if (process.env.FILL_DEBUG) console.error(label, r.status, `${r.ms.toFixed(0)} ms`, "obj", r.objective, "gap", r.gap, "lp bound", bound, "cg", st.pr.rounds);
}

const whole = (values: Float64Array, objective: number): SolveOutcome => ({ status: "Optimal", optimal: true, feasible: true, values, duals: null, objective, gap: 0, ms: 0 });

/**
 * A dive: the orders the LP relaxation staffs (or phase 1 chose) held fixed, the rest of the
 * integer program solved over the gathered columns. Cheap, and when its value meets the LP
 * bound (within the gap) it is proven good enough without the whole integer program.
 */
async function dive(st: SolveState, cost: Float64Array, active: Uint8Array, bounds: Array<[number, number, number]>, initial?: Float64Array | null) {
  const { run } = st;
  const r = await solveLp(st.full.lp, cost, { timeLimitSeconds: Math.max(1, Math.min(remaining(run), run.s.timeLimitSeconds / 4)), gap: run.s.gap, active, bounds, initial });
  run.timings.solverMs += r.ms;
  debugSolve(st, "  dive", r, null);
  return r;
}

/** Phase 1: the integer staffing answer and its gap (null when unknown). */
export async function phaseOne(st: SolveState): Promise<{ a: SolveOutcome; gapA: number | null }> {
  const { run, full, cs, pr } = st;
  full.lp.rowLo[full.staffRow] = -Infinity;
  await checkpoint(run, "staffing");
  // To the exact staffing (a relative gap on priority weights would drop orders).
  const genA = await pr.generate(full.costA, 0.5 * run.s.timeLimitSeconds, "staffing", undefined, 0);
  let found: SolveOutcome | null = null;
  if (!cs.exact && genA.values) {
    if (integral(genA.values, cs.act)) {
      // The LP answer is already whole: a feasible integer solution at the LP's value.
      found = whole(genA.values, genA.objective);
    } else {
      // The orders the LP staffs outright stay staffed; HiGHS settles the rest.
      const fix: Array<[number, number, number]> = [];
      for (const yc of pr.yCols) if (genA.values[yc] >= 0.99) fix.push([yc, 1, 1]);
      const d1 = await dive(st, full.costA, cs.act, fix);
      if (d1.feasible && d1.values) found = d1;
    }
  }
  let a: SolveOutcome;
  if (found && genA.bound !== null && found.objective <= Math.ceil(genA.bound - 1e-6) + 1e-6) a = found;
  else {
    a = await solveLp(full.lp, full.costA, { timeLimitSeconds: remaining(run), gap: cs.exact ? run.s.gap : 0, active: cs.act, initial: found?.values ?? null });
    run.timings.solverMs += a.ms;
    if ((!a.feasible || (found && a.objective > found.objective)) && found) a = found;
  }
  const gapA = cs.exact ? a.gap : a.feasible && genA.bound !== null ? relGap(a.objective, genA.bound) : null;
  debugSolve(st, "phase A", a, genA.bound);
  return { a, gapA };
}

/** Phase 2 from phase 1's answer `a`: the cost answer and its gap (null when unknown). */
export async function phaseTwo(st: SolveState, a: SolveOutcome): Promise<{ b: SolveOutcome; gapB: number | null; active: Uint8Array }> {
  const { run, full, cs, pr } = st;
  const s = run.s;
  const staffValue = Math.round(-a.objective);
  full.lp.rowLo[full.staffRow] = staffValue - 0.5;
  await checkpoint(run, "cost");
  const heldY = new Map<number, number>(pr.yCols.map((yc) => [yc, a.values![yc] > 0.5 ? 1 : 0]));
  if (!cs.exact) seedFairness(run, full, heldY, cs.activate);
  // Pricing may go on until a second (a tenth of the limit) before the deadline: the dive after it takes a fraction of that.
  const genB = await pr.generate(full.costB, Math.max(1, 0.1 * s.timeLimitSeconds), "cost", heldY, s.gap / 2, (k) => Math.max(8, 3 * k));
  const actB = cs.withPairs();
  const bonusOf = (v: Float64Array) => {
    let bonus = 0;
    for (const [z] of full.zLinks) if (v[z] > 0.5) bonus += TOGETHER_BONUS;
    return bonus;
  };
  // The bound leaves out the pair bonuses; it is compared with the cost without them.
  const gapOfB = (r: SolveOutcome) => (genB.bound === null ? r.gap : Math.max(0, relGap(r.objective + bonusOf(r.values!), genB.bound)));
  const held: Array<[number, number, number]> = cs.exact ? [] : [...heldY].map(([yc, v]) => [yc, v, v]);
  const found = await diveFromLp(st, genB, actB, held, a.values);
  let b: SolveOutcome;
  // Over gathered columns the integer program cannot prove more than the LP bound does:
  // on big days the dive's answer stands unless it failed.
  if (found && (!cs.exact || (genB.bound !== null && (gapOfB(found) ?? Infinity) <= s.gap))) b = found;
  else {
    b = await solveLp(full.lp, full.costB, { timeLimitSeconds: remaining(run), gap: s.gap, active: actB, bounds: held, initial: found?.values ?? a.values });
    run.timings.solverMs += b.ms;
    if ((!b.feasible || !Number.isFinite(b.objective) || (found && b.objective > found.objective)) && found) b = found;
    if (!b.feasible) b = { ...a, status: b.status, optimal: false, objective: NaN, gap: null };
  }
  const gapB: number | null = b.feasible && Number.isFinite(b.objective) ? gapOfB(b) : null;
  debugSolve(st, "phase B", b, genB.bound);
  return { b, gapB, active: actB };
}

/** Phase 2's integer answer from its LP: whole already, or a dive holding the seats the LP fills outright. */
async function diveFromLp(st: SolveState, genB: Generated, actB: Uint8Array, held: Array<[number, number, number]>, start: Float64Array | null): Promise<SolveOutcome | null> {
  const { full, cs } = st;
  if (cs.exact || !genB.values) return null;
  if (integral(genB.values, cs.act)) return whole(genB.values, genB.objective);
  const fixOnes: Array<[number, number, number]> = [];
  for (let j = 0; j < cs.n; j++) if (cs.act[j] && full.kind[j] === X && genB.values[j] >= 1 - 1e-6) fixOnes.push([j, 1, 1]);
  const d = await dive(st, full.costB, actB, [...held, ...fixOnes], start);
  return d.feasible && d.values ? d : null;
}
