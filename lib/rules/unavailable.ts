// UNAVAILABLE: leave, training or sickness covering any part of the order (half-open intervals).

import { finding, spanWords, who, type RuleCheck } from "./common";
import { epochToZonedWallTime } from "./time";
import type { Finding } from "./types";

export const UNAVAILABLE_SOURCE = "availability record (no regulation)";

export const unavailable: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  const span = (a: number, b: number) => spanWords(epochToZonedWallTime(a, ix.timezone), epochToZonedWallTime(b, ix.timezone));
  for (const order of orders) {
    for (const w of ix.crew(order.id).people) {
      const hits = w.unavailable
        .filter((u) => u.start < order.end && order.start < u.end)
        .sort((a, b) => a.start - b.start || a.end - b.end || (a.reason < b.reason ? -1 : a.reason > b.reason ? 1 : 0));
      if (hits.length > 0) {
        const spans = hits.map((u) => `${u.reason} ${span(u.start, u.end)}`).join("; ");
        out.push(
          finding(
            "UNAVAILABLE",
            "block",
            order,
            w.id,
            `${who(w)} is unavailable during this order (${spans}). Assign someone else.`,
            UNAVAILABLE_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
