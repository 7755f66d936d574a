// Equipment, rubber goods and field figures for a generated day (benchmarks and property tests):
// every worker's gloves and sleeves, a fleet of trucks with their assignments to the orders that
// need them, and the orders' site elevation, phases and planned lifts. Pure and deterministic:
// its own seeded generator, so the rest of the generated day is the same with or without it.
// All unit names are invented.

import { addDays, mulberry32 } from "./generate";
import type { DaySnapshot, Equipment, EquipmentAssignment, EquipmentKind, GearClass, GearItem, Lift, Worker, WorkOrder } from "./types";

export interface EquipmentOptions {
  /** Pieces of equipment in the fleet (the benchmark's day has 150). */
  trucks: number;
  seed: number;
  /** The dispatch day (YYYY-MM-DD). */
  date: string;
}

export function addEquipmentAndGear(day: DaySnapshot, opts: EquipmentOptions): DaySnapshot {
  const rnd = mulberry32((opts.seed ^ 0x16e9e4) >>> 0);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
  const chance = (p: number) => rnd() < p;
  const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));
  const date = opts.date;

  // Rubber goods: everyone who may climb or lead carries gloves; a few are out of test or under-rated.
  const workers: Worker[] = day.workers.map((w) => {
    const gear: GearItem[] = [];
    const climbs = w.classification === "crew_lead" || w.classification === "journeyman" || w.classification === "apprentice";
    if (climbs || chance(0.3)) {
      const cls: GearClass = climbs ? pick(["2", "2", "2", "2", "2", "2", "1", "3", "4", "0"] as const) : "0";
      gear.push({ kind: "rubber_gloves", class: cls, testedOn: chance(0.02) ? null : addDays(date, -int(0, 200)) });
      if (chance(0.15)) gear.push({ kind: "rubber_gloves", class: cls, testedOn: addDays(date, -int(150, 400)) });
      if (chance(0.6)) gear.push({ kind: "rubber_sleeves", class: cls, testedOn: addDays(date, -int(0, 400)) });
    }
    return { ...w, gear };
  });

  const equipment: Equipment[] = [];
  const kinds: EquipmentKind[] = ["bucket_truck", "bucket_truck", "bucket_truck", "digger_derrick", "digger_derrick", "pickup", "pickup", "trailer", "other"];
  for (let i = 0; i < opts.trucks; i++) {
    const kind = pick(kinds);
    const aerial = kind === "bucket_truck";
    equipment.push({
      id: `t-${String(i + 1).padStart(3, "0")}`,
      name: `${{ bucket_truck: "Bucket", digger_derrick: "Derrick", pickup: "Pickup", trailer: "Trailer", other: "Unit" }[kind]} ${101 + i}`,
      kind,
      insulated: aerial && chance(0.92),
      dielectricTestedOn: aerial && chance(0.97) ? addDays(date, -int(0, 420)) : null,
      licence: kind === "digger_derrick" ? (chance(0.7) ? "cdl_a" : "cdl_b") : aerial ? (chance(0.2) ? "cdl_a" : "cdl_b") : kind === "trailer" ? "cdl_a" : null,
    });
  }
  const free = new Map<EquipmentKind, Equipment[]>();
  for (const e of equipment) {
    let list = free.get(e.kind);
    if (!list) free.set(e.kind, (list = []));
    list.push(e);
  }
  const used: Equipment[] = [];
  const take = (kind: EquipmentKind): Equipment | undefined => {
    // Now and then a truck already out on another order (a double booking to catch).
    if (used.length > 0 && chance(0.02)) return pick(used);
    const e = free.get(kind)?.pop();
    if (e) used.push(e);
    return e;
  };

  const equipmentAssignments: EquipmentAssignment[] = [];
  const workOrders: WorkOrder[] = day.workOrders.map((o) => {
    const needs: EquipmentKind | null = o.workType === "bucket" ? "bucket_truck" : o.workType === "digger_derrick" ? "digger_derrick" : o.workType === "storm" ? "bucket_truck" : null;
    if (needs && chance(0.93)) {
      const e = take(needs);
      if (e) equipmentAssignments.push({ workOrderId: o.id, equipmentId: e.id });
    }
    if (chance(0.15)) {
      const e = take("pickup");
      if (e) equipmentAssignments.push({ workOrderId: o.id, equipmentId: e.id });
    }
    const r = rnd();
    const altitudeM = r < 0.8 ? int(0, 600) : r < 0.95 ? int(901, 2000) : int(2001, 3200);
    const phases = o.voltageKv === 7.2 ? 1 : 3;
    const lift: Lift | null =
      (o.workType === "bucket" || o.workType === "digger_derrick") && chance(0.3)
        ? {
            loadLb: pick([340, 460, 640, 900, 1200]),
            partsOfLine: pick([2, 3, 4]),
            sheaves: 0,
            frictionPerSheave: 0.1,
            blockWllLb: pick([2000, 4000]),
            lineWllLb: pick([300, 450, 600]),
            slingWllLb: pick([1000, 2000, null]),
            slingLegs: pick([1, 2]),
            slingAngleDeg: pick([45, 60, 90]),
          }
        : null;
    if (lift) lift.sheaves = lift.partsOfLine;
    return { ...o, altitudeM, phases, systemKv: null, lift };
  });

  return { ...day, workers, workOrders, equipment, equipmentAssignments };
}
