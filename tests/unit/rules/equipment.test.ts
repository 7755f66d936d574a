// EQUIPMENT, EQUIPMENT_BOOKED, RIGGING and the driver's licence an order's equipment needs
// (CREW-CHECK.md, "Equipment, gear and field figures"). EQUIPMENT is common practice and the
// employer's policy (the 12-month dielectric test of the aerial-device standard), not an OSHA
// table; EQUIPMENT_BOOKED is a scheduling conflict; RIGGING uses the lift formulas.
import { describe, expect, it } from "vitest";
import { checkDay, createEngine } from "@/lib/rules/engine";
import { equipmentRule } from "@/lib/rules/equipment";
import { equipmentBooked } from "@/lib/rules/equipment-booked";
import { parseDayInput } from "@/lib/rules/input";
import { operatorCert } from "@/lib/rules/operator-cert";
import { crewCheckReport } from "@/lib/rules/report";
import { rigging } from "@/lib/rules/rigging";
import type { DaySnapshot, Equipment } from "@/lib/rules/types";
import { brief, day, DAY, exampleInput, order, run, worker } from "./fixtures";

const bucket = (id: string, more: Partial<Equipment> = {}): Equipment => ({
  id,
  name: `Bucket ${id}`,
  kind: "bucket_truck",
  insulated: true,
  dielectricTestedOn: "2026-08-14",
  licence: "cdl_b",
  ...more,
});
const derrick = (id: string, more: Partial<Equipment> = {}): Equipment => ({
  id,
  name: `Derrick ${id}`,
  kind: "digger_derrick",
  insulated: false,
  dielectricTestedOn: null,
  licence: "cdl_a",
  ...more,
});
const withEquipment = (s: DaySnapshot, equipment: Equipment[], pairs: Array<[string, string]>): DaySnapshot => ({
  ...s,
  equipment,
  equipmentAssignments: pairs.map(([workOrderId, equipmentId]) => ({ workOrderId, equipmentId })),
});

describe("EQUIPMENT", () => {
  it("a bucket order needs a bucket truck, a digger_derrick order a digger derrick", () => {
    const s = day([], [order("b", { workType: "bucket" }), order("d", { workType: "digger_derrick" }), order("p", { workType: "pole_climb" })], []);
    const none = run(equipmentRule, withEquipment(s, [bucket("t1"), derrick("t2")], []));
    expect(brief(none)).toEqual(["b/-/block", "d/-/block"]);
    expect(none[0].message).toContain("needs a bucket truck");
    expect(none[1].message).toContain("needs a digger derrick");
    expect(none[0].source).toMatch(/common practice/);
    // A derrick on a bucket order does not stand in for the bucket truck.
    const wrong = run(equipmentRule, withEquipment(s, [bucket("t1"), derrick("t2")], [["b", "t2"], ["d", "t1"]]));
    expect(brief(wrong).filter((x) => x.endsWith("-/block")).length).toBeGreaterThanOrEqual(2);
    expect(run(equipmentRule, withEquipment(s, [bucket("t1"), derrick("t2")], [["b", "t1"], ["d", "t2"]]))).toEqual([]);
  });

  it("silent when the day has no equipment field (not tracked)", () => {
    expect(run(equipmentRule, day([], [order("b", { workType: "bucket" })], []))).toEqual([]);
  });

  it("an aerial device on energized work is insulated and dielectric-tested within 12 months of the work day", () => {
    const s = day([], [order("b", { workType: "bucket" })], []);
    expect(run(equipmentRule, withEquipment(s, [bucket("t1", { dielectricTestedOn: "2026-04-06" })], [["b", "t1"]]))).toEqual([]);
    const late = run(equipmentRule, withEquipment(s, [bucket("t1", { dielectricTestedOn: "2026-04-05" })], [["b", "t1"]]));
    expect(brief(late)).toEqual(["b/-/block"]);
    expect(late[0].equipmentId).toBe("t1");
    expect(late[0].message).toContain("in test only through 5 April 2027 (every 12 months)");
    const bare = run(equipmentRule, withEquipment(s, [bucket("t1", { insulated: false, dielectricTestedOn: null })], [["b", "t1"]]));
    expect(bare[0].message).toMatch(/is not an insulated aerial device and has no dielectric test on record/);
  });

  it("de-energized work does not need an insulated aerial device", () => {
    const s = day([], [order("b", { workType: "bucket", energized: false })], []);
    expect(run(equipmentRule, withEquipment(s, [bucket("t1", { insulated: false })], [["b", "t1"]]))).toEqual([]);
  });
});

