// OBSERVER: a designated observer other than the operator for a digger derrick near energized
// lines; a ground observer who is not a climber for climbing work.

import { finding, isClimbingWork, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const OBSERVER_EQUIPMENT_SOURCE = "29 CFR 1910.269(p)(4)(ii)";
export const OBSERVER_CLIMBING_SOURCE = "common practice";

export const observer: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { positionsOf, holders } = ix.crew(order.id);
    const observers = holders.get("observer") ?? [];
    if (order.workType === "digger_derrick" && order.energized) {
      const ok = observers.some((w) => !positionsOf.get(w.id)!.has("operator"));
      if (!ok) {
        const why =
          observers.length === 0
            ? "no one is in the observer position"
            : "the only observer is also the operator";
        out.push(
          finding(
            "OBSERVER",
            "block",
            order,
            null,
            `A digger derrick near energized lines needs a designated observer who is not the operator; ${why}. ` +
              "Assign an observer other than the operator to watch the approach distance.",
            OBSERVER_EQUIPMENT_SOURCE,
          ),
        );
      }
    }
    if (isClimbingWork(order, holders.has("climber"))) {
      const ok = observers.some((w) => !positionsOf.get(w.id)!.has("climber"));
      if (!ok) {
        const why =
          observers.length === 0 ? "no one is in the observer position" : "the only observer is also a climber";
        out.push(
          finding(
            "OBSERVER",
            "block",
            order,
            null,
            `Climbing work needs a ground observer who is not climbing; ${why}. ` +
              "Assign an observer on the ground to watch the climber and the drop zone.",
            OBSERVER_CLIMBING_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
