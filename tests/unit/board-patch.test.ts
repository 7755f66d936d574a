// Slim board answers (issue 19): a patch computed against the digest of the version the browser
// holds, applied to that version, must give exactly the board a full answer gives — over random
// runs of drops (add, remove, move), credential changes, workers joining and leaving, reordered
// lists and new scalars. Property testing with fast-check (its own documentation: fc.assert /
// fc.property / fc.commands-style sequences as arrays of operations); the boards are built from
// the rule engine's generated day (lib/rules/generate.ts) and the findings from the engine itself.
import { createHash } from "node:crypto";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { applyBoardPatch, diffBoard, digestBoard } from "@/lib/board/patch";
import type { BoardPayload } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import { generateDay } from "@/lib/rules/generate";
import { POSITIONS, type DaySnapshot } from "@/lib/rules/types";

const sha = (s: string) => createHash("sha1").update(s).digest("base64url");

/** A board payload around a generated day: order cards with seats, the pool, findings. */
function boardOf(snapshot: DaySnapshot, cursor: number): BoardPayload {
  const orders = snapshot.workOrders.map((o, i) => ({
    id: Number(o.id.replace(/\D/g, "")) || i + 1,
    number: `WO-${o.id}`,
    title: o.title,
    version: 1,
    seats: snapshot.assignments
      .filter((a) => a.workOrderId === o.id)
      .map((a, k) => ({ id: k + 1, position: a.position, sort: k, assignment: { id: k + 1, workerId: Number(a.workerId.replace(/\D/g, "")), status: "draft" }, declinedBy: null })),
  }));
  const boardOrderIds = snapshot.workOrders.map((o) => o.id);
  return {
    day: "2027-04-06",
    yard: { id: 1, code: "NOR", name: "North", timezone: snapshot.timezone },
    yards: [{ id: 1, code: "NOR", name: "North" }],
    orders,
    pool: snapshot.workers.map((w) => ({ id: Number(w.id.replace(/\D/g, "")), name: w.name, classification: w.classification, yardId: 1, phone: null, restHours: null })),
    snapshot,
    boardOrderIds,
    findings: findingsForOrders(snapshot, boardOrderIds),
    overrides: [],
    onCall: [],
    policy: { minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30, replyDeadlineHours: 12 },
    cursor,
    fakesEnabled: false,
    generatedAt: new Date(cursor * 1000).toISOString(),
  } as unknown as BoardPayload;
}

type Op =
  | { kind: "add"; order: number; worker: number; position: number }
  | { kind: "remove"; n: number }
  | { kind: "move"; n: number; order: number }
  | { kind: "credential"; worker: number; day: number }
  | { kind: "leave"; worker: number }
  | { kind: "join"; worker: number }
  | { kind: "reverse-pool" }
  | { kind: "drop-order"; order: number };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant("add" as const), order: fc.nat(), worker: fc.nat(), position: fc.nat() }),
  fc.record({ kind: fc.constant("remove" as const), n: fc.nat() }),
  fc.record({ kind: fc.constant("move" as const), n: fc.nat(), order: fc.nat() }),
  fc.record({ kind: fc.constant("credential" as const), worker: fc.nat(), day: fc.integer({ min: 1, max: 28 }) }),
  fc.record({ kind: fc.constant("leave" as const), worker: fc.nat() }),
  fc.record({ kind: fc.constant("join" as const), worker: fc.nat() }),
  fc.constant({ kind: "reverse-pool" as const }),
  fc.record({ kind: fc.constant("drop-order" as const), order: fc.nat() }),
);

