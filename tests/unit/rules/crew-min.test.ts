import { describe, expect, it } from "vitest";
import { crewMin } from "@/lib/rules/crew-min";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Sources (recalled from memory, check against the current CFR text):
//   29 CFR 1910.269(l)(2)(i): at least two employees for installation, removal or repair of
//   lines energized above 600 V; (l)(2)(ii): exceptions (routine switching, live-line tools
//   out of reach, emergency repairs to safeguard the public).
const people = [
  worker("j1", "journeyman"),
  worker("j2", "journeyman"),
  worker("cl", "crew_lead"),
  worker("ap", "apprentice"),
  worker("ap2", "apprentice"),
  worker("gh", "ground_hand"),
  worker("op", "operator"),
];

interface Case {
  name: string;
  order?: OrderOpts;
  crew: A[];
  expected: string[];
  message?: RegExp;
}

const cases: Case[] = [
  { name: "(l)(2)(i): two journeymen satisfy the two-worker minimum", crew: [["o", "j1", "climber"], ["o", "j2", "observer"]], expected: [] },
  { name: "(l)(2)(i): crew lead and journeyman", crew: [["o", "cl", "lead"], ["o", "j1", "climber"]], expected: [] },
  {
    name: "(l)(2)(i): one journeyman alone blocks",
    crew: [["o", "j1", "climber"]],
    expected: ["o/-/block"],
    message: /^Needs at least 2 qualified workers on site \(journeymen, crew leads, operators or supervised apprentices\); 1 assigned\. Add a qualified worker\.$/,
  },
  { name: "(l)(2)(i): empty order blocks", crew: [], expected: ["o/-/block"], message: /0 assigned\. Add 2 qualified workers\./ },
  { name: "(l)(2)(i): ground hands do not count", crew: [["o", "j1", "climber"], ["o", "gh", "observer"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i) + 1910.269(x): supervised apprentice counts", crew: [["o", "j1", "lead"], ["o", "ap", "climber"]], expected: [] },
  { name: "(l)(2)(i) + 1910.269(x): two unsupervised apprentices count as none", crew: [["o", "ap", "climber"], ["o", "ap2", "observer"]], expected: ["o/-/block"], message: /0 assigned/ },
  { name: "(l)(2)(i): an operator does not supervise an apprentice", crew: [["o", "op", "operator"], ["o", "ap", "climber"]], expected: ["o/-/block"], message: /1 assigned/ },
  { name: "(l)(2)(i): operator and journeyman", crew: [["o", "op", "operator"], ["o", "j1", "climber"]], expected: [] },
  {
    name: "(l)(2)(i): one person in two positions counts once",
    crew: [["o", "j1", "climber"], ["o", "j1", "lead"]],
    expected: ["o/-/block"],
    message: /1 assigned/,
  },
  { name: "(l)(2)(i): exactly 600 V is not above 600 V", order: { voltageKv: 0.6 }, crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(l)(2)(i): 610 V is above 600 V", order: { voltageKv: 0.61 }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i): unknown voltage counts as above 600 V (CREW-CHECK.md)", order: { voltageKv: null }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i): de-energized work is outside it", order: { energized: false }, crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(l)(2)(i): patrol is outside it (PRODUCT.md)", order: { workType: "patrol" }, crew: [["o", "j1", "lead"]], expected: [] },
  { name: "(l)(2)(i): other work is outside it (CREW-CHECK.md)", order: { workType: "other" }, crew: [["o", "j1", "lead"]], expected: [] },
  { name: "(l)(2)(i): bucket work", order: { workType: "bucket" }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i): digger derrick work", order: { workType: "digger_derrick" }, crew: [["o", "op", "operator"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i): storm restoration", order: { workType: "storm" }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  {
    name: "(l)(2)(ii)(A): routine switching makes it a warning",
    order: { exception: "routine_switching" },
    crew: [["o", "j1", "lead"]],
    expected: ["o/-/warn"],
    message: /routine switching/,
  },
  { name: "(l)(2)(ii)(B): live-line tools out of reach", order: { exception: "live_line_tools" }, crew: [["o", "j1", "lead"]], expected: ["o/-/warn"] },
  { name: "(l)(2)(ii)(C): emergency repair", order: { exception: "emergency" }, crew: [["o", "j1", "lead"]], expected: ["o/-/warn"] },
  {
    name: "order minimum (policy): counts everyone, ground hands included",
    order: { minCrew: 3 },
    crew: [["o", "j1", "climber"], ["o", "j2", "lead"], ["o", "gh", "observer"]],
    expected: [],
  },
  {
    name: "order minimum (policy): 3 needed, 2 on site",
    order: { minCrew: 3 },
    crew: [["o", "j1", "climber"], ["o", "j2", "lead"]],
    expected: ["o/-/block"],
    message: /^Needs at least 3 workers on site; 2 assigned\. Add 1 more worker/,
  },
  { name: "order minimum (policy): applies to patrols too", order: { workType: "patrol", minCrew: 2 }, crew: [["o", "j1", "lead"]], expected: ["o/-/block"] },
  { name: "order minimum (policy): applies to de-energized work", order: { energized: false, minCrew: 2 }, crew: [["o", "j1", "lead"]], expected: ["o/-/block"] },
];

describe("CREW_MIN", () => {
  it.each(cases)("$name", ({ order: o, crew, expected, message }) => {
    const found = run(crewMin, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    if (message) expect(found[0].message).toMatch(message);
    for (const f of found) expect(f.rule).toBe("CREW_MIN");
  });

  it("(l)(2)(ii) + policy: an exception warns on the legal minimum but never lowers the order's own minimum", () => {
    const found = run(crewMin, day(people, [order("o", { exception: "emergency", minCrew: 3 })], [["o", "j1", "climber"]]));
    expect(found.map((f) => [f.level, f.source])).toEqual([
      ["warn", "29 CFR 1910.269(l)(2)(ii)"],
      ["block", "29 CFR 1910.269(l)(2)(i)"],
    ]);
  });

  it("(l)(2)(i): one finding per unmet requirement, never per worker", () => {
    const found = run(crewMin, day(people, [order("o", { minCrew: 3 })], [["o", "j1", "climber"]]));
    expect(found).toHaveLength(2);
    expect(found.every((f) => f.workerId === null && f.source === "29 CFR 1910.269(l)(2)(i)")).toBe(true);
  });
});
