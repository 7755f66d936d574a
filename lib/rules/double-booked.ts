// DOUBLE_BOOKED: one worker on two orders that overlap in time (end == start is not overlap).
// Locked: nobody can be in two places, so no override accepts it (issue 15).

import { finding, spanWords, who, type RuleCheck } from "./common";
import { epochToZonedWallTime } from "./time";
import type { Finding } from "./types";

export const DOUBLE_BOOKED_SOURCE = "scheduling conflict (no regulation)";

export const doubleBooked: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  const span = (a: number, b: number) => spanWords(epochToZonedWallTime(a, ix.timezone), epochToZonedWallTime(b, ix.timezone));
  for (const order of orders) {
    for (const w of ix.crew(order.id).people) {
      const clashes = ix
        .ordersOf(w.id)
        .filter((o) => o.id !== order.id && o.start < order.end && order.start < o.end)
        .sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0))
        .map((o) => `"${o.title}" (${span(o.start, o.end)})`);
      if (clashes.length > 0) {
        out.push(
          finding(
            "DOUBLE_BOOKED",
            "block",
            order,
            w.id,
            `${who(w)} is also on ${clashes.join(", ")} at an overlapping time. Remove them from one of the orders; this cannot be overridden.`,
            DOUBLE_BOOKED_SOURCE,
            true,
          ),
        );
      }
    }
  }
  return out;
};
