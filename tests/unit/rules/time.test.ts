import { describe, expect, it } from "vitest";
import {
  daysBetween,
  epochToOffsetTime,
  epochToZonedDate,
  epochToZonedWallTime,
  isValidTimeZone,
  zonedWallTimeToEpoch,
} from "@/lib/rules/time";

const HOUR = 3_600_000;
const iso = (ms: number) => new Date(ms).toISOString();

/** UTC offset in minutes read straight from Intl ("GMT-5"), independent of lib/rules/time. */
function intlOffsetMinutes(ms: number, tz: string): number {
  const name = new Intl.DateTimeFormat("en-US", { timeZone: tz, timeZoneName: "longOffset" })
    .formatToParts(new Date(ms))
    .find((p) => p.type === "timeZoneName")!.value; // "GMT-05:00" or "GMT"
  const m = /GMT([+-])(\d{2}):(\d{2})/.exec(name);
  return m ? (m[1] === "-" ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3])) : 0;
}

/** The UTC instants (to the minute) where the offset changes between from and to. */
function transitions(tz: string, from: string, to: string): Array<{ at: string; before: number; after: number }> {
  const out: Array<{ at: string; before: number; after: number }> = [];
  const end = Date.parse(to);
  let prev = intlOffsetMinutes(Date.parse(from), tz);
  for (let t = Date.parse(from) + HOUR; t <= end; t += HOUR) {
    const off = intlOffsetMinutes(t, tz);
    if (off !== prev) {
      let lo = t - HOUR; // refine to the minute
      while (intlOffsetMinutes(lo + 60_000, tz) === prev) lo += 60_000;
      out.push({ at: iso(lo + 60_000), before: prev, after: off });
      prev = off;
    }
  }
  return out;
}

describe("2027 US daylight-saving dates, verified against Intl (IANA tz)", () => {
  // Recalled from the IANA US rule (second Sunday in March, first Sunday in November, at
  // 02:00 local): 2027-03-14 and 2027-11-07. The test checks that memory against Intl.
  it.each([
    ["America/New_York", "2027-03-14T07:00:00.000Z", "2027-11-07T06:00:00.000Z", -300, -240],
    ["America/Chicago", "2027-03-14T08:00:00.000Z", "2027-11-07T07:00:00.000Z", -360, -300],
  ])("%s changes at 02:00 local on 2027-03-14 and 2027-11-07", (tz, spring, fall, standard, daylight) => {
    expect(transitions(tz, "2027-01-01T00:00:00Z", "2027-12-31T00:00:00Z")).toEqual([
      { at: spring, before: standard, after: daylight },
      { at: fall, before: daylight, after: standard },
    ]);
  });
});

