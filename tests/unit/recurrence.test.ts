import { describe, expect, it } from "vitest";
import {
  buildRrule,
  defaultRepeatForm,
  occurrences,
  parseRrule,
  repeatFormFrom,
  type RecurrenceSpec,
} from "@/lib/orders/data-occurrences";
import { epochToOffsetTime, offsetAt } from "@/lib/rules/time";

// Worked examples from RFC 5545 §3.8.5.3 ("Recurrence Rule", Examples). Every example there
// starts with DTSTART;TZID=America/New_York and lists its answer as local dates at 9:00 AM,
// marking EDT (UTC-4) and EST (UTC-5). The dates below are the RFC's, as printed.

const NY = "America/New_York";
const HOUR = 3_600_000;

/** The instant of 09:00 local on y-m-d at a UTC offset of `offset` hours (-4 EDT, -5 EST). */
const at9 = (y: number, m: number, d: number, offset: -4 | -5) => Date.UTC(y, m - 1, d, 9 - offset);

/** Expands the RFC's compact answer: [[year, month, [days], offset], ...]. */
function listed(groups: [number, number, number[], -4 | -5][]): number[] {
  return groups.flatMap(([y, m, days, off]) => days.map((d) => at9(y, m, d, off)));
}

const range = (a: number, b: number) => Array.from({ length: b - a + 1 }, (_, i) => a + i);

function expand(dtstart: string, rrule: string, exdates: string[] = [], limit?: number) {
  const spec: RecurrenceSpec = { rrule, dtstartLocal: dtstart, exdates };
  return occurrences(spec, NY, limit ? { limit } : { limit: 1000 });
}

describe("the zone data the examples rely on", () => {
  it("US Eastern fell back on Sunday 1997-10-26 (last Sunday of October then) — recalled from memory, checked with Intl", () => {
    expect(new Date(Date.UTC(1997, 9, 26)).getUTCDay()).toBe(0); // a Sunday
    expect(offsetAt(Date.UTC(1997, 9, 26, 5, 30), NY)).toBe(-4 * HOUR); // 01:30 EDT
    expect(offsetAt(Date.UTC(1997, 9, 26, 7, 30), NY)).toBe(-5 * HOUR); // 02:30 after the change = 01:30 EST
    // and sprang forward on 1998-04-05 (first Sunday of April then)
    expect(offsetAt(Date.UTC(1998, 3, 5, 6, 30), NY)).toBe(-5 * HOUR);
    expect(offsetAt(Date.UTC(1998, 3, 5, 7, 30), NY)).toBe(-4 * HOUR);
  });
});

