import { describe, expect, it } from "vitest";
import { weekStart, weekTotals, type TimeRecordView } from "@/lib/time-records/data";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";

// Week totals on the Time page: daily and weekly hours and overtime beyond the policy's regular
// hours (demo policy: 8 h a day, 40 h a week — common practice, e.g. the FLSA's 40-hour week).

const CHI = "America/Chicago";
const rec = (id: number, start: string, end: string) => {
  const s = zonedWallTimeToEpoch(start, CHI);
  const e = zonedWallTimeToEpoch(end, CHI);
  return { start: s, end: e, view: { id, kind: "shift", startLocal: start, endLocal: end, hours: (e - s) / 3_600_000 } as TimeRecordView };
};

describe("weekTotals", () => {
  it("weeks start on Monday (ISO 8601)", () => {
    expect(weekStart("2027-03-14")).toBe("2027-03-08"); // a Sunday
    expect(weekStart("2027-03-08")).toBe("2027-03-08");
  });

  it("counts overlapping records once, on the day the work started; overtime beyond the day, then beyond the week", () => {
    const week = "2027-03-08";
    const records = [
      rec(1, "2027-03-08T07:00", "2027-03-08T17:30"), // 10.5 h
      rec(2, "2027-03-08T15:00", "2027-03-08T16:00"), // inside the shift: counts once
      rec(3, "2027-03-09T07:00", "2027-03-09T15:00"),
      rec(4, "2027-03-10T07:00", "2027-03-10T15:00"),
      rec(5, "2027-03-11T07:00", "2027-03-11T15:00"),
      rec(6, "2027-03-12T07:00", "2027-03-12T15:00"),
      rec(7, "2027-03-13T22:00", "2027-03-14T04:00"), // call-out across midnight and the spring-forward gap
    ];
    const t = weekTotals(records, week, CHI, { day: 8, week: 40 });
    expect(t.days[0]).toMatchObject({ date: "2027-03-08", hours: 10.5, overRegular: 2.5 });
    expect(t.days[0].records).toHaveLength(2);
    // 22:00 CST → 04:00 CDT is 5 h of elapsed time (the clock skipped 02:00–03:00, IANA US rules)
    expect(t.days[5]).toMatchObject({ date: "2027-03-13", hours: 5, overRegular: 0 });
    expect(t.days[6].hours).toBe(0);
    expect(t.hours).toBe(47.5);
    expect(t.dailyOvertime).toBe(2.5);
    // straight time 8 + 8*4 + 5 = 45 → 5 h beyond the regular week
    expect(t.weeklyOvertime).toBe(5);
    expect(t.overtime).toBe(7.5);
  });
});
