// The integer program's solver: HiGHS (University of Edinburgh) compiled to WebAssembly, from
// the `highs` package. Loaded once per process; each solve gets a fresh native model.

import type { Highs } from "highs";

let loading: Promise<Highs> | null = null;

export function getHighs(): Promise<Highs> {
  if (!loading) {
    loading = import("highs").then((m) => (m.default as unknown as () => Promise<Highs>)());
    loading.catch(() => {
      loading = null;
    });
  }
  return loading;
}

/** A sparse model under construction: columns with bounds and integrality, rows lo <= a·x <= hi. */
export class Lp {
  readonly lower: number[] = [];
  readonly upper: number[] = [];
  readonly integer: boolean[] = [];
  readonly rowLo: number[] = [];
  readonly rowHi: number[] = [];
  readonly rowStart: number[] = [0];
  readonly rowIdx: number[] = [];
  readonly rowVal: number[] = [];

  get numCols() {
    return this.lower.length;
  }
  get numRows() {
    return this.rowLo.length;
  }
  get nonzeros() {
    return this.rowIdx.length;
  }

  col(lo: number, hi: number, integer = true): number {
    this.lower.push(lo);
    this.upper.push(hi);
    this.integer.push(integer);
    return this.lower.length - 1;
  }

  /**
   * Adds lo <= Σ coef·x[col] <= hi. With `merge`, repeated columns are summed; without it the
   * caller guarantees each column appears once. Zero coefficients are dropped.
   */
  row(terms: ReadonlyArray<readonly [number, number]>, lo: number, hi: number, merge = false): number {
    if (merge) {
      const acc = new Map<number, number>();
      for (const [c, v] of terms) acc.set(c, (acc.get(c) ?? 0) + v);
      for (const [c, v] of acc) {
        if (v === 0) continue;
        this.rowIdx.push(c);
        this.rowVal.push(v);
      }
    } else {
      for (const [c, v] of terms) {
        if (v === 0) continue;
        this.rowIdx.push(c);
        this.rowVal.push(v);
      }
    }
    this.rowLo.push(lo);
    this.rowHi.push(hi);
    this.rowStart.push(this.rowIdx.length);
    return this.rowLo.length - 1;
  }
}

export interface SolveOutcome {
  status: string;
  optimal: boolean;
  /** A feasible solution is available (optimal or the best found before a limit). */
  feasible: boolean;
  /** Column values, full length (zero for columns left out). */
  values: Float64Array | null;
  /** Row duals (LP relaxations only), full length (zero for rows left out). */
  duals: Float64Array | null;
  objective: number;
  gap: number | null;
  ms: number;
}

const STATUS_WORDS: Record<number, string> = {
  0: "Not set",
  1: "Load error",
  2: "Model error",
  3: "Presolve error",
  4: "Solve error",
  5: "Postsolve error",
  6: "Empty",
  7: "Optimal",
  8: "Infeasible",
  9: "Primal infeasible or unbounded",
  10: "Unbounded",
  11: "Bound on objective reached",
  12: "Target for objective reached",
  13: "Time limit reached",
  14: "Iteration limit reached",
  15: "Unknown",
  16: "Solution limit reached",
  17: "Interrupted",
};

export interface SolveOptions {
  timeLimitSeconds: number;
  gap: number;
  /** A starting solution (full length), tried as the first incumbent. */
  initial?: ArrayLike<number> | null;
  /** Only these columns (1 = in); the others are held at zero. Rows left empty are dropped. */
  active?: Uint8Array | null;
  /** Solve the LP relaxation and return the row duals. */
  relax?: boolean;
  /** HiGHS presolve (default "choose"). */
  presolve?: "off" | "choose" | "on";
  /** Column bounds for this solve only: [column, lower, upper]. */
  bounds?: ReadonlyArray<readonly [number, number, number]>;
}

/**
 * Minimises cost·x over the model (HiGHS MIP, or its LP relaxation), within the time limit
 * and relative gap; optionally over a subset of the columns (the others fixed at zero).
 */
