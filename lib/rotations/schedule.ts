// On-call rotations: members take turns in `sort` order, one per hand-over period. Hand-overs
// come from the rotation's RRULE and its first hand-over (dtstart_local, wall clock in the
// yard's zone), expanded in floating wall-clock time like order series (lib/orders/data-occurrences.ts),
// so a Monday 07:00 hand-over stays 07:00 local across daylight-saving changes and a period
// that spans one is 167 h or 169 h of elapsed time. A hand-over in the spring-forward gap
// (Sunday 02:30) happens at 03:30 (RFC 5545 "compatible").
//
// This file is the pure part (client-safe: the rotation form previews the schedule with it);
// onCallAt in data-on-call.ts reads the rotations from the database. Before the first
// hand-over nobody is on call; when a rule with COUNT or UNTIL has run out, the rotation is
// over at its last hand-over.

import { floating, floatingRule, floatingToLocal } from "@/lib/time/recurrence";
import { offsetAt, zonedWallTimeToEpoch } from "@/lib/rules/time";

const DAY_MS = 86_400_000;
const MAX_HANDOVERS = 50_000;

export interface RotationRule {
  rrule: string;
  /** First hand-over, wall clock "YYYY-MM-DDTHH:mm[:ss]" in `timezone`. */
  dtstartLocal: string;
  timezone: string;
}

export interface Handover {
  /** 0 for the first hand-over of the rotation, 1 for the next, … */
  index: number;
  /** The instant (epoch ms). */
  at: number;
  /** The wall-clock time the rule names ("YYYY-MM-DDTHH:mm:ss"); `at` may differ in a DST gap. */
  local: string;
}

export interface Period {
  index: number;
  from: number;
  /** End of the period (the next hand-over); null when the rule has no further hand-over. */
  to: number | null;
}

function toHandover(index: number, f: Date, tz: string): Handover {
  const local = floatingToLocal(f.getTime());
  return { index, at: zonedWallTimeToEpoch(local, tz), local };
}

/** Every hand-over from the first up to (and including) the first one after `untilMs`. */
function handoversThrough(rule: RotationRule, untilMs: number): { list: Handover[]; next: Handover | null } {
  const rr = floatingRule({ rrule: rule.rrule, dtstartLocal: rule.dtstartLocal }, rule.timezone, { subDaily: true });
  // Floating bound a little past the instant's wall clock (two days covers any offset change).
  const bound = untilMs + offsetAt(untilMs, rule.timezone) + 2 * DAY_MS;
  const list: Handover[] = [];
  let next: Handover | null = null;
  rr.all((d, i) => {
    if (i >= MAX_HANDOVERS) return false;
    const h = toHandover(i, d, rule.timezone);
    if (h.at > untilMs) {
      next = h;
      return false;
    }
    list.push(h);
    return d.getTime() <= bound;
  });
  return { list, next };
}

/** The hand-over period containing `instant` (from ≤ instant < to), or null before the first / after the last. */
export function periodAt(rule: RotationRule, instant: number): Period | null {
  const { list, next } = handoversThrough(rule, instant);
  if (list.length === 0) return null;
  const cur = list[list.length - 1];
  if (!next) {
    // The rule may simply have run out: the rotation ended at its last hand-over.
    return null;
  }
  return { index: cur.index, from: cur.at, to: (next as Handover).at };
}

/** Hand-overs whose instant falls in [fromMs, toMs). */
export function handoversBetween(rule: RotationRule, fromMs: number, toMs: number): Handover[] {
  const rr = floatingRule({ rrule: rule.rrule, dtstartLocal: rule.dtstartLocal }, rule.timezone, { subDaily: true });
  const bound = toMs + offsetAt(toMs, rule.timezone) + 2 * DAY_MS;
  const out: Handover[] = [];
  rr.all((d, i) => {
    if (i >= MAX_HANDOVERS || d.getTime() > bound) return false;
    const h = toHandover(i, d, rule.timezone);
    if (h.at >= fromMs && h.at < toMs) out.push(h);
    return true;
  });
  return out;
}

export interface OnCall<M> {
  member: M;
  period: Period;
}

/** Who of `members` (in turn order) is on call at `instant`: member (index mod n) of the period. */
export function onCallFromMembers<M>(rule: RotationRule, members: readonly M[], instant: number): OnCall<M> | null {
  if (members.length === 0) return null;
  const p = periodAt(rule, instant);
  if (!p) return null;
  return { member: members[p.index % members.length], period: p };
}

/** The next `count` periods from `fromMs` on (the current one first), with who is on call. */
export function schedule<M>(rule: RotationRule, members: readonly M[], fromMs: number, count: number): OnCall<M>[] {
  if (members.length === 0) return [];
  const out: OnCall<M>[] = [];
  const current = periodAt(rule, fromMs);
  const rr = floatingRule({ rrule: rule.rrule, dtstartLocal: rule.dtstartLocal }, rule.timezone, { subDaily: true });
  const startIndex = current ? current.index : 0;
  let prev: Handover | null = null;
  rr.all((d, i) => {
    if (i >= MAX_HANDOVERS) return false;
    if (i < startIndex) return true;
    const h = toHandover(i, d, rule.timezone);
    if (prev) out.push({ member: members[prev.index % members.length], period: { index: prev.index, from: prev.at, to: h.at } });
    prev = h;
    return out.length < count;
  });
  return out;
}

/** Elapsed hours of a period (167 or 169 across a daylight-saving change of a weekly rotation). */
export const periodHours = (p: Period) => (p.to === null ? null : (p.to - p.from) / 3_600_000);
