import { describe, expect, it } from "vitest";
import { addMonths, dielectricState, equipmentCreateSchema, riggingCreateSchema, type Equipment } from "@/lib/equipment/model";
import { proposeTrucks, withTrucks, type Busy } from "@/lib/equipment/fill";
import { jobEmail, jobSms, MAX_GSM_UNITS, smsSegments, type JobFacts } from "@/lib/notify/wording";
import { DEFAULT_POLICY, type DaySnapshot, type WorkOrder } from "@/lib/rules/types";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";

const TZ = "America/Chicago";
const DAY = "2027-03-10";
const at = (hm: string, day = DAY) => zonedWallTimeToEpoch(`${day}T${hm}`, TZ);

function order(id: string, workType: WorkOrder["workType"], start: string, end: string, over: Partial<WorkOrder> = {}): WorkOrder {
  return { id, title: `Order ${id}`, start: at(start), end: at(end), startDate: DAY, endDate: DAY, workType, energized: true, voltageKv: 12.47, exception: null, minCrew: null, ...over };
}

let nextId = 1;
function truck(over: Partial<Equipment> = {}): Equipment {
  const id = nextId++;
  return {
    id,
    yardId: 1,
    yardCode: "NOR",
    kind: "bucket_truck",
    unitNumber: `B-${100 + id}`,
    name: `Bucket ${id}`,
    insulated: true,
    dielectricTestedOn: "2026-12-01",
    annualInspectionOn: "2026-12-01",
    licence: "cdl_b",
    outOfService: false,
    outOfServiceReason: null,
    version: 1,
    rigging: [],
    ...over,
  };
}

const snapshotOf = (workOrders: WorkOrder[]): DaySnapshot => ({ timezone: TZ, policy: DEFAULT_POLICY, workers: [], workOrders, assignments: [], equipment: [], equipmentAssignments: [] });
const fillOrders = (os: WorkOrder[], yardId = "1") => os.map((o, i) => ({ id: o.id, yardId, priority: 3, number: `WO-${i + 1}-${o.id}` }));

describe("dielectric test state (12 months: common practice for the aerial-device periodic test; policy)", () => {
  it.each([
    ["2026-03-10", "2027-03-10", "ok"], // exactly 12 months: still in date on the anniversary
    ["2026-03-09", "2027-03-10", "overdue"],
    ["2026-02-28", "2027-02-28", "ok"],
    ["2024-02-29", "2025-02-28", "ok"], // a leap day's anniversary falls on the month's last day
    ["2024-02-29", "2025-03-01", "overdue"],
  ] as const)("tested %s, work on %s: %s", (tested, day, state) => {
    expect(dielectricState({ kind: "bucket_truck", dielectricTestedOn: tested }, day)).toBe(state);
  });
  it("no test on record is 'missing'; a pickup or trailer has no dielectric test", () => {
    expect(dielectricState({ kind: "digger_derrick", dielectricTestedOn: null }, DAY)).toBe("missing");
    expect(dielectricState({ kind: "pickup", dielectricTestedOn: null }, DAY)).toBeNull();
    expect(dielectricState({ kind: "trailer", dielectricTestedOn: "2020-01-01" }, DAY)).toBeNull();
  });
  it("addMonths clamps to the month's last day", () => {
    expect(addMonths("2026-01-31", 1)).toBe("2026-02-28");
    expect(addMonths("2026-08-31", 12)).toBe("2027-08-31");
    expect(addMonths("2026-12-15", 3)).toBe("2027-03-15");
  });
});