describe("RFC 5545 §3.8.5.3 examples, DTSTART;TZID=America/New_York", () => {
  it('"Daily for 10 occurrences": September 2-11, 1997 at 9:00 AM EDT', () => {
    const got = expand("1997-09-02T09:00:00", "FREQ=DAILY;COUNT=10");
    expect(got.map((o) => o.start)).toEqual(listed([[1997, 9, range(2, 11), -4]]));
    expect(got.map((o) => o.date)).toEqual(range(2, 11).map((d) => `1997-09-${String(d).padStart(2, "0")}`));
  });

  it('"Daily until December 24, 1997": stays at 9:00 local across the fall-back; UTC offset -04:00 → -05:00', () => {
    const got = expand("1997-09-02T09:00:00", "FREQ=DAILY;UNTIL=19971224T000000Z");
    // ==> (1997 9:00 AM EDT) September 2-30;October 1-25
    //     (1997 9:00 AM EST) October 26-31;November 1-30;December 1-23
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, range(2, 30), -4],
        [1997, 10, range(1, 25), -4],
        [1997, 10, range(26, 31), -5],
        [1997, 11, range(1, 30), -5],
        [1997, 12, range(1, 23), -5],
      ]),
    );
    const oct25 = got.find((o) => o.date === "1997-10-25")!;
    const oct26 = got.find((o) => o.date === "1997-10-26")!;
    expect(epochToOffsetTime(oct25.start, NY)).toBe("1997-10-25T09:00-04:00");
    expect(epochToOffsetTime(oct26.start, NY)).toBe("1997-10-26T09:00-05:00");
    expect(new Date(oct25.start).toISOString()).toBe("1997-10-25T13:00:00.000Z");
    expect(new Date(oct26.start).toISOString()).toBe("1997-10-26T14:00:00.000Z");
    // 25 h of elapsed time between the two 9:00 starts: the clock went back an hour.
    expect(oct26.start - oct25.start).toBe(25 * HOUR);
  });

  it('"Weekly for 10 occurrences": September 2…October 21 EDT, October 28 and November 4 EST', () => {
    const got = expand("1997-09-02T09:00:00", "FREQ=WEEKLY;COUNT=10");
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [2, 9, 16, 23, 30], -4],
        [1997, 10, [7, 14, 21], -4],
        [1997, 10, [28], -5],
        [1997, 11, [4], -5],
      ]),
    );
  });

  it('"Weekly on Tuesday and Thursday for five weeks": both of the RFC\'s rules give September 2,4,…,30; October 2', () => {
    const want = listed([
      [1997, 9, [2, 4, 9, 11, 16, 18, 23, 25, 30], -4],
      [1997, 10, [2], -4],
    ]);
    expect(expand("1997-09-02T09:00:00", "FREQ=WEEKLY;UNTIL=19971007T000000Z;WKST=SU;BYDAY=TU,TH").map((o) => o.start)).toEqual(want);
    expect(expand("1997-09-02T09:00:00", "FREQ=WEEKLY;COUNT=10;WKST=SU;BYDAY=TU,TH").map((o) => o.start)).toEqual(want);
  });

  it('"Every other week on Monday, Wednesday, and Friday until December 24, 1997, starting on Monday, September 1, 1997"', () => {
    const got = expand("1997-09-01T09:00:00", "FREQ=WEEKLY;INTERVAL=2;UNTIL=19971224T000000Z;WKST=SU;BYDAY=MO,WE,FR");
    // ==> (1997 9:00 AM EDT) September 1,3,5,15,17,19,29; October 1,3,13,15,17
    //     (1997 9:00 AM EST) October 27,29,31; November 10,12,14,24,26,28; December 8,10,12,22
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [1, 3, 5, 15, 17, 19, 29], -4],
        [1997, 10, [1, 3, 13, 15, 17], -4],
        [1997, 10, [27, 29, 31], -5],
        [1997, 11, [10, 12, 14, 24, 26, 28], -5],
        [1997, 12, [8, 10, 12, 22], -5],
      ]),
    );
    expect(got).toHaveLength(25);
  });

  it('"Every other week on Tuesday and Thursday, for 8 occurrences"', () => {
    const got = expand("1997-09-02T09:00:00", "FREQ=WEEKLY;INTERVAL=2;COUNT=8;WKST=SU;BYDAY=TU,TH");
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [2, 4, 16, 18, 30], -4],
        [1997, 10, [2, 14, 16], -4],
      ]),
    );
  });

  it('"Monthly on the first Friday for 10 occurrences" (DTSTART 1997-09-05): EDT → EST → EDT again in May 1998', () => {
    const got = expand("1997-09-05T09:00:00", "FREQ=MONTHLY;COUNT=10;BYDAY=1FR");
    // ==> (1997 9:00 AM EDT) September 5;October 3
    //     (1997 9:00 AM EST) November 7;December 5
    //     (1998 9:00 AM EST) January 2;February 6;March 6;April 3
    //     (1998 9:00 AM EDT) May 1;June 5
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [5], -4],
        [1997, 10, [3], -4],
        [1997, 11, [7], -5],
        [1997, 12, [5], -5],
        [1998, 1, [2], -5],
        [1998, 2, [6], -5],
        [1998, 3, [6], -5],
        [1998, 4, [3], -5],
        [1998, 5, [1], -4],
        [1998, 6, [5], -4],
      ]),
    );
    expect(got.every((o) => o.local.endsWith("T09:00:00"))).toBe(true);
  });

  it('"Every other month on the first and last Sunday of the month for 10 occurrences" (DTSTART 1997-09-07)', () => {
    const got = expand("1997-09-07T09:00:00", "FREQ=MONTHLY;INTERVAL=2;COUNT=10;BYDAY=1SU,-1SU");
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [7, 28], -4],
        [1997, 11, [2, 30], -5],
        [1998, 1, [4, 25], -5],
        [1998, 3, [1, 29], -5],
        [1998, 5, [3, 31], -4],
      ]),
    );
  });

  it('"Monthly on the second-to-last Monday of the month for 6 months" (DTSTART 1997-09-22)', () => {
    const got = expand("1997-09-22T09:00:00", "FREQ=MONTHLY;COUNT=6;BYDAY=-2MO");
    // ==> (1997 9:00 AM EDT) September 22;October 20
    //     (1997 9:00 AM EST) November 17;December 22
    //     (1998 9:00 AM EST) January 19;February 16
    expect(got.map((o) => o.start)).toEqual(
      listed([
        [1997, 9, [22], -4],
        [1997, 10, [20], -4],
        [1997, 11, [17], -5],
        [1997, 12, [22], -5],
        [1998, 1, [19], -5],
        [1998, 2, [16], -5],
      ]),
    );
  });

  it('"Every Friday the 13th, forever" with EXDATE of the DTSTART (RFC 5545 §3.8.5.3; §3.8.5.1 EXDATE)', () => {
    // DTSTART;TZID=America/New_York:19970902T090000
    // EXDATE;TZID=America/New_York:19970902T090000
    // RRULE:FREQ=MONTHLY;BYDAY=FR;BYMONTHDAY=13
    // ==> (1998 9:00 AM EST) February 13;March 13;November 13
    //     (1999 9:00 AM EDT) August 13
    //     (2000 9:00 AM EDT) October 13
    const got = expand("1997-09-02T09:00:00", "FREQ=MONTHLY;BYDAY=FR;BYMONTHDAY=13", ["1997-09-02"], 5);
    expect(got.map((o) => o.start)).toEqual([
      at9(1998, 2, 13, -5),
      at9(1998, 3, 13, -5),
      at9(1998, 11, 13, -5),
      at9(1999, 8, 13, -4),
      at9(2000, 10, 13, -4),
    ]);
  });
});

