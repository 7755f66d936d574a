// Plain words for why people are out of a seat: "3 lapsed climbing qualifications, 2 short of
// rest, 1 on leave".

import type { Finding, Position, RuleCode, Worker, WorkOrder } from "@/lib/rules/types";

export type Category =
  | "lapsed_climbing"
  | "no_climbing"
  | "cannot_climb"
  | "cannot_lead"
  | "not_qualified"
  | "no_operator"
  | "no_licence"
  | "no_rubber_goods"
  | "short_of_rest"
  | "leave"
  | "training"
  | "sickness"
  | "unavailable"
  | "double_booked";

const PHRASES: Record<Category, [string, string]> = {
  lapsed_climbing: ["lapsed climbing qualification", "lapsed climbing qualifications"],
  no_climbing: ["without a climbing qualification", "without a climbing qualification"],
  cannot_climb: ["not qualified to climb energized work", "not qualified to climb energized work"],
  cannot_lead: ["not a journeyman or crew lead (cannot lead)", "not journeymen or crew leads (cannot lead)"],
  not_qualified: ["not qualified for the position", "not qualified for the position"],
  no_operator: ["without an equipment operator credential", "without an equipment operator credential"],
  no_licence: ["without the CDL the truck needs", "without the CDL the truck needs"],
  no_rubber_goods: ["without rubber gloves rated and in test for the voltage", "without rubber gloves rated and in test for the voltage"],
  short_of_rest: ["short of rest", "short of rest"],
  leave: ["on leave", "on leave"],
  training: ["in training", "in training"],
  sickness: ["off sick", "off sick"],
  unavailable: ["unavailable", "unavailable"],
  double_booked: ["already on an overlapping order", "already on overlapping orders"],
};

/** The category of one exclusion finding. */
export function categoryOf(f: Finding, position: Position, worker: Worker | undefined, order: WorkOrder | undefined): Category {
  switch (f.rule as RuleCode) {
    case "CLIMB_CERT":
      return /no climbing qualification/.test(f.message) ? "no_climbing" : "lapsed_climbing";
    case "QUALIFIED":
      return position === "lead" ? "cannot_lead" : position === "climber" ? "cannot_climb" : "not_qualified";
    case "OPERATOR_CERT":
      return position === "driver" ? "no_licence" : "no_operator";
    case "RUBBER_GOODS":
      return "no_rubber_goods";
    case "REST":
      return "short_of_rest";
    case "DOUBLE_BOOKED":
      return "double_booked";
    case "UNAVAILABLE": {
      const hit = worker && order ? worker.unavailable.find((u) => u.start < order.end && order.start < u.end) : undefined;
      const r = hit?.reason ?? "";
      return r === "leave" ? "leave" : r === "training" ? "training" : r === "sickness" ? "sickness" : "unavailable";
    }
    default:
      return "not_qualified";
  }
}

export function phrase(c: Category, n: number): string {
  const [one, many] = PHRASES[c];
  return `${n} ${n === 1 ? one : many}`;
}

/** "3 lapsed climbing qualifications, 2 short of rest, 1 on leave" (largest first, stable). */
export function summarise(counts: Map<Category, number>): string {
  const order = Object.keys(PHRASES) as Category[];
  return [...counts.entries()]
    .sort((a, b) => b[1] - a[1] || order.indexOf(a[0]) - order.indexOf(b[0]))
    .map(([c, n]) => phrase(c, n))
    .join(", ");
}

export function hoursText(h: number): string {
  return `${Math.round(h * 10) / 10} h`;
}

export function ordinal(n: number): string {
  const s = n % 100 >= 11 && n % 100 <= 13 ? "th" : ({ 1: "st", 2: "nd", 3: "rd" } as Record<number, string>)[n % 10] ?? "th";
  return `${n}${s}`;
}

export const POSITION_WORD: Record<Position, string> = {
  climber: "climber",
  aerial: "in-the-bucket",
  observer: "observer",
  operator: "operator",
  ground: "ground hand",
  lead: "lead",
  driver: "driver",
};
