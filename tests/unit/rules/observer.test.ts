import { describe, expect, it } from "vitest";
import { observer } from "@/lib/rules/observer";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Sources: 29 CFR 1910.269(p)(4)(ii) (recalled from memory): a designated employee other than
// the equipment operator observes the approach distance for mechanical equipment near
// energized lines. The ground observer for climbing work is common practice (no paragraph).
const people = [worker("j1", "journeyman"), worker("j2", "journeyman"), worker("op", "operator"), worker("gh", "ground_hand")];

const cases: Array<{ name: string; order: OrderOpts; crew: A[]; expected: string[]; source?: string }> = [
  {
    name: "(p)(4)(ii): digger derrick with an observer other than the operator",
    order: { workType: "digger_derrick" },
    crew: [["o", "op", "operator"], ["o", "gh", "observer"]],
    expected: [],
  },
  {
    name: "(p)(4)(ii): digger derrick without an observer blocks",
    order: { workType: "digger_derrick" },
    crew: [["o", "op", "operator"], ["o", "gh", "ground"]],
    expected: ["o/-/block"],
    source: "29 CFR 1910.269(p)(4)(ii)",
  },
  {
    name: "(p)(4)(ii): the operator cannot be the observer",
    order: { workType: "digger_derrick" },
    crew: [["o", "op", "operator"], ["o", "op", "observer"]],
    expected: ["o/-/block"],
  },
  {
    name: "(p)(4)(ii): one observer who is not the operator is enough, even if another observer operates",
    order: { workType: "digger_derrick" },
    crew: [["o", "op", "operator"], ["o", "op", "observer"], ["o", "gh", "observer"]],
    expected: [],
  },
  {
    name: "(p)(4)(ii): de-energized digger derrick work is outside it",
    order: { workType: "digger_derrick", energized: false },
    crew: [["o", "op", "operator"]],
    expected: [],
  },
  {
    name: "common practice: pole climb with a ground observer",
    order: {},
    crew: [["o", "j1", "climber"], ["o", "gh", "observer"]],
    expected: [],
  },
  {
    name: "common practice: pole climb without an observer blocks",
    order: {},
    crew: [["o", "j1", "climber"], ["o", "j2", "lead"]],
    expected: ["o/-/block"],
    source: "common practice",
  },
  {
    name: "common practice: the observer may not also be a climber",
    order: {},
    crew: [["o", "j1", "climber"], ["o", "j1", "observer"]],
    expected: ["o/-/block"],
  },
  {
    name: "common practice: a climber position on storm work is climbing work",
    order: { workType: "storm" },
    crew: [["o", "j1", "climber"]],
    expected: ["o/-/block"],
  },
  {
    name: "common practice: bucket work has no climbing observer (its 'climber' is in the bucket); (p)(4)(ii) Corrections 4 only warns",
    order: { workType: "bucket" },
    crew: [["o", "j1", "climber"]],
    expected: ["o/-/warn"],
  },
  {
    name: "(p)(4)(ii) Corrections 4: bucket work with a ground hand on the ground: no warning",
    order: { workType: "bucket" },
    crew: [["o", "j1", "climber"], ["o", "j2", "ground"]],
    expected: [],
  },
  { name: "patrol needs no observer", order: { workType: "patrol" }, crew: [["o", "j1", "lead"]], expected: [] },
  {
    name: "(p)(4)(ii) + common practice: a derrick setting a pole with a climber needs both observers",
    order: { workType: "digger_derrick" },
    crew: [["o", "op", "operator"], ["o", "j1", "climber"]],
    expected: ["o/-/block", "o/-/block"],
  },
];

describe("OBSERVER", () => {
  it.each(cases)("$name", ({ order: o, crew, expected, source }) => {
    const found = run(observer, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    if (source) expect(found[0].source).toBe(source);
  });
});
