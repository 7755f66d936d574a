// Random single drops for the benchmarks: an add, a remove or a move on a live engine, each
// paired with the change that undoes it, from a seeded generator (the same sequence every run).
import type { AssignmentChange, RuleEngine } from "./engine";
import { mulberry32 } from "./generate";
import { POSITIONS, type Assignment, type DaySnapshot } from "./types";

export function randomDrops(snapshot: DaySnapshot, engine: RuleEngine, seed: number): () => [AssignmentChange, AssignmentChange] {
  const rnd = mulberry32(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
  const randomAssignment = (): Assignment => ({
    workOrderId: pick(snapshot.workOrders).id,
    workerId: pick(snapshot.workers).id,
    position: pick(POSITIONS),
  });
  const equipment = snapshot.equipment ?? [];
  return () => {
    // With a tracked fleet, one drop in five is a truck's (add, remove or move between orders).
    if (equipment.length > 0 && rnd() < 0.2) return equipmentDrop(snapshot, engine, rnd);
    const current = engine.index.allAssignments();
    const r = rnd();
    if (r < 0.34 || current.length === 0) {
      const a = randomAssignment();
      return [{ kind: "add", assignment: a }, { kind: "remove", assignment: a }];
    }
    const existing = pick(current);
    if (r < 0.67) return [{ kind: "remove", assignment: existing }, { kind: "add", assignment: existing }];
    const to = { ...existing, workOrderId: pick(snapshot.workOrders).id, position: pick(POSITIONS) };
    return [{ kind: "move", from: existing, to }, { kind: "move", from: to, to: existing }];
  };
}

function equipmentDrop(snapshot: DaySnapshot, engine: RuleEngine, rnd: () => number): [AssignmentChange, AssignmentChange] {
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
  const current = engine.index.equipment.all(engine.index.orderIds);
  const r = rnd();
  if (r < 0.34 || current.length === 0) {
    // A piece already on the order would make the add a no-op and its undo a real remove.
    for (let tries = 0; tries < 8; tries++) {
      const a = { workOrderId: pick(snapshot.workOrders).id, equipmentId: pick(snapshot.equipment!).id };
      if (!engine.index.equipment.orderIdsOf(a.equipmentId).includes(a.workOrderId)) {
        return [{ kind: "add_equipment", assignment: a }, { kind: "remove_equipment", assignment: a }];
      }
    }
  }
  const existing = current.length > 0 ? pick(current) : { workOrderId: snapshot.workOrders[0].id, equipmentId: snapshot.equipment![0].id };
  if (current.length === 0 || r < 0.67) return [{ kind: "remove_equipment", assignment: existing }, { kind: "add_equipment", assignment: existing }];
  const to = { ...existing, workOrderId: pick(snapshot.workOrders).id };
  if (engine.index.equipment.orderIdsOf(existing.equipmentId).includes(to.workOrderId)) {
    return [{ kind: "remove_equipment", assignment: existing }, { kind: "add_equipment", assignment: existing }];
  }
  return [{ kind: "move_equipment", from: existing, to }, { kind: "move_equipment", from: to, to: existing }];
}
