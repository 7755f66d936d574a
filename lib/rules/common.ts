import type { SnapshotIndex } from "./snapshot-index";
import type { Classification, Finding, Level, Position, RuleCode, Worker, WorkOrder } from "./types";

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

/**
 * A person as messages name them: the name only, never the internal id (issue 18 point 8).
 * The finding's workerId still says exactly who it is.
 */
export function who(w: Worker): string {
  return w.name;
}

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];

/** "2027-05-31" -> "31 May 2027" (dates in words in every message). */
export function dateWords(iso: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!m) return iso;
  return `${Number(m[3])} ${MONTHS[Number(m[2]) - 1]} ${m[1]}`;
}

/** "2027-04-06T07:00" (a zoned wall time) -> "6 April 2027 07:00". */
export function wallTimeWords(wall: string): string {
  return `${dateWords(wall.slice(0, 10))} ${wall.slice(11, 16)}`;
}

/** Two zoned wall times as words: "6 April 2027 07:00 to 15:30", or with both dates when they differ. */
export function spanWords(startWall: string, endWall: string): string {
  const end = startWall.slice(0, 10) === endWall.slice(0, 10) ? endWall.slice(11, 16) : wallTimeWords(endWall);
  return `${wallTimeWords(startWall)} to ${end}`;
}

/** Above 0.6 kV: the two-worker minimum's threshold (more than 600 volts). */
export const HIGH_VOLTAGE_KV = 0.6;

/** The stated voltage of exposed parts near de-energized work is above kv (Corrections 2). */
export function nearAbove(order: WorkOrder, kv: number): boolean {
  return order.nearEnergizedKv != null && order.nearEnergizedKv > kv;
}

/** The work itself, or parts within reach of it, are energized above kv. */
export function onOrNearAbove(order: WorkOrder, kv: number): boolean {
  return energizedAbove(order, kv) || nearAbove(order, kv);
}

/**
 * Who is aloft on an order (Corrections 3). On bucket work: the people in `aerial` positions,
 * or the lead when no `aerial` position is filled. Before `aerial` existed, a `climber` on bucket
 * work was the person in the bucket, and an earlier input keeps that meaning: such a climber is
 * aloft and fills the bucket seat (so the lead is not taken to be aloft beside them). On every
 * other order: the climbers and anyone in an `aerial` position.
 */
export function aloftIds(order: WorkOrder, holders: ReadonlyMap<Position, readonly Worker[]>): Set<string> {
  const ids = new Set<string>();
  for (const w of holders.get("aerial") ?? []) ids.add(w.id);
  for (const w of holders.get("climber") ?? []) ids.add(w.id);
  if (order.workType === "bucket" && ids.size === 0) for (const w of holders.get("lead") ?? []) ids.add(w.id);
  return ids;
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
