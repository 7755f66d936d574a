// Rubber insulating gloves and sleeves: the class ratings of 29 CFR 1910.137 Table I-4 and the
// retest intervals of Table I-5, as pure helpers the RUBBER_GOODS rule, Fill and the product's
// rubber-goods pages share. Client-safe.
//
// Table I-4 (Rubber insulating equipment, voltage requirements), maximum use voltage, AC rms:
//   class 00: 500 V; class 0: 1,000 V; class 1: 7,500 V; class 2: 17,000 V; class 3: 26,500 V;
//   class 4: 36,000 V.
// Table I-5 (Rubber insulating equipment, test intervals): gloves before first issue and every
//   6 months thereafter; sleeves before first issue and every 12 months thereafter.
// (Both as quoted by OSHA-derived pages reachable from here: the Washington WAC 296-307-38018
// copy of the table, the OSHAcademy course quoting Table I-5 and a 1910.137 quotation of the
// older Table I-6 with the same intervals.)

import { epochToZonedDate } from "./time";
import type { GearClass, GearItem, GearKind, WorkOrder } from "./types";
import { GEAR_CLASSES } from "./equipment-types";

export const RUBBER_GOODS_SOURCE =
  "29 CFR 1910.137(c)(2)(i) and Table I-4 (maximum use voltage per class), 1910.137(c)(2)(viii) and Table I-5 (retest intervals)";

/** Table I-4: maximum use voltage (volts AC rms) per class. */
export const MAX_USE_VOLTS: Readonly<Record<GearClass, number>> = {
  "00": 500,
  "0": 1000,
  "1": 7500,
  "2": 17000,
  "3": 26500,
  "4": 36000,
};

/** Table I-5: months between electrical tests. */
export const RETEST_MONTHS: Readonly<Record<GearKind, number>> = { rubber_gloves: 6, rubber_sleeves: 12 };

/** The lowest class rated for a voltage (kV), or null above class 4 (rubber-glove work is not possible). */
export function classFor(kv: number): GearClass | null {
  for (const c of GEAR_CLASSES) if (kv * 1000 <= MAX_USE_VOLTS[c] + 1e-9) return c;
  return null;
}

/** Whether a class's maximum use voltage is at least kv. */
export function classCovers(c: GearClass, kv: number): boolean {
  return kv * 1000 <= MAX_USE_VOLTS[c] + 1e-9;
}

/** "17 kV", "500 V", "26.5 kV". */
export function volts(v: number): string {
  return v < 1000 ? `${v} V` : `${v / 1000} kV`;
}

/**
 * YYYY-MM-DD plus n calendar months; a day past the end of the target month is clamped to its
 * last day (2026-08-31 + 6 months = 2027-02-28).
 */
export function addMonths(date: string, n: number): string {
  const y = Number(date.slice(0, 4));
  const m = Number(date.slice(5, 7)) - 1 + n;
  const d = Number(date.slice(8, 10));
  const ty = y + Math.floor(m / 12);
  const tm = ((m % 12) + 12) % 12;
  const last = new Date(Date.UTC(ty, tm + 1, 0)).getUTCDate();
  return `${String(ty).padStart(4, "0")}-${String(tm + 1).padStart(2, "0")}-${String(Math.min(d, last)).padStart(2, "0")}`;
}

/**
 * The last day an item is within its test interval: its test date plus 6 months (gloves) or 12
 * months (sleeves), that day included. A test on 2027-01-20 keeps gloves in test through
 * 2027-07-20. Null when the item was never tested.
 */
export function inTestThrough(item: Pick<GearItem, "kind" | "testedOn">): string | null {
  return item.testedOn === null ? null : addMonths(item.testedOn, RETEST_MONTHS[item.kind]);
}

/** Whether the item is within its test interval on every day up to and including `lastDay`. */
export function inTestOn(item: Pick<GearItem, "kind" | "testedOn">, lastDay: string): boolean {
  const through = inTestThrough(item);
  return through !== null && through >= lastDay;
}

/**
 * An order's last day in the zone: the date of its last worked instant, so an order ending at
 * midnight ends on the day before. Multi-day orders must have gear in test through this day.
 */
export function lastDayOf(order: Pick<WorkOrder, "start" | "end" | "startDate">, timezone: string): string {
  if (order.end <= order.start) return order.startDate;
  const d = epochToZonedDate(order.end - 1, timezone);
  return d < order.startDate ? order.startDate : d;
}

export type GloveVerdict =
  | { ok: true }
  | { ok: false; reason: "none" }
  | { ok: false; reason: "above_class_4" }
  | { ok: false; reason: "underrated"; best: GearClass; needed: GearClass }
  | { ok: false; reason: "out_of_test"; item: GearItem };

/**
 * Gloves for work at `kv` (null = voltage unknown: any class) through `lastDay`: some pair rated
 * for the voltage and in test. Reports the nearest miss otherwise.
 */
export function gloveVerdict(gear: readonly GearItem[], kv: number | null, lastDay: string): GloveVerdict {
  if (kv !== null && classFor(kv) === null) return { ok: false, reason: "above_class_4" };
  const gloves = gear.filter((g) => g.kind === "rubber_gloves");
  if (gloves.length === 0) return { ok: false, reason: "none" };
  const rated = kv === null ? gloves : gloves.filter((g) => classCovers(g.class, kv));
  if (rated.length === 0) {
    const best = gloves.reduce((a, b) => (MAX_USE_VOLTS[b.class] > MAX_USE_VOLTS[a.class] ? b : a));
    return { ok: false, reason: "underrated", best: best.class, needed: classFor(kv!)! };
  }
  if (rated.some((g) => inTestOn(g, lastDay))) return { ok: true };
  // The most recently tested rated pair (never-tested pairs last).
  const item = rated.reduce((a, b) => ((b.testedOn ?? "") > (a.testedOn ?? "") ? b : a));
  return { ok: false, reason: "out_of_test", item };
}

/** Sleeves, when any are listed, need one pair in test (12 months) through `lastDay`; null = fine. */
export function sleeveProblem(gear: readonly GearItem[], lastDay: string): GearItem | null {
  const sleeves = gear.filter((g) => g.kind === "rubber_sleeves");
  if (sleeves.length === 0 || sleeves.some((g) => inTestOn(g, lastDay))) return null;
  return sleeves.reduce((a, b) => ((b.testedOn ?? "") > (a.testedOn ?? "") ? b : a));
}
