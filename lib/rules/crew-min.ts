// CREW_MIN: two qualified workers on site for energized installation, removal or repair
// work above 600 V, and the order's own minimum counting everyone on site.

import { energizedAbove, finding, hasJourneyLevel, plural, type RuleCheck } from "./common";
import type { CrewException, Finding, Worker, WorkOrder } from "./types";

export const CREW_MIN_SOURCE = "29 CFR 1910.269(l)(2)(i)";
/** The exceptions (routine switching, live-line tools out of reach, emergency repair). */
export const CREW_MIN_EXCEPTION_SOURCE = "29 CFR 1910.269(l)(2)(ii)";

const TWO_WORKER_TYPES = new Set(["pole_climb", "bucket", "digger_derrick", "storm"]);
const HIGH_VOLTAGE_KV = 0.6;

const EXCEPTION_WORDS: Record<CrewException, string> = {
  routine_switching: "routine switching",
  live_line_tools: "live-line tools out of reach",
  emergency: "emergency repair to safeguard the public",
};

export function twoWorkerRuleApplies(order: WorkOrder): boolean {
  return TWO_WORKER_TYPES.has(order.workType) && energizedAbove(order, HIGH_VOLTAGE_KV);
}

/** Journeymen, crew leads and operators; apprentices only with a journeyman or crew lead on the order. */
export function qualifiedCount(people: readonly Worker[]): number {
  const supervised = hasJourneyLevel(people);
  return people.filter((p) => {
    switch (p.classification) {
      case "journeyman":
      case "crew_lead":
      case "operator":
        return true;
      case "apprentice":
        return supervised;
      case "ground_hand":
        return false;
    }
  }).length;
}

export const crewMin: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people } = ix.crew(order.id);
    if (twoWorkerRuleApplies(order)) {
      const qualified = qualifiedCount(people);
      if (qualified < 2) {
        const missing = 2 - qualified;
        const what = missing === 1 ? "a qualified worker" : "2 qualified workers";
        const base =
          "Needs at least 2 qualified workers on site (journeymen, crew leads, operators or supervised apprentices); " +
          `${qualified} assigned.`;
        if (order.exception) {
          out.push(
            finding(
              "CREW_MIN",
              "warn",
              order,
              null,
              `${base} Excepted as ${EXCEPTION_WORDS[order.exception]}: confirm the exception holds on site, or add ${what}.`,
              CREW_MIN_EXCEPTION_SOURCE,
            ),
          );
        } else {
          out.push(finding("CREW_MIN", "block", order, null, `${base} Add ${what}.`, CREW_MIN_SOURCE));
        }
      }
    }
    // The order's own minimum is policy: it applies to every work type and no exception lowers it.
    if (order.minCrew !== null && people.length < order.minCrew) {
      const missing = order.minCrew - people.length;
      out.push(
        finding(
          "CREW_MIN",
          "block",
          order,
          null,
          `Needs at least ${order.minCrew} workers on site; ${people.length} assigned. ` +
            `Add ${plural(missing, "more worker", "more workers")} (this order's own minimum counts everyone on site).`,
          CREW_MIN_SOURCE,
        ),
      );
    }
  }
  return out;
};