describe("register schemas (issue 16 'Bad input')", () => {
  const field = (r: { success: boolean; error?: { issues: { path: PropertyKey[] }[] } }) => r.error?.issues.map((i) => i.path.join("."));
  it("zero parts of line, a negative or zero WLL, fractional sheaves and an unknown kind are refused, each naming its field", () => {
    expect(field(riggingCreateSchema.safeParse({ kind: "rope_block", label: "b", partsOfLine: 0, wllLb: 2000 }))).toEqual(["partsOfLine"]);
    expect(field(riggingCreateSchema.safeParse({ kind: "rope_block", label: "b", partsOfLine: 3, wllLb: -1 }))).toEqual(["wllLb"]);
    expect(field(riggingCreateSchema.safeParse({ kind: "sling", label: "s", wllLb: 0 }))).toEqual(["wllLb"]);
    expect(field(riggingCreateSchema.safeParse({ kind: "rope_block", label: "b", partsOfLine: 3, sheaves: 1.5, wllLb: 2000 }))).toEqual(["sheaves"]);
    expect(riggingCreateSchema.safeParse({ kind: "come_along", label: "c", wllLb: 500 }).success).toBe(false);
    expect(riggingCreateSchema.safeParse({ kind: "rope_block", label: "3-part", partsOfLine: 3, wllLb: 2000, inspectedOn: "2026-11-01" }).success).toBe(true);
  });
  it("out of service needs a reason; an impossible date is refused", () => {
    const base = { yardId: 1, kind: "bucket_truck", unitNumber: "B-1", name: "Bucket" };
    expect(field(equipmentCreateSchema.safeParse({ ...base, outOfService: true }))).toEqual(["outOfServiceReason"]);
    expect(equipmentCreateSchema.safeParse({ ...base, outOfService: true, outOfServiceReason: "Boom leak" }).success).toBe(true);
    expect(field(equipmentCreateSchema.safeParse({ ...base, dielectricTestedOn: "2026-02-30" }))).toEqual(["dielectricTestedOn"]);
    expect(field(equipmentCreateSchema.safeParse({ ...base, licence: "cdl_c" }))).toEqual(["licence"]);
  });
});

describe("Fill open positions: trucks", () => {
  it("a bucket order gets an in-service, insulated, tested bucket truck of its yard; a climbing order gets none", () => {
    const os = [order("1", "bucket", "07:00", "15:00"), order("2", "pole_climb", "07:00", "15:00")];
    const good = truck();
    const other = truck({ yardId: 2, yardCode: "MES", unitNumber: "A-001" }); // first by unit number, but another yard
    const broken = truck({ outOfService: true, outOfServiceReason: "Boom leak", unitNumber: "A-002" });
    const t = proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: [other, broken, good], busy: [] });
    expect(t.map((x) => [x.orderId, x.equipmentId])).toEqual([["1", String(good.id)]]);
  });

  it("the crew rules decide which truck may go: an overdue dielectric test or an uninsulated bucket is passed over on energized work (CREW-CHECK.md, EQUIPMENT)", () => {
    const os = [order("1", "bucket", "07:00", "15:00")];
    const overdue = truck({ unitNumber: "A-001", dielectricTestedOn: "2025-01-01" });
    const bare = truck({ unitNumber: "A-002", insulated: false });
    const fine = truck({ unitNumber: "Z-999" });
    const t = proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: [overdue, bare, fine], busy: [] });
    expect(t.map((x) => x.equipmentId)).toEqual([String(fine.id)]);
    // With only the unfit ones, the order gets no truck (the dispatcher decides).
    expect(proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: [overdue, bare], busy: [] })).toEqual([]);
  });

  it("never one truck on two overlapping orders; touching orders may share it (touching is not overlap, PRODUCT.md)", () => {
    const os = [order("1", "bucket", "07:00", "12:00"), order("2", "bucket", "11:00", "15:00"), order("3", "bucket", "12:00", "16:00")];
    const only = truck();
    const t = proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: [only], busy: [] });
    const byOrder = Object.fromEntries(t.map((x) => [x.orderId, x.equipmentId]));
    expect(byOrder["1"]).toBe(String(only.id));
    expect(byOrder["2"]).toBeUndefined(); // overlaps order 1
    expect(byOrder["3"]).toBe(String(only.id)); // touches order 1's end
  });

  it("a truck booked elsewhere at that time is not proposed; an order that already has its truck gets no second", () => {
    const os = [order("1", "digger_derrick", "07:00", "15:00"), order("2", "digger_derrick", "07:00", "15:00")];
    const d1 = truck({ kind: "digger_derrick", unitNumber: "D-1" });
    const d2 = truck({ kind: "digger_derrick", unitNumber: "D-2" });
    const busy: Busy[] = [
      { equipmentId: d1.id, orderId: 99, start: at("06:00"), end: at("08:00") }, // another order, overlapping
      { equipmentId: d2.id, orderId: 2, start: at("07:00"), end: at("15:00") }, // order 2's own derrick
    ];
    const t = proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: [d1, d2], busy });
    expect(t).toEqual([]);
  });

  it("higher priority orders choose first, and the choice goes into the fill's snapshot", () => {
    const os = [order("1", "bucket", "07:00", "15:00"), order("2", "bucket", "08:00", "14:00")];
    const only = truck();
    const orders = [
      { id: "1", yardId: "1", priority: 4, number: "WO-A" },
      { id: "2", yardId: "1", priority: 1, number: "WO-B" },
    ];
    const snap = snapshotOf(os);
    const t = proposeTrucks({ snapshot: snap, orders, equipment: [only], busy: [] });
    expect(t.map((x) => x.orderId)).toEqual(["2"]);
    const next = withTrucks(snap, t);
    expect(next.equipmentAssignments).toEqual([{ workOrderId: "2", equipmentId: String(only.id) }]);
    expect(snap.equipmentAssignments).toEqual([]); // the input is left as it was
  });

  it("stays a linear pass: 400 orders and 150 trucks in well under a second", () => {
    const os = Array.from({ length: 400 }, (_, i) => order(String(i + 1), i % 2 ? "bucket" : "digger_derrick", i % 3 ? "07:00" : "12:00", i % 3 ? "12:00" : "17:00"));
    const fleet = Array.from({ length: 150 }, (_, i) => truck({ kind: i % 2 ? "bucket_truck" : "digger_derrick", unitNumber: `F-${String(i).padStart(3, "0")}` }));
    const started = performance.now();
    const t = proposeTrucks({ snapshot: snapshotOf(os), orders: fillOrders(os), equipment: fleet, busy: [] });
    expect(performance.now() - started).toBeLessThan(1000);
    // Each truck at most once per overlapping window: two windows (07–12, 12–17) touch, so each truck serves at most two orders.
    const per = new Map<string, string[]>();
    for (const x of t) per.set(x.equipmentId, [...(per.get(x.equipmentId) ?? []), x.orderId]);
    for (const [, list] of per) {
      const spans = list.map((id) => os[Number(id) - 1]).sort((a, b) => a.start - b.start);
      for (let i = 1; i < spans.length; i++) expect(spans[i].start).toBeGreaterThanOrEqual(spans[i - 1].end);
    }
    // Greedy by window is optimal here: each (kind, window) group gets min(trucks of the kind, orders asking).
    const groups = new Map<string, number>();
    for (const o of os) groups.set(`${o.workType}|${o.start}`, (groups.get(`${o.workType}|${o.start}`) ?? 0) + 1);
    const fleetOf = (k: string) => fleet.filter((e) => e.kind === (k === "bucket" ? "bucket_truck" : "digger_derrick")).length;
    const best = [...groups].reduce((n, [key, demand]) => n + Math.min(fleetOf(key.split("|")[0]), demand), 0);
    expect(t.length).toBe(best);
  });
});

