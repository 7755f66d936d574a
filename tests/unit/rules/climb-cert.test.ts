import { describe, expect, it } from "vitest";
import { climbCert, inWarningWindow } from "@/lib/rules/climb-cert";
import { brief, day, order, run, worker } from "./fixtures";

// Source: employer qualification under 29 CFR 1910.269(a)(2) (recalled from memory); OSHA sets
// no renewal period, so expiry and the warning window are policy. The order starts 2027-04-06.
const climber = (expiresOn: string | null | undefined) =>
  worker("c", "journeyman", { credentials: expiresOn === undefined ? { first_aid_cpr: null } : { climbing: expiresOn } });

const cases: Array<{ name: string; expiresOn: string | null | undefined; warnDays?: number; expected: string[]; message?: RegExp }> = [
  { name: "1910.269(a)(2): no climbing qualification blocks", expiresOn: undefined, expected: ["o/c/block"], message: /no climbing qualification/ },
  { name: "1910.269(a)(2): lapsed the day before the start blocks", expiresOn: "2027-04-05", expected: ["o/c/block"], message: /expired on 5 April 2027, before the order starts on 6 April 2027/ },
  { name: "policy: last valid day is the start date: valid, but warns (0 days left)", expiresOn: "2027-04-06", expected: ["o/c/warn"] },
  { name: "policy: 29 days after the start is inside a 30-day window", expiresOn: "2027-05-05", expected: ["o/c/warn"], message: /expires on 5 May 2027, within 30 days of the order's start, 6 April 2027/ },
  { name: "policy: exactly 30 days after the start is outside a 30-day window", expiresOn: "2027-05-06", expected: [] },
  { name: "policy: no expiry never warns", expiresOn: null, expected: [] },
  { name: "policy: a 0-day window never warns, even expiring on the day", expiresOn: "2027-04-06", warnDays: 0, expected: [] },
  { name: "policy: a 7-day window, 6 days left warns", expiresOn: "2027-04-12", warnDays: 7, expected: ["o/c/warn"] },
  { name: "policy: a 7-day window, 7 days left is clear", expiresOn: "2027-04-13", warnDays: 7, expected: [] },
];

describe("CLIMB_CERT", () => {
  it.each(cases)("$name", ({ expiresOn, warnDays, expected, message }) => {
    const snapshot = day([climber(expiresOn)], [order("o")], [["o", "c", "climber"]], warnDays === undefined ? {} : { credentialWarnDays: warnDays });
    const found = run(climbCert, snapshot);
    expect(brief(found)).toEqual(expected);
    if (message) expect(found[0].message).toMatch(message);
  });

  it("1910.269(a)(2): only climber positions are checked", () => {
    const found = run(climbCert, day([climber(undefined)], [order("o")], [["o", "c", "observer"], ["o", "c", "lead"]]));
    expect(found).toEqual([]);
  });

  it("1910.269(a)(2): the latest of several climbing records counts", () => {
    const w = worker("c", "journeyman");
    w.credentials = [
      { type: "climbing", expiresOn: "2026-01-01" },
      { type: "climbing", expiresOn: "2029-01-01" },
    ];
    expect(run(climbCert, day([w], [order("o")], [["o", "c", "climber"]]))).toEqual([]);
  });

  it("Corrections 6: an overnight order needs the qualification on its last day too", () => {
    // An overnight order starting 2027-04-06 22:00 and ending the next morning spans two days.
    const o = order("o", { start: "2027-04-06T22:00", end: "2027-04-07T04:00" });
    const found = run(climbCert, day([climber("2027-04-06")], [o], [["o", "c", "climber"]]));
    expect(brief(found)).toEqual(["o/c/block"]);
    expect(found[0].message).toMatch(/expires on 6 April 2027, before the order's last day, 7 April 2027/);
    // Valid through the last day: only the warning window, counted from the first day.
    expect(brief(run(climbCert, day([climber("2027-04-07")], [o], [["o", "c", "climber"]])))).toEqual(["o/c/warn"]);
  });

  it("Corrections 6: an order ending at midnight does not reach into the next day", () => {
    const o = order("o", { start: "2027-04-06T16:00", end: "2027-04-07T00:00" });
    expect(brief(run(climbCert, day([climber("2027-04-06")], [o], [["o", "c", "climber"]], { credentialWarnDays: 0 })))).toEqual([]);
  });

  it("policy: window boundary helper (fewer than N days left warns)", () => {
    expect(inWarningWindow("2027-05-05", "2027-04-06", 30)).toBe(true);
    expect(inWarningWindow("2027-05-06", "2027-04-06", 30)).toBe(false);
    expect(inWarningWindow("2027-04-06", "2027-04-06", 1)).toBe(true);
    expect(inWarningWindow("2027-04-06", "2027-04-06", 0)).toBe(false);
  });
});
