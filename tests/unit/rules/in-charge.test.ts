import { describe, expect, it } from "vitest";
import { inCharge } from "@/lib/rules/in-charge";
import { type A, brief, day, order, run, worker } from "./fixtures";

// Source: 29 CFR 1910.269(c)(1) (recalled from memory): the employee in charge conducts the
// job briefing. Level block since CREW-CHECK.md "Corrections" 5: without the employee in
// charge the briefing cannot be held.
const people = [worker("j1", "journeyman"), worker("j2", "journeyman")];

const cases: Array<{ name: string; crew: A[]; expected: string[] }> = [
  { name: "(c)(1): two people and no lead blocks (Corrections 5)", crew: [["o", "j1", "climber"], ["o", "j2", "observer"]], expected: ["o/-/block"] },
  { name: "(c)(1): two people with a lead", crew: [["o", "j1", "climber"], ["o", "j2", "lead"]], expected: [] },
  { name: "(c)(1): the lead may also hold another position", crew: [["o", "j1", "climber"], ["o", "j1", "lead"], ["o", "j2", "observer"]], expected: [] },
  { name: "(c)(1): one person alone needs no lead", crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(c)(1): one person in two positions is still one person", crew: [["o", "j1", "climber"], ["o", "j1", "observer"]], expected: [] },
];

describe("IN_CHARGE", () => {
  it.each(cases)("$name", ({ crew, expected }) => {
    const found = run(inCharge, day(people, [order("o", { workType: "other" })], crew));
    expect(brief(found)).toEqual(expected);
    for (const f of found) expect(f.source).toBe("29 CFR 1910.269(c)(1)");
  });
});
