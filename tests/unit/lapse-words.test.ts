// Issue 18, point 13: the words of a lapsed override, as the notice and the e-mail say them —
// the rule by its name, the change in plain words, no internal ids, no ISO dates. The caution's
// parts come from PRODUCT.md "Safety posture".
import { describe, expect, it } from "vitest";
import { changeWords, lapseWords } from "@/lib/notices/model";
import { crewLine, findingLine, DAY_SHEET_CAUTION } from "@/lib/daysheet/model";

describe("crew change words", () => {
  it("names who did what, with the seat as people say it", () => {
    expect(changeWords({ kind: "placed", worker: "Luis Carrasco", position: "ground" }, "Corinne Maddox")).toBe("Corinne Maddox placed Luis Carrasco as ground");
    expect(changeWords({ kind: "placed", worker: "Leah Yazzie", position: "aerial" }, "Corinne Maddox")).toBe("Corinne Maddox placed Leah Yazzie in the bucket");
    expect(changeWords({ kind: "removed", worker: "Luis Carrasco" }, "Corinne Maddox")).toBe("Corinne Maddox took Luis Carrasco off the crew");
    expect(changeWords({ kind: "moved", worker: "Priya Raman", position: "observer", fromOrder: "WO-1", toOrder: "WO-1" }, "A")).toBe("A moved Priya Raman to observer");
    expect(changeWords({ kind: "moved", worker: "Priya Raman", position: "lead", fromOrder: "WO-1", toOrder: "WO-2" }, "A")).toBe("A moved Priya Raman from WO-1 to WO-2, as lead");
    expect(changeWords({ kind: "swapped", a: "Priya Raman", b: "Kayla Sorensen" }, "A")).toBe("A swapped Priya Raman and Kayla Sorensen");
    // A worker's own decline has no user behind it.
    expect(changeWords({ kind: "declined", worker: "Brent Haugland" }, null)).toBe("Brent Haugland declined the assignment");
  });
});

describe("lapse notice and e-mail", () => {
  const facts = {
    orderNumber: "WO-26-0102",
    orderTitle: "Change out 50 kVA transformer, pole N-2204",
    dayWords: "Fri, Dec 4",
    yardName: "North Yard",
    rule: "CLIMB_CERT",
    workerName: "Brent Haugland",
    reason: "Re-evaluation passed this morning",
    givenWords: "Dec 3, 14:05 CST",
    change: "Corinne Maddox placed Luis Carrasco as ground",
    link: "http://127.0.0.1:3000/queue",
  };
  it("says the rule by name, the order, the change and the reason; no ids or ISO dates", () => {
    const w = lapseWords(facts);
    expect(w.title).toBe("Your override lapsed: Climbing qualification (Brent Haugland) on WO-26-0102");
    expect(w.body).toContain("Corinne Maddox placed Luis Carrasco as ground");
    expect(w.body).toContain('"Re-evaluation passed this morning"');
    expect(w.body).not.toMatch(/CLIMB_CERT|\(\d+\)|\d{4}-\d{2}-\d{2}/);
    expect(w.email).toContain("http://127.0.0.1:3000/queue");
    for (const part of ["safety program", "crew lead's judgement", "OSHA 29 CFR 1910.269", "NESC", "local codes"]) expect(w.email).toContain(part);
  });
  it("an override about the whole crew names no worker", () => {
    expect(lapseWords({ ...facts, rule: "CREW_MIN", workerName: null }).title).toBe("Your override lapsed: Crew minimum on WO-26-0102");
  });
});

describe("day sheet lines", () => {
  it("reads a seat and a finding in words", () => {
    expect(crewLine({ position: "lead", positionLabel: "Lead", name: "Marcus Whitfield", employeeNo: "CP-1001", status: "confirmed" })).toBe("Lead: Marcus Whitfield (CP-1001), confirmed");
    expect(crewLine({ position: "climber", positionLabel: "Climber", name: null, employeeNo: null, status: null })).toBe("Climber: open");
    expect(findingLine({ level: "block", rule: "LOCATE", ruleName: "Locate ticket", message: "The ticket ran out.", override: null })).toBe("Block - Locate ticket: The ticket ran out.");
  });
  it("the caution names what the sheet does not replace (PRODUCT.md, Safety posture)", () => {
    for (const part of ["employer's safety program", "crew lead's job briefing and judgement", "manufacturer's ratings", "OSHA 29 CFR 1910.269", "NESC", "local codes"]) {
      expect(DAY_SHEET_CAUTION).toContain(part);
    }
  });
});

describe("audit sentences (issue 18, point 11)", () => {
  it("an override names its rule in words and a quoted reason ends the sentence once", async () => {
    const { auditSentence } = await import("@/lib/audit/model");
    expect(auditSentence({ action: "override.create", actor_name: "Glenn Harrower", detail: { rule: "CLIMB_CERT", order: "WO-26-0102", reason: "Card to HR by noon." } })).toBe(
      "Glenn Harrower overrode Climbing qualification on WO-26-0102: “Card to HR by noon.”",
    );
    expect(auditSentence({ action: "override.create", actor_name: "Glenn Harrower", detail: { rule: "LOCATE", order: "WO-26-0104", reason: "Re-mark called in" } })).toBe(
      "Glenn Harrower overrode Locate ticket on WO-26-0104: “Re-mark called in”.",
    );
  });
  it("actions without a sentence of their own still read as words, never codes", async () => {
    const { auditSentence } = await import("@/lib/audit/model");
    expect(auditSentence({ action: "rotation.create", actor_name: "Corinne Maddox", detail: {} })).toBe("Corinne Maddox created an on-call rotation.");
    expect(auditSentence({ action: "time_record.delete", actor_name: "Nadine Okonkwo", detail: { reason: "Entered twice" } })).toBe("Nadine Okonkwo deleted a time record: “Entered twice”.");
  });
});
