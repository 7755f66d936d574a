// Fill open positions: the problem, the settings and the answer. Plain data (JSON-safe), so
// the route, the board and the benchmark share it. Ids are strings, as in the rule snapshot.

import type { Classification, DaySnapshot, Finding, Position, RuleCode } from "@/lib/rules/types";

export interface FillSeat {
  positionId: string;
  position: Position;
  /** Who holds the seat now (they stay); null = open. */
  workerId: string | null;
  /** The worker who last declined this seat, when it is open because of that. */
  declinedBy?: string | null;
}

export interface FillOrder {
  /** The rule snapshot's work-order id. */
  id: string;
  number: string;
  title: string;
  /** 1 highest … 5 lowest. */
  priority: number;
  yardId: string;
  seats: FillSeat[];
}

export interface FillWorker {
  id: string;
  name: string;
  classification: Classification;
  yardId: string;
  yardCode?: string;
  phone: string | null;
  /** Hours beyond the policy's regular hours per day, summed over the 28 days before the day. */
  overtimeHours: number;
}

export interface FillProblem {
  /** Rules snapshot: every pool worker and every order (and the workers' other orders near the day). */
  snapshot: DaySnapshot;
  /** The orders to fill, each with its seats. */
  orders: FillOrder[];
  /** The pool: who may be proposed. */
  workers: FillWorker[];
  /** Pairs of worker ids who worked on the same order yesterday (kept together when it costs nothing else). */
  yesterdayPairs: Array<[string, string]>;
  /**
   * Optional extra cost of placing a worker on an order (e.g. travel minutes), at the home-yard
   * tier of the objective. Keyed `${workerId}|${orderId}`; non-negative integers.
   */
  extraCost?: Record<string, number>;
}

export interface FillSettings {
  /** HiGHS `time_limit` for the whole fill (both phases and any re-solve), seconds. */
  timeLimitSeconds: number;
  /** HiGHS `mip_rel_gap`, a fraction (0.01 = 1 %). */
  gap: number;
  /** Re-solves after the engine's re-check finds a block the model could not express. */
  maxRounds?: number;
  /** Work out why each order left open could not be staffed (a few small solves). */
  explain?: boolean;
  /** Most candidates listed per open seat (the summary counts everyone). */
  maxCandidates?: number;
  /** Cap on pair variables for "worked together yesterday" (the lowest tier). */
  maxPairVariables?: number;
  /**
   * Up to this many eligible worker–seat pairs, HiGHS gets the whole model at once. Above it,
   * column generation: HiGHS starts from a shortlist and the left-out pairs are priced in.
   */
  exactUpTo?: number;
  /** Starting shortlist per open position on big days (cheapest eligible); 0 = always the whole model. */
  candidatesPerSeat?: number;
  /** Most LP pricing rounds per phase. */
  maxPricingRounds?: number;
}

export const DEFAULT_SETTINGS: Required<FillSettings> = {
  timeLimitSeconds: 10,
  gap: 0.01,
  maxRounds: 4,
  explain: true,
  maxCandidates: 25,
  maxPairVariables: 20_000,
  exactUpTo: 15_000,
  candidatesPerSeat: 4,
  maxPricingRounds: 30,
};

export interface Proposal {
  orderId: string;
  positionId: string;
  position: Position;
  workerId: string;
  workerName: string;
  reasons: string[];
}

export interface Candidate {
  workerId: string;
  name: string;
  /** The rule that keeps them out of this seat (the first of `rules`). */
  excludedBy: RuleCode;
  /** Every per-worker rule that blocks them here. */
  rules: RuleCode[];
  message: string;
}

export interface OpenSeat {
  orderId: string;
  positionId: string;
  position: Position;
  /** People the crew rules keep out of this seat, closest first (capped; see `excludedCount`). */
  candidates: Candidate[];
  excludedCount: number;
  /** Eligible for this seat by the per-worker rules. */
  eligibleCount: number;
  /** e.g. "3 lapsed climbing qualifications, 2 short of rest, 1 on leave". */
  summary: string;
}

export interface OpenOrder {
  orderId: string;
  /** Why the order was left for the dispatcher, in plain words. */
  reason: string;
  /** The crew rule that could not be met, when one could be named. */
  rule: RuleCode | null;
}

export interface StaffedOrder {
  orderId: string;
  /** Blocks that stay on the order after the fill and come from people already placed (the fill keeps them). */
  carried: Finding[];
}

export type FillStatus =
  | "Optimal"
  | "Time limit reached"
  | "Nothing to fill"
  | "Infeasible"
  | "Interrupted"
  | string;

export interface FillResult {
  proposals: Proposal[];
  staffed: StaffedOrder[];
  open: OpenSeat[];
  openOrders: OpenOrder[];
  /** HiGHS's model status of the last solve ("Optimal", "Time limit reached", …). */
  status: FillStatus;
  /** True when every solve proved optimality within the gap and no order had to be dropped after re-checking. */
  optimal: boolean;
  /** Relative MIP gap (fraction) of the worst phase; null when no solution was found. */
  gap: number | null;
  objective: {
    /** Priority-weighted orders staffed (phase 1, maximised). */
    staffing: number;
    /** Fairness, home yard and togetherness cost of the placements (phase 2, minimised). */
    cost: number;
  };
  solveMs: number;
  timings: { eligibilityMs: number; modelMs: number; solverMs: number; recheckMs: number; explainMs: number };
  size: {
    variables: number;
    constraints: number;
    nonzeros: number;
    /** Worker–seat pairs the engine found eligible. */
    eligiblePairs: number;
    /** Of those, the pairs HiGHS's last integer program held (all of them below `exactUpTo`). */
    modelledPairs: number;
    /** Re-solves after the engine's re-check (1 = none needed). */
    rounds: number;
    /** Orders dropped because the re-check still found a block after the last re-solve. */
    dropped: number;
    /** LP pricing rounds (column generation); 0 when the whole model was solved at once. */
    pricingRounds: number;
    /** Every eligible pair was a column of the integer program. */
    complete: boolean;
    /** Pricing found no improving pair left out, so the LP bound (and the gap) covers every pair. */
    pricingConverged: boolean;
  };
  settings: { timeLimitSeconds: number; gap: number };
}

/** One step of a running fill, for a progress bar (streamed by POST /api/fill). */
export interface FillProgress {
  phase: "eligibility" | "model" | "staffing" | "cost" | "check" | "explain";
  /** Since the fill started. */
  elapsedMs: number;
  /** The phase's current relative gap between the best answer and its bound, when known. */
  gap: number | null;
}

export const FILL_PHASES: ReadonlyArray<{ phase: FillProgress["phase"]; label: string }> = [
  { phase: "eligibility", label: "Checking who may sit where" },
  { phase: "model", label: "Building the model" },
  { phase: "staffing", label: "Staffing the orders" },
  { phase: "cost", label: "Placing people fairly" },
  { phase: "check", label: "Re-checking the crews" },
  { phase: "explain", label: "Explaining open seats" },
];
