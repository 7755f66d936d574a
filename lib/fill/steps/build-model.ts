// Step 2, the model: the integer program over every eligible pair (see lib/fill/fill.ts for the
// formulation). `ModelBuilder` holds the columns and the person(w,o) terms; `buildModel` adds
// per order the seat variables, the lead's doubling, every-seat-or-none, the crew conditions
// (crew-rows.ts), then one person one place at a time, the rest rule, yesterday's pairs and the
// staffing row phase 2 holds.

import type { Position } from "@/lib/rules/types";
import { Lp } from "../highs";
import { DOUBLE_PENALTY, TOGETHER_BONUS } from "../objective";
import { D, X, Y, Z, push, type Built, type Ctx, type FillRun, type Group } from "./context";
import { addCrewRows } from "./crew-rows";

interface WV {
  pos: Position[];
  cols: number[];
  d: number;
  person: Array<[number, number]> | null;
}

export class ModelBuilder {
  readonly lp = new Lp();
  readonly kind: number[] = [];
  readonly group: number[] = [];
  readonly cA: number[] = [];
  readonly cB: number[] = [];
  readonly vars = new Map<string, Map<string, WV>>();

  col(k: number, costA: number, costB: number, g = -1, lo = 0): number {
    const c = this.lp.col(lo, 1, true);
    this.kind[c] = k;
    this.group[c] = g;
    this.cA[c] = costA;
    this.cB[c] = costB;
    return c;
  }

  xOf = (o: string, w: string, p: Position): number | undefined => {
    const v = this.vars.get(o)?.get(w);
    if (!v) return undefined;
    const i = v.pos.indexOf(p);
    return i < 0 ? undefined : v.cols[i];
  };

  /** person(w,o) = Σ_p x[w,o,p] − d[w,o]: 1 when w is on o, counted once. */
  person = (o: string, w: string): Array<[number, number]> => {
    const v = this.vars.get(o)?.get(w);
    if (!v) return [];
    if (!v.person) {
      v.person = v.cols.map((k) => [k, 1] as [number, number]);
      if (v.d >= 0) v.person.push([v.d, -1]);
    }
    return v.person;
  };

  /** person(o, w) when w holds none of the `skip` seats (a seat in `skip` is never the rescuer's). */
  personBut(o: string, w: string, skip: readonly Position[]): Array<[number, number]> {
    const v = this.vars.get(o)?.get(w);
    if (!v) return this.person(o, w);
    const sk = new Set(v.pos.flatMap((p, i) => (skip.includes(p) ? [v.cols[i]] : [])));
    if (sk.size === 0) return this.person(o, w);
    return this.person(o, w).filter(([k]) => !sk.has(k));
  }

  /** The x columns of w's eligible seats on the order, and the doubling column (lead and one other seat) with its three rows. */
  seats(c: Ctx, w: string, ps: Position[], groupIndex: Map<Position, number>, cost: (p: Position) => number, oneSeat: boolean, links: Pick<Built, "dLinks" | "dOfX">): WV {
    const cols = ps.map((p) => this.col(X, 0, cost(p), groupIndex.get(p)!));
    const v: WV = { pos: ps, cols, d: -1, person: null };
    const li = ps.indexOf("lead");
    const nl = cols.filter((_, i) => i !== li);
    if (li >= 0 && nl.length) {
      const dc = this.col(D, 0, DOUBLE_PENALTY);
      v.d = dc;
      const xl = cols[li];
      links.dLinks.set(dc, [xl, nl]);
      links.dOfX.set(xl, dc);
      for (const k of nl) links.dOfX.set(k, dc);
      const dl: Array<[number, number]> = [[dc, 1], [xl, -1]];
      for (const k of nl) dl.push([k, -1]);
      this.lp.row(dl, -1, Infinity);
      this.lp.row([[dc, 1], [xl, -1]], -Infinity, 0);
      const dn: Array<[number, number]> = [[dc, 1]];
      for (const k of nl) dn.push([k, -1]);
      this.lp.row(dn, -Infinity, 0);
    }
    if (nl.length >= 2 && oneSeat) this.lp.row(nl.map((k) => [k, 1] as [number, number]), -Infinity, 1);
    return v;
  }
}

export interface BuildOptions {
  /** Crew conditions left out (to find which one keeps an order open). */
  disabled?: Set<Group>;
  /** Every order staffed (y fixed at 1). */
  force?: boolean;
  /** Yesterday's pairs as z variables (default on). */
  pairs?: boolean;
}