export async function solveLp(lp: Lp, cost: ArrayLike<number>, opts: SolveOptions): Promise<SolveOutcome> {
  const highs = await getHighs();
  const t0 = performance.now();
  const active = opts.active ?? null;
  const colMap = new Int32Array(lp.numCols).fill(-1);
  const cols: number[] = [];
  for (let j = 0; j < lp.numCols; j++) {
    if (!active || active[j]) {
      colMap[j] = cols.length;
      cols.push(j);
    }
  }
  const rowsKept: number[] = [];
  const starts: number[] = [0];
  const idx: number[] = [];
  const val: number[] = [];
  for (let r = 0; r < lp.numRows; r++) {
    const before = idx.length;
    for (let k = lp.rowStart[r]; k < lp.rowStart[r + 1]; k++) {
      const c = colMap[lp.rowIdx[k]];
      if (c >= 0) {
        idx.push(c);
        val.push(lp.rowVal[k]);
      }
    }
    if (idx.length === before) {
      // An empty row: 0 must lie within its bounds, or the restriction is infeasible.
      if (lp.rowLo[r] > 1e-9 || lp.rowHi[r] < -1e-9) {
        return { status: "Infeasible", optimal: false, feasible: false, values: null, duals: null, objective: NaN, gap: null, ms: performance.now() - t0 };
      }
      continue;
    }
    rowsKept.push(r);
    starts.push(idx.length);
  }
  const numCols = cols.length;
  const numRows = rowsKept.length;
  if (numCols === 0) {
    return { status: "Empty", optimal: true, feasible: true, values: new Float64Array(lp.numCols), duals: new Float64Array(lp.numRows), objective: 0, gap: 0, ms: 0 };
  }
  const model = highs.createModel();
  try {
    model.options.set({
      output_flag: false,
      time_limit: Math.max(0.05, opts.timeLimitSeconds),
      mip_rel_gap: opts.gap,
      presolve: opts.presolve ?? "choose",
    });
    const inf = highs.infinity;
    const lower = Float64Array.from(cols, (j) => lp.lower[j]);
    const upper = Float64Array.from(cols, (j) => lp.upper[j]);
    for (const [j, lo, hi] of opts.bounds ?? []) {
      if (colMap[j] >= 0) {
        lower[colMap[j]] = lo;
        upper[colMap[j]] = hi;
      }
    }
    const fix = (v: number) => (v === Infinity ? inf : v === -Infinity ? -inf : v);
    model.passModel({
      numCols,
      numRows,
      sense: highs.constants.objectiveSense.minimize,
      offset: 0,
      colCost: Float64Array.from(cols, (j) => cost[j] ?? 0),
      colLower: lower,
      colUpper: upper,
      rowLower: Float64Array.from(rowsKept, (r) => fix(lp.rowLo[r])),
      rowUpper: Float64Array.from(rowsKept, (r) => fix(lp.rowHi[r])),
      matrix: { format: "csr", numRows, numCols, starts: Int32Array.from(starts), indices: Int32Array.from(idx), values: Float64Array.from(val) },
      integrality: Int32Array.from(cols, (j) => (!opts.relax && lp.integer[j] ? 1 : 0)),
    });
    if (opts.initial && !opts.relax) {
      try {
        model.setSolution({ colValue: Float64Array.from(cols, (j) => opts.initial![j] ?? 0) });
      } catch {
        /* a rejected start is only a lost head start */
      }
    }
    const run = model.run();
    const code = run.modelStatus as number;
    const status = STATUS_WORDS[code] ?? `Status ${code}`;
    let primal = 0;
    try {
      primal = Number(model.info.get("primal_solution_status"));
    } catch {
      primal = code === 7 ? 2 : 0;
    }
    const feasible = primal === 2;
    let gap: number | null = null;
    if (feasible && !opts.relax) {
      try {
        const g = Number(model.info.get("mip_gap"));
        gap = Number.isFinite(g) ? Math.max(0, g) : null;
      } catch {
        gap = code === 7 ? 0 : null;
      }
    } else if (feasible) gap = code === 7 ? 0 : null;
    let values: Float64Array | null = null;
    let duals: Float64Array | null = null;
    if (feasible) {
      const sol = model.getSolution();
      values = new Float64Array(lp.numCols);
      for (let i = 0; i < numCols; i++) values[cols[i]] = sol.colValue[i];
      if (opts.relax && code === 7) {
        duals = new Float64Array(lp.numRows);
        for (let i = 0; i < numRows; i++) duals[rowsKept[i]] = sol.rowDual[i];
      }
    }
    const objective = feasible ? model.getObjectiveValue() : NaN;
    return { status, optimal: code === 7, feasible, values, duals, objective, gap, ms: performance.now() - t0 };
  } finally {
    model.dispose();
  }
}

