// QUALIFIED: on energized work the climber, aerial and lead positions hold qualified workers
// (journeymen or crew leads); an apprentice may climb or work aloft only under a journeyman or
// crew lead on the same order, and never leads. A ground hand climbing or aloft on energized
// work is locked. `aerial` (the bucket) is treated like `climber` (Corrections 3).

import {
  aClassification,
  energizedAtLeast,
  ENERGIZED_WORK_KV,
  finding,
  isJourneyLevel,
  who,
  type RuleCheck,
} from "./common";
import type { Finding } from "./types";

export const QUALIFIED_SOURCE = '29 CFR 1910.269(l)(1); "qualified employee" in 1910.269(x)';

export const qualified: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    if (!energizedAtLeast(order, ENERGIZED_WORK_KV)) continue;
    const { people, positionsOf } = ix.crew(order.id);
    for (const w of people) {
      const positions = positionsOf.get(w.id)!;
      const c = w.classification;
      if (isJourneyLevel(c)) continue;
      const problems: string[] = [];
      let locked = false;
      const aloftSeats = (["climber", "aerial"] as const).filter((p) => positions.has(p));
      if (aloftSeats.length > 0) {
        const seat = aloftSeats.length === 2 ? "a climber and an aerial position" : aloftSeats[0] === "climber" ? "a climber position" : "an aerial position (in the bucket)";
        const doing = aloftSeats[0] === "climber" ? "climbing" : "working aloft on";
        if (c === "apprentice") {
          const supervised = people.some((p) => p.id !== w.id && isJourneyLevel(p.classification));
          if (!supervised) {
            problems.push(
              `is an apprentice ${doing} energized work without a journeyman or crew lead on the order; add one to supervise or assign a qualified worker`,
            );
          }
        } else {
          locked = c === "ground_hand";
          problems.push(
            `is ${aClassification(c)} in ${seat} on energized work; only journeymen, crew leads or supervised apprentices may work there, so assign a qualified worker`,
          );
        }
      }
      if (positions.has("lead")) {
        problems.push(
          `is ${aClassification(c)} in the lead position; the lead on energized work must be a journeyman or crew lead`,
        );
      }
      if (problems.length > 0) {
        out.push(
          finding(
            "QUALIFIED",
            "block",
            order,
            w.id,
            `${who(w)} ${problems.join("; and ")}.${locked ? " This cannot be overridden." : ""}`,
            QUALIFIED_SOURCE,
            locked,
          ),
        );
      }
    }
  }
  return out;
};
