import { describe, expect, it } from "vitest";
import { firstAid } from "@/lib/rules/first-aid";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Source: 29 CFR 1910.269(b)(1)(i) (recalled from memory): for field work on or associated with
// lines energized at 50 V or more with two or more employees, at least two trained persons
// "available"; counting them on the order itself is common practice.
const fa = (id: string, expiresOn: string | null) => worker(id, "journeyman", { credentials: { first_aid_cpr: expiresOn } });
const people = [fa("a", null), fa("b", "2028-01-01"), fa("c", "2027-04-06"), fa("x", "2027-04-05"), worker("n", "ground_hand", { credentials: {} })];

const cases: Array<{ name: string; order?: OrderOpts; crew: A[]; expected: string[] }> = [
  { name: "(b)(1)(i): two trained of two", crew: [["o", "a", "climber"], ["o", "b", "observer"]], expected: [] },
  { name: "(b)(1)(i): one trained of two blocks", crew: [["o", "a", "climber"], ["o", "n", "observer"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): none trained of three blocks", crew: [["o", "n", "climber"], ["o", "x", "observer"], ["o", "n", "lead"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): valid through the start date counts", crew: [["o", "a", "climber"], ["o", "c", "observer"]], expected: [] },
  { name: "(b)(1)(i): lapsed the day before does not count", crew: [["o", "a", "climber"], ["o", "x", "observer"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): one person alone is outside it", crew: [["o", "n", "climber"]], expected: [] },
  { name: "(b)(1)(i): one trained person in two positions counts once", crew: [["o", "a", "climber"], ["o", "a", "observer"], ["o", "n", "lead"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): 50 V is energized work", order: { voltageKv: 0.05 }, crew: [["o", "a", "climber"], ["o", "n", "observer"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): below 50 V is outside it", order: { voltageKv: 0.048 }, crew: [["o", "a", "climber"], ["o", "n", "observer"]], expected: [] },
  { name: "(b)(1)(i): unknown voltage counts as energized", order: { voltageKv: null }, crew: [["o", "a", "climber"], ["o", "n", "observer"]], expected: ["o/-/block"] },
  { name: "(b)(1)(i): de-energized work is outside it", order: { energized: false }, crew: [["o", "a", "climber"], ["o", "n", "observer"]], expected: [] },
  { name: "(b)(1)(i): applies to any work type, e.g. patrol", order: { workType: "patrol" }, crew: [["o", "a", "lead"], ["o", "n", "ground"]], expected: ["o/-/block"] },
];

describe("FIRST_AID", () => {
  it.each(cases)("$name", ({ order: o, crew, expected }) => {
    const found = run(firstAid, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toBe("29 CFR 1910.269(b)(1)(i)");
  });
});
