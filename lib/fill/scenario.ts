// A fill problem from lib/rules/generate.ts's synthetic day: each order gets the seats its work
// type's template lists (as the generator crews them), the generated crew sits in them, and a
// seeded share of the placements is taken out again so there is something to fill. Workers
// and orders alternate between two yards. Pure and deterministic.

import { generateDay, mulberry32, type GenerateOptions } from "@/lib/rules/generate";
import type { Assignment, DaySnapshot, Position, WorkType } from "@/lib/rules/types";
import { overtimeHours } from "./overtime";
import type { FillOrder, FillProblem, FillSeat, FillWorker } from "./types";

export const SEAT_TEMPLATES: Record<WorkType, Position[]> = {
  pole_climb: ["lead", "climber", "observer"],
  bucket: ["lead", "aerial", "ground", "driver"],
  digger_derrick: ["lead", "operator", "observer", "ground"],
  patrol: ["lead"],
  storm: ["lead", "climber", "observer", "driver"],
  other: ["lead", "ground"],
};

export interface ScenarioOptions extends GenerateOptions {
  /** Share of the generated placements taken off again (0..1). */
  openShare?: number;
  regularHoursDay?: number;
}

export function fillScenario(opts: ScenarioOptions): { problem: FillProblem; snapshot: DaySnapshot; removed: number } {
  const day = generateDay(opts);
  const date = opts.date ?? "2027-04-06";
  const rnd = mulberry32(opts.seed + 7);
  const openShare = opts.openShare ?? 0.3;
  const yards = ["Y1", "Y2"];
  const yardOfWorker = (i: number) => yards[i % 2];

  const byOrder = new Map<string, Assignment[]>();
  for (const a of day.assignments) (byOrder.get(a.workOrderId) ?? byOrder.set(a.workOrderId, []).get(a.workOrderId)!).push(a);

  // Yesterday's crews: the generated crews (before any seat is opened).
  const pairs: Array<[string, string]> = [];
  for (const list of byOrder.values()) {
    const ids = [...new Set(list.map((a) => a.workerId))].sort();
    for (let i = 0; i < ids.length; i++) for (let j = i + 1; j < ids.length; j++) pairs.push([ids[i], ids[j]]);
  }

  const kept: Assignment[] = [];
  let removed = 0;
  const orders: FillOrder[] = day.workOrders.map((o, i) => {
    const seats: FillSeat[] = SEAT_TEMPLATES[o.workType].map((position, k) => ({ positionId: `${o.id}-s${k + 1}`, position, workerId: null }));
    for (const a of byOrder.get(o.id) ?? []) {
      let seat = seats.find((x) => x.position === a.position && x.workerId === null);
      if (!seat) seats.push((seat = { positionId: `${o.id}-s${seats.length + 1}`, position: a.position, workerId: null }));
      if (rnd() < openShare) {
        removed++;
        continue;
      }
      seat.workerId = a.workerId;
      kept.push(a);
    }
    // A person left holding a seat twice on one order (a generated "booked twice") keeps both.
    return { id: o.id, number: o.id.toUpperCase(), title: o.title, priority: 1 + Math.floor(rnd() * 5), yardId: yards[i % 2], seats };
  });

  const snapshot: DaySnapshot = { ...day, assignments: kept };
  const cache = new Map<string, number>();
  const workers: FillWorker[] = day.workers.map((w, i) => ({
    id: w.id,
    name: w.name,
    classification: w.classification,
    yardId: yardOfWorker(i),
    yardCode: yardOfWorker(i),
    phone: null,
    overtimeHours: overtimeHours(w.timeRecords, { day: date, timezone: day.timezone, regularHoursDay: opts.regularHoursDay ?? 8 }, cache),
  }));
  return { problem: { snapshot, orders, workers, yesterdayPairs: pairs }, snapshot, removed };
}
