// Briefing checks that need facts beyond the form (issue 18 point 12): who is trained in
// rescue, who is aloft, and the clock. Pure: the caller hands in the facts.
//
// - The rescuer holds rescue training valid on the work day: pole-top rescue for climbing
//   work, aerial-lift rescue for bucket work (1910.269(b)(1) and (a)(2)(i)(B): emergency
//   procedures such as pole-top and aerial rescue; either for other work), and is not aloft.
// - The one who calls for help stays on the ground: not a climber or the person in the bucket.
// - A briefing is held before the job, at the earliest the evening before it: from 18:00 on the
//   yard's clock the day before the work day (policy of this product, common practice: the
//   briefing is about the day's conditions, so a day-old one is not a briefing).

import { zonedWallTimeToEpoch } from "@/lib/rules/time";

export const RESCUE_CODES = { climb: "pole_top_rescue", aerial: "aerial_rescue" } as const;
const ALOFT = new Set(["climber", "aerial"]);

export interface BriefingFacts {
  /** The order's rule work type (pole_climb, bucket, digger_derrick, …). */
  ruleType: string;
  /** worker id → rescue credential codes valid on the work day. */
  rescueTraining: Map<number, Set<string>>;
  /** worker id → name, for messages. */
  names: Map<number, string>;
}

function previousDay(date: string) {
  const [y, m, d] = date.split("-").map(Number);
  return new Date(Date.UTC(y, m - 1, d - 1)).toISOString().slice(0, 10);
}

/** The earliest moment a briefing may be completed: 18:00 local the day before the work day. */
export function earliestCompletion(workDate: string, timezone: string): number {
  return zonedWallTimeToEpoch(`${previousDay(workDate)}T18:00`, timezone);
}

/** "Mon, Dec 7, 18:00 CST" on the yard's clock. */
export function fmtEarliest(ms: number, timezone: string) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    weekday: "short",
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
    timeZoneName: "short",
  }).format(new Date(ms));
}

/** Too early to complete? Then the message that says from when. */
export function completionTooEarly(now: number, workDate: string, timezone: string): string | null {
  const from = earliestCompletion(workDate, timezone);
  if (now >= from) return null;
  return `A briefing can be completed from 18:00 the evening before the job at the earliest (${fmtEarliest(from, timezone)}); save it as a draft until then`;
}

export function rescueNeeded(ruleType: string): string[] {
  if (ruleType === "bucket") return [RESCUE_CODES.aerial];
  if (ruleType === "pole_climb") return [RESCUE_CODES.climb];
  return [RESCUE_CODES.climb, RESCUE_CODES.aerial];
}

const RESCUE_WORDS: Record<string, string> = {
  pole_top_rescue: "pole-top rescue",
  aerial_rescue: "aerial-lift rescue",
};

/** Issues on the emergency fields, beyond "someone on this crew" (completionIssues checks that). */
export function emergencyRoleIssues(
  emergency: { callerWorkerId: number | null; rescuerWorkerId: number | null },
  crew: { workerId: number; position: string }[],
  facts: BriefingFacts,
) {
  const issues: { field: string; message: string }[] = [];
  const aloft = new Set(crew.filter((c) => ALOFT.has(c.position)).map((c) => c.workerId));
  const name = (id: number) => facts.names.get(id) ?? "That person";
  const { callerWorkerId: caller, rescuerWorkerId: rescuer } = emergency;
  if (caller && aloft.has(caller)) {
    issues.push({
      field: "emergency.callerWorkerId",
      message: `${name(caller)} works aloft on this job; the one who calls for help must stay on the ground`,
    });
  }
  if (rescuer) {
    const needed = rescueNeeded(facts.ruleType);
    const held = facts.rescueTraining.get(rescuer) ?? new Set<string>();
    if (!needed.some((c) => held.has(c))) {
      issues.push({
        field: "emergency.rescuerWorkerId",
        message: `${name(rescuer)} has no ${needed.map((c) => RESCUE_WORDS[c]).join(" or ")} training valid on the work day; pick someone trained`,
      });
    } else if (aloft.has(rescuer)) {
      issues.push({ field: "emergency.rescuerWorkerId", message: `${name(rescuer)} works aloft on this job; the rescuer must be someone else` });
    }
  }
  return issues;
}
