import { describe, expect, it } from "vitest";
import { unavailable } from "@/lib/rules/unavailable";
import { brief, day, order, run, worker } from "./fixtures";

// Source: none (leave, training and sickness records, PRODUCT.md). Half-open intervals; the
// order runs 2027-04-06 07:00-15:30.
const cases: Array<{ name: string; spans: Array<[string, string, string]>; expected: string[] }> = [
  { name: "availability: leave covering the whole day", spans: [["2027-04-05T00:00", "2027-04-09T00:00", "leave"]], expected: ["o/w/block"] },
  { name: "availability: training over the last two hours", spans: [["2027-04-06T13:30", "2027-04-06T17:00", "training"]], expected: ["o/w/block"] },
  { name: "availability: sickness inside the order", spans: [["2027-04-06T09:00", "2027-04-06T10:00", "sickness"]], expected: ["o/w/block"] },
  { name: "availability: leave ending exactly at the start", spans: [["2027-04-01T00:00", "2027-04-06T07:00", "leave"]], expected: [] },
  { name: "availability: leave starting exactly at the end", spans: [["2027-04-06T15:30", "2027-04-10T00:00", "leave"]], expected: [] },
  { name: "availability: leave on another day", spans: [["2027-04-12T00:00", "2027-04-16T00:00", "leave"]], expected: [] },
  {
    name: "availability: two overlapping entries make one finding",
    spans: [["2027-04-06T06:00", "2027-04-06T08:00", "training"], ["2027-04-06T12:00", "2027-04-06T13:00", "sickness"]],
    expected: ["o/w/block"],
  },
];

describe("UNAVAILABLE", () => {
  it.each(cases)("$name", ({ spans, expected }) => {
    const w = worker("w", "journeyman", { unavailable: spans });
    expect(brief(run(unavailable, day([w], [order("o")], [["o", "w", "climber"]])))).toEqual(expected);
  });

  it("availability: the message names the reason and the local times", () => {
    const w = worker("w", "journeyman", { name: "Ines Kesley", unavailable: [["2027-04-06T13:30", "2027-04-06T17:00", "training"]] });
    const [f] = run(unavailable, day([w], [order("o")], [["o", "w", "lead"]]));
    expect(f.message).toBe("Ines Kesley is unavailable during this order (training 6 April 2027 13:30 to 17:00). Assign someone else.");
  });
});
