import { describe, expect, it } from "vitest";
import { handoversBetween, onCallFromMembers, periodAt, periodHours, schedule } from "@/lib/rotations/schedule";
import { epochToOffsetTime, offsetAt } from "@/lib/rules/time";

// Hand-overs over the 2027 daylight-saving weekends in America/Chicago. IANA's US rules
// (since 2007): clocks spring forward at 02:00 on the second Sunday of March and fall back at
// 02:00 on the first Sunday of November — 2027-03-14 and 2027-11-07. Checked with Intl below.

const CHI = "America/Chicago";
const HOUR = 3_600_000;
const members = ["Ada", "Ben", "Cal"] as const;

describe("the zone data (IANA America/Chicago, via Intl)", () => {
  it("springs forward on Sunday 2027-03-14 and falls back on Sunday 2027-11-07", () => {
    expect(new Date(Date.UTC(2027, 2, 14)).getUTCDay()).toBe(0);
    expect(new Date(Date.UTC(2027, 10, 7)).getUTCDay()).toBe(0);
    expect(offsetAt(Date.UTC(2027, 2, 14, 7, 59), CHI)).toBe(-6 * HOUR); // 01:59 CST
    expect(offsetAt(Date.UTC(2027, 2, 14, 8, 0), CHI)).toBe(-5 * HOUR); // 03:00 CDT
    expect(offsetAt(Date.UTC(2027, 10, 7, 6, 59), CHI)).toBe(-5 * HOUR); // 01:59 CDT
    expect(offsetAt(Date.UTC(2027, 10, 7, 7, 0), CHI)).toBe(-6 * HOUR); // 01:00 CST
  });
});

describe("weekly Sunday 02:30 hand-over", () => {
  const rule = { rrule: "FREQ=WEEKLY;BYDAY=SU", dtstartLocal: "2027-02-28T02:30", timezone: CHI };

  it("on the spring-forward day the 02:30 hand-over happens at 03:30 CDT (RFC 5545 'compatible': a time in the gap moves forward by the gap)", () => {
    const h = handoversBetween(rule, Date.UTC(2027, 2, 6), Date.UTC(2027, 2, 22));
    expect(h.map((x) => epochToOffsetTime(x.at, CHI))).toEqual([
      "2027-03-07T02:30-06:00",
      "2027-03-14T03:30-05:00",
      "2027-03-21T02:30-05:00",
    ]);
    expect(h[1].local).toBe("2027-03-14T02:30:00"); // the wall time the rule names
    expect(new Date(h[1].at).toISOString()).toBe("2027-03-14T08:30:00.000Z");
  });

  it("the week after the gap runs 167 h of elapsed time", () => {
    const p = periodAt(rule, Date.UTC(2027, 2, 16, 12))!;
    expect(epochToOffsetTime(p.from, CHI)).toBe("2027-03-14T03:30-05:00");
    expect(epochToOffsetTime(p.to!, CHI)).toBe("2027-03-21T02:30-05:00");
    expect(periodHours(p)).toBe(167);
  });
});

describe("weekly Monday 07:00 hand-over, members taking turns in sort order", () => {
  // First hand-over Monday 2027-03-01 07:00 CST: Ada, then Ben from 03-08, Cal from 03-15, …
  const rule = { rrule: "FREQ=WEEKLY;BYDAY=MO", dtstartLocal: "2027-03-01T07:00", timezone: CHI };

  it("over the spring-forward weekend: 07:00 stays 07:00 local and the period is 167 h", () => {
    const hit = onCallFromMembers(rule, members, Date.UTC(2027, 2, 14, 12))!; // Sunday noon
    expect(hit.member).toBe("Ben");
    expect(epochToOffsetTime(hit.period.from, CHI)).toBe("2027-03-08T07:00-06:00");
    expect(epochToOffsetTime(hit.period.to!, CHI)).toBe("2027-03-15T07:00-05:00");
    expect(periodHours(hit.period)).toBe(167);
  });

  it("over the fall-back weekend: 07:00 stays 07:00 local and the period is 169 h", () => {
    const hit = onCallFromMembers(rule, members, Date.UTC(2027, 10, 7, 18))!; // Sunday noon CST
    // 35 weeks after 03-01 → turn 35 → 35 mod 3 = 2 → Cal
    expect(hit.member).toBe("Cal");
    expect(epochToOffsetTime(hit.period.from, CHI)).toBe("2027-11-01T07:00-05:00");
    expect(epochToOffsetTime(hit.period.to!, CHI)).toBe("2027-11-08T07:00-06:00");
    expect(periodHours(hit.period)).toBe(169);
  });

  it("a hand-over instant belongs to the incoming member; before the first hand-over nobody is on call", () => {
    const handover = Date.UTC(2027, 2, 8, 13); // 2027-03-08 07:00 CST
    expect(onCallFromMembers(rule, members, handover - 1)!.member).toBe("Ada");
    expect(onCallFromMembers(rule, members, handover)!.member).toBe("Ben");
    expect(onCallFromMembers(rule, members, Date.UTC(2027, 2, 1, 12))).toBeNull(); // 06:00 CST on the first day
  });

  it("lists the coming periods with who is on call", () => {
    const s = schedule(rule, members, Date.UTC(2027, 2, 10), 4);
    expect(s.map((p) => p.member)).toEqual(["Ben", "Cal", "Ada", "Ben"]);
    expect(s.map((p) => periodHours(p.period))).toEqual([167, 168, 168, 168]);
  });

  it("a rule that has run out (COUNT) ends the rotation at its last hand-over", () => {
    const short = { ...rule, rrule: "FREQ=WEEKLY;BYDAY=MO;COUNT=3" };
    // Hand-overs 03-01, 03-08, 03-15: Ada, then Ben until 03-15 07:00, then the rotation is over.
    expect(onCallFromMembers(short, members, Date.UTC(2027, 2, 10))!.member).toBe("Ben");
    expect(onCallFromMembers(short, members, Date.UTC(2027, 2, 16))).toBeNull();
  });
});