describe("EQUIPMENT_BOOKED", () => {
  const two = (secondStart: string, secondEnd: string) =>
    withEquipment(
      day([], [order("o1", { start: `${DAY}T07:00`, end: `${DAY}T12:00` }), order("o2", { start: secondStart, end: secondEnd })], []),
      [bucket("t1")],
      [["o1", "t1"], ["o2", "t1"]],
    );

  it("one truck on two overlapping orders blocks both", () => {
    const f = run(equipmentBooked, two(`${DAY}T11:00`, `${DAY}T15:00`));
    expect(brief(f)).toEqual(["o1/-/block", "o2/-/block"]);
    expect(f[0].message).toContain("also on o2");
    expect(f[0].equipmentId).toBe("t1");
  });

  it("touching is not overlap (one ends when the other starts)", () => {
    expect(run(equipmentBooked, two(`${DAY}T12:00`, `${DAY}T15:00`))).toEqual([]);
  });
});

describe("RIGGING", () => {
  it("names the part, the force and the limit; within limits is clean", () => {
    const lift = { loadLb: 640, partsOfLine: 3, sheaves: 3, frictionPerSheave: 0.1, blockWllLb: 2000, lineWllLb: 250, slingWllLb: 300, slingLegs: 2, slingAngleDeg: 60 };
    const f = run(rigging, day([], [order("o1", { lift })], []));
    expect(brief(f)).toEqual(["o1/-/block", "o1/-/block"]);
    expect(f.map((x) => x.message).join(" | ")).toMatch(/257\.4 lb on the hand line.*limit of 250 lb/);
    expect(f.map((x) => x.message).join(" | ")).toMatch(/369\.5 lb on each sling leg.*limit of 300 lb/);
    expect(run(rigging, day([], [order("o1", { lift: { ...lift, lineWllLb: 450, slingWllLb: 1000 } })], []))).toEqual([]);
  });
});

describe("the driver's licence comes from the order's equipment", () => {
  const cdlB = worker("w1", "operator", { credentials: { cdl_b: "2029-01-01" } });
  const s = day([cdlB], [order("o1", { workType: "digger_derrick" })], [["o1", "w1", "driver"]]);

  it("a class A derrick needs a class A driver", () => {
    const f = run(operatorCert, withEquipment(s, [derrick("t40")], [["o1", "t40"]]));
    expect(brief(f)).toEqual(["o1/w1/block"]);
    expect(f[0].message).toContain("class A");
  });

  it("class B equipment is fine with class B; class A covers class B", () => {
    expect(run(operatorCert, withEquipment(s, [bucket("t31")], [["o1", "t31"]]))).toEqual([]);
    const a = day([worker("w1", "operator", { credentials: { cdl_a: "2029-01-01" } })], [order("o1")], [["o1", "w1", "driver"]]);
    expect(run(operatorCert, withEquipment(a, [derrick("t40"), bucket("t31")], [["o1", "t40"], ["o1", "t31"]]))).toEqual([]);
  });

  it("the highest licence any piece requires wins", () => {
    expect(brief(run(operatorCert, withEquipment(s, [bucket("t31"), derrick("t40")], [["o1", "t31"], ["o1", "t40"]])))).toEqual(["o1/w1/block"]);
  });

  it("equipment needing no commercial licence needs none; an order without equipment keeps its own driverLicence", () => {
    const none = day([worker("w1", "operator", { credentials: {} })], [order("o1")], [["o1", "w1", "driver"]]);
    expect(run(operatorCert, withEquipment(none, [{ ...bucket("p1"), kind: "pickup", licence: null }], [["o1", "p1"]]))).toEqual([]);
    expect(brief(run(operatorCert, withEquipment(none, [bucket("t31")], [])))).toEqual(["o1/w1/block"]);
  });
});