/** Column-wise view of the model's matrix (for pricing). */
export function columns(lp: Lp): { start: Int32Array; row: Int32Array; val: Float64Array } {
  const n = lp.numCols;
  const count = new Int32Array(n + 1);
  for (const c of lp.rowIdx) count[c + 1]++;
  for (let j = 0; j < n; j++) count[j + 1] += count[j];
  const start = Int32Array.from(count);
  const fillAt = Int32Array.from(count);
  const row = new Int32Array(lp.rowIdx.length);
  const val = new Float64Array(lp.rowIdx.length);
  for (let r = 0; r < lp.numRows; r++) {
    for (let k = lp.rowStart[r]; k < lp.rowStart[r + 1]; k++) {
      const c = lp.rowIdx[k];
      const at = fillAt[c]++;
      row[at] = r;
      val[at] = lp.rowVal[k];
    }
  }
  return { start, row, val };
}

/**
 * A persistent LP relaxation over a growing set of a model's columns, for column generation:
 * columns (and the rows they bring) are added to the live HiGHS model, so each re-solve starts
 * from the previous basis instead of from scratch.
 */
export class GrowingLp {
  private model: ReturnType<Highs["createModel"]> | null = null;
  private readonly colOf: Int32Array;
  private readonly rowOf: Int32Array;
  private readonly cols: number[] = [];
  private readonly rows: number[] = [];
  private inf = Infinity;

  private constructor(
    private readonly highs: Highs,
    private readonly lp: Lp,
    private readonly csc: { start: Int32Array; row: Int32Array; val: Float64Array },
  ) {
    this.colOf = new Int32Array(lp.numCols).fill(-1);
    this.rowOf = new Int32Array(lp.numRows).fill(-1);
    this.inf = highs.infinity;
  }

  static async create(lp: Lp, csc: { start: Int32Array; row: Int32Array; val: Float64Array }) {
    const highs = await getHighs();
    const g = new GrowingLp(highs, lp, csc);
    g.model = highs.createModel();
    g.model.options.set({ output_flag: false, presolve: "off" });
    return g;
  }

  private fix(v: number) {
    return v === Infinity ? this.inf : v === -Infinity ? -this.inf : v;
  }

  /** Adds columns (full-model indices) that are not in yet, with every row they touch. */
  add(full: readonly number[], cost: ArrayLike<number>) {
    const m = this.model!;
    const fresh = full.filter((j) => this.colOf[j] < 0);
    if (!fresh.length) return;
    // 1. The columns, with their entries in rows already in.
    const starts = [0];
    const idx: number[] = [];
    const val: number[] = [];
    for (const j of fresh) {
      for (let e = this.csc.start[j]; e < this.csc.start[j + 1]; e++) {
        const r = this.rowOf[this.csc.row[e]];
        if (r >= 0) {
          idx.push(r);
          val.push(this.csc.val[e]);
        }
      }
      starts.push(idx.length);
    }
    const base = this.cols.length;
    m.addCols({
      cost: Float64Array.from(fresh, (j) => cost[j] ?? 0),
      lower: Float64Array.from(fresh, (j) => this.lp.lower[j]),
      upper: Float64Array.from(fresh, (j) => this.lp.upper[j]),
      matrix: { format: "csc", numRows: this.rows.length, numCols: fresh.length, starts: Int32Array.from(starts), indices: Int32Array.from(idx), values: Float64Array.from(val) },
    });
    fresh.forEach((j, i) => {
      this.colOf[j] = base + i;
      this.cols.push(j);
    });
    // 2. The rows they touch for the first time, with every column in so far.
    const newRows: number[] = [];
    for (const j of fresh) {
      for (let e = this.csc.start[j]; e < this.csc.start[j + 1]; e++) {
        const r = this.csc.row[e];
        if (this.rowOf[r] === -1) {
          this.rowOf[r] = -2;
          newRows.push(r);
        }
      }
    }
    if (!newRows.length) return;
    const rs = [0];
    const ri: number[] = [];
    const rv: number[] = [];
    for (const r of newRows) {
      for (let k = this.lp.rowStart[r]; k < this.lp.rowStart[r + 1]; k++) {
        const c = this.colOf[this.lp.rowIdx[k]];
        if (c >= 0) {
          ri.push(c);
          rv.push(this.lp.rowVal[k]);
        }
      }
      rs.push(ri.length);
    }
    const rbase = this.rows.length;
    m.addRows({
      lower: Float64Array.from(newRows, (r) => this.fix(this.lp.rowLo[r])),
      upper: Float64Array.from(newRows, (r) => this.fix(this.lp.rowHi[r])),
      matrix: { format: "csr", numRows: newRows.length, numCols: this.cols.length, starts: Int32Array.from(rs), indices: Int32Array.from(ri), values: Float64Array.from(rv) },
    });
    newRows.forEach((r, i) => {
      this.rowOf[r] = rbase + i;
      this.rows.push(r);
    });
  }

