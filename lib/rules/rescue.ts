// RESCUE: someone besides the exposed worker trained to get them down: pole-top rescue for
// climbing work, aerial-lift (lower controls) rescue on the ground for bucket work.

import { finding, isClimbingWork, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const RESCUE_SOURCE = "29 CFR 1910.269(a)(2)(i)(B); one trained person besides the exposed worker is common practice";

export const rescue: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people, positionsOf, holders } = ix.crew(order.id);
    const notClimbing = people.filter((w) => !positionsOf.get(w.id)!.has("climber"));
    if (isClimbingWork(order, holders.has("climber"))) {
      if (!notClimbing.some((w) => ix.holdsOn(w, "pole_top_rescue", order.startDate))) {
        out.push(
          finding(
            "RESCUE",
            "block",
            order,
            null,
            "Climbing work needs someone on site who is not climbing with valid pole-top rescue training; none assigned. " +
              "Add a worker on the ground trained in pole-top rescue.",
            RESCUE_SOURCE,
          ),
        );
      }
    }
    if (order.workType === "bucket") {
      if (!notClimbing.some((w) => ix.holdsOn(w, "aerial_rescue", order.startDate))) {
        out.push(
          finding(
            "RESCUE",
            "block",
            order,
            null,
            "Bucket work needs someone on the ground with valid aerial-lift rescue training (lower controls); none assigned. " +
              "Add a ground worker trained in aerial-lift rescue.",
            RESCUE_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
