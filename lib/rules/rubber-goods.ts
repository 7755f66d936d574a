// RUBBER_GOODS: on energized work at 0.05 kV or more, each person in a climber, aerial or lead
// position has rubber gloves whose class's maximum use voltage (1910.137 Table I-4) is at least
// the order's voltage and which were electrically tested within the last 6 months (Table I-5);
// sleeves, when listed, within 12 months. Only workers whose gear is tracked (a `gear` field;
// an empty list means none) are checked.
//
// Which voltage is compared: Table I-4's footnote makes the maximum use voltage the nominal
// design voltage, which is the phase-to-phase voltage on multiphase circuits, and the
// phase-to-ground voltage when there is no multiphase exposure and the exposure is limited to
// phase to ground. An order's voltageKv is phase to phase on a multiphase line and, with
// `phases: 1` (a single-phase tap), the voltage to ground: so the order's voltageKv is the
// voltage compared in both cases (a 7.2 kV tap of a 12.47Y/7.2 kV feeder needs class 1, a
// three-phase 12.47 kV order class 2). Nothing here lowers the voltage of a multiphase order:
// whether the multiphase exposure is removed on site is the crew's call, not the board's.
//
// Multi-day orders: the gloves must stay in test through the order's last day (the date of its
// last worked instant), not only its first, as for credentials (Corrections 6). A voltage that
// is not recorded cannot be matched to a class: one order-level finding asks for it, and each
// person still needs gloves of some class in test.

import { dateWords, energizedAtLeast, ENERGIZED_WORK_KV, finding, who, type RuleCheck } from "./common";
import { addMonths, classFor, gloveVerdict, inTestThrough, MAX_USE_VOLTS, RETEST_MONTHS, RUBBER_GOODS_SOURCE, sleeveProblem, volts } from "./gear";
import type { Finding, Worker } from "./types";

/** Positions whose holders work within reach of energized parts and need rated gloves. */
export const GLOVED_POSITIONS = ["climber", "aerial", "lead"] as const;

function kvWords(kv: number): string {
  return `${kv} kV`;
}

export const rubberGoods: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    if (!energizedAtLeast(order, ENERGIZED_WORK_KV)) continue;
    const { holders } = ix.crew(order.id);
    const people = new Map<string, Worker>();
    for (const p of GLOVED_POSITIONS) {
      for (const w of holders.get(p as never) ?? []) if (w.gear !== undefined) people.set(w.id, w);
    }
    if (people.size === 0) continue;
    const kv = order.voltageKv;
    const lastDay = ix.lastDay(order);
    const span = lastDay === order.startDate ? `on ${dateWords(lastDay)}` : `through the order's last day, ${dateWords(lastDay)}`;

    if (kv === null) {
      out.push(
        finding(
          "RUBBER_GOODS",
          "block",
          order,
          null,
          "The order's voltage is not recorded, so nobody's rubber gloves can be matched to a class rated for it. Record the voltage on the order.",
          RUBBER_GOODS_SOURCE,
        ),
      );
    }

    const ids = [...people.keys()].sort();
    for (const id of ids) {
      const w = people.get(id)!;
      const gear = w.gear!;
      const problems: string[] = [];
      const v = gloveVerdict(gear, kv, lastDay);
      if (!v.ok) {
        if (v.reason === "above_class_4") {
          problems.push(
            `cannot do rubber-glove work on this ${kvWords(kv!)} line: the highest glove class, class 4, is rated for ${volts(MAX_USE_VOLTS["4"])} at most. ` +
              "Rubber-glove work is not possible here; plan the job with live-line tools (hot sticks) from outside the minimum approach distance",
          );
        } else if (v.reason === "none") {
          const need = kv === null ? "rubber gloves" : `class ${classFor(kv)} rubber gloves (or higher)`;
          problems.push(`has no rubber gloves on record; the work needs ${need} tested within the last ${RETEST_MONTHS.rubber_gloves} months`);
        } else if (v.reason === "underrated") {
          problems.push(
            `has gloves up to class ${v.best} (rated for ${volts(MAX_USE_VOLTS[v.best])}), not enough for this ${kvWords(kv!)} line, ` +
              `which needs class ${v.needed} or higher (rated for ${volts(MAX_USE_VOLTS[v.needed])})`,
          );
        } else {
          const through = inTestThrough(v.item);
          problems.push(
            through === null
              ? `has class ${v.item.class} gloves with no electrical test on record`
              : `has class ${v.item.class} gloves last tested on ${dateWords(v.item.testedOn!)}, in test only through ${dateWords(through)} ` +
                  `(every ${RETEST_MONTHS.rubber_gloves} months), not ${span}`,
          );
        }
      }
      const sleeve = sleeveProblem(gear, lastDay);
      if (sleeve) {
        problems.push(
          sleeve.testedOn === null
            ? "has sleeves listed with no electrical test on record"
            : `has sleeves last tested on ${dateWords(sleeve.testedOn)}, in test only through ${dateWords(addMonths(sleeve.testedOn, RETEST_MONTHS.rubber_sleeves))} ` +
                `(every ${RETEST_MONTHS.rubber_sleeves} months), not ${span}`,
        );
      }
      if (problems.length > 0) {
        const fix =
          !v.ok && v.reason === "above_class_4" && problems.length === 1
            ? ""
            : " Record a current test, issue rated gear, or assign someone whose gear is rated and in test.";
        out.push(finding("RUBBER_GOODS", "block", order, w.id, `${who(w)} ${problems.join("; and ")}.${fix}`, RUBBER_GOODS_SOURCE));
      }
    }
  }
  return out;
};