/** The snapshot after one operation (a new object: the old board is left as it was). */
function step(s: DaySnapshot, op: Op, spare: DaySnapshot["workers"]): DaySnapshot {
  const at = <T,>(xs: T[], n: number) => xs[n % xs.length];
  switch (op.kind) {
    case "add":
      if (!s.workOrders.length || !s.workers.length) return s;
      return { ...s, assignments: [...s.assignments, { workOrderId: at(s.workOrders, op.order).id, workerId: at(s.workers, op.worker).id, position: at([...POSITIONS], op.position) }] };
    case "remove":
      if (!s.assignments.length) return s;
      return { ...s, assignments: s.assignments.filter((_, i) => i !== op.n % s.assignments.length) };
    case "move": {
      if (!s.assignments.length || !s.workOrders.length) return s;
      const i = op.n % s.assignments.length;
      return { ...s, assignments: s.assignments.map((a, k) => (k === i ? { ...a, workOrderId: at(s.workOrders, op.order).id } : a)) };
    }
    case "credential": {
      if (!s.workers.length) return s;
      const w = at(s.workers, op.worker);
      const credentials = [...w.credentials.slice(1), { type: "climbing", expiresOn: `2027-04-${String(op.day).padStart(2, "0")}` }] as typeof w.credentials;
      return { ...s, workers: s.workers.map((x) => (x.id === w.id ? { ...x, credentials } : x)) };
    }
    case "leave": {
      if (s.workers.length < 2) return s;
      const w = at(s.workers, op.worker);
      return { ...s, workers: s.workers.filter((x) => x.id !== w.id), assignments: s.assignments.filter((a) => a.workerId !== w.id) };
    }
    case "join": {
      const w = at(spare, op.worker);
      return s.workers.some((x) => x.id === w.id) ? s : { ...s, workers: [...s.workers, w] };
    }
    case "reverse-pool":
      return { ...s, workers: [...s.workers].reverse() };
    case "drop-order": {
      if (s.workOrders.length < 2) return s;
      const o = at(s.workOrders, op.order);
      return { ...s, workOrders: s.workOrders.filter((x) => x.id !== o.id), assignments: s.assignments.filter((a) => a.workOrderId !== o.id) };
    }
  }
}

describe("slim board answers: a patch from the held version rebuilds the full board", () => {
  const day = generateDay({ workers: 40, orders: 12, days: 5, seed: 7 });
  const spareDay = generateDay({ workers: 50, orders: 1, days: 1, seed: 8 });
  const spare = spareDay.workers.slice(40).map((w) => ({ ...w, id: `x${w.id}` }));

  it("over random sequences of changes, patching version by version equals the full answer at each version (sha1 digests)", () => {
    fc.assert(
      fc.property(fc.array(fc.array(opArb, { minLength: 1, maxLength: 4 }), { minLength: 1, maxLength: 6 }), (versions) => {
        let snapshot = day;
        let full = boardOf(snapshot, 1);
        let held = full; // what the browser keeps, only ever patched
        for (const [v, ops] of versions.entries()) {
          for (const op of ops) snapshot = step(snapshot, op, spare);
          const next = boardOf(snapshot, v + 2);
          const patch = diffBoard(digestBoard(full, sha), next, digestBoard(next, sha), `v${v}`, `v${v + 1}`);
          held = applyBoardPatch(held, JSON.parse(JSON.stringify(patch)));
          expect(held).toEqual(next);
          full = next;
        }
      }),
      { numRuns: 60 },
    );
  });

  it("a patch carries only what changed: one drop sends one order card and none of the pool's rule snapshot", () => {
    const a = boardOf(day, 1);
    const s2 = step(day, { kind: "add", order: 0, worker: 3, position: 0 }, spare);
    const b = boardOf(s2, 2);
    const patch = diffBoard(digestBoard(a, sha), b, digestBoard(b, sha), "a", "b");
    expect(patch.collections["snapshot.workers"]).toBeUndefined();
    expect(patch.collections["pool"]).toBeUndefined();
    expect(patch.collections["orders"].upsert).toHaveLength(1);
    expect(patch.collections["snapshot.assignments"].upsert).toHaveLength(1);
    expect(JSON.stringify(patch).length).toBeLessThan(JSON.stringify(b).length / 5);
  });

  it("a patch is not a copy: applying it to the wrong version does not give the new board", () => {
    const a = boardOf(day, 1);
    const s2 = step(day, { kind: "credential", worker: 1, day: 3 }, spare);
    const b = boardOf(s2, 2);
    const patch = diffBoard(digestBoard(a, sha), b, digestBoard(b, sha), "a", "b");
    const other = boardOf(step(day, { kind: "leave", worker: 5 }, spare), 1);
    expect(applyBoardPatch(other, patch)).not.toEqual(b);
  });
});
