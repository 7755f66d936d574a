import { describe, expect, it } from "vitest";
import { rest } from "@/lib/rules/rest";
import type { Policy } from "@/lib/rules/types";
import { type A, brief, day, order, run, worker, type OrderOpts } from "./fixtures";

// Source: common practice in utility labour agreements ("16 on, 8 off"); both numbers are
// policy (PRODUCT.md), not regulation. Elapsed time throughout.
interface Case {
  name: string;
  records?: Array<[string, string]>;
  orders?: Array<[id: string, opts: OrderOpts]>;
  crew?: A[];
  policy?: Partial<Policy>;
  tz?: string;
  expected: string[];
  message?: RegExp;
}

const cases: Case[] = [
  {
    name: "common practice: a 1 h call-out at 01:00 does not block a 07:00 start (14.5 h stretch)",
    records: [["2027-04-06T01:00", "2027-04-06T02:00"]],
    expected: [],
  },
  {
    name: "common practice: 16 h day, 7 h off, then an 8 h order blocks",
    records: [["2027-04-05T08:00", "2027-04-06T00:00"]],
    orders: [["o", { start: "2027-04-06T07:00", end: "2027-04-06T15:00" }]],
    expected: ["o/w/block"],
    message: /31 h stretch \(5 April 2027 08:00 to 6 April 2027 15:00\) without 8 h rest; the limit is 16 h/,
  },
  {
    name: "common practice: 16 h day, exactly 8 h off, then an 8 h order is clear",
    records: [["2027-04-05T07:00", "2027-04-05T23:00"]],
    orders: [["o", { start: "2027-04-06T07:00", end: "2027-04-06T15:00" }]],
    expected: [],
  },
  {
    name: "common practice: exactly 16 h is within the limit",
    records: [["2027-04-05T23:00", "2027-04-06T00:00"]],
    orders: [["o", { start: "2027-04-06T07:00", end: "2027-04-06T15:00" }]],
    expected: [],
  },
  {
    name: "common practice: one minute over 16 h blocks",
    records: [["2027-04-05T23:00", "2027-04-06T00:00"]],
    orders: [["o", { start: "2027-04-06T07:00", end: "2027-04-06T15:01" }]],
    expected: ["o/w/block"],
  },
  {
    name: "common practice: one order longer than the maximum blocks on its own",
    orders: [["o", { workType: "storm", start: "2027-04-06T05:00", end: "2027-04-06T22:00" }]],
    expected: ["o/w/block"],
  },
  {
    name: "common practice: the day's orders count as worked time (two orders 1 h apart, 16.5 h)",
    orders: [
      ["a", { start: "2027-04-06T05:00", end: "2027-04-06T12:00" }],
      ["b", { start: "2027-04-06T13:00", end: "2027-04-06T21:30" }],
    ],
    crew: [["a", "w", "climber"], ["b", "w", "climber"]],
    expected: ["a/w/block", "b/w/block"],
  },
  {
    name: "common practice: an order bridges yesterday's shift into a later order",
    records: [["2027-04-05T15:00", "2027-04-05T23:00"]],
    orders: [
      ["a", { start: "2027-04-06T06:00", end: "2027-04-06T08:00" }],
      ["b", { start: "2027-04-06T10:00", end: "2027-04-06T16:00" }],
    ],
    crew: [["a", "w", "climber"], ["b", "w", "climber"]],
    expected: ["a/w/block", "b/w/block"],
    message: /25 h stretch/,
  },
  {
    name: "common practice: worked time after the order counts too (evening call-out, 16.5 h)",
    records: [["2027-04-06T18:00", "2027-04-06T23:30"]],
    expected: ["o/w/block"],
  },
  {
    name: "common practice: a long stretch that ended well before does not reach the order",
    records: [
      ["2027-04-04T05:00", "2027-04-04T23:00"],
      ["2027-04-05T07:00", "2027-04-05T15:30"],
    ],
    expected: [],
  },
  {
    name: "policy: a 10 h minimum rest with exactly 10 h off is clear",
    records: [["2027-04-05T12:00", "2027-04-05T21:00"]],
    policy: { minRestHours: 10 },
    expected: [],
  },
  {
    name: "policy: an 11 h minimum rest joins a 10 h break",
    records: [["2027-04-05T12:00", "2027-04-05T21:00"]],
    policy: { minRestHours: 11 },
    expected: ["o/w/block"],
  },
  {
    name: "policy: a 12 h maximum blocks the 14.5 h call-out stretch",
    records: [["2027-04-06T01:00", "2027-04-06T02:00"]],
    policy: { maxShiftHours: 12 },
    expected: ["o/w/block"],
    message: /14\.5 h stretch.*the limit is 12 h/,
  },
  {
    name: "common practice: time records in any input order",
    records: [
      ["2027-04-06T01:00", "2027-04-06T02:00"],
      ["2027-04-05T08:00", "2027-04-05T18:00"],
      ["2027-04-05T18:00", "2027-04-05T20:00"],
    ],
    expected: ["o/w/block"],
    message: /31\.5 h stretch/,
  },
  // Daylight saving, America/Chicago 2027 (second Sunday in March, first Sunday in November,
  // recalled from the IANA rules and verified in time.test.ts).
  {
    name: "common practice, DST spring-forward: wall clock says 8 h off, 7 h elapsed, so it joins (23 h)",
    records: [["2027-03-13T15:00", "2027-03-13T23:00"]],
    orders: [["o", { start: "2027-03-14T07:00", end: "2027-03-14T15:00" }]],
    expected: ["o/w/block"],
    message: /23 h stretch/,
  },
  {
    name: "common practice, DST spring-forward: a night order of 8 wall-clock hours is 7 elapsed (limit 7.5 h: clear)",
    orders: [["o", { start: "2027-03-13T23:00", end: "2027-03-14T07:00" }]],
    policy: { maxShiftHours: 7.5 },
    expected: [],
  },
  {
    name: "common practice, DST fall-back: wall clock says 8 h off, 9 h elapsed (minimum 9 h: separate, clear)",
    records: [["2027-11-06T15:00", "2027-11-06T23:00"]],
    orders: [["o", { start: "2027-11-07T07:00", end: "2027-11-07T15:00" }]],
    policy: { minRestHours: 9 },
    expected: [],
  },
  {
    name: "common practice, DST fall-back: a night order of 8 wall-clock hours is 9 elapsed (limit 8.5 h: blocks)",
    orders: [["o", { start: "2027-11-06T23:00", end: "2027-11-07T07:00" }]],
    policy: { maxShiftHours: 8.5 },
    expected: ["o/w/block"],
    message: /9 h stretch/,
  },
  {
    name: "common practice, DST fall-back in New York: 16 wall-clock hours across the night are 17 elapsed",
    tz: "America/New_York",
    orders: [["o", { workType: "storm", start: "2027-11-06T20:00", end: "2027-11-07T12:00", tz: "America/New_York" }]],
    expected: ["o/w/block"],
    message: /17 h stretch/,
  },
];

describe("REST", () => {
  it.each(cases)("$name", ({ records, orders, crew, policy, tz, expected, message }) => {
    const w = worker("w", "journeyman", { timeRecords: records ?? [], tz });
    const os = (orders ?? [["o", {}]]).map(([id, opts]) => order(id, opts));
    const as: A[] = crew ?? os.map((o): A => [o.id, "w", "climber"]);
    const found = run(rest, day([w], os, as, policy, tz));
    expect(brief(found)).toEqual(expected);
    if (message) expect(found[0].message).toMatch(message);
    for (const f of found) expect(f.source).toBe('common practice in utility labour agreements ("16 on, 8 off")');
  });

  it("common practice: other workers' time does not count", () => {
    const tired = worker("t", "journeyman", { timeRecords: [["2027-04-05T08:00", "2027-04-06T00:00"]] });
    const fresh = worker("f", "journeyman");
    const found = run(rest, day([tired, fresh], [order("o")], [["o", "t", "climber"], ["o", "f", "lead"]]));
    expect(brief(found)).toEqual(["o/t/block"]);
  });
});
