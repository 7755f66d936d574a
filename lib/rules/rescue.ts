// RESCUE: someone besides the exposed workers trained to get them down: pole-top rescue held by
// someone other than every climber for climbing work; aerial-lift (lower controls) rescue held
// by someone on site who is not aloft for bucket work (Corrections 3). An aloft worker is never
// their own rescuer. The training must be valid on every day of the order.

import { aloftIds, finding, isClimbingWork, type RuleCheck } from "./common";
import type { Finding } from "./types";

/** Climbing work: the paragraph and OSHA's reading of it. */
export const RESCUE_SOURCE =
  "29 CFR 1910.269(a)(2)(i)(B) (training in emergency procedures such as pole-top rescue); OSHA letter of interpretation of 1997-02-13 (at least one crew member other than the exposed employee trained in pole-top rescue)";
/** Bucket work: the same paragraph; the letter speaks of pole-top rescue, so its bucket reading is common practice. */
export const RESCUE_BUCKET_SOURCE =
  "29 CFR 1910.269(a)(2)(i)(B) (training in emergency procedures); someone not aloft trained to lower the bucket is common practice, as the 1997-02-13 letter asks for pole-top rescue";

export const rescue: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people, positionsOf, holders } = ix.crew(order.id);
    if (isClimbingWork(order, holders.has("climber"))) {
      const notClimbing = people.filter((w) => !positionsOf.get(w.id)!.has("climber"));
      if (!notClimbing.some((w) => ix.holdsThrough(w, "pole_top_rescue", order))) {
        out.push(
          finding(
            "RESCUE",
            "block",
            order,
            null,
            "Climbing work needs someone on site who is not climbing with pole-top rescue training valid on every day of the order; none assigned. " +
              "Add a worker on the ground trained in pole-top rescue.",
            RESCUE_SOURCE,
          ),
        );
      }
    }
    if (order.workType === "bucket") {
      const aloft = aloftIds(order, holders);
      const aloftHolder = people.some((w) => aloft.has(w.id) && ix.holdsThrough(w, "aerial_rescue", order));
      if (!people.some((w) => !aloft.has(w.id) && ix.holdsThrough(w, "aerial_rescue", order))) {
        out.push(
          finding(
            "RESCUE",
            "block",
            order,
            null,
            "Bucket work needs someone on the ground, not aloft, with aerial-lift rescue training (lower controls) valid on every day of the order; " +
              (aloftHolder ? "the only trained worker is up in the bucket and cannot rescue themselves. " : "none assigned. ") +
              "Add a ground worker trained in aerial-lift rescue.",
            RESCUE_BUCKET_SOURCE,
          ),
        );
      }
    }
  }
  return out;
};
