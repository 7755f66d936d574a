// Column generation on the LP relaxation, warm-started round to round (one live HiGHS model):
// solve the LP over the columns in, price every left-out pair with the duals (reduced cost
// c − aᵀπ), add the improving ones, until none prices in or the bound is close enough.

import { GrowingLp } from "../highs";
import { checkpoint, D, push, relGap, remaining, X, type FillRun } from "./context";
import type { Columns } from "./columns";
import { lagrangianBound } from "./bound";

export interface Generated {
  /** The best valid lower bound over every pair (null when none). */
  bound: number | null;
  values: Float64Array | null;
  objective: number;
}

export class Pricing {
  private glp: GrowingLp | null = null;
  private readonly heldZero: number[] = [];
  /** LP pricing rounds so far. */
  rounds = 0;
  /** The last pricing found no improving pair left out. */
  converged = true;
  /** Some solve or the pricing stopped at the time limit. */
  timeHit = false;
  readonly yCols: number[];
  private readonly groupsOfOrder = new Map<number, number[]>(); // y column -> its groups

  constructor(
    private readonly run: FillRun,
    private readonly cs: Columns,
  ) {
    const full = cs.full;
    this.yCols = full.ctxs.map((c) => full.y.get(c.fo.id)!);
    full.groups.forEach((gr, g) => push(this.groupsOfOrder, full.y.get(gr.ctx.fo.id)!, g));
  }

  /** The order group of an X column, or of a D column's lead seat. */
  private closedGroupOf(j: number, closed: Set<number>) {
    const full = this.cs.full;
    return closed.has(full.kind[j] === D ? full.group[full.dLinks.get(j)![0]] : full.group[j]);
  }

  /** Loads the columns in so far, the phase's costs and y bounds; holds at zero the seats of orders held empty. */
  private async prepare(cost: Float64Array, fixY?: Map<number, number>): Promise<{ glp: GrowingLp; closed: Set<number> }> {
    const { cs } = this;
    const full = cs.full;
    this.glp ??= await GrowingLp.create(full.lp, cs.view());
    const glp = this.glp;
    glp.add(cs.pending.splice(0), cost);
    glp.setCosts(cost);
    glp.syncRow(full.staffRow);
    for (const yc of this.yCols) glp.setBounds(yc, fixY?.has(yc) ? fixY.get(yc)! : full.lp.lower[yc], fixY?.has(yc) ? fixY.get(yc)! : full.lp.upper[yc]);
    const closed = new Set<number>();
    if (fixY) full.groups.forEach((gr, g) => fixY.get(full.y.get(gr.ctx.fo.id)!) === 0 && closed.add(g));
    const closedCols: number[] = [];
    for (let j = 0; j < cs.n; j++) if (cs.act[j] && (full.kind[j] === X || full.kind[j] === D) && this.closedGroupOf(j, closed)) closedCols.push(j);
    glp.restoreBounds(this.heldZero.splice(0));
    glp.fixZero(closedCols);
    this.heldZero.push(...closedCols);
    return { glp, closed };
  }