describe("Send crews names the truck", () => {
  const base: JobFacts = {
    assignmentId: 1,
    orderNumber: "WO-26-0105",
    title: "Replace crossarm and insulators, pole N-1452",
    address: "1452 Dunmore Ridge Road, Cedar Prairie",
    structureNo: "N-1452",
    start: new Date("2026-12-04T14:00:00Z"),
    end: new Date("2026-12-04T20:00:00Z"),
    timezone: TZ,
    position: "lead",
    replyCode: "4821",
    workerFirstName: "Tomas",
    workerName: "Tomas Lindqvist",
    yardName: "North Yard",
    dispatcherPhone: "+13205550191",
    crew: [],
    version: 1,
    trucks: [{ unit: "N-314", name: "Bluestem 55 ft insulated bucket" }],
  };
  it("the text carries the unit number and still fits two GSM-7 segments (GSM 03.38, recalled from memory)", () => {
    const t = jobSms("assignment", base);
    expect(t).toContain("Truck N-314.");
    expect(t).toMatch(/Reply Y 4821 to confirm, N 4821 to decline\.$/);
    const long = jobSms("assignment", { ...base, title: "x ".repeat(300), trucks: [{ unit: "N-314", name: "" }, { unit: "N-502", name: "" }] });
    expect(long).toContain("Trucks N-314, N-502.");
    expect(smsSegments(long).units).toBeLessThanOrEqual(MAX_GSM_UNITS);
  });
  it("the e-mail lists the equipment in its text and HTML; no truck, no line", () => {
    const e = jobEmail("assignment", base, "http://127.0.0.1:3000");
    expect(e.text).toContain("Equipment:  N-314 Bluestem 55 ft insulated bucket");
    expect(e.html).toContain("<th align=\"left\">Equipment</th><td>N-314 Bluestem 55 ft insulated bucket</td>");
    const none = jobEmail("assignment", { ...base, trucks: [] }, "http://127.0.0.1:3000");
    expect(none.text).not.toContain("Equipment:");
    expect(jobSms("assignment", { ...base, trucks: [] })).not.toContain("Truck");
  });
});