describe("zonedWallTimeToEpoch", () => {
  it.each([
    // [local, tz, expected UTC, why]
    ["2027-04-06T07:00", "America/Chicago", "2027-04-06T12:00:00.000Z", "ordinary daylight time (CDT, UTC-5)"],
    ["2027-01-15T07:00", "America/Chicago", "2027-01-15T13:00:00.000Z", "ordinary standard time (CST, UTC-6)"],
    ["2027-03-14T01:59", "America/New_York", "2027-03-14T06:59:00.000Z", "last minute before the gap (EST)"],
    ["2027-03-14T02:00", "America/New_York", "2027-03-14T07:00:00.000Z", "gap start moves forward to 03:00 EDT"],
    ["2027-03-14T02:30", "America/New_York", "2027-03-14T07:30:00.000Z", "gap 02:30 moves forward by the gap to 03:30 EDT"],
    ["2027-03-14T03:00", "America/New_York", "2027-03-14T07:00:00.000Z", "03:00 EDT exists"],
    ["2027-03-14T02:30", "America/Chicago", "2027-03-14T08:30:00.000Z", "gap 02:30 moves forward to 03:30 CDT"],
    ["2027-11-07T01:30", "America/New_York", "2027-11-07T05:30:00.000Z", "ambiguous 01:30 takes the earlier (EDT) instant"],
    ["2027-11-07T01:30", "America/Chicago", "2027-11-07T06:30:00.000Z", "ambiguous 01:30 takes the earlier (CDT) instant"],
    ["2027-11-07T00:59", "America/Chicago", "2027-11-07T05:59:00.000Z", "before the overlap"],
    ["2027-11-07T02:00", "America/Chicago", "2027-11-07T08:00:00.000Z", "02:00 after the overlap is CST"],
    ["2027-04-06T07:00Z", "America/Chicago", "2027-04-06T07:00:00.000Z", "explicit Z"],
    ["2027-04-06T07:00-05:00", "Europe/Berlin", "2027-04-06T12:00:00.000Z", "explicit offset wins over the zone"],
    ["2027-04-06T07:00:30", "America/Chicago", "2027-04-06T12:00:30.000Z", "seconds are accepted"],
  ])("%s in %s -> %s (%s)", (local, tz, expected) => {
    expect(iso(zonedWallTimeToEpoch(local, tz))).toBe(expected);
  });

  it("the gap result reads 03:30 on the wall clock", () => {
    expect(epochToZonedWallTime(zonedWallTimeToEpoch("2027-03-14T02:30", "America/New_York"), "America/New_York")).toBe(
      "2027-03-14T03:30",
    );
  });

  it("the later 01:30 of the fall-back night is one elapsed hour after the earlier", () => {
    const early = zonedWallTimeToEpoch("2027-11-07T01:30", "America/New_York");
    expect(epochToZonedWallTime(early + HOUR, "America/New_York")).toBe("2027-11-07T01:30");
    expect(zonedWallTimeToEpoch("2027-11-07T01:30-05:00", "UTC")).toBe(early + HOUR);
  });

  // Compatible disambiguation checked minute by minute against Intl's own offsets, including a
  // zone with a 30-minute shift (Lord Howe Island) and a southern-hemisphere zone.
  it.each([
    ["America/New_York", "2027-03-14", "2027-11-07"],
    ["America/Chicago", "2027-03-14", "2027-11-07"],
    ["Europe/Berlin", "2027-03-28", "2027-10-31"],
    ["Australia/Lord_Howe", "2027-04-04", "2027-10-03"],
  ])("%s: every local time on its transition days resolves compatibly", (tz, d1, d2) => {
    let gaps = 0;
    let ambiguous = 0;
    for (const date of [d1, d2]) {
      for (let m = 0; m < 24 * 60; m += 5) {
        const local = `${date}T${String(Math.floor(m / 60)).padStart(2, "0")}:${String(m % 60).padStart(2, "0")}`;
        const ms = zonedWallTimeToEpoch(local, tz);
        const asUtc = Date.parse(`${local}:00Z`);
        const offsets = [...new Set([-1, 1].map((s) => intlOffsetMinutes(asUtc + s * 86_400_000, tz)))];
        const exact = offsets.map((o) => asUtc - o * 60_000).filter((c) => intlOffsetMinutes(c, tz) * 60_000 === asUtc - c);
        if (exact.length > 1) ambiguous++;
        if (exact.length > 0) {
          expect(ms, local).toBe(Math.min(...exact));
        } else {
          // In the gap: forward by the gap length, i.e. read with the offset from before it.
          gaps++;
          const before = intlOffsetMinutes(asUtc - 86_400_000, tz);
          const after = intlOffsetMinutes(asUtc + 86_400_000, tz);
          expect(ms, local).toBe(asUtc - before * 60_000);
          expect(Date.parse(`${epochToZonedWallTime(ms, tz)}:00Z`) - asUtc, local).toBe((after - before) * 60_000);
        }
      }
    }
    expect(gaps).toBeGreaterThan(0); // the days chosen really hold a gap and an overlap
    expect(ambiguous).toBeGreaterThan(0);
  });

  it.each(["2027-02-30T07:00", "2027-04-06 07:00", "2027-04-06T24:00", "2027-04-06T07:60", "2027-04-06", "07:00", "2027-4-6T07:00"])(
    "rejects %s",
    (bad) => {
      expect(() => zonedWallTimeToEpoch(bad, "America/Chicago")).toThrow(RangeError);
    },
  );

  it("rejects an unknown zone", () => {
    expect(() => zonedWallTimeToEpoch("2027-04-06T07:00", "America/Springfield")).toThrow(RangeError);
    expect(isValidTimeZone("America/Chicago")).toBe(true);
    expect(isValidTimeZone("Mars/Base")).toBe(false);
    expect(isValidTimeZone("")).toBe(false);
  });

  it("accepts 2028-02-29 and rejects 2027-02-29", () => {
    expect(() => zonedWallTimeToEpoch("2028-02-29T07:00", "UTC")).not.toThrow();
    expect(() => zonedWallTimeToEpoch("2027-02-29T07:00", "UTC")).toThrow(RangeError);
  });
});

describe("epochToZonedDate and friends", () => {
  it("dates are in the zone, not UTC", () => {
    expect(epochToZonedDate(Date.parse("2027-04-07T04:59:00Z"), "America/Chicago")).toBe("2027-04-06");
    expect(epochToZonedDate(Date.parse("2027-04-07T05:00:00Z"), "America/Chicago")).toBe("2027-04-07");
  });

  it("offset times round-trip exactly, across both transitions", () => {
    for (const tz of ["America/New_York", "America/Chicago", "Australia/Lord_Howe"]) {
      for (let t = Date.parse("2027-03-13T00:00:00Z"); t < Date.parse("2027-03-16T00:00:00Z"); t += 15 * 60_000) {
        expect(zonedWallTimeToEpoch(epochToOffsetTime(t, tz), "UTC")).toBe(t);
      }
      for (let t = Date.parse("2027-11-06T00:00:00Z"); t < Date.parse("2027-11-09T00:00:00Z"); t += 15 * 60_000) {
        expect(zonedWallTimeToEpoch(epochToOffsetTime(t, tz), "UTC")).toBe(t);
      }
    }
  });

  it("daysBetween counts calendar days", () => {
    expect(daysBetween("2027-04-06", "2027-05-06")).toBe(30);
    expect(daysBetween("2027-03-13", "2027-03-15")).toBe(2);
    expect(daysBetween("2027-04-06", "2027-04-05")).toBe(-1);
    expect(daysBetween("2027-12-31", "2028-01-01")).toBe(1);
  });
});
