// Where column generation starts on big days: a shortlist for phase 1 (staffing) and a head
// start for phase 2 (cost) from the orders phase 1 staffs.

import { isJourneyLevel } from "@/lib/rules/common";
import type { Worker, WorkOrder } from "@/lib/rules/types";
import { cmpStr, push, type Built, type Ctx, type FillRun } from "./context";

/** Each seat group's eligible people, cheapest first (ties by id). */
function cheapestFirst(run: FillRun, built: Built) {
  const sorted = new Map<number, string[]>();
  return (g: number) => {
    let l = sorted.get(g);
    if (!l) {
      const { ctx, p } = built.groups[g];
      const costed = ctx.eligible.get(p)!.map((w) => [run.seatCostOf(w, ctx, p), w] as const);
      l = costed.sort((a, b) => a[0] - b[0] || cmpStr(a[1], b[1])).map(([, w]) => w);
      sorted.set(g, l);
    }
    return l;
  };
}

/** Initial columns on big days: greedy picks (two per seat, by priority) and the cheapest few of each kind. */
export function seedShortlist(run: FillRun, built: Built, activate: (j: number) => boolean) {
  const { ix, s } = run;
  const sortedOf = cheapestFirst(run, built);
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
export function seedFairness(run: FillRun, built: Built, heldY: Map<number, number>, activate: (j: number) => boolean) {
  const pairs: Array<[number, number, string]> = []; // cost, group, worker
  built.groups.forEach((gr, g) => {
    if (heldY.get(built.y.get(gr.ctx.fo.id)!) !== 1) return;
    for (const w of gr.ctx.eligible.get(gr.p)!) pairs.push([run.seatCostOf(w, gr.ctx, gr.p), g, w]);
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
