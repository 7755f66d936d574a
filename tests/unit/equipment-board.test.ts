import { describe, expect, it } from "vitest";
import fc from "fast-check";
import type { BoardPayload } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import { DEFAULT_POLICY, type DaySnapshot, type WorkOrder } from "@/lib/rules/types";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { applyEquipmentLocally, parseEquipmentDrag, parseEquipmentDrop } from "@/app/(app)/board/use-equipment";

// The board's optimistic equipment change: the client engine's findings over the changed
// snapshot must be the findings a full check of that snapshot gives (CREW-CHECK.md: the
// incremental view equals the full check), and a truck put on one order changes no other
// order's findings unless that truck is also there.

const TZ = "America/Chicago";
const DAY = "2027-03-10";
const at = (hm: string) => zonedWallTimeToEpoch(`${DAY}T${hm}`, TZ);
const order = (id: string, workType: WorkOrder["workType"], start: string, end: string): WorkOrder => ({
  id, title: `Order ${id}`, start: at(start), end: at(end), startDate: DAY, endDate: DAY, workType, energized: true, voltageKv: 12.47, exception: null, minCrew: null,
});

const orders = [order("1", "bucket", "07:00", "12:00"), order("2", "bucket", "11:00", "15:00"), order("3", "digger_derrick", "07:00", "15:00"), order("4", "pole_climb", "07:00", "15:00")];
const fleet = [
  { id: "11", name: "B-11", kind: "bucket_truck" as const, insulated: true, dielectricTestedOn: "2027-01-05", licence: "cdl_b" as const },
  { id: "12", name: "B-12", kind: "bucket_truck" as const, insulated: true, dielectricTestedOn: "2025-01-05", licence: "cdl_b" as const }, // test overdue
  { id: "13", name: "D-13", kind: "digger_derrick" as const, insulated: false, dielectricTestedOn: null, licence: "cdl_a" as const },
];

function payload(): BoardPayload {
  const snapshot: DaySnapshot = { timezone: TZ, policy: DEFAULT_POLICY, workers: [], workOrders: orders, assignments: [], equipment: fleet, equipmentAssignments: [] };
  const ids = orders.map((o) => o.id);
  return { snapshot, boardOrderIds: ids, findings: findingsForOrders(snapshot, ids), equipmentBookings: [], orders: [] } as unknown as BoardPayload;
}
const eq = (fs: { rule: string; workOrderId: string }[], o: string) => fs.filter((f) => f.workOrderId === o && f.rule.startsWith("EQUIPMENT")).map((f) => f.rule);

describe("drag ids", () => {
  it("parses what it makes and nothing else", () => {
    expect(parseEquipmentDrag("truck:12")).toEqual({ kind: "truck", equipmentId: 12 });
    expect(parseEquipmentDrag("eqbook:7")).toEqual({ kind: "booking", bookingId: 7 });
    expect(parseEquipmentDrag("pool:12")).toBeNull();
    expect(parseEquipmentDrop("eqseat:5:bucket_truck")).toEqual({ kind: "order", orderId: 5, seatKind: "bucket_truck" });
    expect(parseEquipmentDrop("eqadd:5")).toEqual({ kind: "order", orderId: 5, seatKind: null });
    expect(parseEquipmentDrop("eqpool")).toEqual({ kind: "pool" });
    expect(parseEquipmentDrop("seat:5")).toBeNull();
  });
});

describe("optimistic equipment changes", () => {
  it("a tested bucket truck clears the bucket order's EQUIPMENT block; taking it off brings it back", () => {
    const p = payload();
    expect(eq(p.findings, "1")).toEqual(["EQUIPMENT"]);
    const on = applyEquipmentLocally(p, { kind: "add", orderId: 1, equipmentId: 11 });
    expect(eq(on.findings, "1")).toEqual([]);
    const off = applyEquipmentLocally(on, { kind: "remove", booking: on.equipmentBookings![0] });
    expect(eq(off.findings, "1")).toEqual(["EQUIPMENT"]);
    expect(off.snapshot.equipmentAssignments).toEqual([]);
  });

  it("one truck on two overlapping orders shows EQUIPMENT_BOOKED on both", () => {
    const a = applyEquipmentLocally(payload(), { kind: "add", orderId: 1, equipmentId: 11 });
    const b = applyEquipmentLocally(a, { kind: "add", orderId: 2, equipmentId: 11 });
    expect(eq(b.findings, "1")).toContain("EQUIPMENT_BOOKED");
    expect(eq(b.findings, "2")).toContain("EQUIPMENT_BOOKED");
  });

  it("property: after any sequence of drops, the optimistic findings equal a full check, and orders the truck is not on keep theirs", () => {
    const drop = fc.record({ orderId: fc.constantFrom(1, 2, 3, 4), equipmentId: fc.constantFrom(11, 12, 13), remove: fc.boolean() });
    fc.assert(
      fc.property(fc.array(drop, { maxLength: 8 }), (drops) => {
        let p = payload();
        for (const d of drops) {
          const before = p;
          const existing = (p.equipmentBookings ?? []).find((b) => b.workOrderId === d.orderId && b.equipmentId === d.equipmentId);
          if (d.remove && existing) p = applyEquipmentLocally(p, { kind: "remove", booking: existing });
          else if (!d.remove && !existing) p = applyEquipmentLocally(p, { kind: "add", orderId: d.orderId, equipmentId: d.equipmentId });
          else continue;
          expect(p.findings).toEqual(findingsForOrders(p.snapshot, p.boardOrderIds));
          // Orders the moved truck is not on, before or after, keep their findings.
          const touched = new Set((p.equipmentBookings ?? []).concat(before.equipmentBookings ?? []).filter((b) => b.equipmentId === d.equipmentId).map((b) => String(b.workOrderId)));
          touched.add(String(d.orderId));
          for (const o of p.boardOrderIds.filter((x) => !touched.has(x))) {
            expect(p.findings.filter((f) => f.workOrderId === o)).toEqual(before.findings.filter((f) => f.workOrderId === o));
          }
        }
      }),
      { numRuns: 150, seed: 16 },
    );
  });
});