  /**
   * The best lower bound over every pair (the LP's value once it converges), and the last LP
   * solution. `reserve`: seconds to keep before the deadline for the integer step.
   */
  async generate(
    cost: Float64Array,
    reserve: number,
    phase: "staffing" | "cost",
    fixY?: Map<number, number>,
    target = this.run.s.gap / 2,
    perRound: (k: number) => number = (k) => Math.max(2, k + 1),
  ): Promise<Generated> {
    const { run, cs } = this;
    if (cs.exact) return { bound: null, values: null, objective: NaN };
    const full = cs.full;
    let bestBound = -Infinity;
    const stopAt = run.deadline - reserve * 1000;
    let lastValues: Float64Array | null = null;
    let lastObjective = NaN;
    const { glp, closed } = await this.prepare(cost, fixY);
    const stopped = (): Generated => {
      this.converged = false;
      return { bound: Number.isFinite(bestBound) ? bestBound : null, values: lastValues, objective: lastObjective };
    };
    for (let r = 0; r < run.s.maxPricingRounds; r++) {
      this.rounds++;
      const lpRes = glp.solve(remaining(run), r === 0 || process.env.FILL_SIMPLEX === "dual" ? "dual" : "primal");
      run.timings.solverMs += lpRes.ms;
      if (process.env.FILL_DEBUG) console.error("  lp", lpRes.status, lpRes.ms.toFixed(0), "ms obj", lpRes.objective, "active", cs.count());
      if (!lpRes.optimal || !lpRes.duals) {
        if (lpRes.status === "Time limit reached") this.timeHit = true;
        return stopped();
      }
      lastValues = lpRes.values;
      lastObjective = lpRes.objective;
      const pi = lpRes.duals;
      const { best, rcOf, tol } = this.price(cost, pi, closed);
      bestBound = Math.max(bestBound, lagrangianBound(full, cs, cost, pi, this.yCols, this.groupsOfOrder, fixY));
      const dAdd = this.doublingsToAdd(closed, rcOf, tol);
      if (process.env.FILL_DEBUG) console.error(`    bound ${bestBound}, ${best.size} groups and ${dAdd.length} doublings price in`);
      await checkpoint(run, phase, Number.isFinite(bestBound) ? relGap(lpRes.objective, bestBound) : null);
      if (!best.size && !dAdd.length) return { bound: lpRes.objective, values: lastValues, objective: lastObjective };
      // Close enough: the LP cannot improve by more than half the gap the fill may leave.
      if (relGap(lpRes.objective, bestBound) <= target) return stopped();
      for (const [g, list] of best) {
        const k = full.groups[g].ctx.open.get(full.groups[g].p)!.length;
        list.sort((a, b) => a[0] - b[0]);
        for (const [, j] of list.slice(0, perRound(k))) cs.activate(j);
      }
      for (const j of dAdd.slice(0, 500)) cs.activate(j);
      glp.add(cs.pending.splice(0), cost);
      if (performance.now() >= stopAt) {
        this.timeHit = true;
        break;
      }
    }
    return stopped();
  }

  /** Left-out seat columns with a negative reduced cost, by seat group. */
  private price(cost: Float64Array, pi: Float64Array, closed: Set<number>) {
    const { cs } = this;
    const full = cs.full;
    const { start, row, val } = cs.view();
    const best = new Map<number, Array<[number, number]>>();
    const rcOf = (j: number) => {
      let rc = cost[j];
      for (let e = start[j]; e < start[j + 1]; e++) rc -= val[e] * pi[row[e]];
      return rc;
    };
    const tol = (j: number) => -1e-6 * Math.max(1, Math.abs(cost[j]));
    for (let j = 0; j < cs.n; j++) {
      if (cs.act[j] || full.kind[j] !== X) continue;
      if (this.closedGroupOf(j, closed)) continue; // held at zero
      const rc = rcOf(j);
      if (rc < tol(j)) push(best, full.group[j], [rc, j]);
    }
    return { best, rcOf, tol };
  }

  /**
   * A doubling column whose own rows are not in yet: those rows (d ≤ x_lead, d ≤ Σ others)
   * may take a dual t that lifts d's reduced cost to zero, at t off each of its x's. So it is
   * an improvement only if its x's still price in after that.
   */
  private doublingsToAdd(closed: Set<number>, rcOf: (j: number) => number, tol: (j: number) => number): number[] {
    const { act, full } = this.cs;
    const dAdd: number[] = [];
    for (const [dc, [xl, nl]] of full.dLinks) {
      if (act[dc] || this.closedGroupOf(dc, closed)) continue;
      const rd = rcOf(dc);
      if (rd >= tol(dc)) continue;
      const leadOut = !act[xl];
      const othersOut = nl.every((k) => !act[k]);
      const m = (leadOut ? 1 : 0) + (othersOut ? 1 : 0);
      if (m === 0) continue; // both rows in: activate() brings d in with its x's
      const t = -rd / m;
      const hit = [...(leadOut ? [xl] : []), ...(othersOut ? nl : [])];
      const rcs = hit.map((k) => [k, rcOf(k)] as const);
      // Already improving on its own: it is priced in through its seat group.
      if (rcs.some(([k, rc]) => rc < tol(k))) continue;
      if (rcs.some(([k, rc]) => rc - t < tol(k))) dAdd.push(dc);
    }
    return dAdd;
  }

  /** New rows (cuts): the next growing LP starts again over the columns gathered so far. */
  restart() {
    this.glp?.dispose();
    this.glp = null;
    this.cs.reloadAll();
  }

  dispose() {
    this.glp?.dispose();
    this.glp = null;
  }
}

