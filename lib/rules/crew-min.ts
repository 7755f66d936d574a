// CREW_MIN: the two-worker minimum of 29 CFR 1910.269(l)(2)(i), counting qualified employees,
// and the order's own minimum from the organisation's crew template, counting everyone on site.
// Both requirements are stated in one finding per order (the board keys overrides by rule,
// order and worker, and a card showing CREW_MIN twice, a warning and a block, read as a
// contradiction; issue 18 point 9).

import {
  energizedAbove,
  finding,
  hasJourneyLevel,
  HIGH_VOLTAGE_KV,
  nearAbove,
  onOrNearAbove,
  plural,
  type RuleCheck,
} from "./common";
import { kvNumber, voltageLabel } from "./labels";
import type { SnapshotIndex } from "./snapshot-index";
import type { CrewException, Equipment, Finding, Worker, WorkOrder } from "./types";

/** The paragraph as a whole (kept for callers that name it). */
export const CREW_MIN_SOURCE = "29 CFR 1910.269(l)(2)(i)";
/** Two qualified employees, not two of anyone: OSHA's letter of interpretation of 1994-11-08. */
export const QUALIFIED_LETTER = "OSHA letter of interpretation of 1994-11-08 (two qualified employees)";
/** The order's own minimum is the organisation's crew template: policy, not regulation. */
export const CREW_TEMPLATE_SOURCE = "the organisation's crew template for this work (policy)";
/** The exceptions (routine switching, live-line tools out of reach, emergency repair). */
export const CREW_MIN_EXCEPTION_SOURCE = "29 CFR 1910.269(l)(2)(ii)";

const EXCEPTION_PARAGRAPH: Record<CrewException, string> = {
  routine_switching: "29 CFR 1910.269(l)(2)(ii)(A)",
  live_line_tools: "29 CFR 1910.269(l)(2)(ii)(B)",
  emergency: "29 CFR 1910.269(l)(2)(ii)(C)",
};

const EXCEPTION_WORDS: Record<CrewException, string> = {
  routine_switching: "routine switching",
  live_line_tools: "live-line tools out of reach",
  emergency: "emergency repair to safeguard the public",
};

/** Why the two-worker minimum applies to an order: the paragraphs of (l)(2)(i) and the words for them. */
export interface TwoWorkerBasis {
  paragraphs: string[];
  why: string;
}

function kvWords(order: WorkOrder): string {
  return order.voltageKv === null ? "of unknown voltage (counted as above 600 V)" : `at ${voltageLabel(order.voltageKv, order.phases, order.systemKv)}`;
}

/**
 * The mechanical equipment of (l)(2)(i)(D) on an order: a digger_derrick order's derrick, and,
 * when the day tracks equipment, any digger derrick or non-insulated bucket truck on it (an
 * insulated aerial lift is the paragraph's own exception). Pickups, trailers and "other" are
 * not counted.
 */
export function mechanicalEquipment(order: WorkOrder, equipment: readonly Equipment[] = []): string[] {
  const out: string[] = [];
  for (const e of equipment) {
    if (e.kind === "digger_derrick" || (e.kind === "bucket_truck" && !e.insulated)) {
      out.push(e.kind === "digger_derrick" ? `${e.name} (a digger derrick)` : `${e.name} (a bucket truck that is not insulated)`);
    }
  }
  if (out.length === 0 && order.workType === "digger_derrick") out.push("a digger derrick");
  return out;
}

/**
 * Corrections 2: installation, removal or repair work of any work type except patrol, when the
 * work is energized above 0.6 kV ((l)(2)(i)(A), lines and equipment energized) or when exposed
 * parts nearby are above 0.6 kV ((l)(2)(i)(B)); and, for any work type, mechanical equipment
 * other than an insulated aerial lift near parts above 0.6 kV ((l)(2)(i)(D)). Null when the
 * minimum does not apply.
 */
