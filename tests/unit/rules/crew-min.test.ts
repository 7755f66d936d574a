import { describe, expect, it } from "vitest";
import { crewMin, twoWorkerBasis, twoWorkerRuleApplies } from "@/lib/rules/crew-min";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Sources: 29 CFR 1910.269(l)(2)(i)(A)-(E) and (l)(2)(ii)(A)-(C), text read from osha.gov's
// 1910.269 page and the identical 1926.960(b)(3) text: at least two employees for
// installation, removal or repair of lines energized above 600 V (A), of de-energized lines
// with exposure to other parts above 600 V (B), of equipment such as transformers (C), and for
// mechanical equipment other than insulated aerial lifts near parts above 600 V (D); the
// exceptions are routine switching (ii)(A), live-line tools out of reach (ii)(B) and emergency
// repairs to safeguard the public (ii)(C). OSHA's letter of interpretation of 1994-11-08 (read
// on osha.gov): "at least two qualified employees present"; the insulated aerial lift exception
// applies only to (D). CREW-CHECK.md "Corrections" 1 and 2 for who counts and which orders.
const QE = { qualified_electrical: "2028-03-31" };
const people = [
  worker("j1", "journeyman"),
  worker("j2", "journeyman"),
  worker("cl", "crew_lead"),
  worker("ap", "apprentice"),
  worker("ap2", "apprentice"),
  worker("gh", "ground_hand"),
  worker("op", "operator"),
  worker("opq", "operator", { credentials: { equipment_operator: "2028-03-31", ...QE } }),
  worker("opx", "operator", { credentials: { equipment_operator: "2028-03-31", qualified_electrical: "2027-04-07" } }),
];

interface Case {
  name: string;
  order?: OrderOpts;
  crew: A[];
  expected: string[];
  message?: RegExp;
  source?: string;
}

const A = "29 CFR 1910.269(l)(2)(i)(A); OSHA letter of interpretation of 1994-11-08 (two qualified employees)";
const B = "29 CFR 1910.269(l)(2)(i)(B); OSHA letter of interpretation of 1994-11-08 (two qualified employees)";
const TEMPLATE = "the organisation's crew template for this work (policy)";

