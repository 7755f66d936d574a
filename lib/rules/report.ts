// The crew-check report: exactly the contract's fields, plus the block/warn summary.
// Shared by the command and POST /api/crew-check.
import { checkDay } from "./engine";
import { orderFigures } from "./figures";
import type { DaySnapshot, Finding, OrderFigures } from "./types";

export interface CrewCheckReport {
  findings: Pick<Finding, "rule" | "level" | "workOrderId" | "workerId" | "message" | "source">[];
  summary: { block: number; warn: number };
  /** One entry per work order, sorted by id: approach distance and lift figures (issue 16). */
  orders: OrderFigures[];
}

export function crewCheckReport(snapshot: DaySnapshot): CrewCheckReport {
  const findings = checkDay(snapshot).map((f) => ({
    rule: f.rule,
    level: f.level,
    workOrderId: f.workOrderId,
    workerId: f.workerId,
    message: f.message,
    source: f.source,
  }));
  return {
    findings,
    summary: {
      block: findings.filter((f) => f.level === "block").length,
      warn: findings.filter((f) => f.level === "warn").length,
    },
    orders: orderFigures(snapshot.workOrders),
  };
}