describe("crew-check input and report", () => {
  const input = () => {
    const i = exampleInput();
    i.workers[0].gear = [{ kind: "rubber_gloves", class: "2", testedOn: "2027-01-20" }];
    i.equipment = [{ id: "t-31", name: "Bucket 31", kind: "bucket_truck", insulated: true, dielectricTestedOn: "2026-08-14", licence: "cdl_b" }];
    i.equipmentAssignments = [{ workOrderId: "wo-2201", equipmentId: "t-31" }];
    Object.assign(i.workOrders[0], {
      altitudeM: 1650,
      phases: 3,
      lift: { loadLb: 640, partsOfLine: 3, sheaves: 3, blockWllLb: 2000, lineWllLb: 450, slingLegs: 2, slingAngleDeg: 60, slingWllLb: 1000 },
    });
    return i;
  };

  it("reads CREW-CHECK.md's new input and reports the order's figures", () => {
    const p = parseDayInput(input());
    if (!p.ok) throw new Error(p.errors.join("; "));
    const r = crewCheckReport(p.snapshot);
    expect(r.orders).toEqual([
      {
        workOrderId: "wo-2201",
        approach: { meters: 0.7, feet: 2.31, altitudeFactor: 1.08, exposure: "phase_to_ground", source: "29 CFR 1910.269 Table R-6, Table R-5" },
        lift: { leadLinePullLb: 257.4, blockLoadLb: 897.4, slingLegLb: 369.5, source: expect.any(String) },
      },
    ]);
    expect(r.findings.filter((f) => ["RUBBER_GOODS", "EQUIPMENT", "EQUIPMENT_BOOKED", "RIGGING"].includes(f.rule))).toEqual([]);
    for (const f of r.findings) expect(Object.keys(f)).toEqual(["rule", "level", "workOrderId", "workerId", "message", "source"]);
  });

  it("an input without the new fields keeps its findings", () => {
    const old = parseDayInput(exampleInput());
    if (!old.ok) throw new Error(old.errors.join("; "));
    expect(checkDay(old.snapshot).map((f) => f.rule)).not.toContain("RUBBER_GOODS");
    expect(old.snapshot.equipment).toBeUndefined();
    expect(crewCheckReport(old.snapshot).orders).toEqual([
      { workOrderId: "wo-2201", approach: { meters: 0.65, feet: 2.14, altitudeFactor: 1, exposure: "phase_to_ground", source: "29 CFR 1910.269 Table R-6, Table R-5" }, lift: null },
    ]);
  });

  it.each([
    ["workers[0].gear[0].class", (i: Record<string, any>) => (i.workers[0].gear[0].class = "5")],
    ["workers[0].gear[0].kind", (i: Record<string, any>) => (i.workers[0].gear[0].kind = "rubber_boots")],
    ["workers[0].gear[0].testedOn", (i: Record<string, any>) => (i.workers[0].gear[0].testedOn = "2027-02-30")],
    ["workOrders[0].lift.loadLb", (i: Record<string, any>) => (i.workOrders[0].lift.loadLb = -640)],
    ["workOrders[0].lift.partsOfLine", (i: Record<string, any>) => (i.workOrders[0].lift.partsOfLine = 0)],
    ["workOrders[0].lift.slingAngleDeg", (i: Record<string, any>) => (i.workOrders[0].lift.slingAngleDeg = 0)],
    ["workOrders[0].lift.slingAngleDeg", (i: Record<string, any>) => (i.workOrders[0].lift.slingAngleDeg = 91)],
    ["workOrders[0].lift.blockWllLb", (i: Record<string, any>) => (i.workOrders[0].lift.blockWllLb = -1)],
    ["workOrders[0].altitudeM", (i: Record<string, any>) => (i.workOrders[0].altitudeM = 7000)],
    ["workOrders[0].phases", (i: Record<string, any>) => (i.workOrders[0].phases = 0)],
    ["equipment[0].kind", (i: Record<string, any>) => (i.equipment[0].kind = "crane")],
    ["equipment[0].licence", (i: Record<string, any>) => (i.equipment[0].licence = "cdl_c")],
    ["equipment[1].id", (i: Record<string, any>) => i.equipment.push({ ...i.equipment[0] })],
    ["equipmentAssignments[0].equipmentId", (i: Record<string, any>) => (i.equipmentAssignments[0].equipmentId = "t-99")],
    ["equipmentAssignments[0].workOrderId", (i: Record<string, any>) => (i.equipmentAssignments[0].workOrderId = "wo-9")],
  ] as Array<[string, (i: Record<string, any>) => unknown]>)("%s: an invalid value is an error naming the path (exit 2 on the command)", (path, corrupt) => {
    const i = input();
    corrupt(i);
    const p = parseDayInput(i);
    expect(p.ok).toBe(false);
    if (!p.ok) expect(p.errors.some((e) => e.startsWith(`${path}:`))).toBe(true);
  });
});

describe("equipment drops on the incremental engine", () => {
  it("add, move and remove a truck: each result equals a full check of the same day", () => {
    const s = withEquipment(
      day([], [order("o1", { workType: "bucket" }), order("o2", { workType: "bucket", start: `${DAY}T10:00`, end: `${DAY}T18:00` })], []),
      [bucket("t1")],
      [],
    );
    const engine = createEngine(s);
    expect(brief(engine.findings().filter((f) => f.rule === "EQUIPMENT"))).toEqual(["o1/-/block", "o2/-/block"]);
    engine.apply({ kind: "add_equipment", assignment: { workOrderId: "o1", equipmentId: "t1" } });
    expect(engine.findings()).toEqual(checkDay(engine.snapshot()));
    engine.apply({ kind: "add_equipment", assignment: { workOrderId: "o2", equipmentId: "t1" } });
    expect(brief(engine.findings().filter((f) => f.rule === "EQUIPMENT_BOOKED"))).toEqual(["o1/-/block", "o2/-/block"]);
    expect(engine.findings()).toEqual(checkDay(engine.snapshot()));
    engine.apply({ kind: "move_equipment", from: { workOrderId: "o2", equipmentId: "t1" }, to: { workOrderId: "o1", equipmentId: "t1" } });
    expect(engine.findings().filter((f) => f.rule === "EQUIPMENT_BOOKED")).toEqual([]);
    expect(engine.findings()).toEqual(checkDay(engine.snapshot()));
    engine.apply({ kind: "remove_equipment", assignment: { workOrderId: "o1", equipmentId: "t1" } });
    expect(engine.findings()).toEqual(checkDay(s));
    expect(() => engine.apply({ kind: "add_equipment", assignment: { workOrderId: "o1", equipmentId: "nope" } })).toThrow(/unknown equipment/);
  });
});
