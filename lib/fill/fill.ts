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

import { findingsForOrders, SnapshotIndex } from "@/lib/rules/engine";
import { energizedAtLeast, ENERGIZED_WORK_KV, HIGH_VOLTAGE_KV, isClimbingWork, isJourneyLevel, onOrNearAbove } from "@/lib/rules/common";
import { twoWorkerRuleApplies } from "@/lib/rules/crew-min";
import type { Assignment, Finding, Position, RuleCode, Worker, WorkOrder } from "@/lib/rules/types";
import { EligibilityProbe, exclusionOf, timeKey } from "./eligibility";
import { columns, GrowingLp, Lp, solveLp, type SolveOutcome } from "./highs";
import { DOUBLE_PENALTY, leadSeatCost, overtimeTenths, placementCost, priorityOf, staffValues, TOGETHER_BONUS } from "./objective";
import {
  DEFAULT_SETTINGS,
  type Candidate,
  type FillOrder,
  type FillProblem,
  type FillResult,
  type FillSettings,
  type FillWorker,
  type OpenOrder,
  type OpenSeat,
  type Proposal,
  type StaffedOrder,
} from "./types";
import { categoryOf, hoursText, ordinal, POSITION_WORD, summarise, type Category } from "./words";

type Group = "MIN_CREW" | "FIRST_AID" | "RESCUE" | "CREW_MIN" | "APPRENTICE" | "ONE_SEAT";

const HOUR = 3_600_000;
const X = 0;
const Y = 1;
const D = 2;
const G = 3;
const Z = 4;

