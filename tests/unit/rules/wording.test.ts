// Finding wording (issue 18 points 8 and 9): messages name people, never internal ids; dates in
// words ("31 May 2027"), never ISO; plurals right ("1 more worker", "2 more workers"); one
// CREW_MIN per order. Checked on a large synthetic day that raises every rule, and on examples.

import { describe, expect, it } from "vitest";
import { dateWords, plural, spanWords, wallTimeWords } from "@/lib/rules/common";
import { checkDay } from "@/lib/rules/engine";
import { generateDay } from "@/lib/rules/generate";
import { crewMin } from "@/lib/rules/crew-min";
import { climbCert } from "@/lib/rules/climb-cert";
import { type A, brief, day, order, run, worker } from "./fixtures";

const ISO_DATE = /\b\d{4}-\d{2}-\d{2}\b/;
const ISO_TIME = /\d{2}T\d{2}:\d{2}/;
const SINGULAR_WITH_PLURAL = /(^|[^\d.])1 (people|workers|more workers|qualified workers|days|hours|warnings)\b/;
const PLURAL_WITH_SINGULAR = /\b([02-9]|\d{2,}) (person|worker|more worker|qualified worker|day|hour|warning)\b(?!s)/;

describe("finding wording on a synthetic day", () => {
  const s = generateDay({ workers: 400, orders: 160, days: 14, seed: 20270406 });
  const found = checkDay(s);

  it("the day raises every rule the engine has without equipment data (so the checks below see each message kind)", () => {
    const seen = new Set(found.map((f) => f.rule));
    for (const code of ["CREW_MIN", "OBSERVER", "RESCUE", "CLIMB_CERT", "FIRST_AID", "QUALIFIED", "OPERATOR_CERT", "REST", "IN_CHARGE", "DOUBLE_BOOKED", "UNAVAILABLE", "LOCATE"]) {
      expect(seen, code).toContain(code);
    }
  });

  it("no message shows a worker's or an order's internal id", () => {
    const ids = [...s.workers.map((w) => w.id), ...s.workOrders.map((o) => o.id)];
    for (const f of found) for (const id of ids) expect(f.message, f.message).not.toContain(id);
  });

  it("no message shows an ISO date or time", () => {
    for (const f of found) {
      expect(f.message).not.toMatch(ISO_DATE);
      expect(f.message).not.toMatch(ISO_TIME);
    }
  });

  it("plurals agree with their numbers", () => {
    for (const f of found) {
      expect(f.message).not.toMatch(SINGULAR_WITH_PLURAL);
      expect(f.message).not.toMatch(PLURAL_WITH_SINGULAR);
    }
  });

  it("at most one CREW_MIN per order (the board keys a finding by rule, order and worker)", () => {
    const keys = found.filter((f) => f.rule === "CREW_MIN").map((f) => f.workOrderId);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it("every finding names a source", () => {
    for (const f of found) expect(f.source.length).toBeGreaterThan(3);
  });
});

describe("wording helpers and examples", () => {
  it("dates in words (day month year, month spelled out)", () => {
    expect(dateWords("2027-05-31")).toBe("31 May 2027");
    expect(dateWords("2027-01-01")).toBe("1 January 2027");
    expect(dateWords("2026-12-09")).toBe("9 December 2026");
    expect(wallTimeWords("2027-04-06T07:05")).toBe("6 April 2027 07:05");
    expect(spanWords("2027-04-06T07:00", "2027-04-06T15:30")).toBe("6 April 2027 07:00 to 15:30");
    expect(spanWords("2027-04-06T22:00", "2027-04-07T06:00")).toBe("6 April 2027 22:00 to 7 April 2027 06:00");
  });

  it("plural", () => {
    expect(plural(1, "warning")).toBe("1 warning");
    expect(plural(2, "warning")).toBe("2 warnings");
    expect(plural(0, "worker")).toBe("0 workers");
    expect(plural(1, "person", "people")).toBe("1 person");
    expect(plural(3, "person", "people")).toBe("3 people");
  });

  it("a person is named without the id: \"Brent Haugland's climbing qualification …\"", () => {
    const w = worker("6", "journeyman", { name: "Brent Haugland", credentials: { climbing: "2027-04-05" } });
    const [f] = run(climbCert, day([w], [order("o")], [["o", "6", "climber"]]));
    expect(f.message).toBe(
      "Brent Haugland's climbing qualification expired on 5 April 2027, before the order starts on 6 April 2027. Renew the climbing evaluation or assign another climber.",
    );
    expect(f.workerId).toBe("6");
  });

  it.each([
    [2, 1, "This order's crew template asks for at least 2 people on site; 1 assigned. Add 1 more worker."],
    [4, 1, "This order's crew template asks for at least 4 people on site; 1 assigned. Add 3 more workers."],
  ])("crew template of %i with %i on site", (minCrew, _n, text) => {
    const crew: A[] = [["o", "j", "lead"]];
    const found = run(crewMin, day([worker("j", "journeyman")], [order("o", { workType: "patrol", minCrew })], crew));
    expect(brief(found)).toEqual(["o/-/block"]);
    expect(found[0].message).toBe(text);
  });
});
