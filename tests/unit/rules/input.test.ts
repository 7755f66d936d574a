import { existsSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { parseDayInput } from "@/lib/rules/input";
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

describe("parseDayInput: valid input", () => {
  it("parses the CREW-CHECK.md example into epoch times in the zone", () => {
    const s = snapshotOf(exampleInput());
    expect(s.timezone).toBe("America/Chicago");
    expect(s.policy).toEqual({ minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30 });
    const [o] = s.workOrders;
    expect(new Date(o.start).toISOString()).toBe("2027-04-06T12:00:00.000Z");
    expect(new Date(o.end).toISOString()).toBe("2027-04-06T20:30:00.000Z");
    expect(o).toMatchObject({ startDate: "2027-04-06", endDate: "2027-04-06", exception: null, minCrew: 3, driverLicence: "cdl_b" });
    expect(s.workers[0].unavailable).toEqual([
      { start: Date.parse("2027-04-12T05:00:00Z"), end: Date.parse("2027-04-16T05:00:00Z"), reason: "leave" },
    ]);
    expect(s.workers[0].credentials[0]).toEqual({ type: "climbing", expiresOn: "2027-05-31" });
  });

  it("is the same input as the example in the shared contract", () => {
    const path = "/work/shared/CREW-CHECK.md";
    if (!existsSync(path)) return; // the shared docs live outside the repository
    const doc = readFileSync(path, "utf8");
    const block = /```json\n([\s\S]*?)```/.exec(doc);
    if (block) expect(JSON.parse(block[1])).toEqual(exampleInput());
  });

  it("applies the defaults: policy, energized, voltage, emergency, unavailable, timeRecords, driverLicence", () => {
    const input = exampleInput();
    delete input.policy;
    delete input.workers[0].unavailable;
    delete input.workers[0].timeRecords;
    const o = input.workOrders[0];
    delete o.energized;
    delete o.voltageKv;
    delete o.emergency;
    delete o.minCrew;
    const s = snapshotOf(input);
    expect(s.policy).toEqual({ minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30 });
    expect(s.workers[0]).toMatchObject({ unavailable: [], timeRecords: [] });
    expect(s.workOrders[0]).toMatchObject({ energized: true, voltageKv: null, exception: null, minCrew: null, driverLicence: "cdl_b" });
  });

  it("takes each policy field on its own", () => {
    const input = exampleInput();
    input.policy = { maxShiftHours: 14 };
    expect(snapshotOf(input).policy).toEqual({ minRestHours: 8, maxShiftHours: 14, credentialWarnDays: 30 });
  });

  it("reads emergency: true as the emergency exception, and keeps an explicit exception", () => {
    const input = exampleInput();
    input.workOrders[0].emergency = true;
    expect(snapshotOf(input).workOrders[0].exception).toBe("emergency");
    input.workOrders[0].exception = "live_line_tools";
    expect(snapshotOf(input).workOrders[0].exception).toBe("live_line_tools");
  });

  it("accepts driverLicence cdl_a, null expiry, null voltage and offset times", () => {
    const input = exampleInput();
    Object.assign(input.workOrders[0], { driverLicence: "cdl_a", voltageKv: null, start: "2027-04-06T12:00Z", end: "2027-04-06T15:30-05:00" });
    input.workers[0].credentials[0].expiresOn = null;
    const s = snapshotOf(input);
    expect(s.workOrders[0]).toMatchObject({ driverLicence: "cdl_a", voltageKv: null, start: Date.parse("2027-04-06T12:00:00Z") });
    expect(s.workOrders[0].end).toBe(Date.parse("2027-04-06T20:30:00Z"));
    expect(s.workers[0].credentials[0].expiresOn).toBeNull();
  });

  it("ignores unknown fields everywhere", () => {
    const input = exampleInput();
    input.yard = "North";
    input.workers[0].phone = "+1 555 0100";
    input.workOrders[0].location = { lat: 1, lon: 2 };
    input.assignments[0].confirmed = true;
    input.policy.crewTemplates = [];
    const s = snapshotOf(input);
    expect(s).not.toHaveProperty("yard");
    expect(s.workers[0]).not.toHaveProperty("phone");
    expect(s.assignments[0]).toEqual({ workOrderId: "wo-2201", workerId: "w-104", position: "climber" });
  });

  it("accepts any credential type (other codes are ignored by the rules)", () => {
    const input = exampleInput();
    input.workers[0].credentials.push({ type: "traffic_control", expiresOn: "2027-09-01" });
    expect(snapshotOf(input).workers[0].credentials).toHaveLength(5);
  });

  it("resolves a spring-forward gap time forward and a fall-back time to the earlier instant", () => {
    const input = exampleInput();
    Object.assign(input.workOrders[0], { start: "2027-03-14T02:30", end: "2027-11-07T01:30" });
    const [o] = snapshotOf(input).workOrders;
    expect(new Date(o.start).toISOString()).toBe("2027-03-14T08:30:00.000Z");
    expect(new Date(o.end).toISOString()).toBe("2027-11-07T06:30:00.000Z");
  });

  it("reads policy levels (an extension), ignoring unknown rule codes", () => {
    const input = exampleInput();
    input.policy.levels = { IN_CHARGE: "block", NOT_A_RULE: "block" };
    expect(snapshotOf(input).policy.levels).toEqual({ IN_CHARGE: "block" });
  });
});

describe("parseDayInput: invalid input names the path", () => {
  const cases: Array<[string, (i: Record<string, any>) => void, string]> = [
    ["missing start", (i) => delete i.workOrders[0].start, "workOrders[0].start: required"],
    ["malformed start", (i) => (i.workOrders[0].start = "2027-04-06 07:00"), "workOrders[0].start: expected YYYY-MM-DDTHH:mm"],
    ["impossible date", (i) => (i.workOrders[0].end = "2027-02-30T07:00"), "workOrders[0].end: expected YYYY-MM-DDTHH:mm"],
    ["start as a number", (i) => (i.workOrders[0].start = 1_800_000_000_000), "workOrders[0].start: expected YYYY-MM-DDTHH:mm"],
    ["bad classification", (i) => (i.workers[0].classification = "foreman"), 'workers[0].classification: expected one of "journeyman"'],
    ["bad position", (i) => (i.assignments[0].position = "spotter"), "assignments[0].position: expected one of"],
    ["bad work type", (i) => (i.workOrders[0].workType = "trenching"), "workOrders[0].workType: expected one of"],
    ["bad exception", (i) => (i.workOrders[0].exception = "hurry"), "workOrders[0].exception: expected one of"],
    ["bad driver licence", (i) => (i.workOrders[0].driverLicence = "cdl_c"), "workOrders[0].driverLicence: expected one of"],
    ["bad expiry date", (i) => (i.workers[0].credentials[1].expiresOn = "2027-11"), "workers[0].credentials[1].expiresOn: expected YYYY-MM-DD"],
    ["missing expiry", (i) => delete i.workers[0].credentials[1].expiresOn, "workers[0].credentials[1].expiresOn: required"],
    ["missing worker name", (i) => delete i.workers[0].name, "workers[0].name: required"],
    ["missing credentials", (i) => delete i.workers[0].credentials, "workers[0].credentials: required"],
    ["bad time record", (i) => (i.workers[0].timeRecords[0].end = "19:30"), "workers[0].timeRecords[0].end: expected YYYY-MM-DDTHH:mm"],
    ["energized as a string", (i) => (i.workOrders[0].energized = "yes"), "workOrders[0].energized: expected boolean, got string"],
    ["voltage as a string", (i) => (i.workOrders[0].voltageKv = "12.47"), "workOrders[0].voltageKv: expected number, got string"],
    ["minCrew zero", (i) => (i.workOrders[0].minCrew = 0), "workOrders[0].minCrew: must be at least 1"],
    ["minCrew fractional", (i) => (i.workOrders[0].minCrew = 2.5), "workOrders[0].minCrew:"],
    ["negative rest", (i) => (i.policy.minRestHours = -1), "policy.minRestHours: must be at least 0"],
    ["bad policy level", (i) => (i.policy.levels = { REST: "stop" }), "policy.levels.REST: expected one of"],
    ["missing timezone", (i) => delete i.timezone, "timezone: required"],
    ["unknown timezone", (i) => (i.timezone = "America/Springfield"), 'timezone: expected an IANA time zone name, got "America/Springfield"'],
    ["missing assignments", (i) => delete i.assignments, "assignments: required"],
    ["end before start", (i) => (i.workOrders[0].end = "2027-04-06T06:00"), "workOrders[0].end: must be after start"],
    ["empty leave", (i) => (i.workers[0].unavailable[0].to = "2027-04-12T00:00"), "workers[0].unavailable[0].to: must be after from"],
    ["unknown worker", (i) => (i.assignments[0].workerId = "w-999"), 'assignments[0].workerId: unknown worker "w-999"'],
    ["unknown order", (i) => (i.assignments[0].workOrderId = "wo-1"), 'assignments[0].workOrderId: unknown work order "wo-1"'],
    ["duplicate worker", (i) => i.workers.push({ ...i.workers[0] }), 'workers[1].id: duplicate worker id "w-104"'],
    ["duplicate order", (i) => i.workOrders.push({ ...i.workOrders[0] }), 'workOrders[1].id: duplicate work order id "wo-2201"'],
  ];

  it.each(cases)("%s", (_name, mutate, expected) => {
    const input = exampleInput();
    mutate(input);
    const errors = errorsOf(input);
    expect(errors.some((e) => e.startsWith(expected)), errors.join("\n")).toBe(true);
  });

  it("reports every error, not just the first", () => {
    const input = exampleInput();
    delete input.workOrders[0].title;
    input.workers[0].classification = "boss";
    expect(errorsOf(input)).toHaveLength(2);
  });

  it.each([
    [[], "(root): expected object, got array"],
    [null, "(root): expected object, got null"],
    ["day", "(root): expected object, got string"],
  ])("rejects a non-object document %j", (doc, expected) => {
    expect(errorsOf(doc)).toEqual([expected]);
  });
});