interface Ctx {
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

interface Cut {
  key: string;
  /** person(w,o) for these (worker, order) pairs: at most `max` of them may hold. */
  people?: Array<[string, string]>;
  /** Or these exact x variables (order, worker, position). */
  seats?: Array<[string, string, Position]>;
  max: number;
}

interface Built {
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

const cmpStr = (a: string, b: string) => (a < b ? -1 : a > b ? 1 : 0);

function push<K, V>(m: Map<K, V[]>, k: K, v: V) {
  const l = m.get(k);
  if (l) l.push(v);
  else m.set(k, [v]);
}

export async function fill(problem: FillProblem, settingsIn: Partial<FillSettings> = {}): Promise<FillResult> {
  const s = { ...DEFAULT_SETTINGS, ...settingsIn };
  const t0 = performance.now();
  const timings = { eligibilityMs: 0, modelMs: 0, solverMs: 0, recheckMs: 0, explainMs: 0 };

  const ix = new SnapshotIndex(problem.snapshot);
  const policy = ix.policy;
  const pool = problem.workers.filter((w) => ix.workers.has(w.id));
  const poolById = new Map<string, FillWorker>(pool.map((w) => [w.id, w]));
  const fillable = problem.orders.filter((o) => ix.orders.has(o.id));
  const values = staffValues(fillable);

  // --- the orders with open seats, and who may sit where ------------------------------------
  let t = performance.now();
  const probe = new EligibilityProbe(problem.snapshot, fillable.map((o) => ix.orders.get(o.id)!));
  const ctxs: Ctx[] = [];
  for (const fo of fillable) {
    const order = ix.orders.get(fo.id)!;
    const crew = ix.crew(fo.id);
    const open = new Map<Position, string[]>();
    for (const seat of fo.seats) if (seat.workerId === null) push(open, seat.position, seat.positionId);
    for (const list of open.values()) list.sort(cmpStr);
    const openCount = [...open.values()].reduce((n, l) => n + l.length, 0);
    if (openCount === 0) continue;
    ctxs.push({
      fo,
      order,
      existing: crew.people.slice(),
      existingIds: new Set(crew.people.map((w) => w.id)),
      open,
      openCount,
      eligible: new Map([...open.keys()].map((p) => [p, [] as string[]])),
      cand: new Map(),
      value: values.get(fo.id) ?? 1,
      impossible: null,
    });
  }
  const ctxById = new Map(ctxs.map((c) => [c.fo.id, c]));
  const posKeys = ctxs.map((c) => [...c.open.keys()].map((p) => [p, `${p}|${probe.keyOf(c.order)}`] as const));
  const timeKeys = ctxs.map((c) => timeKey(c.order));
  let eligiblePairs = 0;
  for (const w of pool) {
    const rw = ix.workers.get(w.id)!;
    // Certain blocks skip the probe: another order overlapping in time (DOUBLE_BOOKED) or
    // leave over it (UNAVAILABLE) always block, at any policy. Everything else asks the rules.
    const busy = ix.ordersOf(w.id);
    const away = rw.unavailable;
    const timeOk = new Map<string, boolean>();
    const posOk = new Map<string, boolean>();
    for (let i = 0; i < ctxs.length; i++) {
      const c = ctxs[i];
      if (c.existingIds.has(w.id)) continue;
      const tk = timeKeys[i];
      let ok = timeOk.get(tk);
      if (ok === undefined) {
        const { start, end } = c.order;
        ok =
          !busy.some((o) => o.start < end && start < o.end) &&
          !away.some((u) => u.start < end && start < u.end) &&
          probe.timeBlocks(w.id, c.order, tk).length === 0;
        timeOk.set(tk, ok);
      }
      if (!ok) continue;
      let got: Position[] | null = null;
      for (const [p, pk] of posKeys[i]) {
        let pok = posOk.get(pk);
        if (pok === undefined) posOk.set(pk, (pok = probe.positionBlocks(w.id, c.order, p, pk.slice(p.length + 1)).length === 0));
        if (!pok) continue;
        c.eligible.get(p)!.push(w.id);
        (got ??= []).push(p);
        eligiblePairs++;
      }
      if (got) c.cand.set(w.id, got);
    }
  }
  for (const c of ctxs) c.impossible = staticImpossibility(c, ix);
  timings.eligibilityMs = performance.now() - t;

  // --- overlapping sets, pairs too close for the rest rule, yesterday's pairs ---------------
  const live = ctxs.filter((c) => !c.impossible);
  const cliques = maximalCliques(live);
  const restPairs: Array<[Ctx, Ctx]> = [];
  const gapMs = policy.minRestHours * HOUR;
  const maxMs = policy.maxShiftHours * HOUR;
  for (let i = 0; i < live.length; i++) {
    for (let j = i + 1; j < live.length; j++) {
      const a = live[i].order;
      const b = live[j].order;
      if (a.start < b.end && b.start < a.end) continue; // overlapping: the overlap rows
      const gap = a.end <= b.start ? b.start - a.end : a.start - b.end;
      if (gap < gapMs && Math.max(a.end, b.end) - Math.min(a.start, b.start) > maxMs) restPairs.push([live[i], live[j]]);
    }
  }
  const pairsOf = new Map<string, Set<string>>();
  for (const [a, b] of problem.yesterdayPairs) {
    if (a === b) continue;
    if (!pairsOf.has(a)) pairsOf.set(a, new Set());
    if (!pairsOf.has(b)) pairsOf.set(b, new Set());
    pairsOf.get(a)!.add(b);
    pairsOf.get(b)!.add(a);
  }
  const costCache = new Map<string, number>();
  const costOf = (w: string, c: Ctx) => {
    const k = `${w}|${c.fo.id}`;
    let v = costCache.get(k);
    if (v === undefined) costCache.set(k, (v = placementCost(poolById.get(w)!, c.fo, problem.extraCost)));
    return v;
  };
  /** A seat's cost: the placement's, plus the lead seat's preference for crew leads (issue 18). */
  const seatCostOf = (w: string, c: Ctx, p: Position) => {
    if (p !== "lead") return costOf(w, c);
    const rw = ix.workers.get(w);
    return costOf(w, c) + leadSeatCost(poolById.get(w)!, c.order, (code) => (rw ? ix.holdsThrough(rw, code, c.order) : false));
  };

  /** The whole model over `orders` (every eligible pair a column). */
  const build = (orders: Ctx[], opts: { disabled?: Set<Group>; force?: boolean; pairs?: boolean }): Built => {
    const lp = new Lp();
    const kind: number[] = [];
    const group: number[] = [];
    const groups: Built["groups"] = [];
    const cA: number[] = [];
    const cB: number[] = [];
    interface WV {
      pos: Position[];
      cols: number[];
      d: number;
      person: Array<[number, number]> | null;
    }
    const vars = new Map<string, Map<string, WV>>();
    const y = new Map<string, number>();
    const dOfX = new Map<number, number>();
    const dLinks = new Map<number, [number, number[]]>();
    const zLinks = new Map<number, [number[], number[]]>();
    const needs = new Map<string, Set<Group>>();
    const off = opts.disabled ?? new Set<Group>();
    const col = (k: number, costA: number, costB: number, g = -1, lo = 0) => {
      const c = lp.col(lo, 1, true);
      kind[c] = k;
      group[c] = g;
      cA[c] = costA;
      cB[c] = costB;
      return c;
    };
    const xOf = (o: string, w: string, p: Position) => {
      const v = vars.get(o)?.get(w);
      if (!v) return undefined;
      const i = v.pos.indexOf(p);
      return i < 0 ? undefined : v.cols[i];
    };
    const person = (o: string, w: string): Array<[number, number]> => {
      const v = vars.get(o)?.get(w);
      if (!v) return [];
      if (!v.person) {
        v.person = v.cols.map((k) => [k, 1] as [number, number]);
        if (v.d >= 0) v.person.push([v.d, -1]);
      }
      return v.person;
    };
    /** person(o, w) when w holds none of the `skip` seats (a seat in `skip` is never the rescuer's). */
    const personBut = (o: string, w: string, skip: readonly Position[]) => {
      const v = vars.get(o)?.get(w);
      if (!v) return person(o, w);
      const sk = new Set(v.pos.flatMap((p, i) => (skip.includes(p) ? [v.cols[i]] : [])));
      if (sk.size === 0) return person(o, w);
      return person(o, w).filter(([k]) => !sk.has(k));
    };
    const inSet = new Set(orders.map((c) => c.fo.id));
    const seatRows: number[] = [];
    const groupCols: number[][] = [];
    const neg = (terms: Array<[number, number]>, f = 1) => terms.map(([k, v]) => [k, -v * f] as [number, number]);

    for (const c of orders) {
      const o = c.fo.id;
      const yc = col(Y, -c.value, 0, -1, opts.force ? 1 : 0);
      y.set(o, yc);
      const groupIndex = new Map<Position, number>();
      for (const p of c.open.keys()) {
        groupIndex.set(p, groups.length);
        groups.push({ ctx: c, p });
      }
      const here = new Map<string, WV>();
      vars.set(o, here);
      for (const [w, ps] of c.cand) {
        const cols = ps.map((p) => col(X, 0, seatCostOf(w, c, p), groupIndex.get(p)!));
        const v: WV = { pos: ps, cols, d: -1, person: null };
        here.set(w, v);
        const li = ps.indexOf("lead");
        const nl = cols.filter((_, i) => i !== li);
        if (li >= 0 && nl.length) {
          const dc = col(D, 0, DOUBLE_PENALTY);
          v.d = dc;
          const xl = cols[li];
          dLinks.set(dc, [xl, nl]);
          dOfX.set(xl, dc);
          for (const k of nl) dOfX.set(k, dc);
          const dl: Array<[number, number]> = [[dc, 1], [xl, -1]];
          for (const k of nl) dl.push([k, -1]);
          lp.row(dl, -1, Infinity);
          lp.row([[dc, 1], [xl, -1]], -Infinity, 0);
          const dn: Array<[number, number]> = [[dc, 1]];
          for (const k of nl) dn.push([k, -1]);
          lp.row(dn, -Infinity, 0);
        }
        if (nl.length >= 2 && !off.has("ONE_SEAT")) lp.row(nl.map((k) => [k, 1] as [number, number]), -Infinity, 1);
      }
      // Every open seat filled, or none.
      for (const [p, seats] of c.open) {
        const terms: Array<[number, number]> = c.eligible.get(p)!.map((w) => [xOf(o, w, p)!, 1]);
        groupCols[groupIndex.get(p)!] = terms.map(([k]) => k);
        terms.push([yc, -seats.length]);
        seatRows.push(lp.row(terms, 0, 0));
      }
      const need = new Set<Group>();
      needs.set(o, need);
      const order = c.order;
      const E = c.existing;
      const candIds = [...c.cand.keys()];
      const workersOf = (pred: (w: Worker) => boolean) => candIds.filter((w) => pred(ix.workers.get(w)!));
      const sumPeople = (ws: string[]) => ws.flatMap((w) => person(o, w));

      // The order's own minimum, counting everyone on site.
      if (order.minCrew !== null && order.minCrew > E.length && !off.has("MIN_CREW")) {
        need.add("MIN_CREW");
        lp.row([...sumPeople(candIds), [yc, -(order.minCrew - E.length)]], 0, Infinity);
      }
      // FIRST_AID: energized work, two or more on site, two trained.
      if (energizedAtLeast(order, ENERGIZED_WORK_KV) && !off.has("FIRST_AID")) {
        const trainedE = E.filter((w) => ix.holdsThrough(w, "first_aid_cpr", order)).length;
        const lead = c.open.get("lead")?.length ?? 0;
        const minPeople = E.length + c.openCount - Math.min(lead, c.openCount - lead);
        if (trainedE < 2 && E.length + c.openCount >= 2) {
          need.add("FIRST_AID");
          const want = 2 - trainedE;
          const terms = sumPeople(workersOf((w) => ix.holdsThrough(w, "first_aid_cpr", order)));
          if (minPeople <= 1) for (const w of candIds) { const dc = here.get(w)!.d; if (dc >= 0) terms.push([dc, want]); }
          lp.row([...terms, [yc, -want]], 0, Infinity, true);
        }
      }
      // RESCUE: someone other than the exposed worker trained to get them down.
      if (!off.has("RESCUE")) {
        const positionsOf = ix.crew(o).positionsOf;
        const hasClimber = c.open.has("climber") || E.some((w) => positionsOf.get(w.id)?.has("climber"));
        // Who is aloft (Corrections 3, lib/rules/common.ts aloftIds): climbers; on bucket work
        // also the aerial seats, and the lead when the order has neither an aerial nor a climber
        // seat (filled or open).
        const bucketSeat = (p: Position) => c.open.has(p) || E.some((w) => positionsOf.get(w.id)?.has(p));
        const aloftSeats: Position[] =
          order.workType === "bucket"
            ? bucketSeat("aerial") || bucketSeat("climber")
              ? ["climber", "aerial"]
              : ["climber", "aerial", "lead"]
            : ["climber"];
        const rescue = (code: string, skip: Position[]) => {
          if (E.some((w) => !skip.some((p) => positionsOf.get(w.id)?.has(p)) && ix.holdsThrough(w, code, order))) return;
          need.add("RESCUE");
          const terms = workersOf((w) => ix.holdsThrough(w, code, order)).flatMap((w) => personBut(o, w, skip));
          lp.row([...terms, [yc, -1]], 0, Infinity);
        };
        if (isClimbingWork(order, hasClimber)) rescue("pole_top_rescue", ["climber"]);
        if (order.workType === "bucket") rescue("aerial_rescue", aloftSeats);
      }
      // CREW_MIN: two qualified workers on energized work above 600 V (the exceptions only warn).
      const jE = E.filter((w) => isJourneyLevel(w.classification)).length;
      const qualifiedOperator = (w: Worker) => w.classification === "operator" && ix.holdsThrough(w, "qualified_electrical", order);
      const oE = E.filter(qualifiedOperator).length;
      const aE = E.filter((w) => w.classification === "apprentice").length;
      const J = sumPeople(workersOf((w) => isJourneyLevel(w.classification)));
      const O = sumPeople(workersOf(qualifiedOperator));
      const A = sumPeople(workersOf((w) => w.classification === "apprentice"));
      const crewMinBlocks = twoWorkerRuleApplies(order, ix.equipment.of(o)) && (!order.exception || policy.levels?.CREW_MIN === "block");
      if (crewMinBlocks && jE + oE < 2 && !off.has("CREW_MIN")) {
        need.add("CREW_MIN");
        lp.row([...J, ...O, ...A, [yc, -2]], -(jE + oE + aE), Infinity);
        if (jE === 0) {
          const g = col(G, 0, 0);
          lp.row([...J, ...O, [g, 2], [yc, -2]], -(jE + oE), Infinity);
          lp.row([...J, [g, -1]], 0, Infinity);
        }
      }
      // An apprentice only beside a journeyman or crew lead.
      if (jE === 0 && !off.has("APPRENTICE")) {
        if (A.length) {
          need.add("APPRENTICE");
          lp.row([...A, ...neg(J, c.openCount)], -Infinity, 0);
        }
        if (aE > 0) {
          need.add("APPRENTICE");
          lp.row([...J, [yc, -1]], 0, Infinity);
        }
      }
    }

    // One person, one place at a time.
    const seen = new Set<string>();
    for (const clique of cliques) {
      const members = clique.filter((c) => inSet.has(c.fo.id));
      if (members.length < 2) continue;
      const byWorker = new Map<string, Ctx[]>();
      for (const c of members) for (const w of c.cand.keys()) push(byWorker, w, c);
      for (const [w, cs] of byWorker) {
        if (cs.length < 2) continue;
        const key = `${w}|${cs.map((c) => c.fo.id).join(",")}`;
        if (seen.has(key)) continue;
        seen.add(key);
        lp.row(cs.flatMap((c) => person(c.fo.id, w)), -Infinity, 1);
      }
    }
    for (const [a, b] of restPairs) {
      if (!inSet.has(a.fo.id) || !inSet.has(b.fo.id)) continue;
      for (const w of a.cand.keys()) if (b.cand.has(w)) lp.row([...person(a.fo.id, w), ...person(b.fo.id, w)], -Infinity, 1);
    }

    // Worked together yesterday: a bonus per pair kept on one order.
    if (opts.pairs !== false && pairsOf.size) {
      let zs = 0;
      for (const c of orders) {
        const o = c.fo.id;
        for (const w of c.cand.keys()) {
          const partners = pairsOf.get(w);
          if (!partners) continue;
          for (const v of partners) {
            if (c.existingIds.has(v)) {
              for (const [k, coef] of person(o, w)) cB[k] -= TOGETHER_BONUS * coef;
            } else if (w < v && c.cand.has(v) && zs < s.maxPairVariables) {
              const z = col(Z, 0, -TOGETHER_BONUS);
              zs++;
              const pa = person(o, w);
              const pb = person(o, v);
              zLinks.set(z, [pa.filter(([, coef]) => coef > 0).map(([k]) => k), pb.filter(([, coef]) => coef > 0).map(([k]) => k)]);
              lp.row([[z, 1], ...neg(pa)], -Infinity, 0);
              lp.row([[z, 1], ...neg(pb)], -Infinity, 0);
            }
          }
        }
      }
    }
    const staffRow = lp.row(
      orders.map((c) => [y.get(c.fo.id)!, c.value] as [number, number]),
      -Infinity,
      Infinity,
    );
    return {
      lp,
      kind,
      group,
      groups,
      dOfX,
      dLinks,
      zLinks,
      xOf,
      y,
      costA: Float64Array.from(cA),
      costB: Float64Array.from(cB),
      staffRow,
      ctxs: orders,
      person,
      needs,
      seatRow: (() => {
        const m = new Uint8Array(lp.numRows + 1);
        for (const r of seatRows) m[r] = 1;
        return m;
      })(),
      groupCols,
    };
  };

  // --- solve, re-check, cut, solve again -----------------------------------------------------
  const cuts: Cut[] = [];
  const cutKeys = new Set<string>();
  let rounds = 0;
  let cgRounds = 0;
  let cgConverged = true;
  /** Some solve or the pricing stopped at the time limit. */
  let timeHit = false;
  // No open seat at all: nothing to fill. Open seats on orders that cannot be staffed: the
  // (empty) proposal is trivially the best, and each order says why.
  let status = ctxs.length ? "Optimal" : "Nothing to fill";
  let optimal = true;
  let worstGap: number | null = 0;
  let staffed = new Map<string, Assignment[]>();
  let dropped = new Map<string, Finding[]>();
  let carried = new Map<string, Finding[]>();
  let size = { variables: 0, constraints: 0, nonzeros: 0 };
  let modelledPairs = 0;
  let lastBuilt: Built | null = null;

  t = performance.now();
  const full = live.length ? build(live, { pairs: true }) : null;
  timings.modelMs += performance.now() - t;
  const deadline = performance.now() + s.timeLimitSeconds * 1000;
  const remaining = () => Math.max(0.05, (deadline - performance.now()) / 1000);

  if (full) {
    lastBuilt = full;
    const n = full.lp.numCols;
    const act = new Uint8Array(n);
    const exact = s.candidatesPerSeat <= 0 || eligiblePairs <= s.exactUpTo;
    const pending: number[] = [];
    const on = (j: number) => {
      if (act[j]) return;
      act[j] = 1;
      pending.push(j);
    };
    const activate = (j: number) => {
      if (act[j]) return false;
      on(j);
      if (full.kind[j] === X) {
        const dc = full.dOfX.get(j);
        if (dc !== undefined && !act[dc]) {
          const [xl, nl] = full.dLinks.get(dc)!;
          if (act[xl] && nl.some((k) => act[k])) on(dc);
        }
      } else if (full.kind[j] === D) {
        const [xl, nl] = full.dLinks.get(j)!;
        on(xl);
        for (const k of nl) on(k);
      }
      return true;
    };
    for (let j = 0; j < n; j++) if (full.kind[j] === Y || full.kind[j] === G || (exact && full.kind[j] !== Z)) on(j);
    if (!exact) seedShortlist(full, act, activate);
    let cols = columns(full.lp);
    let colsRows = full.lp.numRows;
    const view = () => {
      if (colsRows !== full.lp.numRows) {
        cols = columns(full.lp);
        colsRows = full.lp.numRows;
      }
      return cols;
    };
    const withPairs = (base: Uint8Array) => {
      const a = Uint8Array.from(base);
      for (const [z, [xa, xb]] of full.zLinks) if (xa.some((k) => base[k]) && xb.some((k) => base[k])) a[z] = 1;
      return a;
    };

    const relGap = (obj: number, bound: number) => Math.max(0, (obj - bound) / Math.max(1, Math.abs(obj)));
    const groupsOfOrder = new Map<number, number[]>(); // y column -> its groups
    full.groups.forEach((gr, g) => push(groupsOfOrder, full.y.get(gr.ctx.fo.id)!, g));

    /**
     * A Lagrangian bound over every column: every row but the seat rows priced at the LP's
     * duals π, the seat rows kept. Each order then costs min over y of y·(rc(y) + the k
     * cheapest reduced costs of each of its seat groups); other columns min(0, rc). Valid for
     * any sign-consistent π (weak duality), so for the LP over every pair and the integer program.
     */
    const lagrangian = (cost: Float64Array, pi: Float64Array, fixY?: Map<number, number>): number => {
      const { start, row, val } = view();
      let L = 0;
      for (let r = 0; r < full.lp.numRows; r++) {
        if (full.seatRow[r] || pi[r] === 0) continue;
        const v = pi[r];
        const bound = v > 0 ? full.lp.rowLo[r] : full.lp.rowHi[r];
        if (!Number.isFinite(bound)) {
          if (Math.abs(v) > 1e-9) return -Infinity;
          continue;
        }
        L += v * bound;
      }
      const rcs = new Float64Array(n);
      for (let j = 0; j < n; j++) {
        let rc = cost[j];
        for (let e = start[j]; e < start[j + 1]; e++) if (!full.seatRow[row[e]]) rc -= val[e] * pi[row[e]];
        rcs[j] = rc;
      }
      const inGroup = new Uint8Array(n);
      for (const cols of full.groupCols) for (const j of cols) inGroup[j] = 1;
      for (const yc of yCols) {
        let term = rcs[yc];
        for (const g of groupsOfOrder.get(yc) ?? []) {
          const k = full.groups[g].ctx.open.get(full.groups[g].p)!.length;
          const vals = full.groupCols[g].map((j) => rcs[j]).sort((a, b) => a - b);
          if (vals.length < k) {
            term = Infinity; // cannot be staffed at all
            break;
          }
          for (let i = 0; i < k; i++) term += vals[i];
        }
        const lo = fixY?.has(yc) ? fixY.get(yc)! : full.lp.lower[yc];
        const hi = fixY?.has(yc) ? fixY.get(yc)! : full.lp.upper[yc];
        L += term === Infinity ? (lo > 0 ? Infinity : 0) : Math.min(term * lo, term * hi);
      }
      for (let j = 0; j < n; j++) {
        const k = full.kind[j];
        if (k === Y || k === Z || inGroup[j]) continue;
        L += Math.min(rcs[j] * full.lp.lower[j], rcs[j] * full.lp.upper[j]);
      }
      return L;
    };
    let glp: GrowingLp | null = null;
    const heldZero: number[] = [];
    // The order group of an X column, or of a D column's lead seat.
    const closedGroupOf = (j: number, closed: Set<number>) => closed.has(full.kind[j] === D ? full.group[full.dLinks.get(j)![0]] : full.group[j]);
    /**
     * Column generation on the LP relaxation, warm-started round to round: the best lower bound
     * over every pair (the LP's value once it converges), and the last LP solution.
     */
    const generate = async (
      cost: Float64Array,
      /** Seconds to keep before the deadline (for the integer step after pricing). */
      reserve: number,
      fixY?: Map<number, number>,
      target = s.gap / 2,
      perRound: (k: number) => number = (k) => Math.max(2, k + 1),
    ): Promise<{ bound: number | null; values: Float64Array | null; objective: number }> => {
      if (exact) return { bound: null, values: null, objective: NaN };
      // The best valid lower bound so far (the Lagrangian above, at each LP's duals); equal to
      // the LP's value once no left-out column prices in.
      let bestBound = -Infinity;
      const stopAt = deadline - reserve * 1000;
      let lastValues: Float64Array | null = null;
      let lastObjective = NaN;
      glp ??= await GrowingLp.create(full.lp, view());
      glp.add(pending.splice(0), cost);
      glp.setCosts(cost);
      glp.syncRow(full.staffRow);
      for (const yc of yCols) glp.setBounds(yc, fixY?.has(yc) ? fixY.get(yc)! : full.lp.lower[yc], fixY?.has(yc) ? fixY.get(yc)! : full.lp.upper[yc]);
      // Orders held empty take no one: their columns are held at zero and not priced.
      const closed = new Set<number>();
      if (fixY) full.groups.forEach((gr, g) => fixY.get(full.y.get(gr.ctx.fo.id)!) === 0 && closed.add(g));
      const closedCols: number[] = [];
      for (let j = 0; j < n; j++) if (act[j] && (full.kind[j] === X || full.kind[j] === D) && closedGroupOf(j, closed)) closedCols.push(j);
      glp.restoreBounds(heldZero.splice(0));
      glp.fixZero(closedCols);
      heldZero.push(...closedCols);
      for (let r = 0; r < s.maxPricingRounds; r++) {
        cgRounds++;
        const lpRes = glp.solve(remaining());
        timings.solverMs += lpRes.ms;
        if (process.env.FILL_DEBUG) console.error("  lp", lpRes.status, lpRes.ms.toFixed(0), "ms obj", lpRes.objective, "active", act.reduce((m, v) => m + v, 0));
        if (!lpRes.optimal || !lpRes.duals) {
          if (lpRes.status === "Time limit reached") timeHit = true;
          cgConverged = false;
          return { bound: Number.isFinite(bestBound) ? bestBound : null, values: lastValues, objective: lastObjective };
        }
        lastValues = lpRes.values;
        lastObjective = lpRes.objective;
        const pi = lpRes.duals;
        const tp = performance.now();
        const { start, row, val } = view();
        const best = new Map<number, Array<[number, number]>>();
        const dAdd: number[] = [];
        const rcOf = (j: number) => {
          let rc = cost[j];
          for (let e = start[j]; e < start[j + 1]; e++) rc -= val[e] * pi[row[e]];
          return rc;
        };
        const tol = (j: number) => -1e-6 * Math.max(1, Math.abs(cost[j]));
        for (let j = 0; j < n; j++) {
          if (act[j] || (full.kind[j] !== X && full.kind[j] !== D)) continue;
          if (closedGroupOf(j, closed)) continue; // held at zero
          const rc = rcOf(j);
          if (full.kind[j] === X && rc < tol(j)) push(best, full.group[j], [rc, j]);
        }
        const tl = performance.now();
        bestBound = Math.max(bestBound, lagrangian(cost, pi, fixY));
        if (process.env.FILL_DEBUG) console.error(`    pricing ${(tl - tp).toFixed(0)} ms, bound ${(performance.now() - tl).toFixed(0)} ms: ${bestBound}`);
        // A doubling column whose own rows are not in yet: those rows (d ≤ x_lead, d ≤ Σ others)
        // may take a dual t that lifts d's reduced cost to zero, at t off each of its x's. So
        // it is an improvement only if its x's still price in after that.
        for (const [dc, [xl, nl]] of full.dLinks) {
          if (act[dc] || closedGroupOf(dc, closed)) continue;
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
        if (!best.size && !dAdd.length) return { bound: lpRes.objective, values: lastValues, objective: lastObjective };
        // Close enough: the LP cannot improve by more than half the gap the fill may leave.
        if (relGap(lpRes.objective, bestBound) <= target) {
          cgConverged = false;
          return { bound: bestBound, values: lastValues, objective: lastObjective };
        }
        for (const [g, list] of best) {
          const k = full.groups[g].ctx.open.get(full.groups[g].p)!.length;
          list.sort((a, b) => a[0] - b[0]);
          for (const [, j] of list.slice(0, perRound(k))) activate(j);
        }
        for (const j of dAdd.slice(0, 500)) activate(j);
        glp.add(pending.splice(0), cost);
        if (performance.now() >= stopAt) {
          timeHit = true;
          break;
        }
      }
      cgConverged = false;
      return { bound: Number.isFinite(bestBound) ? bestBound : null, values: lastValues, objective: lastObjective };
    };
    const yCols = live.map((c) => full.y.get(c.fo.id)!);

    /**
     * A dive: the orders the LP relaxation staffs (or phase 1 chose) held fixed, the rest of
     * the integer program solved over the gathered columns. Cheap, and when its value meets
     * the LP bound (within the gap) it is proven good enough without the whole integer program.
     */
    const dive = async (cost: Float64Array, active: Uint8Array, bounds: Array<[number, number, number]>, initial?: Float64Array | null) => {
      const r = await solveLp(full.lp, cost, { timeLimitSeconds: Math.max(1, Math.min(remaining(), s.timeLimitSeconds / 4)), gap: s.gap, active, bounds, initial });
      timings.solverMs += r.ms;
      debug("  dive", r, null);
      return r;
    };

    while (true) {
      rounds++;
      // Phase 1: staff orders by priority.
      full.lp.rowLo[full.staffRow] = -Infinity;
      // Phase 1 to the exact staffing (a relative gap on priority weights would drop orders).
      const genA = await generate(full.costA, 0.5 * s.timeLimitSeconds, undefined, 0);
      let a: SolveOutcome;
      let gapA: number | null;
      /** Phase 1 by a dive or the integer program (also the fallback when phase 2 cannot hold the LP's orders). */
      const phaseOneInteger = async (): Promise<SolveOutcome> => {
        let found: SolveOutcome | null = null;
        if (!exact && genA.values) {
          if (integral(genA.values, act)) {
            // The LP answer is already whole: a feasible integer solution at the LP's value.
            found = { status: "Optimal", optimal: true, feasible: true, values: genA.values, duals: null, objective: genA.objective, gap: 0, ms: 0 };
          } else {
            // The orders the LP staffs outright stay staffed; HiGHS settles the rest.
            const fix: Array<[number, number, number]> = [];
            for (const yc of yCols) if (genA.values[yc] >= 0.99) fix.push([yc, 1, 1]);
            const d1 = await dive(full.costA, act, fix);
            if (d1.feasible && d1.values) found = d1;
          }
          if (found && genA.bound !== null && found.objective <= Math.ceil(genA.bound - 1e-6) + 1e-6) return found;
        }
        let r = await solveLp(full.lp, full.costA, { timeLimitSeconds: remaining(), gap: exact ? s.gap : 0, active: act, initial: found?.values ?? null });
        timings.solverMs += r.ms;
        if ((!r.feasible || (found && r.objective > found.objective)) && found) r = found;
        return r;
      };
      // Always an integer phase-1 answer first: whatever happens in phase 2, it stands.
      a = await phaseOneInteger();
      gapA = exact ? a.gap : a.feasible && genA.bound !== null ? relGap(a.objective, genA.bound) : null;
      debug("phase A", a, genA.bound);
      if (!a.feasible || !a.values) {
        status = a.status;
        optimal = false;
        worstGap = null;
        staffed = new Map();
        break;
      }
      const staffValue = Math.round(-a.objective);
      // Phase 2: the same staffing, placed as fairly as possible. On big days (column
      // generation) it keeps phase 1's orders; on small ones any orders worth the same.
      full.lp.rowLo[full.staffRow] = staffValue - 0.5;
      const heldY = new Map<number, number>(yCols.map((yc) => [yc, a!.values![yc] > 0.5 ? 1 : 0]));
      if (!exact) seedFairness(full, heldY, activate);
      const genB = await generate(full.costB, Math.max(2.5, 0.25 * s.timeLimitSeconds), heldY, s.gap / 2, (k) => Math.max(8, 3 * k));
      const actB = withPairs(act);
      const bonusOf = (v: Float64Array) => {
        let bonus = 0;
        for (const [z] of full.zLinks) if (v[z] > 0.5) bonus += TOGETHER_BONUS;
        return bonus;
      };
      // The bound leaves out the pair bonuses; it is compared with the cost without them.
      const gapOfB = (r: SolveOutcome) => (genB.bound === null ? r.gap : Math.max(0, relGap(r.objective + bonusOf(r.values!), genB.bound)));
      let b: SolveOutcome;
      const av = a.values;
      const held: Array<[number, number, number]> = exact ? [] : [...heldY].map(([yc, v]) => [yc, v, v]);
      let found: SolveOutcome | null = null;
      if (!exact && genB.values) {
        if (integral(genB.values, act)) {
          found = { status: "Optimal", optimal: true, feasible: true, values: genB.values, duals: null, objective: genB.objective, gap: 0, ms: 0 };
        } else {
          // Dive from the LP: the seats it fills outright stay, HiGHS settles the rest.
          const fixOnes: Array<[number, number, number]> = [];
          for (let j = 0; j < n; j++) if (act[j] && full.kind[j] === X && genB.values[j] >= 1 - 1e-6) fixOnes.push([j, 1, 1]);
          const d = await dive(full.costB, actB, [...held, ...fixOnes], av);
          if (d.feasible && d.values) found = d;
        }
      }
      // Over gathered columns the integer program cannot prove more than the LP bound does:
      // on big days the dive's answer stands unless it failed.
      if (found && (!exact || (genB.bound !== null && (gapOfB(found) ?? Infinity) <= s.gap))) b = found;
      else {
        b = await solveLp(full.lp, full.costB, { timeLimitSeconds: remaining(), gap: s.gap, active: actB, bounds: held, initial: found?.values ?? av });
        timings.solverMs += b.ms;
        if ((!b.feasible || !Number.isFinite(b.objective) || (found && b.objective > found.objective)) && found) b = found;
        if (!b.feasible) b = { ...a, status: b.status, optimal: false, objective: NaN, gap: null };
      }
      const gapB: number | null = b.feasible && Number.isFinite(b.objective) ? gapOfB(b) : null;
      debug("phase B", b, genB.bound);
      const use = b.feasible && b.values && Number.isFinite(b.objective) ? b.values : a.feasible ? a.values : null;
      if (!use) {
        status = b.status;
        optimal = false;
        worstGap = null;
        staffed = new Map();
        break;
      }
      worstGap = gapA === null || gapB === null ? null : Math.max(gapA, gapB);
      // Proven within the gap asked for: by HiGHS on the whole model, or by the LP bound over every pair.
      optimal = worstGap !== null && worstGap <= s.gap + 1e-12 && (exact ? a.optimal && b.optimal : true);
      status = optimal ? "Optimal" : timeHit ? "Time limit reached" : worstGap === null ? (b.status !== "Optimal" ? b.status : a.status) : "Gap above target";
      size = { variables: actB.reduce((m, v) => m + v, 0), constraints: full.lp.numRows, nonzeros: full.lp.nonzeros };
      modelledPairs = 0;
      for (let j = 0; j < n; j++) if (act[j] && full.kind[j] === X) modelledPairs++;

      t = performance.now();
      staffed = extract(full, use);
      const check = recheck(staffed);
      timings.recheckMs += performance.now() - t;
      carried = check.carried;
      if (check.problems.size === 0) {
        dropped = new Map();
        break;
      }
      const fresh = check.cuts.filter((c) => !cutKeys.has(c.key));
      if (rounds >= s.maxRounds || performance.now() >= deadline || fresh.length === 0) {
        dropped = check.problems;
        for (const id of dropped.keys()) staffed.delete(id);
        optimal = false;
        break;
      }
      for (const c of fresh) {
        cutKeys.add(c.key);
        cuts.push(c);
        addCut(full, c);
      }
      // New rows: the growing LP starts again over the columns gathered so far.
      (glp as GrowingLp | null)?.dispose();
      glp = null;
      pending.splice(0);
      for (let j = 0; j < n; j++) if (act[j]) pending.push(j);
    }
    (glp as GrowingLp | null)?.dispose();
  }

  function debug(label: string, r: SolveOutcome, bound: number | null) {
    if (r.status === "Time limit reached") timeHit = true;
    if (process.env.FILL_DEBUG) console.error(label, r.status, `${r.ms.toFixed(0)} ms`, "obj", r.objective, "gap", r.gap, "lp bound", bound, "cg", cgRounds);
  }

  /** Initial columns on big days: greedy picks (two per seat, by priority) and the cheapest few of each kind. */
  function seedShortlist(built: Built, act: Uint8Array, activate: (j: number) => boolean) {
    const sorted = new Map<number, string[]>();
    const sortedOf = (g: number) => {
      let l = sorted.get(g);
      if (!l) {
        const { ctx, p } = built.groups[g];
        l = ctx.eligible.get(p)!.slice().sort((a, b) => seatCostOf(a, ctx, p) - seatCostOf(b, ctx, p) || cmpStr(a, b));
        sorted.set(g, l);
      }
      return l;
    };
    const groupOf = new Map<string, number>();
    built.groups.forEach((gr, g) => groupOf.set(`${gr.ctx.fo.id}|${gr.p}`, g));
    // Greedy: orders by priority, scarce positions first; each seat its cheapest free person and the next one.
    const busy = new Map<string, Array<[number, number]>>();
    const free = (w: string, o: WorkOrder) => !(busy.get(w) ?? []).some(([a, b]) => a < o.end && o.start < b);
    const order = built.ctxs.slice().sort((a, b) => b.value - a.value || a.order.start - b.order.start || cmpStr(a.fo.id, b.fo.id));
    for (const c of order) {
      const here = new Set<string>();
      const ps = [...c.open.keys()].sort((a, b) => c.eligible.get(a)!.length - c.eligible.get(b)!.length);
      for (const p of ps) {
        const g = groupOf.get(`${c.fo.id}|${p}`)!;
        const list = sortedOf(g);
        let want = 2 * c.open.get(p)!.length;
        for (const w of list) {
          if (want === 0) break;
          if (here.has(w) || !free(w, c.order)) continue;
          activate(built.xOf(c.fo.id, w, p)!);
          if (want % 2 === 0) here.add(w);
          want--;
        }
      }
      for (const w of here) push(busy, w, [c.order.start, c.order.end]);
    }
    const kinds: Array<(w: Worker, c: Ctx) => boolean> = [
      () => true,
      (w) => isJourneyLevel(w.classification),
      (w, c) => w.classification === "operator" && ix.holdsThrough(w, "qualified_electrical", c.order),
      (w, c) => ix.holdsThrough(w, "first_aid_cpr", c.order),
      (w, c) => ix.holdsThrough(w, "pole_top_rescue", c.order),
      (w, c) => ix.holdsThrough(w, "aerial_rescue", c.order),
    ];
    built.groups.forEach((gr, g) => {
      const list = sortedOf(g);
      const k = gr.ctx.open.get(gr.p)!.length;
      kinds.forEach((kind, i) => {
        let left = i === 0 ? Math.max(s.candidatesPerSeat, 2 * k) : 2;
        for (const w of list) {
          if (left === 0) break;
          if (!kind(ix.workers.get(w)!, gr.ctx)) continue;
          activate(built.xOf(gr.ctx.fo.id, w, gr.p)!);
          left--;
        }
      });
    });
  }

  /**
   * Phase 2's head start on big days: over the orders phase 1 staffs, seats taken cheapest
   * person first (each person once at a time), and the next few cheapest per seat beside them.
   */
  function seedFairness(built: Built, heldY: Map<number, number>, activate: (j: number) => boolean) {
    const pairs: Array<[number, number, string]> = []; // cost, group, worker
    built.groups.forEach((gr, g) => {
      if (heldY.get(built.y.get(gr.ctx.fo.id)!) !== 1) return;
      for (const w of gr.ctx.eligible.get(gr.p)!) pairs.push([seatCostOf(w, gr.ctx, gr.p), g, w]);
    });
    pairs.sort((a, b) => a[0] - b[0] || a[1] - b[1] || cmpStr(a[2], b[2]));
    const left = built.groups.map((gr) => gr.ctx.open.get(gr.p)!.length);
    const extra = built.groups.map(() => 2);
    const busy = new Map<string, WorkOrder[]>();
    const onOrder = new Set<string>();
    for (const [, g, w] of pairs) {
      const { ctx, p } = built.groups[g];
      const o = ctx.order;
      const free = !(busy.get(w) ?? []).some((b) => b.start < o.end && o.start < b.end) && !onOrder.has(`${w}|${ctx.fo.id}`);
      if (left[g] > 0 && free) {
        left[g]--;
        push(busy, w, o);
        onOrder.add(`${w}|${ctx.fo.id}`);
        activate(built.xOf(ctx.fo.id, w, p)!);
      } else if (extra[g] > 0 && free) {
        extra[g]--;
        activate(built.xOf(ctx.fo.id, w, p)!);
      }
    }
  }

  function addCut(built: Built, cut: Cut) {
    const terms: Array<[number, number]> = [];
    for (const [w, o] of cut.people ?? []) terms.push(...built.person(o, w));
    for (const [o, w, p] of cut.seats ?? []) {
      const k = built.xOf(o, w, p);
      if (k !== undefined) terms.push([k, 1]);
    }
    if (terms.length) built.lp.row(terms, -Infinity, cut.max, true);
  }

  function extract(built: Built, v: Float64Array): Map<string, Assignment[]> {
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

  /** The engine's own verdict on the proposal: blocks it introduces, per order, and the cuts that forbid them. */
  function recheck(proposal: Map<string, Assignment[]>) {
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

  // --- the answer ---------------------------------------------------------------------------
  const proposals: Proposal[] = [];
  const staffedOut: StaffedOrder[] = [];
  let cost = 0;
  let staffing = 0;
  const placedOn = new Map<string, string[]>(); // worker -> orders (new)
  for (const [o, list] of staffed) for (const a of list) push(placedOn, a.workerId, o);
  for (const c of ctxs) {
    const o = c.fo.id;
    const list = staffed.get(o);
    if (!list) continue;
    staffing += c.value;
    staffedOut.push({ orderId: o, carried: carried.get(o) ?? [] });
    const byPos = new Map<Position, string[]>();
    for (const a of list) push(byPos, a.position, a.workerId);
    const seatsOf = new Map<string, number>();
    for (const a of list) seatsOf.set(a.workerId, (seatsOf.get(a.workerId) ?? 0) + 1);
    for (const n of seatsOf.values()) if (n > 1) cost += DOUBLE_PENALTY;
    const needs = lastBuilt?.needs.get(o) ?? new Set<Group>();
    for (const [p, seats] of c.open) {
      const ws = (byPos.get(p) ?? []).sort(cmpStr);
      seats.forEach((positionId, i) => {
        const w = ws[i];
        if (!w) return;
        const fw = poolById.get(w)!;
        cost += seatCostOf(w, c, p);
        proposals.push({ orderId: o, positionId, position: p, workerId: w, workerName: fw.name, reasons: reasonsFor(c, p, fw, list, needs) });
      });
    }
  }
  // Pair bonuses earned (a pair once per order).
  for (const [o, list] of staffed) {
    const c = ctxById.get(o)!;
    const people = new Set([...c.existingIds, ...list.map((a) => a.workerId)]);
    const counted = new Set<string>();
    for (const w of new Set(list.map((a) => a.workerId))) {
      for (const v of pairsOf.get(w) ?? []) {
        if (!people.has(v)) continue;
        const k = w < v ? `${w}|${v}` : `${v}|${w}`;
        if (counted.has(k)) continue;
        counted.add(k);
        cost -= TOGETHER_BONUS;
      }
    }
  }

  function reasonsFor(c: Ctx, p: Position, w: FillWorker, crew: Assignment[], needs: Set<Group>): string[] {
    const out: string[] = [`priority ${priorityOf(c.fo)} order`];
    const eligible = c.eligible.get(p)!.map((id) => poolById.get(id)!);
    const mine = overtimeTenths(w);
    const lower = eligible.filter((x2) => overtimeTenths(x2) < mine).length;
    out.push(
      lower === 0
        ? `${hoursText(w.overtimeHours)} overtime in 28 days (lowest eligible${eligible.length > 1 ? ` of ${eligible.length}` : ""})`
        : `${hoursText(w.overtimeHours)} overtime in 28 days (${ordinal(lower + 1)} lowest of ${eligible.length} eligible; the ${lower === 1 ? "one" : lower} lower ${lower === 1 ? "is" : "are"} placed elsewhere or would break a crew rule)`,
    );
    out.push(w.yardId === c.fo.yardId ? "home yard" : `from ${w.yardCode ?? `yard ${w.yardId}`} (not the order's yard)`);
    const rw = ix.workers.get(w.id)!;
    if (p === "lead") {
      // Issue 18: why this person leads.
      const leads = eligible.filter((x2) => x2.classification === "crew_lead").length;
      out.push(
        w.classification === "crew_lead"
          ? "crew lead in the lead seat (crew leads are preferred for lead)"
          : leads === 0
            ? "no crew lead could take the lead seat, so a journey-level worker leads"
            : "a crew lead was eligible but is needed elsewhere or would break a crew rule",
      );
      if (c.order.workType === "digger_derrick" && c.order.energized) {
        const aid = ix.holdsThrough(rw, "first_aid_cpr", c.order);
        const rescue = ix.holdsThrough(rw, "pole_top_rescue", c.order) || ix.holdsThrough(rw, "aerial_rescue", c.order);
        out.push(aid && rescue ? "holds first aid/CPR and rescue training (preferred to lead energized derrick work)" : `leads without ${[aid ? "" : "first aid/CPR", rescue ? "" : "rescue training"].filter(Boolean).join(" or ")}: nobody better was free`);
      }
    }
    const mineSeats = crew.filter((a) => a.workerId === w.id).map((a) => a.position);
    if (mineSeats.length > 1) out.push(`also ${mineSeats.filter((x2) => x2 !== p).map((x2) => `the ${POSITION_WORD[x2]}`).join(" and ")} (the lead may double)`);
    // Credentials the crew rules count, named only where this person is one the count rests on.
    const crewIds = new Set([...c.existing.map((x2) => x2.id), ...crew.map((a) => a.workerId)]);
    const crewWorkers = [...crewIds].map((id) => ix.workers.get(id)!);
    const holds = (x2: Worker, code: string) => ix.holdsThrough(x2, code, c.order);
    if (needs.has("FIRST_AID") && holds(rw, "first_aid_cpr") && crewWorkers.filter((x2) => holds(x2, "first_aid_cpr")).length <= 2) {
      out.push("first aid/CPR trained (one of the two the crew needs)");
    }
    if (needs.has("RESCUE") && !mineSeats.includes("climber") && !mineSeats.includes("aerial")) {
      const climbing = (id: string) =>
        c.existing.some((x2) => x2.id === id && ["climber", "aerial"].some((p) => ix.crew(c.fo.id).positionsOf.get(id)?.has(p as Position))) ||
        crew.some((a) => a.workerId === id && (a.position === "climber" || a.position === "aerial"));
      const code = c.order.workType === "bucket" ? "aerial_rescue" : "pole_top_rescue";
      const rescuers = crewWorkers.filter((x2) => !climbing(x2.id) && holds(x2, code));
      if (rescuers.length === 1 && rescuers[0].id === w.id) {
        out.push(code === "aerial_rescue" ? "aerial-lift rescue trained, on the ground (the crew's only one)" : "pole-top rescue trained, not climbing (the crew's only one)");
      }
    }
    const people = new Set([...c.existing.map((x2) => x2.id), ...crew.map((a) => a.workerId)]);
    const hasApprentice = [...people].some((id) => ix.workers.get(id)?.classification === "apprentice");
    if (hasApprentice && isJourneyLevel(rw.classification) && !c.existing.some((x2) => isJourneyLevel(x2.classification))) out.push("journey-level beside the apprentice");
    const mates = [...(pairsOf.get(w.id) ?? [])].filter((v) => people.has(v)).map((v) => ix.workers.get(v)?.name ?? v);
    if (mates.length) out.push(`worked with ${mates.join(", ")} yesterday`);
    return out;
  }

  // --- why each order left open is open -----------------------------------------------------
  t = performance.now();
  const explainDeadline = t + Math.max(1000, 0.15 * s.timeLimitSeconds * 1000);
  const openOrders: OpenOrder[] = [];
  const openSeats: OpenSeat[] = [];
  const numberOf = (id: string) => ctxById.get(id)?.fo.number ?? id;
  for (const c of ctxs) {
    const o = c.fo.id;
    if (staffed.has(o)) continue;
    for (const [p, seats] of c.open) {
      const info = seatInfo(c, p);
      for (const positionId of seats) openSeats.push({ orderId: o, positionId, position: p, ...info });
    }
    if (c.impossible) {
      openOrders.push({ orderId: o, reason: c.impossible.reason, rule: c.impossible.rule });
      continue;
    }
    const problemsHere = dropped.get(o);
    if (problemsHere) {
      const rules = [...new Set(problemsHere.map((f) => f.rule))];
      openOrders.push({
        orderId: o,
        reason: `The best crew found still had ${rules.join(", ")} after ${rounds} solve${rounds > 1 ? "s" : ""}: ${problemsHere[0].message}`,
        rule: rules[0],
      });
      continue;
    }
    openOrders.push({ orderId: o, ...(await explainOpen(c)) });
  }
  timings.explainMs = performance.now() - t;

  function seatInfo(c: Ctx, p: Position) {
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

  async function explainOpen(c: Ctx): Promise<{ reason: string; rule: RuleCode | null }> {
    if (!s.explain || performance.now() > explainDeadline) {
      return { reason: "Not staffed: its eligible people are needed on higher-priority or overlapping orders, or no crew of them meets the crew rules.", rule: null };
    }
    // Could it be staffed if it were the only order of the day?
    const alone = await feasible(build([c], { force: true, pairs: false }));
    if (alone) {
      const people = new Set<string>();
      for (const [w, ps] of c.cand) for (const p of ps) if (alone.v[alone.built.xOf(c.fo.id, w, p)!] > 0.5) people.add(w);
      const elsewhere = new Map<string, number>();
      for (const w of people) for (const o2 of placedOn.get(w) ?? []) if (o2 !== c.fo.id) elsewhere.set(o2, priorityOf(ctxById.get(o2)!.fo));
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
      if (await feasible(build([c], { force: true, pairs: false, disabled: new Set([g]) }))) return { reason, rule };
    }
    return { reason: "No crew of eligible people meets the crew rules together for this order.", rule: null };
  }

  /** Feasibility of a one-order model (forced staffed), every column in. */
  async function feasible(built: Built): Promise<{ built: Built; v: Float64Array } | null> {
    const r = await solveLp(built.lp, new Float64Array(built.lp.numCols), {
      timeLimitSeconds: Math.min(1, Math.max(0.1, (explainDeadline - performance.now()) / 1000)),
      gap: 0,
    });
    return r.feasible && r.values ? { built, v: r.values } : null;
  }

  return {
    proposals,
    staffed: staffedOut,
    open: openSeats,
    openOrders,
    status,
    optimal,
    gap: worstGap,
    objective: { staffing, cost },
    solveMs: Math.round(performance.now() - t0),
    timings: roundTimings(timings),
    size: { ...size, eligiblePairs, modelledPairs, rounds, dropped: dropped.size, pricingRounds: cgRounds, complete: modelledPairs === eligiblePairs, pricingConverged: cgConverged },
    settings: { timeLimitSeconds: s.timeLimitSeconds, gap: s.gap },
  };
}

/** Every active column at 0 or 1 (within 1e-6). */
function integral(v: Float64Array, active: Uint8Array): boolean {
  for (let j = 0; j < v.length; j++) {
    if (!active[j]) continue;
    const x = v[j];
    if (x > 1e-6 && x < 1 - 1e-6) return false;
  }
  return true;
}

function roundTimings<T extends Record<string, number>>(t: T): T {
  return Object.fromEntries(Object.entries(t).map(([k, v]) => [k, Math.round(v * 10) / 10])) as T;
}

function staticImpossibility(c: Ctx, ix: SnapshotIndex): { reason: string; rule: RuleCode | null } | null {
  const order = c.order;
  for (const [p, seats] of c.open) {
    const n = c.eligible.get(p)!.length;
    if (n < seats.length) {
      return {
        reason:
          n === 0 ? `No one in the pool is eligible for the ${POSITION_WORD[p]} position.` : `Only ${n} eligible for ${seats.length} ${POSITION_WORD[p]} positions.`,
        rule: null,
      };
    }
  }
  if (order.minCrew !== null && c.existing.length + c.openCount < order.minCrew) {
    return {
      reason: `Needs at least ${order.minCrew} people on site but has only ${c.existing.length + c.openCount} position${c.existing.length + c.openCount === 1 ? "" : "s"}; add a position to the order.`,
      rule: "CREW_MIN",
    };
  }
  const positionsOf = ix.crew(c.fo.id).positionsOf;
  const observers = c.existing.filter((w) => positionsOf.get(w.id)?.has("observer"));
  if (order.workType === "digger_derrick" && onOrNearAbove(order, HIGH_VOLTAGE_KV) && !c.open.has("observer") && !observers.some((w) => !positionsOf.get(w.id)!.has("operator"))) {
    return { reason: "A digger derrick on or near parts above 600 V needs an observer who is not the operator, and the order has no open observer position.", rule: "OBSERVER" };
  }
  // IN_CHARGE blocks (Corrections 5): two or more on site need someone in the lead position.
  if (c.existing.length + c.openCount >= 2 && !c.open.has("lead") && !c.existing.some((w) => positionsOf.get(w.id)?.has("lead"))) {
    return { reason: "Two or more people on site need a lead (the employee in charge, who holds the job briefing), and the order has no lead position; add one to the order.", rule: "IN_CHARGE" };
  }
  const hasClimber = c.open.has("climber") || c.existing.some((w) => positionsOf.get(w.id)?.has("climber"));
  if (isClimbingWork(order, hasClimber) && !c.open.has("observer") && !observers.some((w) => !positionsOf.get(w.id)!.has("climber"))) {
    return { reason: "Climbing work needs a ground observer who is not climbing, and the order has no open observer position.", rule: "OBSERVER" };
  }
  return null;
}

/** Maximal sets of mutually overlapping orders (an interval graph's cliques: the orders running at some start time). */
function maximalCliques(ctxs: Ctx[]): Ctx[][] {
  const starts = [...new Set(ctxs.map((c) => c.order.start))].sort((a, b) => a - b);
  const sets = starts.map((t) => ctxs.filter((c) => c.order.start <= t && t < c.order.end));
  const asSets = sets.map((l) => new Set(l));
  const keep: Ctx[][] = [];
  for (let i = 0; i < sets.length; i++) {
    const a = sets[i];
    const sub = asSets.some((b, j) => j !== i && b.size > a.length && a.every((c) => b.has(c)));
    if (!sub && a.length) keep.push(a);
  }
  return keep;
}
