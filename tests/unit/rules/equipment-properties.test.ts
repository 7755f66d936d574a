// Properties of the equipment side of the engine (issue 16), over generated days with a fleet,
// rubber goods, lifts and single-phase taps (lib/rules/generate-equipment.ts):
// - adding a truck to an order changes no other order's findings, when the truck is on no other order;
// - after any sequence of equipment drops (and people's drops between them) the incremental
//   engine's findings equal a full check of the resulting day.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { checkDay, createEngine, findingsForOrders, type AssignmentChange } from "@/lib/rules/engine";
import { generateDay } from "@/lib/rules/generate";
import { POSITIONS, type DaySnapshot } from "@/lib/rules/types";

const dayArb = fc
  .record({ seed: fc.integer({ min: 1, max: 1_000_000 }), workers: fc.integer({ min: 4, max: 25 }), orders: fc.integer({ min: 2, max: 10 }), trucks: fc.integer({ min: 1, max: 8 }) })
  .map(({ seed, workers, orders, trucks }) => generateDay({ workers, orders, days: 2, seed, trucks }));

const without = (s: DaySnapshot, orderId: string) => findingsForOrders(s, s.workOrders.filter((o) => o.id !== orderId).map((o) => o.id));

describe("equipment properties", () => {
  it("adding a truck that is on no other order to an order changes no other order's findings", () => {
    fc.assert(
      fc.property(dayArb, fc.nat(), fc.nat(), (s, oi, ei) => {
        const onSomeOrder = new Set(s.equipmentAssignments!.map((a) => a.equipmentId));
        const free = s.equipment!.filter((e) => !onSomeOrder.has(e.id));
        // Always have one: a fresh truck of any kind, on no order.
        const extra = { id: "t-extra", name: "Bucket 999", kind: (["bucket_truck", "digger_derrick", "pickup"] as const)[ei % 3], insulated: ei % 2 === 0, dielectricTestedOn: null, licence: ei % 4 === 0 ? ("cdl_a" as const) : null };
        const base: DaySnapshot = { ...s, equipment: [...s.equipment!, extra] };
        const truck = free.length > 0 && ei % 2 === 1 ? free[ei % free.length] : extra;
        const target = s.workOrders[oi % s.workOrders.length].id;
        const after: DaySnapshot = { ...base, equipmentAssignments: [...base.equipmentAssignments!, { workOrderId: target, equipmentId: truck.id }] };
        expect(without(after, target)).toEqual(without(base, target));
      }),
      { numRuns: 60 },
    );
  });

  it("after any sequence of equipment and people drops the incremental findings equal a full check", () => {
    const dropArb = fc.record({ kind: fc.nat(5), o: fc.nat(), o2: fc.nat(), e: fc.nat(), w: fc.nat(), p: fc.nat() });
    fc.assert(
      fc.property(dayArb, fc.array(dropArb, { minLength: 1, maxLength: 12 }), (s, drops) => {
        const engine = createEngine(s);
        for (const d of drops) {
          const order = s.workOrders[d.o % s.workOrders.length].id;
          const other = s.workOrders[d.o2 % s.workOrders.length].id;
          const current = engine.index.equipment.all(engine.index.orderIds);
          let change: AssignmentChange;
          if (d.kind <= 1 || current.length === 0) {
            change = { kind: "add_equipment", assignment: { workOrderId: order, equipmentId: s.equipment![d.e % s.equipment!.length].id } };
          } else if (d.kind === 2) {
            change = { kind: "remove_equipment", assignment: current[d.e % current.length] };
          } else if (d.kind === 3) {
            const from = current[d.e % current.length];
            change = { kind: "move_equipment", from, to: { ...from, workOrderId: other } };
          } else {
            change = { kind: "add", assignment: { workOrderId: order, workerId: s.workers[d.w % s.workers.length].id, position: POSITIONS[d.p % POSITIONS.length] } };
          }
          const incremental = engine.apply(change);
          expect(incremental).toEqual(checkDay(engine.snapshot()));
        }
      }),
      { numRuns: 40 },
    );
  });
});
