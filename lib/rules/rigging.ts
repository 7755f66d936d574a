// RIGGING: a planned lift whose computed force on the block, the line or a sling leg exceeds
// that part's working load limit (the figures of lift.ts, rounded to 0.1 lb as shown). One
// finding per overloaded part, naming the part, the force and the limit.

import { finding, type RuleCheck } from "./common";
import { riggingOverloads, LIFT_SOURCE, withLiftDefaults } from "./lift";
import type { Finding } from "./types";

export const RIGGING_SOURCE = LIFT_SOURCE;

const PART_WORDS = { block: "the upper block", line: "the hand line (lead-line pull)", "sling leg": "each sling leg" } as const;

/** Plain figures (897.4 lb, 2000 lb): the same digits the report's `orders[].lift` shows. */
const lb = (n: number) => `${n} lb`;

export const rigging: RuleCheck = (orders) => {
  const out: Finding[] = [];
  for (const order of orders) {
    if (!order.lift) continue;
    for (const o of riggingOverloads(withLiftDefaults(order.lift))) {
      out.push(
        finding(
          "RIGGING",
          "block",
          order,
          null,
          `The lift puts ${lb(o.forceLb)} on ${PART_WORDS[o.part]}, over its working load limit of ${lb(o.limitLb)}. ` +
            "Add parts of line, choose rigging rated for the load, or change the sling angle before the lift.",
          RIGGING_SOURCE,
        ),
      );
    }
  }
  return out;
};
