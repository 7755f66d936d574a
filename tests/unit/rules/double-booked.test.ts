import { describe, expect, it } from "vitest";
import { doubleBooked } from "@/lib/rules/double-booked";
import { type A, brief, day, order, run, worker } from "./fixtures";

// Source: none (a scheduling conflict, PRODUCT.md). Intervals are half-open: end == start
// does not overlap. Locked since issue 15: nobody can be in two places, so no override.
const people = [worker("w", "journeyman"), worker("v", "journeyman")];
const orders = [
  order("a", { start: "2027-04-06T07:00", end: "2027-04-06T12:00" }),
  order("b", { start: "2027-04-06T11:00", end: "2027-04-06T15:00" }),
  order("c", { start: "2027-04-06T12:00", end: "2027-04-06T16:00" }),
  order("d", { start: "2027-04-06T06:00", end: "2027-04-06T18:00" }),
];

const cases: Array<{ name: string; crew: A[]; expected: string[] }> = [
  { name: "scheduling: overlapping orders give a finding on each", crew: [["a", "w", "climber"], ["b", "w", "lead"]], expected: ["a/w/block/locked", "b/w/block/locked"] },
  { name: "scheduling: touching end and start is not overlap", crew: [["a", "w", "climber"], ["c", "w", "climber"]], expected: [] },
  { name: "scheduling: different workers on overlapping orders", crew: [["a", "w", "climber"], ["b", "v", "climber"]], expected: [] },
  { name: "scheduling: two positions on one order are not a double booking", crew: [["a", "w", "climber"], ["a", "w", "lead"]], expected: [] },
  {
    name: "scheduling: one finding per order and worker, naming every clash",
    crew: [["a", "w", "climber"], ["b", "w", "climber"], ["c", "w", "climber"], ["d", "w", "lead"]],
    expected: ["a/w/block/locked", "b/w/block/locked", "c/w/block/locked", "d/w/block/locked"],
  },
];

describe("DOUBLE_BOOKED", () => {
  it.each(cases)("$name", ({ crew, expected }) => {
    expect(brief(run(doubleBooked, day(people, orders, crew)))).toEqual(expected);
  });

  it("scheduling: the message lists the other orders in id order, by title and local time, never by id", () => {
    const found = run(doubleBooked, day(people, orders, [["d", "w", "lead"], ["c", "w", "climber"], ["a", "w", "climber"]]));
    expect(found.find((f) => f.workOrderId === "d")!.message).toBe(
      'Worker w is also on "Order a" (6 April 2027 07:00 to 12:00), "Order c" (6 April 2027 12:00 to 16:00) at an overlapping time. ' +
        "Remove them from one of the orders; this cannot be overridden.",
    );
  });
});
