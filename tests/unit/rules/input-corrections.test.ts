// The fields CREW-CHECK.md "Corrections" adds to the input (nearEnergizedKv, shifts, digs,
// locate, the aerial position, the qualified_electrical credential): read from a file through
// the same parser as the command and the API, and through the command itself (exit 2 naming
// the path on a bad value). An input without them keeps its meaning.

import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { crewCheckReport } from "@/lib/rules/report";
import { parseDayInput } from "@/lib/rules/input";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { exampleInput } from "./fixtures";

function errorsOf(input: unknown): string[] {
  const r = parseDayInput(input);
  if (r.ok) throw new Error("expected errors");
  return r.errors;
}

function snapshotOf(input: unknown) {
  const r = parseDayInput(input);
  if (!r.ok) throw new Error(r.errors.join("\n"));
  return r.snapshot;
}

/** The contract's example as a three-day order with shifts, digging, a ticket and a nearby feeder. */
function multiDay(): Record<string, any> {
  const input = exampleInput();
  Object.assign(input.workOrders[0], {
    end: "2027-04-08T15:30",
    nearEnergizedKv: 12.47,
    digs: true,
    locate: { ticket: "27040512345", validThrough: "2027-04-08" },
    shifts: [
      { start: "2027-04-06T07:00", end: "2027-04-06T15:30" },
      { start: "2027-04-07T07:00", end: "2027-04-07T15:30" },
      { start: "2027-04-08T07:00", end: "2027-04-08T15:30" },
    ],
  });
  return input;
}

describe("parseDayInput: the corrections' fields", () => {
  it("reads nearEnergizedKv, shifts (wall-clock in the zone), digs and locate", () => {
    const o = snapshotOf(multiDay()).workOrders[0];
    expect(o.nearEnergizedKv).toBe(12.47);
    expect(o.digs).toBe(true);
    expect(o.locate).toEqual({ ticket: "27040512345", validThrough: "2027-04-08" });
    expect(o.shifts).toEqual([
      { start: zonedWallTimeToEpoch("2027-04-06T07:00", "America/Chicago"), end: zonedWallTimeToEpoch("2027-04-06T15:30", "America/Chicago") },
      { start: zonedWallTimeToEpoch("2027-04-07T07:00", "America/Chicago"), end: zonedWallTimeToEpoch("2027-04-07T15:30", "America/Chicago") },
      { start: zonedWallTimeToEpoch("2027-04-08T07:00", "America/Chicago"), end: zonedWallTimeToEpoch("2027-04-08T15:30", "America/Chicago") },
    ]);
  });

  it("defaults: no nearby voltage, no shifts (the span is worked), does not dig, no ticket", () => {
    const o = snapshotOf(exampleInput()).workOrders[0];
    expect(o.nearEnergizedKv).toBeNull();
    expect(o.shifts).toBeUndefined();
    expect(o.digs).toBe(false);
    expect(o.locate).toBeNull();
  });

  it("accepts the aerial position and the qualified_electrical credential", () => {
    const input = exampleInput();
    input.workers[0].credentials.push({ type: "qualified_electrical", expiresOn: null });
    input.assignments.push({ workOrderId: "wo-2201", workerId: "w-104", position: "aerial" });
    const s = snapshotOf(input);
    expect(s.assignments.map((a) => a.position)).toEqual(["climber", "aerial"]);
    expect(s.workers[0].credentials.at(-1)).toEqual({ type: "qualified_electrical", expiresOn: null });
  });

  const bad: Array<[string, (i: Record<string, any>) => void, string]> = [
    ["shift start not a wall time", (i) => (i.workOrders[0].shifts[0].start = "seven"), "workOrders[0].shifts[0].start: expected YYYY-MM-DDTHH:mm"],
    ["shift end missing", (i) => delete i.workOrders[0].shifts[1].end, "workOrders[0].shifts[1].end: required"],
    ["shift ends before it starts", (i) => (i.workOrders[0].shifts[0].end = "2027-04-06T06:00"), "workOrders[0].shifts[0].end: must be after start"],
    ["shift before the order", (i) => (i.workOrders[0].shifts[0].start = "2027-04-06T05:00"), "workOrders[0].shifts[0].start: must be inside the order"],
    ["shift past the order", (i) => (i.workOrders[0].shifts[2].end = "2027-04-08T18:00"), "workOrders[0].shifts[2].end: must be inside the order"],
    ["shifts not a list", (i) => (i.workOrders[0].shifts = "days"), "workOrders[0].shifts: expected array, got string"],
    ["nearby voltage negative", (i) => (i.workOrders[0].nearEnergizedKv = -1), "workOrders[0].nearEnergizedKv: must be at least 0"],
    ["nearby voltage as text", (i) => (i.workOrders[0].nearEnergizedKv = "12.47"), "workOrders[0].nearEnergizedKv: expected number, got string"],
    ["digs as text", (i) => (i.workOrders[0].digs = "yes"), "workOrders[0].digs: expected boolean, got string"],
    ["locate date malformed", (i) => (i.workOrders[0].locate.validThrough = "2027-04"), "workOrders[0].locate.validThrough: expected YYYY-MM-DD"],
    ["locate ticket empty", (i) => (i.workOrders[0].locate.ticket = ""), "workOrders[0].locate.ticket: must not be empty"],
    ["locate ticket missing", (i) => delete i.workOrders[0].locate.ticket, "workOrders[0].locate.ticket: required"],
  ];
  it.each(bad)("%s", (_name, mutate, expected) => {
    const input = multiDay();
    mutate(input);
    const errors = errorsOf(input);
    expect(errors.some((e) => e.startsWith(expected)), errors.join("\n")).toBe(true);
  });

  it("the report of the three-day order: LOCATE clear with a ticket through the last day, blocked without", () => {
    const withTicket = crewCheckReport(snapshotOf(multiDay())).findings.map((f) => f.rule);
    expect(withTicket).not.toContain("LOCATE");
    const input = multiDay();
    input.workOrders[0].locate.validThrough = "2027-04-07";
    const found = crewCheckReport(snapshotOf(input)).findings.filter((f) => f.rule === "LOCATE");
    expect(found).toHaveLength(1);
    expect(found[0].message).toMatch(/valid through 7 April 2027, before the order's last day, 8 April 2027/);
  });
});

describe("crew-check command: a bad corrections field exits 2 naming the path", () => {
  const run = (stdin: string) =>
    spawnSync(process.execPath, ["--import", "tsx", "scripts/crew-check.ts", "-"], {
      cwd: join(__dirname, "../../.."),
      input: stdin,
      encoding: "utf8",
      timeout: 30_000,
    });

  it("workOrders[0].shifts[0].start", () => {
    const input = multiDay();
    input.workOrders[0].shifts[0].start = "2027-04-06 seven";
    const r = run(JSON.stringify(input));
    expect(r.status).toBe(2);
    expect(r.stdout).toBe("");
    expect(r.stderr).toContain("workOrders[0].shifts[0].start: expected YYYY-MM-DDTHH:mm");
  });

  it("a good multi-day input exits 0 and unknown fields are ignored", () => {
    const input = multiDay();
    input.workOrders[0].crewColour = "teal";
    input.workOrders[0].shifts[0].note = "first day";
    const r = run(JSON.stringify(input));
    expect(r.stderr).toBe("");
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).findings.length).toBeGreaterThan(0);
  });
});
