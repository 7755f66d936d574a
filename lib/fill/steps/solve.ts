// Step 3, solve: phase 1 then phase 2 (phases.ts), the engine's re-check of the proposal, and
// a cut and another solve for any block the model could not express, a bounded number of
// times; orders still blocked after that are left open.

import type { Assignment, Finding } from "@/lib/rules/types";
import { checkpoint, X, type Built, type Cut, type FillRun } from "./context";
import { Columns } from "./columns";
import { phaseOne, phaseTwo, type SolveState } from "./phases";
import { Pricing } from "./pricing";
import { addCut, extract, recheck } from "./recheck";
import { seedShortlist } from "./seed";

export interface Solved {
  status: string;
  optimal: boolean;
  /** The worse of the two phases' gaps; null when unknown. */
  worstGap: number | null;
  staffed: Map<string, Assignment[]>;
  /** Orders the re-check still blocked after the last solve (left open). */
  dropped: Map<string, Finding[]>;
  /** Blocks that stay on staffed orders from people already placed. */
  carried: Map<string, Finding[]>;
  size: { variables: number; constraints: number; nonzeros: number };
  modelledPairs: number;
  rounds: number;
  pricingRounds: number;
  pricingConverged: boolean;
}

/** Nothing to solve: no open seat at all, or only orders that cannot be staffed (each says why). */
export function nothingToSolve(run: FillRun): Solved {
  return {
    status: run.ctxs.length ? "Optimal" : "Nothing to fill",
    optimal: true,
    worstGap: 0,
    staffed: new Map(),
    dropped: new Map(),
    carried: new Map(),
    size: { variables: 0, constraints: 0, nonzeros: 0 },
    modelledPairs: 0,
    rounds: 0,
    pricingRounds: 0,
    pricingConverged: true,
  };
}

export async function solve(run: FillRun, full: Built): Promise<Solved> {
  const { s } = run;
  const exact = s.candidatesPerSeat <= 0 || run.eligiblePairs <= s.exactUpTo;
  const cs = new Columns(full, exact);
  if (!exact) seedShortlist(run, full, cs.activate);
  const pr = new Pricing(run, cs);
  const st: SolveState = { run, full, cs, pr };
  const out = nothingToSolve(run);
  const cutKeys = new Set<string>();
  try {
    while (true) {
      out.rounds++;
      // Always an integer phase-1 answer first: whatever happens in phase 2, it stands.
      const { a, gapA } = await phaseOne(st);
      if (!a.feasible || !a.values) {
        Object.assign(out, { status: a.status, optimal: false, worstGap: null, staffed: new Map() });
        break;
      }
      const { b, gapB, active } = await phaseTwo(st, a);
      const use = b.feasible && b.values && Number.isFinite(b.objective) ? b.values : a.values;
      out.worstGap = gapA === null || gapB === null ? null : Math.max(gapA, gapB);
      // Proven within the gap asked for: by HiGHS on the whole model, or by the LP bound over every pair.
      out.optimal = out.worstGap !== null && out.worstGap <= s.gap + 1e-12 && (exact ? a.optimal && b.optimal : true);
      out.status = out.optimal ? "Optimal" : pr.timeHit ? "Time limit reached" : out.worstGap === null ? (b.status !== "Optimal" ? b.status : a.status) : "Gap above target";
      out.size = { variables: active.reduce((m, v) => m + v, 0), constraints: full.lp.numRows, nonzeros: full.lp.nonzeros };
      out.modelledPairs = cs.count(X);

      await checkpoint(run, "check", out.worstGap);
      const t = performance.now();
      out.staffed = extract(full, use);
      const check = recheck(run.problem, run.ix, out.staffed);
      run.timings.recheckMs += performance.now() - t;
      out.carried = check.carried;
      if (check.problems.size === 0) {
        out.dropped = new Map();
        break;
      }
      const fresh = check.cuts.filter((c: Cut) => !cutKeys.has(c.key));
      if (out.rounds >= s.maxRounds || performance.now() >= run.deadline || fresh.length === 0) {
        out.dropped = check.problems;
        for (const id of out.dropped.keys()) out.staffed.delete(id);
        out.optimal = false;
        break;
      }
      for (const c of fresh) {
        cutKeys.add(c.key);
        addCut(full, c);
      }
      pr.restart();
    }
  } finally {
    pr.dispose();
  }
  out.pricingRounds = pr.rounds;
  out.pricingConverged = pr.converged;
  return out;
}
