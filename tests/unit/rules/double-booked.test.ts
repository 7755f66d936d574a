import { describe, expect, it } from "vitest";
import { doubleBooked } from "@/lib/rules/double-booked";
import { type A, brief, day, order, run, worker } from "./fixtures";

// Source: none (a scheduling conflict, PRODUCT.md). Intervals are half-open: end == start
// does not overlap.
const people = [worker("w", "journeyman"), worker("v", "journeyman")];
const orders = [
  order("a", { start: "2027-04-06T07:00", end: "2027-04-06T12:00" }),
  order("b", { start: "2027-04-06T11:00", end: "2027-04-06T15:00" }),
  order("c", { start: "2027-04-06T12:00", end: "2027-04-06T16:00" }),
  order("d", { start: "2027-04-06T06:00", end: "2027-04-06T18:00" }),
];

const cases: Array<{ name: string; crew: A[]; expected: string[] }> = [
  { name: "scheduling: overlapping orders give a finding on each", crew: [["a", "w", "climber"], ["b", "w", "lead"]], expected: ["a/w/block", "b/w/block"] },
  { name: "scheduling: touching end and start is not overlap", crew: [["a", "w", "climber"], ["c", "w", "climber"]], expected: [] },
  { name: "scheduling: different workers on overlapping orders", crew: [["a", "w", "climber"], ["b", "v", "climber"]], expected: [] },
  { name: "scheduling: two positions on one order are not a double booking", crew: [["a", "w", "climber"], ["a", "w", "lead"]], expected: [] },
  {
    name: "scheduling: one finding per order and worker, naming every clash",
    crew: [["a", "w", "climber"], ["b", "w", "climber"], ["c", "w", "climber"], ["d", "w", "lead"]],
    expected: ["a/w/block", "b/w/block", "c/w/block", "d/w/block"],
  },
];

describe("DOUBLE_BOOKED", () => {
  it.each(cases)("$name", ({ crew, expected }) => {
    expect(brief(run(doubleBooked, day(people, orders, crew)))).toEqual(expected);
  });

  it("scheduling: the message lists the other orders in id order", () => {
    const found = run(doubleBooked, day(people, orders, [["d", "w", "lead"], ["c", "w", "climber"], ["a", "w", "climber"]]));
    expect(found.find((f) => f.workOrderId === "d")!.message).toMatch(/is also on a, c at an overlapping time/);
  });
});