export function twoWorkerBasis(order: WorkOrder, equipment: readonly Equipment[] = []): TwoWorkerBasis | null {
  const paragraphs: string[] = [];
  const whys: string[] = [];
  if (order.workType === "patrol") {
    // Patrol is outside (A) and (B); (D) below still covers a machine working near live parts.
  } else if (energizedAbove(order, HIGH_VOLTAGE_KV)) {
    paragraphs.push("(A)");
    whys.push(`the work is energized ${kvWords(order)}`);
  } else if (nearAbove(order, HIGH_VOLTAGE_KV)) {
    paragraphs.push("(B)");
    whys.push(`exposed parts at ${kvNumber(order.nearEnergizedKv!)} kV are within reach of the ${order.energized ? "work" : "de-energized work"}`);
  }
  const machines = onOrNearAbove(order, HIGH_VOLTAGE_KV) ? mechanicalEquipment(order, equipment) : [];
  if (machines.length > 0) {
    paragraphs.push("(D)");
    const near = paragraphs.length === 1 ? " near parts energized above 600 V" : " near them";
    whys.push(`${machines.join(" and ")} ${machines.length === 1 ? "is" : "are"} mechanical equipment working${near}`);
  }
  if (paragraphs.length === 0) return null;
  return { paragraphs: paragraphs.map((p) => `29 CFR 1910.269(l)(2)(i)${p}`), why: whys.join(" and ") };
}

/** The same test as twoWorkerBasis(order) !== null, without building its words. */
export function twoWorkerRuleApplies(order: WorkOrder, equipment: readonly Equipment[] = []): boolean {
  if (!onOrNearAbove(order, HIGH_VOLTAGE_KV)) return false;
  return order.workType !== "patrol" || mechanicalEquipment(order, equipment).length > 0;
}

/**
 * Whether a worker counts toward the two-worker minimum (Corrections 1): journeymen and crew
 * leads; apprentices only with a journeyman or crew lead on the order; operators only with the
 * `qualified_electrical` credential valid on every day of the order; ground hands never.
 */
export function countsAsQualified(w: Worker, people: readonly Worker[], ix: SnapshotIndex, order: WorkOrder): boolean {
  switch (w.classification) {
    case "journeyman":
    case "crew_lead":
      return true;
    case "apprentice":
      return hasJourneyLevel(people);
    case "operator":
      return ix.holdsThrough(w, "qualified_electrical", order);
    case "ground_hand":
      return false;
  }
}

export function qualifiedCount(people: readonly Worker[], ix: SnapshotIndex, order: WorkOrder): number {
  return people.filter((p) => countsAsQualified(p, people, ix, order)).length;
}

const WHO_COUNTS =
  "journeymen, crew leads, apprentices with a journeyman or crew lead on the order, and equipment operators who hold the qualified-electrical credential";

export const crewMin: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    const { people } = ix.crew(order.id);
    const parts: Array<{ level: "block" | "warn"; text: string; source: string }> = [];

    // The order's own minimum: the crew template, counting everyone on site; no exception lowers it.
    if (order.minCrew !== null && people.length < order.minCrew) {
      const missing = order.minCrew - people.length;
      parts.push({
        level: "block",
        text:
          `This order's crew template asks for at least ${plural(order.minCrew, "person", "people")} on site; ` +
          `${people.length} assigned. Add ${plural(missing, "more worker", "more workers")}.`,
        source: CREW_TEMPLATE_SOURCE,
      });
    }

    const equipment = ix.equipment.of(order.id);
    const qualified = twoWorkerRuleApplies(order, equipment) ? qualifiedCount(people, ix, order) : 2;
    const basis = qualified < 2 ? twoWorkerBasis(order, equipment) : null;
    if (basis) {
      {
        const what = qualified === 1 ? "a second qualified worker" : "2 qualified workers";
        const base =
          `At least 2 qualified workers must be on site because ${basis.why}; ` +
          `${qualified} of the crew ${qualified === 1 ? "counts" : "count"} (${WHO_COUNTS}).`;
        const legal = `${basis.paragraphs.join(", ")}; ${QUALIFIED_LETTER}`;
        if (order.exception) {
          parts.push({
            level: "warn",
            text: `${base} The order is excepted as ${EXCEPTION_WORDS[order.exception]}: confirm the exception holds on site, or add ${what}.`,
            source: `${EXCEPTION_PARAGRAPH[order.exception]} (exception to ${basis.paragraphs.join(", ")})`,
          });
        } else {
          parts.push({ level: "block", text: `${base} Add ${what}.`, source: legal });
        }
      }
    }

    if (parts.length > 0) {
      const level = parts.some((p) => p.level === "block") ? "block" : "warn";
      out.push(
        finding(
          "CREW_MIN",
          level,
          order,
          null,
          parts.map((p) => p.text).join(" "),
          parts.map((p) => p.source).join("; "),
        ),
      );
    }
  }
  return out;
};
