import { describe, expect, it } from "vitest";
import { qualified } from "@/lib/rules/qualified";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Sources (recalled from memory): 29 CFR 1910.269(l)(1), only qualified employees work on
// exposed energized parts; 1910.269(x) "qualified employee" (a trainee counts only under the
// direct supervision of a qualified person). The locked ground-hand case is PRODUCT.md policy.
const people = [
  worker("j1", "journeyman"),
  worker("cl", "crew_lead"),
  worker("ap", "apprentice"),
  worker("ap2", "apprentice"),
  worker("gh", "ground_hand"),
  worker("op", "operator"),
];

const cases: Array<{ name: string; order?: OrderOpts; crew: A[]; expected: string[] }> = [
  { name: "(l)(1): journeyman climbs, crew lead leads", crew: [["o", "j1", "climber"], ["o", "cl", "lead"]], expected: [] },
  { name: "(x): apprentice climbs with a journeyman on the order", crew: [["o", "ap", "climber"], ["o", "j1", "observer"]], expected: [] },
  { name: "(x): apprentice climbs with a crew lead on the order", crew: [["o", "ap", "climber"], ["o", "cl", "lead"]], expected: [] },
  { name: "(x): apprentice climbs unsupervised blocks", crew: [["o", "ap", "climber"], ["o", "op", "observer"]], expected: ["o/ap/block"] },
  { name: "(x): two apprentices do not supervise each other", crew: [["o", "ap", "climber"], ["o", "ap2", "climber"]], expected: ["o/ap/block", "o/ap2/block"] },
  { name: "(l)(1) + PRODUCT.md: an apprentice never leads, even supervised", crew: [["o", "ap", "lead"], ["o", "j1", "climber"]], expected: ["o/ap/block"] },
  { name: "(l)(1) + PRODUCT.md: a ground hand climbing is locked", crew: [["o", "gh", "climber"], ["o", "j1", "lead"]], expected: ["o/gh/block/locked"] },
  { name: "(l)(1): a ground hand leading blocks (not locked)", crew: [["o", "gh", "lead"], ["o", "j1", "climber"]], expected: ["o/gh/block"] },
  { name: "(l)(1): an equipment operator climbing blocks (not locked)", crew: [["o", "op", "climber"], ["o", "j1", "lead"]], expected: ["o/op/block"] },
  { name: "(l)(1): an equipment operator in the operator position is fine", crew: [["o", "op", "operator"], ["o", "j1", "lead"]], expected: [] },
  { name: "(l)(1): a ground hand on the ground is fine", crew: [["o", "gh", "ground"], ["o", "gh", "observer"]], expected: [] },
  { name: "(l)(1): de-energized work is outside it", order: { energized: false }, crew: [["o", "gh", "climber"]], expected: [] },
  { name: "(l)(1): below 50 V is outside it", order: { voltageKv: 0.024 }, crew: [["o", "gh", "climber"]], expected: [] },
  {
    name: "(l)(1): one finding per worker, locked when the worker also climbs",
    crew: [["o", "gh", "climber"], ["o", "gh", "lead"]],
    expected: ["o/gh/block/locked"],
  },
];

describe("QUALIFIED", () => {
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(qualified, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toMatch(/1910\.269\(l\)\(1\)/);
  });

  it("(l)(1): the locked message says it cannot be overridden", () => {
    const [f] = run(qualified, day(people, [order("o")], [["o", "gh", "climber"]]));
    expect(f.locked).toBe(true);
    expect(f.message).toMatch(/ground hand in a climber position.*cannot be overridden/);
  });
});