const cases: Case[] = [
  { name: "(l)(2)(i)(A): two journeymen satisfy the two-worker minimum", crew: [["o", "j1", "climber"], ["o", "j2", "observer"]], expected: [] },
  { name: "(l)(2)(i)(A): crew lead and journeyman", crew: [["o", "cl", "lead"], ["o", "j1", "climber"]], expected: [] },
  {
    name: "(l)(2)(i)(A): one journeyman alone blocks",
    crew: [["o", "j1", "climber"]],
    expected: ["o/-/block"],
    message: /^At least 2 qualified workers must be on site because the work is energized at 12\.47 kV; 1 of the crew counts \(journeymen, crew leads, apprentices with a journeyman or crew lead on the order, and equipment operators who hold the qualified-electrical credential\)\. Add a second qualified worker\.$/,
    source: A,
  },
  { name: "(l)(2)(i)(A): empty order blocks", crew: [], expected: ["o/-/block"], message: /0 of the crew count .* Add 2 qualified workers\./ },
  { name: "(l)(2)(i)(A): ground hands never count (Corrections 1)", crew: [["o", "j1", "climber"], ["o", "gh", "observer"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i)(A) + 1910.269(x): an apprentice counts with a journeyman on the order", crew: [["o", "j1", "lead"], ["o", "ap", "climber"]], expected: [] },
  { name: "(l)(2)(i)(A) + 1910.269(x): two apprentices without a journeyman count as none", crew: [["o", "ap", "climber"], ["o", "ap2", "observer"]], expected: ["o/-/block"], message: /0 of the crew count/ },
  { name: "(l)(2)(i)(A): an operator does not supervise an apprentice", crew: [["o", "opq", "operator"], ["o", "ap", "climber"]], expected: ["o/-/block"], message: /1 of the crew counts/ },
  {
    name: "letter 1994-11-08 + Corrections 1: an operator without qualified_electrical does not count",
    crew: [["o", "op", "operator"], ["o", "j1", "climber"]],
    expected: ["o/-/block"],
    message: /1 of the crew counts/,
  },
  { name: "letter 1994-11-08 + Corrections 1: an operator with qualified_electrical counts", crew: [["o", "opq", "operator"], ["o", "j1", "climber"]], expected: [] },
  {
    name: "Corrections 1 + 6: qualified_electrical lapsing before the last day does not count",
    order: { start: "2027-04-06T07:00", end: "2027-04-08T15:00" },
    crew: [["o", "opx", "operator"], ["o", "j1", "climber"]],
    expected: ["o/-/block"],
  },
  {
    name: "(l)(2)(i)(A): one person in two positions counts once",
    crew: [["o", "j1", "climber"], ["o", "j1", "lead"]],
    expected: ["o/-/block"],
    message: /1 of the crew counts/,
  },
  { name: "(l)(2)(i)(A): exactly 600 V is not above 600 V", order: { voltageKv: 0.6 }, crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(l)(2)(i)(A): 610 V is above 600 V", order: { voltageKv: 0.61 }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  { name: "(l)(2)(i)(A): unknown voltage counts as above 600 V (CREW-CHECK.md)", order: { voltageKv: null }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"], message: /unknown voltage/ },
  { name: "(l)(2)(i): de-energized work with nothing live nearby is outside it", order: { energized: false }, crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(l)(2)(i): patrol is outside it (Corrections 2)", order: { workType: "patrol" }, crew: [["o", "j1", "lead"]], expected: [] },
  { name: "(l)(2)(i): patrol beside a live feeder is still outside it (Corrections 2)", order: { workType: "patrol", energized: false, nearEnergizedKv: 12.47 }, crew: [["o", "j1", "lead"]], expected: [] },
  { name: "(l)(2)(i)(A) Corrections 2: energized work of type other is inside it now", order: { workType: "other" }, crew: [["o", "j1", "lead"]], expected: ["o/-/block"], source: A },
  { name: "(l)(2)(i)(A): bucket work", order: { workType: "bucket" }, crew: [["o", "j1", "aerial"]], expected: ["o/-/block"] },
  {
    name: "(l)(2)(i)(A),(D): digger derrick work",
    order: { workType: "digger_derrick" },
    crew: [["o", "opq", "operator"]],
    expected: ["o/-/block"],
    source: "29 CFR 1910.269(l)(2)(i)(A), 29 CFR 1910.269(l)(2)(i)(D); OSHA letter of interpretation of 1994-11-08 (two qualified employees)",
  },
  { name: "(l)(2)(i)(A): storm restoration", order: { workType: "storm" }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"] },
  {
    name: "(l)(2)(i)(B) Corrections 2: de-energized work beside a live 12.47 kV feeder",
    order: { energized: false, nearEnergizedKv: 12.47 },
    crew: [["o", "j1", "climber"]],
    expected: ["o/-/block"],
    message: /because exposed parts at 12\.47 kV are within reach of the de-energized work/,
    source: B,
  },
  { name: "(l)(2)(i)(B): parts nearby at exactly 0.6 kV are not above 600 V", order: { energized: false, nearEnergizedKv: 0.6 }, crew: [["o", "j1", "climber"]], expected: [] },
  { name: "(l)(2)(i)(B): energized at 240 V with a 7.2 kV phase within reach", order: { voltageKv: 0.24, nearEnergizedKv: 7.2 }, crew: [["o", "j1", "climber"]], expected: ["o/-/block"], source: B },
  {
    name: "(l)(2)(i)(B),(D) Corrections 2: a de-energized derrick job beside a live feeder",
    order: { workType: "digger_derrick", energized: false, nearEnergizedKv: 12.47 },
    crew: [["o", "opq", "operator"]],
    expected: ["o/-/block"],
    source: "29 CFR 1910.269(l)(2)(i)(B), 29 CFR 1910.269(l)(2)(i)(D); OSHA letter of interpretation of 1994-11-08 (two qualified employees)",
  },
  {
    name: "(l)(2)(ii)(A): routine switching makes it a warning",
    order: { exception: "routine_switching" },
    crew: [["o", "j1", "lead"]],
    expected: ["o/-/warn"],
    message: /excepted as routine switching/,
    source: "29 CFR 1910.269(l)(2)(ii)(A) (exception to 29 CFR 1910.269(l)(2)(i)(A))",
  },
  { name: "(l)(2)(ii)(B): live-line tools out of reach", order: { exception: "live_line_tools" }, crew: [["o", "j1", "lead"]], expected: ["o/-/warn"], source: "29 CFR 1910.269(l)(2)(ii)(B) (exception to 29 CFR 1910.269(l)(2)(i)(A))" },
  { name: "(l)(2)(ii)(C): emergency repair", order: { exception: "emergency" }, crew: [["o", "j1", "lead"]], expected: ["o/-/warn"], source: "29 CFR 1910.269(l)(2)(ii)(C) (exception to 29 CFR 1910.269(l)(2)(i)(A))" },
  {
    name: "crew template (policy): counts everyone, ground hands included",
    order: { minCrew: 3 },
    crew: [["o", "j1", "climber"], ["o", "j2", "lead"], ["o", "gh", "observer"]],
    expected: [],
  },
  {
    name: "crew template (policy, Corrections 1): 3 needed, 2 on site cites the template, not (l)(2)(i)",
    order: { minCrew: 3 },
    crew: [["o", "j1", "climber"], ["o", "j2", "lead"]],
    expected: ["o/-/block"],
    message: /^This order's crew template asks for at least 3 people on site; 2 assigned\. Add 1 more worker\.$/,
    source: TEMPLATE,
  },
  { name: "crew template (policy): applies to patrols too", order: { workType: "patrol", minCrew: 2 }, crew: [["o", "j1", "lead"]], expected: ["o/-/block"], source: TEMPLATE },
  { name: "crew template (policy): applies to de-energized work", order: { energized: false, minCrew: 2 }, crew: [["o", "j1", "lead"]], expected: ["o/-/block"], source: TEMPLATE },
];

describe("CREW_MIN", () => {
  it.each(cases)("$name", ({ order: o, crew, expected, message, source }) => {
    const found = run(crewMin, day(people, [order("o", o)], crew));
    expect(brief(found)).toEqual(expected);
    if (message) expect(found[0].message).toMatch(message);
    if (source) expect(found[0].source).toBe(source);
    for (const f of found) expect(f.rule).toBe("CREW_MIN");
  });

  it("issue 18 point 9: an emergency order short of its template gives one CREW_MIN, a block naming both requirements", () => {
    // The storm template asks for 2 on site; one lineman answers the call-out alone.
    const found = run(crewMin, day(people, [order("o", { workType: "storm", exception: "emergency", minCrew: 2 })], [["o", "j1", "lead"]]));
    expect(found).toHaveLength(1);
    expect(found[0].level).toBe("block");
    expect(found[0].message).toBe(
      "This order's crew template asks for at least 2 people on site; 1 assigned. Add 1 more worker. " +
        "At least 2 qualified workers must be on site because the work is energized at 12.47 kV; 1 of the crew counts " +
        "(journeymen, crew leads, apprentices with a journeyman or crew lead on the order, and equipment operators who hold the qualified-electrical credential). " +
        "The order is excepted as emergency repair to safeguard the public: confirm the exception holds on site, or add a second qualified worker.",
    );
    expect(found[0].source).toBe(`${TEMPLATE}; 29 CFR 1910.269(l)(2)(ii)(C) (exception to 29 CFR 1910.269(l)(2)(i)(A))`);
  });

  it("issue 18 point 9: the template met but the legal minimum excepted is one warning", () => {
    const found = run(crewMin, day(people, [order("o", { workType: "storm", exception: "emergency", minCrew: 2 })], [["o", "j1", "lead"], ["o", "gh", "ground"]]));
    expect(brief(found)).toEqual(["o/-/warn"]);
    expect(found[0].source).toBe("29 CFR 1910.269(l)(2)(ii)(C) (exception to 29 CFR 1910.269(l)(2)(i)(A))");
  });

  it("never one finding per worker: both requirements unmet, no exception, is one block", () => {
    const found = run(crewMin, day(people, [order("o", { minCrew: 3 })], [["o", "j1", "climber"]]));
    expect(brief(found)).toEqual(["o/-/block"]);
    expect(found[0].source).toBe(`${TEMPLATE}; ${A}`);
  });
});

describe("CREW_MIN wording of the voltage (Corrections 8)", () => {
  it("a single-phase tap off a 12.47Y/7.2 kV feeder reads as its system", () => {
    const found = run(crewMin, day(people, [order("o", { voltageKv: 7.2, phases: 1 })], [["o", "j1", "climber"]]));
    expect(found[0].message).toMatch(/because the work is energized at 12\.47Y\/7\.2 kV;/);
  });
});

describe("twoWorkerRuleApplies is twoWorkerBasis without the words", () => {
  it("agrees on every combination of work type, energized, voltage, nearby voltage and equipment", () => {
    const kinds = [[], [{ id: "d", name: "D", kind: "digger_derrick", insulated: false, dielectricTestedOn: null, licence: null }], [{ id: "b", name: "B", kind: "bucket_truck", insulated: true, dielectricTestedOn: null, licence: null }]] as const;
    let applied = 0;
    for (const workType of ["pole_climb", "bucket", "digger_derrick", "patrol", "storm", "other"] as const)
      for (const energized of [true, false])
        for (const voltageKv of [null, 0.24, 0.6, 12.47])
          for (const nearEnergizedKv of [null, 0.6, 7.2])
            for (const eq of kinds) {
              const o = order("o", { workType, energized, voltageKv, nearEnergizedKv });
              const applies = twoWorkerRuleApplies(o, eq);
              expect(applies, JSON.stringify({ workType, energized, voltageKv, nearEnergizedKv, eq: eq.length })).toBe(twoWorkerBasis(o, eq) !== null);
              if (applies) applied++;
            }
    expect(applied).toBeGreaterThan(50);
  });
});
