// OBSERVER: a designated observer other than the operator for a digger derrick working on or
// near parts above 600 V; a ground observer who is not climbing for climbing work; and, as a
// warning, someone on the ground watching bucket work on or near parts above 600 V.

import { aloftIds, finding, HIGH_VOLTAGE_KV, isClimbingWork, onOrNearAbove, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const OBSERVER_EQUIPMENT_SOURCE = "29 CFR 1910.269(p)(4)(ii)";
export const OBSERVER_BUCKET_SOURCE =
  "29 CFR 1910.269(p)(4)(ii) (a warning: the paragraph excepts an operator who can accurately judge the distance, as one in the bucket often can)";
export const OBSERVER_CLIMBING_SOURCE = "common practice";

export const observer: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people, positionsOf, holders } = ix.crew(order.id);
    const observers = holders.get("observer") ?? [];
    const aloft = aloftIds(order, holders);
    // Corrections 2: the derrick's own work or the parts near it above 0.6 kV.
    if (order.workType === "digger_derrick" && onOrNearAbove(order, HIGH_VOLTAGE_KV)) {
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
            `A digger derrick working on or near parts energized above 600 V needs a designated observer who is not the operator; ${why}. ` +
              "Assign an observer other than the operator to watch the approach distance.",
            OBSERVER_EQUIPMENT_SOURCE,
          ),
        );
      }
    }
    if (isClimbingWork(order, holders.has("climber"))) {
      const ok = observers.some((w) => !aloft.has(w.id));
      if (!ok) {
        const why =
          observers.length === 0 ? "no one is in the observer position" : "the only observer is also aloft";
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
    // Corrections 4: bucket work on or near parts above 0.6 kV with nobody on the ground in an
    // observer or ground position.
    if (order.workType === "bucket" && onOrNearAbove(order, HIGH_VOLTAGE_KV)) {
      const onGround = people.some((w) => {
        const ps = positionsOf.get(w.id)!;
        return !aloft.has(w.id) && (ps.has("observer") || ps.has("ground"));
      });
      if (!onGround) {
        out.push(
          finding(
            "OBSERVER",
            "warn",
            order,
            null,
            "Bucket work on or near parts energized above 600 V has no one on the ground in an observer or ground position. " +
              "Assign someone on the ground to watch the approach distance and to reach the lower controls.",
            OBSERVER_BUCKET_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
