// What the steps of Fill open positions share: the orders with open seats (`Ctx`), the model
// as built (`Built`), the re-check's cuts, and one run's state (`FillRun`): the problem, the
// settings, the rule engine's index, the clock, progress and cancel.
//
// The pipeline (lib/fill/fill.ts): eligibility.ts → build-model.ts (+ crew-rows.ts) → solve.ts
// (phases.ts, columns.ts, bound.ts, seed.ts, recheck.ts) → answer.ts → explain.ts.

import type { SnapshotIndex } from "@/lib/rules/engine";
import type { Position, RuleCode, Worker, WorkOrder } from "@/lib/rules/types";
import type { EligibilityProbe } from "../eligibility";
import type { Lp } from "../highs";
import type { FillOrder, FillProblem, FillProgress, FillSettings, FillWorker } from "../types";

/** Crew conditions the model states per order (each can be switched off to explain an open order). */
export type Group = "MIN_CREW" | "FIRST_AID" | "RESCUE" | "CREW_MIN" | "APPRENTICE" | "ONE_SEAT";

export const HOUR = 3_600_000;
/** Column kinds: x worker in seat, y order staffed, d lead doubles, g CREW_MIN's supervised branch, z pair together. */
export const X = 0;
export const Y = 1;
export const D = 2;
export const G = 3;
export const Z = 4;

export interface Ctx {
  fo: FillOrder;
  order: WorkOrder;
  existing: Worker[];
  existingIds: Set<string>;
  /** Open seat ids by position, sorted. */
  open: Map<Position, string[]>;
  openCount: number;
  /** Eligible pool workers per open position. */
  eligible: Map<Position, string[]>;
  /** Eligible open positions per worker. */
  cand: Map<string, Position[]>;
  value: number;
  impossible: { reason: string; rule: RuleCode | null } | null;
}

export interface Cut {
  key: string;
  /** person(w,o) for these (worker, order) pairs: at most `max` of them may hold. */
  people?: Array<[string, string]>;
  /** Or these exact x variables (order, worker, position). */
  seats?: Array<[string, string, Position]>;
  max: number;
}

export interface Built {
  lp: Lp;
  kind: number[];
  /** X columns: the (order, position) group; -1 otherwise. */
  group: number[];
  groups: Array<{ ctx: Ctx; p: Position }>;
  /** X column -> its d column (when the pair can double). */
  dOfX: Map<number, number>;
  /** d column -> [lead x, other x's]. */
  dLinks: Map<number, [number, number[]]>;
  /** z column -> [x's of a on o, x's of b on o]. */
  zLinks: Map<number, [number[], number[]]>;
  /** The x column of (order, worker, position), if any. */
  xOf: (o: string, w: string, p: Position) => number | undefined;
  y: Map<string, number>;
  costA: Float64Array;
  costB: Float64Array;
  /** Σ V·y ≥ V*: phase 2 holds phase 1's staffing (row bounds set per phase). */
  staffRow: number;
  ctxs: Ctx[];
  person: (o: string, w: string) => Array<[number, number]>;
  needs: Map<string, Set<Group>>;
  /** Rows Σ_w x[w,o,p] − k·y[o] = 0 (one per group). */
  seatRow: Uint8Array;
  /** X columns per group. */
  groupCols: number[][];
}

export type Timings = { eligibilityMs: number; modelMs: number; solverMs: number; recheckMs: number; explainMs: number };

/** Thrown when the caller's signal aborts a fill: nothing is proposed (and nothing was written). */
export class FillCancelled extends Error {
  constructor() {
    super("The fill was cancelled.");
    this.name = "FillCancelled";
  }
}

/** One fill's shared state, filled in step by step. */
export interface FillRun {
  problem: FillProblem;
  s: Required<FillSettings>;
  ix: SnapshotIndex;
  pool: FillWorker[];
  poolById: Map<string, FillWorker>;
  probe: EligibilityProbe;
  ctxs: Ctx[];
  ctxById: Map<string, Ctx>;
  eligiblePairs: number;
  /** Orders that can be staffed at all (no static impossibility). */
  live: Ctx[];
  /** Maximal sets of mutually overlapping live orders. */
  cliques: Ctx[][];
  /** Live orders too close together for the rest rule. */
  restPairs: Array<[Ctx, Ctx]>;
  /** Worked together yesterday. */
  pairsOf: Map<string, Set<string>>;
  /** A seat's cost (phase 2): the placement's, plus the lead seat's preference. */
  seatCostOf: (w: string, c: Ctx, p: Position) => number;
  timings: Timings;
  t0: number;
  /** Where the solver stops (epoch of performance.now()). */
  deadline: number;
  signal?: AbortSignal;
  onProgress?: (p: FillProgress) => void;
}

export const cmpStr = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

export function push<K, V>(m: Map<K, V[]>, k: K, v: V) {
  const l = m.get(k);
  if (l) l.push(v);
  else m.set(k, [v]);
}

/** Relative gap of an objective over a lower bound (minimisation). */
export const relGap = (obj: number, bound: number) => Math.max(0, (obj - bound) / Math.max(1, Math.abs(obj)));

export const remaining = (run: FillRun) => Math.max(0.05, (run.deadline - performance.now()) / 1000);

/**
 * Reports progress and gives the event loop a turn (so a streamed answer flushes and an abort
 * is seen); throws FillCancelled when the caller's signal has aborted.
 */
export async function checkpoint(run: FillRun, phase: FillProgress["phase"], gap: number | null = null): Promise<void> {
  if (!run.signal && !run.onProgress) return;
  run.onProgress?.({ phase, elapsedMs: Math.round(performance.now() - run.t0), gap });
  // A timer turn (about 1 ms): time for the streamed line to pass the server's stream pipes to
  // the socket before the next synchronous stretch of solving.
  await new Promise<void>((resolve) => setTimeout(resolve, 1));
  if (run.signal?.aborted) throw new FillCancelled();
}
