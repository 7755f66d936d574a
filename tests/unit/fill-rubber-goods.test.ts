// Fill and rubber goods (issue 16): eligibility comes from the engine, so with gear tracked the
// solver never puts anyone in a climber, aerial or lead seat on energized work without gloves
// rated for the voltage (29 CFR 1910.137 Table I-4) and in test (Table I-5, 6 months), and a
// driver's licence follows the order's equipment.
import { describe, expect, it } from "vitest";
import { fill } from "@/lib/fill/fill";
import type { FillProblem } from "@/lib/fill/types";
import { checkDay } from "@/lib/rules/engine";
import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import { DEFAULT_POLICY, type Classification, type Equipment, type GearItem, type Position, type Worker, type WorkOrder } from "@/lib/rules/types";

const TZ = "America/Chicago";
const at = (local: string) => zonedWallTimeToEpoch(local, TZ);
const EXACT = { timeLimitSeconds: 20, gap: 0 };
const ALL = ["climbing", "first_aid_cpr", "pole_top_rescue", "aerial_rescue", "equipment_operator", "cdl_b"];
// The lead does not climb in these scenarios, so the climbing seat goes to someone else.
const NO_CLIMB = ALL.filter((c) => c !== "climbing");

function w(id: string, classification: Classification, gear: GearItem[] | undefined, overtimeHours: number, creds = ALL): [Worker, number] {
  return [
    { id, name: `Worker ${id}`, classification, credentials: creds.map((type) => ({ type, expiresOn: "2028-06-30" })), unavailable: [], timeRecords: [], ...(gear ? { gear } : {}) },
    overtimeHours,
  ];
}
const gloves = (cls: GearItem["class"], testedOn = "2027-02-01"): GearItem => ({ kind: "rubber_gloves", class: cls, testedOn });

function order(id: string, o: Partial<WorkOrder>): WorkOrder {
  const start = at("2027-04-06T07:00");
  const end = at("2027-04-06T15:00");
  return { id, title: `Order ${id}`, start, end, startDate: epochToZonedDate(start, TZ), endDate: epochToZonedDate(end - 1, TZ), workType: "other", energized: true, voltageKv: 12.47, exception: null, minCrew: null, driverLicence: "cdl_b", ...o };
}

function problem(people: Array<[Worker, number]>, o: WorkOrder, seats: Position[], equipment?: { equipment: Equipment[]; on: string[] }): FillProblem {
  const workers = people.map(([x]) => x);
  return {
    snapshot: {
      timezone: TZ,
      policy: { ...DEFAULT_POLICY },
      workers,
      workOrders: [o],
      assignments: [],
      ...(equipment ? { equipment: equipment.equipment, equipmentAssignments: equipment.on.map((equipmentId) => ({ workOrderId: o.id, equipmentId })) } : {}),
    },
    orders: [{ id: o.id, number: o.id.toUpperCase(), title: o.title, priority: 1, yardId: "Y1", seats: seats.map((position, k) => ({ positionId: `${o.id}-${k}`, position, workerId: null })) }],
    workers: people.map(([x, ot]) => ({ id: x.id, name: x.name, classification: x.classification, yardId: "Y1", phone: null, overtimeHours: ot })),
    yesterdayPairs: [],
  };
}

const blocksAfter = (p: FillProblem, proposals: Array<{ orderId: string; workerId: string; position: Position }>) =>
  checkDay({ ...p.snapshot, assignments: [...p.snapshot.assignments, ...proposals.map((x) => ({ workOrderId: x.orderId, workerId: x.workerId, position: x.position }))] }).filter((f) => f.level === "block");

describe("fill: rubber goods and licences", () => {
  it("Table I-4: a climber with class 0 gloves is never proposed on a 12.47 kV order, however little overtime they have", async () => {
    const p = problem([w("cheap", "journeyman", [gloves("0")], 0), w("rated", "journeyman", [gloves("2")], 30), w("lead", "crew_lead", [gloves("2")], 10, NO_CLIMB), w("obs", "ground_hand", [], 5)], order("o", {}), ["lead", "climber", "observer"]);
    const r = await fill(p, EXACT);
    const seats = r.proposals.map((x) => `${x.position}:${x.workerId}`);
    expect(seats).toContain("climber:rated");
    expect(seats).toContain("lead:lead");
    expect(seats.filter((x) => /^(climber|aerial|lead):cheap$/.test(x))).toEqual([]);
    expect(blocksAfter(p, r.proposals)).toEqual([]);
  });

  it("Table I-5: gloves out of their 6-month test keep a worker out of an aerial seat", async () => {
    const p = problem([w("lapsed", "journeyman", [gloves("2", "2026-09-01")], 0), w("tested", "journeyman", [gloves("2", "2027-03-01")], 25), w("lead", "crew_lead", [gloves("2")], 10, NO_CLIMB), w("obs", "ground_hand", [], 5)], order("o", {}), ["lead", "aerial", "observer"]);
    const r = await fill(p, EXACT);
    const aloft = r.proposals.find((x) => x.position === "aerial")?.workerId;
    expect(aloft).toBeDefined();
    expect(aloft).not.toBe("lapsed");
    expect(blocksAfter(p, r.proposals).filter((f) => f.rule === "RUBBER_GOODS")).toEqual([]);
  });

  it("nobody rated: no one is proposed as climber, and the open seat says why", async () => {
    const p = problem([w("a", "journeyman", [gloves("1")], 0), w("b", "journeyman", [], 0), w("lead", "crew_lead", [gloves("2")], 10, NO_CLIMB), w("obs", "ground_hand", [], 5)], order("o", {}), ["lead", "climber", "observer"]);
    const r = await fill(p, EXACT);
    expect(r.proposals.filter((x) => x.position === "climber")).toEqual([]);
    const seat = r.open.find((x) => x.position === "climber");
    expect(seat?.summary).toContain("without rubber gloves rated and in test for the voltage");
  });

  it("gear not tracked (no gear field) changes nothing: the cheapest climber is proposed", async () => {
    const p = problem([w("cheap", "journeyman", undefined, 0), w("dear", "journeyman", undefined, 30), w("lead", "crew_lead", undefined, 10, NO_CLIMB), w("obs", "ground_hand", undefined, 5)], order("o", {}), ["lead", "climber", "observer"]);
    const r = await fill(p, EXACT);
    expect(r.proposals.find((x) => x.position === "climber")?.workerId).toBe("cheap");
  });

  it("a driver needs the class A the order's derrick needs (class A covers B)", async () => {
    const derrick: Equipment = { id: "t40", name: "Derrick 40", kind: "digger_derrick", insulated: false, dielectricTestedOn: null, licence: "cdl_a" };
    const p = problem([w("b", "operator", [], 0, ["cdl_b"]), w("a", "operator", [], 30, ["cdl_a"])], order("o", { energized: false }), ["driver"], { equipment: [derrick], on: ["t40"] });
    const r = await fill(p, EXACT);
    expect(r.proposals.map((x) => x.workerId)).toEqual(["a"]);
  });
});
