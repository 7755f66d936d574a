import type { SnapshotIndex } from "./snapshot-index";
import type { Classification, Finding, Level, RuleCode, Worker, WorkOrder } from "./types";

/** A rule evaluates a set of orders against the index and returns their findings at default level. */
export type RuleCheck = (orders: readonly WorkOrder[], ix: SnapshotIndex) => Finding[];

export function finding(
  rule: RuleCode,
  level: Level,
  order: WorkOrder,
  workerId: string | null,
  message: string,
  source: string,
  locked = false,
): Finding {
  const f: Finding = { rule, level, workOrderId: order.id, workerId, message, source };
  if (locked) f.locked = true;
  return f;
}

/** Energized at or above kv; an unknown voltage (null) counts as high voltage. */
export function energizedAtLeast(order: WorkOrder, kv: number): boolean {
  return order.energized && (order.voltageKv === null || order.voltageKv >= kv);
}

export function energizedAbove(order: WorkOrder, kv: number): boolean {
  return order.energized && (order.voltageKv === null || order.voltageKv > kv);
}

/** "Energized work" for first aid and qualification: 50 V or more. */
export const ENERGIZED_WORK_KV = 0.05;

/** Journeymen and crew leads: the workers who may climb or lead energized work unsupervised. */
export function isJourneyLevel(c: Classification): boolean {
  return c === "journeyman" || c === "crew_lead";
}

export function hasJourneyLevel(people: readonly Worker[]): boolean {
  return people.some((p) => isJourneyLevel(p.classification));
}

/**
 * Climbing work: a pole_climb order, or a climber position on any order except bucket work,
 * where the "climber" position is the person in the bucket (aerial-lift rescue applies instead).
 */
export function isClimbingWork(order: WorkOrder, hasClimber: boolean): boolean {
  return order.workType === "pole_climb" || (hasClimber && order.workType !== "bucket");
}

export function who(w: Worker): string {
  return `${w.name} (${w.id})`;
}

export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** Hours with at most one decimal: 14.5, 16, 7. */
export function hours(ms: number): string {
  return String(Math.round(ms / 360_000) / 10);
}

const CLASSIFICATION_WORDS: Record<Classification, string> = {
  journeyman: "journeyman",
  apprentice: "apprentice",
  ground_hand: "ground hand",
  operator: "equipment operator",
  crew_lead: "crew lead",
};

export function classificationWord(c: Classification): string {
  return CLASSIFICATION_WORDS[c];
}

/** "an apprentice", "a ground hand". */
export function aClassification(c: Classification): string {
  const word = CLASSIFICATION_WORDS[c];
  return `${/^[aeiou]/.test(word) ? "an" : "a"} ${word}`;
}
