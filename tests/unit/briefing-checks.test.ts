import { describe, expect, it } from "vitest";
import { completionTooEarly, earliestCompletion, emergencyRoleIssues, rescueNeeded } from "@/lib/briefings/checks";

// Issue 18 point 12. Zone rules from the IANA tz database: America/Chicago is UTC−6 in winter
// (CST) and UTC−5 in summer (CDT); in 2026 summer time starts Sunday March 8 and ends Sunday
// November 1 (US rule since 2007: second Sunday of March, first Sunday of November).

describe("earliestCompletion: 18:00 on the yard's clock, the day before the work day", () => {
  it("a winter day: 18:00 CST = 00:00 UTC the next calendar day", () => {
    expect(new Date(earliestCompletion("2026-12-08", "America/Chicago")).toISOString()).toBe("2026-12-08T00:00:00.000Z");
  });
  it("the evening before is still winter when the work day is the first day of summer time (March 8 2026 starts at 02:00)", () => {
    expect(new Date(earliestCompletion("2026-03-09", "America/Chicago")).toISOString()).toBe("2026-03-08T23:00:00.000Z"); // 18:00 CDT
    expect(new Date(earliestCompletion("2026-03-08", "America/Chicago")).toISOString()).toBe("2026-03-08T00:00:00.000Z"); // 18:00 CST on Mar 7
  });
  it("across a month end and in another zone (America/Denver, MST = UTC−7)", () => {
    expect(new Date(earliestCompletion("2027-01-01", "America/Denver")).toISOString()).toBe("2027-01-01T01:00:00.000Z");
  });
});

describe("completionTooEarly", () => {
  const from = earliestCompletion("2026-12-08", "America/Chicago");
  it("29 hours before a 07:00 start is refused, with the moment in words and the zone's abbreviation", () => {
    const start = Date.parse("2026-12-08T13:00:00Z"); // 07:00 CST
    const msg = completionTooEarly(start - 29 * 3_600_000, "2026-12-08", "America/Chicago");
    expect(msg).toContain("from 18:00 the evening before the job");
    expect(msg).toContain("Mon, Dec 7, 18:00 CST");
  });
  it("one minute before 18:00 is refused; 18:00 itself and later are allowed", () => {
    expect(completionTooEarly(from - 60_000, "2026-12-08", "America/Chicago")).not.toBeNull();
    expect(completionTooEarly(from, "2026-12-08", "America/Chicago")).toBeNull();
    expect(completionTooEarly(from + 14 * 3_600_000, "2026-12-08", "America/Chicago")).toBeNull();
  });
});

describe("emergencyRoleIssues", () => {
  const crew = [
    { workerId: 1, position: "lead" },
    { workerId: 2, position: "climber" },
    { workerId: 3, position: "ground" },
    { workerId: 4, position: "aerial" },
  ];
  const names = new Map([
    [1, "Marcus Whitfield"],
    [2, "Priya Raman"],
    [3, "Cody Brandvold"],
    [4, "Jesse Navarro"],
  ]);
  const trained = (m: Record<number, string[]>) => new Map(Object.entries(m).map(([k, v]) => [Number(k), new Set(v)]));

  it("climbing work needs pole-top rescue; bucket work aerial-lift rescue; other work either (1910.269(b)(1), (a)(2)(i)(B))", () => {
    expect(rescueNeeded("pole_climb")).toEqual(["pole_top_rescue"]);
    expect(rescueNeeded("bucket")).toEqual(["aerial_rescue"]);
    expect(rescueNeeded("digger_derrick")).toEqual(["pole_top_rescue", "aerial_rescue"]);
  });
  it("an untrained rescuer is refused by name; a trained one on the ground passes", () => {
    const facts = { ruleType: "pole_climb", names, rescueTraining: trained({ 1: ["pole_top_rescue"], 3: ["aerial_rescue"] }) };
    expect(emergencyRoleIssues({ callerWorkerId: 1, rescuerWorkerId: 3 }, crew, facts)).toEqual([
      { field: "emergency.rescuerWorkerId", message: "Cody Brandvold has no pole-top rescue training valid on the work day; pick someone trained" },
    ]);
    expect(emergencyRoleIssues({ callerWorkerId: 3, rescuerWorkerId: 1 }, crew, facts)).toEqual([]);
  });
  it("the climber or the person in the bucket cannot be the one who calls for help, nor the rescuer", () => {
    const facts = { ruleType: "pole_climb", names, rescueTraining: trained({ 2: ["pole_top_rescue"], 4: ["pole_top_rescue"] }) };
    const issues = emergencyRoleIssues({ callerWorkerId: 4, rescuerWorkerId: 2 }, crew, facts);
    expect(issues.map((i) => i.field)).toEqual(["emergency.callerWorkerId", "emergency.rescuerWorkerId"]);
    expect(issues[0].message).toBe("Jesse Navarro works aloft on this job; the one who calls for help must stay on the ground");
    expect(issues[1].message).toBe("Priya Raman works aloft on this job; the rescuer must be someone else");
  });
});
