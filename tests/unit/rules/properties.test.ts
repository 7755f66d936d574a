import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { checkDay, compareFindings, createEngine, findingsForOrders, type AssignmentChange } from "@/lib/rules/engine";
import { generateDay, mulberry32 } from "@/lib/rules/generate";
import { epochToZonedDate } from "@/lib/rules/time";
import {
  CLASSIFICATIONS,
  EXCEPTIONS,
  POSITIONS,
  RULE_CODES,
  RULE_CREDENTIALS,
  WORK_TYPES,
  type Assignment,
  type DaySnapshot,
  type Interval,
  type Worker,
  type WorkOrder,
} from "@/lib/rules/types";

const TZ = "America/Chicago";
const BASE = Date.parse("2027-04-06T12:00:00Z"); // 07:00 in Chicago
const H = 3_600_000;

const interval = (lo: number, hi: number): fc.Arbitrary<Interval> =>
  fc.tuple(fc.integer({ min: lo, max: hi }), fc.integer({ min: 1, max: 18 })).map(([s, len]) => ({ start: BASE + s * H, end: BASE + (s + len) * H }));

const workerArb = fc.record({
  classification: fc.constantFrom(...CLASSIFICATIONS),
  credentials: fc.array(
    fc.record({
      type: fc.constantFrom(...RULE_CREDENTIALS, "traffic_control"),
      expiresOn: fc.option(fc.constantFrom("2027-04-05", "2027-04-06", "2027-04-07", "2027-04-20", "2027-05-06", "2028-01-01"), { nil: null }),
    }),
    { maxLength: 8 },
  ),
  unavailable: fc.array(fc.tuple(interval(-12, 18), fc.constantFrom("leave", "training", "sickness")).map(([i, reason]) => ({ ...i, reason })), { maxLength: 2 }),
  timeRecords: fc.array(interval(-60, 24), { maxLength: 6 }),
});

const orderArb = fc.record({
  startH: fc.integer({ min: -8, max: 16 }),
  // Mostly one day; sometimes a multi-day order (CREW-CHECK.md Corrections 6).
  len: fc.oneof({ arbitrary: fc.integer({ min: 1, max: 17 }), weight: 4 }, { arbitrary: fc.integer({ min: 20, max: 60 }), weight: 1 }),
  workType: fc.constantFrom(...WORK_TYPES),
  energized: fc.boolean(),
  voltageKv: fc.option(fc.constantFrom(0.024, 0.05, 0.24, 0.6, 0.61, 12.47), { nil: null }),
  exception: fc.option(fc.constantFrom(...EXCEPTIONS), { nil: null }),
  minCrew: fc.option(fc.integer({ min: 1, max: 4 }), { nil: null }),
  driverLicence: fc.constantFrom("cdl_a" as const, "cdl_b" as const),
  // Corrections 2, 6, 7: nearby voltage, shifts (offset and length in hours inside the span), digging and tickets.
  nearEnergizedKv: fc.option(fc.constantFrom(0.24, 0.6, 0.61, 7.2, 12.47), { nil: null }),
  shifts: fc.option(fc.array(fc.tuple(fc.nat({ max: 60 }), fc.integer({ min: 1, max: 18 })), { minLength: 1, maxLength: 3 }), { nil: undefined }),
  digs: fc.boolean(),
  locate: fc.option(fc.record({ ticket: fc.constantFrom("T1", "T2"), validThrough: fc.constantFrom("2027-04-05", "2027-04-06", "2027-04-07", "2027-04-08", "2027-04-09") }), { nil: null }),
});

type OrderRecord = typeof orderArb extends fc.Arbitrary<infer R> ? R : never;