describe("skipped dates (EXDATE)", () => {
  it("removes the named days from the set the RRULE generates; COUNT still counts them (RFC 5545 §3.8.5.1, §3.8.5.3)", () => {
    // "Daily for 10 occurrences" with 1997-09-05 and 1997-09-08 skipped → 8 of the 10 remain.
    const got = expand("1997-09-02T09:00:00", "FREQ=DAILY;COUNT=10", ["1997-09-05", "1997-09-08"]);
    expect(got.map((o) => o.date)).toEqual([
      "1997-09-02",
      "1997-09-03",
      "1997-09-04",
      "1997-09-06",
      "1997-09-07",
      "1997-09-09",
      "1997-09-10",
      "1997-09-11",
    ]);
  });

  it("a window of dates returns only occurrences inside it (the materialiser's horizon)", () => {
    const spec = { rrule: "FREQ=WEEKLY;BYDAY=TU,TH", dtstartLocal: "1997-09-02T09:00", exdates: ["1997-10-28"] };
    const got = occurrences(spec, NY, { from: "1997-10-20", to: "1997-11-02" });
    expect(got.map((o) => o.date)).toEqual(["1997-10-21", "1997-10-23", "1997-10-30"]);
  });
});

describe("daylight saving at the yard (America/Chicago, IANA US rules: 2nd Sunday of March, 1st Sunday of November)", () => {
  it("a daily 02:30 start on the spring-forward day 2027-03-14 lands at 03:30 CDT (RFC 5545 'compatible' gap rule)", () => {
    const got = occurrences({ rrule: "FREQ=DAILY;COUNT=3", dtstartLocal: "2027-03-13T02:30" }, "America/Chicago", { limit: 3 });
    expect(got.map((o) => epochToOffsetTime(o.start, "America/Chicago"))).toEqual([
      "2027-03-13T02:30-06:00",
      "2027-03-14T03:30-05:00",
      "2027-03-15T02:30-05:00",
    ]);
    expect(got[1].date).toBe("2027-03-14");
  });

  it("a weekly 07:00 order keeps 07:00 local across 2027-11-07 (offset -05:00 → -06:00)", () => {
    const got = occurrences({ rrule: "FREQ=WEEKLY;COUNT=2", dtstartLocal: "2027-11-01T07:00" }, "America/Chicago", { limit: 2 });
    expect(got.map((o) => epochToOffsetTime(o.start, "America/Chicago"))).toEqual(["2027-11-01T07:00-05:00", "2027-11-08T07:00-06:00"]);
  });
});

describe("the form's usual cases (common practice)", () => {
  it("builds and reads back weekly, monthly n-th weekday, until and count rules", () => {
    const weekly = { ...defaultRepeatForm("2027-06-01"), kind: "weekly" as const, weekdays: ["TU" as const, "TH" as const], end: "count" as const, count: 10 };
    expect(buildRrule(weekly)).toBe("FREQ=WEEKLY;BYDAY=TU,TH;COUNT=10");
    expect(repeatFormFrom("FREQ=WEEKLY;BYDAY=TU,TH;COUNT=10")).toMatchObject({ kind: "weekly", weekdays: ["TU", "TH"], end: "count", count: 10 });
    const monthly = { ...defaultRepeatForm("2027-06-28"), kind: "monthly" as const, end: "until" as const, until: "2027-12-31" };
    expect(monthly.nth).toBe(-1); // June 28, 2027 is the last Monday of its month
    expect(buildRrule(monthly)).toBe("FREQ=MONTHLY;BYDAY=-1MO;UNTIL=20271231T235959");
    expect(repeatFormFrom("FREQ=MONTHLY;BYDAY=-1MO;UNTIL=20271231T235959")).toMatchObject({ kind: "monthly", nth: -1, weekday: "MO", until: "2027-12-31" });
    expect(repeatFormFrom("FREQ=YEARLY;BYMONTH=6")).toMatchObject({ kind: "custom", custom: "FREQ=YEARLY;BYMONTH=6" });
  });

  it("refuses rules a work order cannot follow, in plain words", () => {
    expect(parseRrule("FREQ=HOURLY;INTERVAL=3")).toMatchObject({ ok: false });
    expect(parseRrule("FREQ=DAILY;BYHOUR=7,19")).toMatchObject({ ok: false });
    expect(parseRrule("FREQ=DAILY;BYHOUR=7,19", { subDaily: true })).toMatchObject({ ok: true });
    expect(parseRrule("FREQ=DAILY;COUNT=3;UNTIL=20270101")).toMatchObject({ ok: false });
    expect(parseRrule("BYDAY=MO")).toMatchObject({ ok: false });
    expect(parseRrule("RRULE:freq=weekly;byday=mo")).toMatchObject({ ok: true, rule: "FREQ=WEEKLY;BYDAY=MO" });
  });
});
