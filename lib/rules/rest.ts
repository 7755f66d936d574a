// REST: worked time (time records plus every order the worker is on) separated by less than
// the minimum rest joins into one stretch; a stretch containing an order must not exceed the
// maximum shift. Elapsed epoch time throughout, so daylight-saving nights count real hours.
// An order that lists `shifts` (a multi-day order, Corrections 6) is worked during those
// shifts only, not over its whole span.

import { finding, hours, spanWords, who, type RuleCheck } from "./common";
import { upperBound, type SnapshotIndex } from "./snapshot-index";
import { epochToZonedWallTime } from "./time";
import type { Finding, Interval, Worker, WorkOrder } from "./types";

export const REST_SOURCE = 'common practice in utility labour agreements ("16 on, 8 off")';

const HOUR_MS = 3_600_000;

/** The worked time of an order: its shifts when it lists any, otherwise its whole span. */
export function workedIntervals(order: WorkOrder): readonly Interval[] {
  return order.shifts && order.shifts.length > 0 ? order.shifts : [order];
}

/**
 * The stretch of worked time containing the interval `from` (an order's span or one of its
 * shifts) for `worker`. Grows the order's interval by
 * absorbing every order or time-record stretch less than the minimum rest away, until nothing
 * more joins. Time records are pre-merged per worker, so each pass is a binary search.
 */
export function stretchContaining(ix: SnapshotIndex, worker: Worker, from: Interval): Interval {
  const gap = ix.policy.minRestHours * HOUR_MS;
  const others = ix.ordersOf(worker.id).flatMap((o) => workedIntervals(o));
  const { starts, ends } = ix.recordStretches(worker);
  let s = from.start;
  let e = from.end;
  for (;;) {
    let ns = s;
    let ne = e;
    for (const o of others) {
      if (o.start - e < gap && s - o.end < gap) {
        if (o.start < ns) ns = o.start;
        if (o.end > ne) ne = o.end;
      }
    }
    // Record stretches are disjoint and sorted, so ends ascend too: the first that can join
    // is the first with end > s - gap; they keep joining while start < e + gap.
    for (let i = upperBound(ends, s - gap); i < starts.length && starts[i] - e < gap; i++) {
      if (starts[i] < ns) ns = starts[i];
      if (ends[i] > ne) ne = ends[i];
    }
    if (ns === s && ne === e) return { start: s, end: e };
    s = ns;
    e = ne;
  }
}

export const rest: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  const { minRestHours, maxShiftHours } = ix.policy;
  const tz = ix.timezone;
  const span = (a: number, b: number) => spanWords(epochToZonedWallTime(a, tz), epochToZonedWallTime(b, tz));
  for (const order of orders) {
    const worked = workedIntervals(order);
    for (const w of ix.crew(order.id).people) {
      // The longest stretch any of the order's worked intervals falls in; the earliest of
      // equally long ones, so the message does not depend on the order shifts are listed in.
      let st: Interval | null = null;
      for (const iv of worked) {
        const s = stretchContaining(ix, w, iv);
        const d = s.end - s.start - (st ? st.end - st.start : -1);
        if (!st || d > 0 || (d === 0 && s.start < st.start)) st = s;
      }
      if (st && st.end - st.start > maxShiftHours * HOUR_MS) {
        out.push(
          finding(
            "REST",
            "block",
            order,
            w.id,
            `${who(w)} would work a ${hours(st.end - st.start)} h stretch (${span(st.start, st.end)}) ` +
              `without ${minRestHours} h rest; the limit is ${maxShiftHours} h. ` +
              `Give at least ${minRestHours} h rest before this order or assign someone else.`,
            REST_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