/** An order from orderArb's record: shifts are clipped into the order's span. */
function toOrder(o: OrderRecord, id: string, title: string): WorkOrder {
  const start = BASE + o.startH * H;
  const end = start + o.len * H;
  const shifts = o.shifts?.map(([off, len]) => {
    const s = start + (off % o.len) * H;
    return { start: s, end: Math.min(end, s + len * H) };
  });
  return {
    id,
    title,
    start,
    end,
    startDate: epochToZonedDate(start, TZ),
    endDate: epochToZonedDate(end, TZ),
    workType: o.workType,
    energized: o.energized,
    voltageKv: o.voltageKv,
    exception: o.exception,
    minCrew: o.minCrew,
    driverLicence: o.driverLicence,
    nearEnergizedKv: o.nearEnergizedKv,
    ...(shifts ? { shifts } : {}),
    digs: o.digs,
    locate: o.locate,
  };
}

const assignmentArb = fc.record({ o: fc.nat(), w: fc.nat(), position: fc.constantFrom(...POSITIONS) });

const snapshotArb: fc.Arbitrary<DaySnapshot> = fc
  .record({
    workers: fc.array(workerArb, { minLength: 1, maxLength: 7 }),
    orders: fc.array(orderArb, { minLength: 1, maxLength: 5 }),
    assignments: fc.array(assignmentArb, { maxLength: 18 }),
    minRestHours: fc.constantFrom(0, 8, 10),
    maxShiftHours: fc.constantFrom(8, 12, 16),
    credentialWarnDays: fc.constantFrom(0, 1, 30),
    levels: fc.option(fc.dictionary(fc.constantFrom(...RULE_CODES), fc.constantFrom("block" as const, "warn" as const)), { nil: undefined }),
  })
  .map((r) => {
    const workers: Worker[] = r.workers.map((w, i) => ({ id: `w${i}`, name: `Worker ${i}`, ...w }));
    const workOrders: WorkOrder[] = r.orders.map((o, i) => toOrder(o, `o${i}`, `Order ${i}`));
    const assignments: Assignment[] = r.assignments.map((a) => ({
      workOrderId: workOrders[a.o % workOrders.length].id,
      workerId: workers[a.w % workers.length].id,
      position: a.position,
    }));
    const policy = { minRestHours: r.minRestHours, maxShiftHours: r.maxShiftHours, credentialWarnDays: r.credentialWarnDays, ...(r.levels ? { levels: r.levels } : {}) };
    return { timezone: TZ, policy, workers, workOrders, assignments };
  });

function shuffle<T>(xs: readonly T[], rnd: () => number): T[] {
  const a = xs.slice();
  for (let i = a.length - 1; i > 0; i--) {
    const j = Math.floor(rnd() * (i + 1));
    [a[i], a[j]] = [a[j], a[i]];
  }
  return a;
}

