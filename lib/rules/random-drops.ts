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
  return () => {
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
