// FIRST_AID: energized work (50 V or more) with two or more people on site has at least two
// people with current first aid and CPR training on the order.

import { energizedAtLeast, ENERGIZED_WORK_KV, finding, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const FIRST_AID_SOURCE = "29 CFR 1910.269(b)(1)(i)";

export const firstAid: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    if (!energizedAtLeast(order, ENERGIZED_WORK_KV)) continue;
    const { people } = ix.crew(order.id);
    if (people.length < 2) continue;
    const trained = people.filter((w) => ix.holdsThrough(w, "first_aid_cpr", order)).length;
    if (trained < 2) {
      out.push(
        finding(
          "FIRST_AID",
          "block",
          order,
          null,
          `Energized work with ${people.length} people on site needs at least 2 with first aid and CPR training valid on every day of the order; ${trained} on this order. ` +
            `Add or swap in ${trained === 0 ? "2 trained workers" : "a trained worker"}.`,
          FIRST_AID_SOURCE,
        ),
      );
    }
  }
  return out;
};
