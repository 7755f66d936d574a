// The report's per-order field figures: the minimum approach distance and the lift figures of
// every work order, sorted by work order id (plain string order). Pure, client-safe.

import { approachDistance } from "./approach";
import { liftFigures } from "./lift";
import type { OrderFigures, WorkOrder } from "./types";

export function figuresFor(order: WorkOrder): OrderFigures {
  return { workOrderId: order.id, approach: approachDistance(order), lift: liftFigures(order.lift) };
}

export function orderFigures(orders: readonly WorkOrder[]): OrderFigures[] {
  return [...orders].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)).map(figuresFor);
}