describe("crew rules: properties", () => {
  it("findings are deterministic and strictly sorted (order, rule, worker with null first)", () => {
    fc.assert(
      fc.property(snapshotArb, (s) => {
        const a = checkDay(s);
        expect(checkDay(structuredClone(s))).toEqual(a);
        for (let i = 1; i < a.length; i++) expect(compareFindings(a[i - 1], a[i])).toBeLessThan(0);
        for (const f of a) {
          expect(f.level === "block" || f.level === "warn").toBe(true);
          if (f.locked) expect(f.level).toBe("block");
        }
      }),
      { numRuns: 200 },
    );
  });

  it("permuting every input array changes nothing", () => {
    fc.assert(
      fc.property(snapshotArb, fc.integer(), (s, seed) => {
        const rnd = mulberry32(seed);
        const permuted: DaySnapshot = {
          ...s,
          workers: shuffle(s.workers, rnd).map((w) => ({
            ...w,
            credentials: shuffle(w.credentials, rnd),
            unavailable: shuffle(w.unavailable, rnd),
            timeRecords: shuffle(w.timeRecords, rnd),
          })),
          workOrders: shuffle(s.workOrders, rnd).map((o) => (o.shifts ? { ...o, shifts: shuffle(o.shifts, rnd) } : o)),
          assignments: shuffle(s.assignments, rnd),
        };
        expect(checkDay(permuted)).toEqual(checkDay(s));
      }),
      { numRuns: 200 },
    );
  });

  it("adding an unrelated order (no shared workers) leaves the other orders' findings unchanged", () => {
    fc.assert(
      fc.property(snapshotArb, fc.array(workerArb, { maxLength: 4 }), orderArb, fc.array(fc.constantFrom(...POSITIONS), { maxLength: 6 }), (s, extraWorkers, o, positions) => {
        const newWorkers: Worker[] = extraWorkers.map((w, i) => ({ id: `x${i}`, name: `Extra ${i}`, ...w }));
        const newOrder: WorkOrder = toOrder(o, "o-new", "Unrelated");
        const newAssignments: Assignment[] =
          newWorkers.length === 0 ? [] : positions.map((position, i) => ({ workOrderId: "o-new", workerId: newWorkers[i % newWorkers.length].id, position }));
        const grown: DaySnapshot = {
          ...s,
          workers: [...s.workers, ...newWorkers],
          workOrders: [...s.workOrders, newOrder],
          assignments: [...s.assignments, ...newAssignments],
        };
        expect(checkDay(grown).filter((f) => f.workOrderId !== "o-new")).toEqual(checkDay(s));
      }),
      { numRuns: 150 },
    );
  });

  it("findingsForOrders equals the full check filtered to those orders", () => {
    fc.assert(
      fc.property(snapshotArb, fc.array(fc.nat(), { maxLength: 3 }), (s, picks) => {
        const ids = new Set(picks.map((p) => s.workOrders[p % s.workOrders.length].id));
        expect(findingsForOrders(s, ids)).toEqual(checkDay(s).filter((f) => ids.has(f.workOrderId)));
      }),
    );
  });

  const changeArb = fc.record({
    kind: fc.constantFrom("add", "remove", "move", "remove-missing"),
    pick: fc.nat(),
    o: fc.nat(),
    w: fc.nat(),
    position: fc.constantFrom(...POSITIONS),
  });

  it("after any sequence of single changes (add, remove, move) the incremental findings equal a full check", () => {
    fc.assert(
      fc.property(snapshotArb, fc.array(changeArb, { minLength: 1, maxLength: 8 }), (s, changes) => {
        const engine = createEngine(s);
        expect(engine.findings()).toEqual(checkDay(s));
        for (const c of changes) {
          const current = engine.snapshot().assignments;
          const target: Assignment = {
            workOrderId: s.workOrders[c.o % s.workOrders.length].id,
            workerId: s.workers[c.w % s.workers.length].id,
            position: c.position,
          };
          let change: AssignmentChange;
          if (c.kind === "add" || (current.length === 0 && c.kind !== "remove-missing")) change = { kind: "add", assignment: target };
          else if (c.kind === "remove") change = { kind: "remove", assignment: current[c.pick % current.length] };
          else if (c.kind === "move") change = { kind: "move", from: current[c.pick % current.length], to: target };
          else change = { kind: "remove", assignment: target }; // usually not assigned: a no-op
          const after = engine.apply(change);
          expect(after).toEqual(checkDay(engine.snapshot()));
        }
      }),
      { numRuns: 300 },
    );
  });

  it("the generated benchmark day is deterministic and the incremental engine agrees with it", () => {
    const a = generateDay({ workers: 120, orders: 30, days: 10, seed: 7 });
    expect(generateDay({ workers: 120, orders: 30, days: 10, seed: 7 })).toEqual(a);
    expect(generateDay({ workers: 120, orders: 30, days: 10, seed: 8 })).not.toEqual(a);
    const engine = createEngine(a);
    const rnd = mulberry32(99);
    for (let i = 0; i < 100; i++) {
      const current = engine.snapshot().assignments;
      const from = current[Math.floor(rnd() * current.length)];
      const to = { ...from, workOrderId: a.workOrders[Math.floor(rnd() * a.workOrders.length)].id };
      engine.apply({ kind: "move", from, to });
    }
    expect(engine.findings()).toEqual(checkDay(engine.snapshot()));
  });
});
