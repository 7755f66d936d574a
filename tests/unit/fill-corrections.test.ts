// Fill follows the crew rules' second pass (CREW-CHECK.md "Corrections"): eligibility and the
// model come from the engine, so its proposals must pass the engine's check. Sources as in
// tests/unit/rules/corrections.test.ts: 29 CFR 1910.269(l)(2)(i) and OSHA's letter of
// 1994-11-08 (two qualified employees), (a)(2)(i)(B) (rescue training, from memory), (c)(1)
// (the employee in charge holds the briefing, from memory).

import { describe, expect, it } from "vitest";
import { fill } from "@/lib/fill/fill";
import type { FillProblem } from "@/lib/fill/types";
import { checkDay } from "@/lib/rules/engine";
import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import { DEFAULT_POLICY, type Classification, type Position, type Worker, type WorkOrder } from "@/lib/rules/types";

const TZ = "America/Chicago";
const at = (local: string) => zonedWallTimeToEpoch(local, TZ);
const EXACT = { timeLimitSeconds: 20, gap: 0 };
const ALL = ["climbing", "first_aid_cpr", "pole_top_rescue", "equipment_operator", "cdl_b"];

function w(id: string, classification: Classification, creds: string[], overtimeHours = 0): [Worker, number] {
  return [{ id, name: `Worker ${id}`, classification, credentials: creds.map((type) => ({ type, expiresOn: "2028-06-30" })), unavailable: [], timeRecords: [] }, overtimeHours];
}

function order(id: string, o: Partial<WorkOrder>): WorkOrder {
  const start = at("2027-04-06T07:00");
  const end = at("2027-04-06T15:00");
  return {
    id, title: `Order ${id}`, start, end, startDate: epochToZonedDate(start, TZ), endDate: epochToZonedDate(end - 1, TZ),
    workType: "other", energized: true, voltageKv: 12.47, exception: null, minCrew: null, driverLicence: "cdl_b", ...o,
  };
}

function problem(people: Array<[Worker, number]>, o: WorkOrder, seats: Position[]): FillProblem {
  const workers = people.map(([x]) => x);
  return {
    snapshot: { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders: [o], assignments: [] },
    orders: [{ id: o.id, number: o.id.toUpperCase(), title: o.title, priority: 1, yardId: "Y1", seats: seats.map((position, k) => ({ positionId: `${o.id}-${k}`, position, workerId: null })) }],
    workers: people.map(([x, ot]) => ({ id: x.id, name: x.name, classification: x.classification, yardId: "Y1", phone: null, overtimeHours: ot })),
    yesterdayPairs: [],
  };
}

/** The engine's blocks on the day with the proposal applied. */
function blocksAfter(p: FillProblem, proposals: Array<{ orderId: string; workerId: string; position: Position }>) {
  const s = { ...p.snapshot, assignments: [...p.snapshot.assignments, ...proposals.map((x) => ({ workOrderId: x.orderId, workerId: x.workerId, position: x.position }))] };
  return checkDay(s).filter((f) => f.level === "block");
}

describe("fill: corrections", () => {
  it("letter 1994-11-08 + Corrections 1: an operator without qualified_electrical is not the second qualified worker", async () => {
    // The unqualified operator has the least overtime, so only the rule keeps them out.
    const p = problem([w("j", "journeyman", ALL, 20), w("op", "operator", ALL, 0), w("opq", "operator", [...ALL, "qualified_electrical"], 30)], order("o", {}), ["lead", "ground"]);
    const r = await fill(p, EXACT);
    expect(r.proposals.map((x) => `${x.position}:${x.workerId}`).sort()).toEqual(["ground:opq", "lead:j"]);
    expect(blocksAfter(p, r.proposals)).toEqual([]);
  });

  it("(l)(2)(i)(B) Corrections 2: de-energized work beside a live feeder still needs two qualified", async () => {
    const p = problem([w("j", "journeyman", ALL, 20), w("g", "ground_hand", ALL, 0), w("j2", "journeyman", ALL, 40)], order("o", { energized: false, nearEnergizedKv: 12.47 }), ["lead", "ground"]);
    const r = await fill(p, EXACT);
    expect(r.proposals.map((x) => x.workerId).sort()).toEqual(["j", "j2"]);
  });

  it("(a)(2)(i)(B) Corrections 3: on bucket work the aerial-rescue holder is kept on the ground, not put in the bucket", async () => {
    const p = problem(
      [w("a", "journeyman", [...ALL, "aerial_rescue"], 0), w("b", "journeyman", ALL, 10), w("c", "journeyman", ALL, 10)],
      order("o", { workType: "bucket" }),
      ["lead", "aerial", "ground"],
    );
    const r = await fill(p, EXACT);
    expect(r.proposals).toHaveLength(3);
    expect(r.proposals.find((x) => x.workerId === "a")?.position).not.toBe("aerial");
    expect(blocksAfter(p, r.proposals)).toEqual([]);
  });

  it("(a)(2)(i)(B) Corrections 3: a bucket order without an aerial seat: the lead is aloft, so the rescuer takes the ground seat", async () => {
    const p = problem([w("a", "crew_lead", [...ALL, "aerial_rescue"], 0), w("b", "journeyman", ALL, 50)], order("o", { workType: "bucket" }), ["lead", "ground"]);
    const r = await fill(p, EXACT);
    expect(r.proposals.map((x) => `${x.position}:${x.workerId}`).sort()).toEqual(["ground:a", "lead:b"]);
    expect(blocksAfter(p, r.proposals)).toEqual([]);
  });

  it("(c)(1) Corrections 5: an order of two seats and no lead seat is left open, naming IN_CHARGE", async () => {
    const p = problem([w("j", "journeyman", ALL), w("k", "journeyman", ALL)], order("o", {}), ["ground", "ground"]);
    const r = await fill(p, EXACT);
    expect(r.proposals).toEqual([]);
    expect(r.openOrders.find((x) => x.orderId === "o")?.rule).toBe("IN_CHARGE");
  });

  it("Corrections 7: a missing locate ticket does not stop Fill staffing the crew (the ticket is the dispatcher's)", async () => {
    const p = problem([w("j", "journeyman", ALL), w("k", "journeyman", ALL)], order("o", { digs: true, locate: null }), ["lead", "ground"]);
    const r = await fill(p, EXACT);
    expect(r.proposals).toHaveLength(2);
    expect(blocksAfter(p, r.proposals).map((f) => f.rule)).toEqual(["LOCATE"]);
  });
});