/** The whole model over `orders` (every eligible pair a column). */
export function buildModel(run: FillRun, orders: Ctx[], opts: BuildOptions): Built {
  const mb = new ModelBuilder();
  const { lp } = mb;
  const groups: Built["groups"] = [];
  const y = new Map<string, number>();
  const links: Pick<Built, "dLinks" | "dOfX"> = { dLinks: new Map(), dOfX: new Map() };
  const needs = new Map<string, Set<Group>>();
  const off = opts.disabled ?? new Set<Group>();
  const seatRows: number[] = [];
  const groupCols: number[][] = [];

  for (const c of orders) {
    const o = c.fo.id;
    const yc = mb.col(Y, -c.value, 0, -1, opts.force ? 1 : 0);
    y.set(o, yc);
    const groupIndex = new Map<Position, number>();
    for (const p of c.open.keys()) {
      groupIndex.set(p, groups.length);
      groups.push({ ctx: c, p });
    }
    const here = new Map<string, WV>();
    mb.vars.set(o, here);
    for (const [w, ps] of c.cand) here.set(w, mb.seats(c, w, ps, groupIndex, (p) => run.seatCostOf(w, c, p), !off.has("ONE_SEAT"), links));
    // Every open seat filled, or none.
    for (const [p, seats] of c.open) {
      const terms: Array<[number, number]> = c.eligible.get(p)!.map((w) => [mb.xOf(o, w, p)!, 1]);
      groupCols[groupIndex.get(p)!] = terms.map(([k]) => k);
      terms.push([yc, -seats.length]);
      seatRows.push(lp.row(terms, 0, 0));
    }
    needs.set(o, addCrewRows(mb, run, c, yc, off));
  }
  addOverlapRows(mb, run, orders);
  const zLinks = opts.pairs !== false ? addPairBonuses(mb, run, orders) : new Map<number, [number[], number[]]>();
  const staffRow = lp.row(
    orders.map((c) => [y.get(c.fo.id)!, c.value] as [number, number]),
    -Infinity,
    Infinity,
  );
  const seatRow = new Uint8Array(lp.numRows + 1);
  for (const r of seatRows) seatRow[r] = 1;
  return {
    lp,
    kind: mb.kind,
    group: mb.group,
    groups,
    ...links,
    zLinks,
    xOf: mb.xOf,
    y,
    costA: Float64Array.from(mb.cA),
    costB: Float64Array.from(mb.cB),
    staffRow,
    ctxs: orders,
    person: mb.person,
    needs,
    seatRow,
    groupCols,
  };
}

/** One person, one place at a time (each maximal overlapping set), and the rest rule between close orders. */
function addOverlapRows(mb: ModelBuilder, run: FillRun, orders: Ctx[]) {
  const inSet = new Set(orders.map((c) => c.fo.id));
  const seen = new Set<string>();
  for (const clique of run.cliques) {
    const members = clique.filter((c) => inSet.has(c.fo.id));
    if (members.length < 2) continue;
    const byWorker = new Map<string, Ctx[]>();
    for (const c of members) for (const w of c.cand.keys()) push(byWorker, w, c);
    for (const [w, cs] of byWorker) {
      if (cs.length < 2) continue;
      const key = `${w}|${cs.map((c) => c.fo.id).join(",")}`;
      if (seen.has(key)) continue;
      seen.add(key);
      mb.lp.row(cs.flatMap((c) => mb.person(c.fo.id, w)), -Infinity, 1);
    }
  }
  for (const [a, b] of run.restPairs) {
    if (!inSet.has(a.fo.id) || !inSet.has(b.fo.id)) continue;
    for (const w of a.cand.keys()) if (b.cand.has(w)) mb.lp.row([...mb.person(a.fo.id, w), ...mb.person(b.fo.id, w)], -Infinity, 1);
  }
}

/** Worked together yesterday: a bonus per pair kept on one order (z ≤ person(a), z ≤ person(b)); a partner already there discounts the person. */
function addPairBonuses(mb: ModelBuilder, run: FillRun, orders: Ctx[]): Map<number, [number[], number[]]> {
  const zLinks = new Map<number, [number[], number[]]>();
  if (!run.pairsOf.size) return zLinks;
  const neg = (terms: Array<[number, number]>) => terms.map(([k, v]) => [k, -v] as [number, number]);
  let zs = 0;
  for (const c of orders) {
    const o = c.fo.id;
    for (const w of c.cand.keys()) {
      const partners = run.pairsOf.get(w);
      if (!partners) continue;
      for (const v of partners) {
        if (c.existingIds.has(v)) {
          for (const [k, coef] of mb.person(o, w)) mb.cB[k] -= TOGETHER_BONUS * coef;
        } else if (w < v && c.cand.has(v) && zs < run.s.maxPairVariables) {
          const z = mb.col(Z, 0, -TOGETHER_BONUS);
          zs++;
          const pa = mb.person(o, w);
          const pb = mb.person(o, v);
          zLinks.set(z, [pa.filter(([, coef]) => coef > 0).map(([k]) => k), pb.filter(([, coef]) => coef > 0).map(([k]) => k)]);
          mb.lp.row([[z, 1], ...neg(pa)], -Infinity, 0);
          mb.lp.row([[z, 1], ...neg(pb)], -Infinity, 0);
        }
      }
    }
  }
  return zLinks;
}