  setCosts(cost: ArrayLike<number>) {
    if (!this.cols.length) return;
    this.model!.changeColsCost({ kind: "range", from: 0, to: this.cols.length - 1 }, Float64Array.from(this.cols, (j) => cost[j] ?? 0));
  }

  /** Column bounds on the live model only (the Lp is not changed). */
  setBounds(j: number, lo: number, hi: number) {
    const i = this.colOf[j];
    if (i >= 0) this.model!.changeColBounds(i, lo, hi);
  }

  /** Holds columns at zero on the live model (e.g. the seats of orders phase 1 left empty). */
  fixZero(full: readonly number[]) {
    const idx = [...new Set(full.map((j) => this.colOf[j]).filter((i) => i >= 0))].sort((a, b) => a - b);
    if (!idx.length) return;
    this.model!.changeColsBounds({ kind: "set", indices: Int32Array.from(idx) }, new Float64Array(idx.length), new Float64Array(idx.length));
  }

  /** Restores columns' own bounds from the model. */
  restoreBounds(full: readonly number[]) {
    const pairs = [...new Map(full.filter((j) => this.colOf[j] >= 0).map((j) => [this.colOf[j], j])).entries()].sort((a, b) => a[0] - b[0]);
    if (!pairs.length) return;
    this.model!.changeColsBounds(
      { kind: "set", indices: Int32Array.from(pairs, ([i]) => i) },
      Float64Array.from(pairs, ([, j]) => this.lp.lower[j]),
      Float64Array.from(pairs, ([, j]) => this.lp.upper[j]),
    );
  }

  /** Re-reads a row's bounds from the model (e.g. phase 2's staffing row). */
  syncRow(r: number) {
    const i = this.rowOf[r];
    if (i >= 0) this.model!.changeRowBounds(i, this.fix(this.lp.rowLo[r]), this.fix(this.lp.rowHi[r]));
  }

  /**
   * Re-solves from the last basis. `simplex`: "dual" after the costs or bounds changed, "primal"
   * after columns were added (the last basis stays primal feasible then; common practice in
   * column generation, and measured faster here: README, benchmarks).
   */
  solve(timeLimitSeconds: number, simplex: "dual" | "primal" = "dual"): SolveOutcome {
    const m = this.model!;
    const t0 = performance.now();
    // The run clock of a persistent model adds up across runs; each run gets its own limit.
    m.zeroAllClocks();
    m.options.set({ time_limit: Math.max(0.05, timeLimitSeconds), simplex_strategy: simplex === "primal" ? 4 : 1 });
    const run = m.run();
    const code = run.modelStatus as number;
    const status = STATUS_WORDS[code] ?? `Status ${code}`;
    if (code !== 7) return { status, optimal: false, feasible: false, values: null, duals: null, objective: NaN, gap: null, ms: performance.now() - t0 };
    const sol = m.getSolution();
    const values = new Float64Array(this.lp.numCols);
    this.cols.forEach((j, i) => (values[j] = sol.colValue[i]));
    const duals = new Float64Array(this.lp.numRows);
    this.rows.forEach((r, i) => (duals[r] = sol.rowDual[i]));
    return { status, optimal: true, feasible: true, values, duals, objective: m.getObjectiveValue(), gap: 0, ms: performance.now() - t0 };
  }

  dispose() {
    this.model?.dispose();
    this.model = null;
  }
}
