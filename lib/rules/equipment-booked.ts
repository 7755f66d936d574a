// EQUIPMENT_BOOKED: one piece of equipment on two orders that overlap in time (an order ending
// when the other starts does not overlap). Only when the day tracks equipment.

import { finding, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const EQUIPMENT_BOOKED_SOURCE = "scheduling conflict (no regulation)";

export const equipmentBooked: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  if (!ix.equipment.tracked) return out;
  for (const order of orders) {
    for (const e of ix.equipment.of(order.id)) {
      const clashes = ix.equipment
        .orderIdsOf(e.id)
        .filter((id) => id !== order.id)
        .map((id) => ix.orders.get(id)!)
        .filter((o) => o.start < order.end && order.start < o.end)
        .map((o) => o.id)
        .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
      if (clashes.length > 0) {
        const f = finding(
          "EQUIPMENT_BOOKED",
          "block",
          order,
          null,
          `${e.name} is also on ${clashes.join(", ")} at an overlapping time. Take it off one of the orders or assign another.`,
          EQUIPMENT_BOOKED_SOURCE,
        );
        f.equipmentId = e.id;
        out.push(f);
      }
    }
  }
  return out;
};
