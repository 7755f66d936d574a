// IN_CHARGE (block, Corrections 5): an order with two or more people has someone in the lead
// position, the employee in charge who holds the job briefing; without one the briefing cannot
// be held.

import { finding, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const IN_CHARGE_SOURCE = "29 CFR 1910.269(c)(1)";

export const inCharge: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people, holders } = ix.crew(order.id);
    if (people.length >= 2 && !holders.has("lead")) {
      out.push(
        finding(
          "IN_CHARGE",
          "block",
          order,
          null,
          `${people.length} people on site and no one in the lead position: the job briefing cannot be held without the employee in charge. ` +
            "Name a lead; the lead may also hold another position.",
          IN_CHARGE_SOURCE,
        ),
      );
    }
  }
  return out;
};
