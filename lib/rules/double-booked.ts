// DOUBLE_BOOKED: one worker on two orders that overlap in time (end == start is not overlap).

import { finding, who, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const DOUBLE_BOOKED_SOURCE = "scheduling conflict (no regulation)";

export const doubleBooked: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    for (const w of ix.crew(order.id).people) {
      const clashes = ix
        .ordersOf(w.id)
        .filter((o) => o.id !== order.id && o.start < order.end && order.start < o.end)
        .map((o) => o.id)
        .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
      if (clashes.length > 0) {
        out.push(
          finding(
            "DOUBLE_BOOKED",
            "block",
            order,
            w.id,
            `${who(w)} is also on ${clashes.join(", ")} at an overlapping time. Remove them from one of the orders.`,
            DOUBLE_BOOKED_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
