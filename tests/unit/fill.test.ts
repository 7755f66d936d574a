// Fill open positions (lib/fill): the HiGHS model against an exhaustive search on small random
// days, against the Hungarian method on pure assignment days, and its explanations.
// The crew rules themselves are the engine's (lib/rules); the search below uses the engine as
// its oracle, not the model's constraints, so a constraint the model gets wrong shows up here.

import fc from "fast-check";
import munkres from "munkres-js";
import { describe, expect, it } from "vitest";
import { fill } from "@/lib/fill/fill";
import { DOUBLE_PENALTY, leadSeatCost, placementCost, staffValues, TOGETHER_BONUS } from "@/lib/fill/objective";
import { overtimeHours } from "@/lib/fill/overtime";
import type { FillOrder, FillProblem, FillWorker } from "@/lib/fill/types";
import { isJourneyLevel } from "@/lib/rules/common";
import { findingsForOrders, SnapshotIndex } from "@/lib/rules/engine";
import { mulberry32 } from "@/lib/rules/generate";
import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import {
  DEFAULT_POLICY,
  type Assignment,
  type Classification,
  type DaySnapshot,
  type Position,
  type Worker,
  type WorkOrder,
  type WorkType,
} from "@/lib/rules/types";

const TZ = "America/Chicago";
const DAY = "2027-04-06";
const at = (hhmm: string, day = DAY) => zonedWallTimeToEpoch(`${day}T${hhmm}`, TZ);
const EXACT = { timeLimitSeconds: 20, gap: 0 };

function mkOrder(id: string, o: Partial<WorkOrder> & { from: string; to: string }): WorkOrder {
  const start = at(o.from);
  const end = at(o.to);
  return {
    id,
    title: `Order ${id}`,
    start,
    end,
    startDate: epochToZonedDate(start, TZ),
    endDate: epochToZonedDate(end - 1, TZ),
    workType: o.workType ?? "other",
    energized: o.energized ?? true,
    voltageKv: o.voltageKv ?? 12.47,
    exception: o.exception ?? null,
    minCrew: o.minCrew ?? null,
    driverLicence: o.driverLicence ?? "cdl_b",
    nearEnergizedKv: o.nearEnergizedKv ?? null,
  };
}

// --- random small days -------------------------------------------------------------------------

// qualified_electrical: an operator counts toward the two-worker minimum only with it (CREW-CHECK.md Corrections 1).
const CREDS = ["climbing", "first_aid_cpr", "pole_top_rescue", "aerial_rescue", "equipment_operator", "cdl_b", "qualified_electrical"];
const CLASSES: Classification[] = ["journeyman", "crew_lead", "apprentice", "ground_hand", "operator"];
const TYPES: WorkType[] = ["pole_climb", "bucket", "digger_derrick", "patrol", "storm", "other"];
const SEATS: Record<WorkType, Position[]> = {
  pole_climb: ["lead", "climber", "observer"],
  bucket: ["lead", "aerial", "ground"], // aerial: the person in the bucket (Corrections 3)
  digger_derrick: ["lead", "operator", "observer"],
  patrol: ["lead"],
  storm: ["lead", "ground"],
  other: ["lead", "ground"],
};
const SLOTS: Array<[string, string]> = [
  ["07:00", "12:00"],
  ["07:00", "15:00"],
  ["13:00", "17:00"],
  ["09:00", "14:00"],
];

function randomDay(seed: number): FillProblem {
  const rnd = mulberry32(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)];
  const nWorkers = 2 + Math.floor(rnd() * 5); // 2..6
  const nOrders = 1 + Math.floor(rnd() * 3); // 1..3
  const workers: Worker[] = [];
  const fillWorkers: FillWorker[] = [];
  for (let i = 0; i < nWorkers; i++) {
    const classification = pick(CLASSES);
    const credentials = CREDS.filter(() => rnd() < 0.7).map((type) => ({
      type,
      // Mostly current, sometimes lapsed before the day, sometimes lapsing in the warning window.
      expiresOn: rnd() < 0.15 ? "2027-03-20" : rnd() < 0.1 ? "2027-04-20" : "2028-06-30",
    }));
    const unavailable = rnd() < 0.1 ? [{ start: at("00:00"), end: at("00:00", "2027-04-07"), reason: "leave" }] : [];
    // A late shift yesterday now and then (REST), and some overtime history.
    const timeRecords = [];
    if (rnd() < 0.15) timeRecords.push({ start: at("08:00", "2027-04-05"), end: at("23:30", "2027-04-05") });
    for (let d = 3; d <= 20; d += 1 + Math.floor(rnd() * 4)) {
      const day = `2027-03-${String(31 - d + 1).padStart(2, "0")}`;
      timeRecords.push({ start: at("07:00", day), end: at(rnd() < 0.5 ? "15:00" : "17:30", day) });
    }
    const w: Worker = { id: `w${i + 1}`, name: `Worker ${i + 1}`, classification, credentials, unavailable, timeRecords };
    workers.push(w);
    fillWorkers.push({
      id: w.id,
      name: w.name,
      classification,
      yardId: rnd() < 0.7 ? "Y1" : "Y2",
      yardCode: "Y",
      phone: null,
      overtimeHours: overtimeHours(timeRecords, { day: DAY, timezone: TZ, regularHoursDay: 8 }),
    });
  }
  const workOrders: WorkOrder[] = [];
  const orders: FillOrder[] = [];
  const assignments: Assignment[] = [];
  const used = new Set<string>();
  for (let i = 0; i < nOrders; i++) {
    const workType = pick(TYPES);
    const [from, to] = pick(SLOTS);
    const id = `o${i + 1}`;
    const energized = rnd() < 0.85;
    workOrders.push(
      mkOrder(id, {
        from,
        to,
        workType,
        energized,
        // De-energized work beside a live feeder now and then (Corrections 2).
        nearEnergizedKv: !energized && rnd() < 0.6 ? 12.47 : null,
        voltageKv: rnd() < 0.8 ? 12.47 : 0.24,
        exception: rnd() < 0.1 ? "emergency" : null,
        minCrew: rnd() < 0.2 ? 2 : null,
      }),
    );
    const positions = SEATS[workType].slice(0, 1 + Math.floor(rnd() * SEATS[workType].length));
    const seats = positions.map((position, k) => {
      // Now and then someone already sits there (and stays).
      let workerId: string | null = null;
      if (rnd() < 0.15) {
        const w = pick(workers);
        if (!used.has(w.id)) {
          used.add(w.id);
          workerId = w.id;
          assignments.push({ workOrderId: id, workerId, position });
        }
      }
      return { positionId: `${id}-p${k + 1}`, position, workerId };
    });
    orders.push({ id, number: id.toUpperCase(), title: id, priority: 1 + Math.floor(rnd() * 5), yardId: rnd() < 0.6 ? "Y1" : "Y2", seats });
  }
  const pairs: Array<[string, string]> = [];
  for (let i = 0; i < nWorkers; i++) for (let j = i + 1; j < nWorkers; j++) if (rnd() < 0.2) pairs.push([workers[i].id, workers[j].id]);
  const snapshot: DaySnapshot = { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders, assignments };
  return { snapshot, orders, workers: fillWorkers, yesterdayPairs: pairs };
}

// --- the exhaustive search ---------------------------------------------------------------------

const blockKey = (f: { rule: string; workOrderId: string; workerId: string | null }) => `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}`;

/**
 * A proposal is acceptable when: each order is staffed whole or left; a new person takes at most
 * one non-lead seat and optionally the lead on an order, and none on an order they already sit
 * on; an apprentice is only placed beside a journeyman or crew lead (the fill's house rule); and
 * the crew rules engine finds no block on a staffed order other than those already there on
 * people who were placed before, and no new block on any other order of the people placed.
 */
function acceptable(p: FillProblem, proposal: Map<string, Assignment[]>): boolean {
  const ix = new SnapshotIndex(p.snapshot);
  const after = new SnapshotIndex(p.snapshot);
  const placed = new Set<string>();
  for (const [o, list] of proposal) {
    const crew = ix.crew(o);
    const perWorker = new Map<string, Position[]>();
    for (const a of list) {
      if (crew.positionsOf.has(a.workerId)) return false;
      perWorker.set(a.workerId, [...(perWorker.get(a.workerId) ?? []), a.position]);
      after.add(a);
      placed.add(a.workerId);
    }
    for (const ps of perWorker.values()) if (ps.filter((x) => x !== "lead").length > 1) return false;
    const people = after.crew(o).people;
    const journey = people.some((w) => isJourneyLevel(w.classification));
    if (!journey && people.some((w) => w.classification === "apprentice")) return false;
  }
  const ids = new Set<string>(proposal.keys());
  for (const w of placed) for (const id of after.orderIdsOf(w)) ids.add(id);
  const before = new Set(findingsForOrders(p.snapshot, ids).filter((f) => f.level === "block").map(blockKey));
  for (const f of findingsForOrders(after, ids)) {
    if (f.level !== "block") continue;
    const wasThere = before.has(blockKey(f)) && f.workerId !== null && !placed.has(f.workerId);
    if (proposal.has(f.workOrderId) && !wasThere) return false;
    if (!proposal.has(f.workOrderId) && !before.has(blockKey(f))) return false;
  }
  return true;
}

function objectiveOf(p: FillProblem, proposal: Map<string, Assignment[]>) {
  const values = staffValues(p.orders);
  const byId = new Map(p.workers.map((w) => [w.id, w]));
  const partners = new Map<string, Set<string>>();
  for (const [a, b] of p.yesterdayPairs) {
    partners.set(a, new Set([...(partners.get(a) ?? []), b]));
    partners.set(b, new Set([...(partners.get(b) ?? []), a]));
  }
  let staffing = 0;
  let cost = 0;
  for (const [o, list] of proposal) {
    const order = p.orders.find((x) => x.id === o)!;
    staffing += values.get(o)!;
    const ruleOrder = p.snapshot.workOrders.find((x) => x.id === o)!;
    for (const a of list) {
      cost += placementCost(byId.get(a.workerId)!, order, p.extraCost);
      // The lead seat prefers crew leads (issue 18), and aid/rescue on energized derrick work.
      if (a.position === "lead") {
        const rw = p.snapshot.workers.find((x) => x.id === a.workerId)!;
        const holds = (code: string) => rw.credentials.some((c) => c.type === code && (c.expiresOn === null || c.expiresOn >= ruleOrder.endDate));
        cost += leadSeatCost(byId.get(a.workerId)!, ruleOrder, holds);
      }
    }
    const fresh = new Set(list.map((a) => a.workerId));
    cost += DOUBLE_PENALTY * (list.length - fresh.size); // the lead doubling
    const people = new Set([...order.seats.filter((s) => s.workerId).map((s) => s.workerId!), ...fresh]);
    const counted = new Set<string>();
    for (const w of fresh) {
      for (const v of partners.get(w) ?? []) {
        if (!people.has(v)) continue;
        const k = [w, v].sort().join("|");
        if (!counted.has(k)) {
          counted.add(k);
          cost -= TOGETHER_BONUS;
        }
      }
    }
  }
  return { staffing, cost };
}

/** Every way to staff each order whole (or not), best by staffing then cost. */
function bruteForce(p: FillProblem) {
  const pool = p.workers.map((w) => w.id);
  // Per order: the local options (staffing it alone is acceptable), then every combination.
  const local: Array<Array<Assignment[] | null>> = p.orders.map((o) => {
    const open = o.seats.filter((s) => s.workerId === null);
    const out: Array<Assignment[] | null> = [null];
    if (!open.length) return out;
    const rec = (i: number, acc: Assignment[]) => {
      if (i === open.length) {
        if (acceptable(p, new Map([[o.id, acc]]))) out.push(acc.slice());
        return;
      }
      for (const w of pool) rec(i + 1, [...acc, { workOrderId: o.id, workerId: w, position: open[i].position }]);
    };
    rec(0, []);
    return out;
  });
  let best = { staffing: 0, cost: 0 };
  const rec = (i: number, acc: Map<string, Assignment[]>) => {
    if (i === p.orders.length) {
      if (acc.size && !acceptable(p, acc)) return;
      const v = objectiveOf(p, acc);
      if (v.staffing > best.staffing || (v.staffing === best.staffing && v.cost < best.cost)) best = v;
      return;
    }
    for (const opt of local[i]) {
      if (opt) acc.set(p.orders[i].id, opt);
      rec(i + 1, acc);
      acc.delete(p.orders[i].id);
    }
  };
  rec(0, new Map());
  return best;
}

function proposalMap(r: Awaited<ReturnType<typeof fill>>) {
  const m = new Map<string, Assignment[]>();
  for (const x of r.proposals) m.set(x.orderId, [...(m.get(x.orderId) ?? []), { workOrderId: x.orderId, workerId: x.workerId, position: x.position }]);
  return m;
}

describe("fill: HiGHS against an exhaustive search (small random days, fast-check)", () => {
  it("finds the same optimum, and every proposal passes the crew rules engine", async () => {
    await fc.assert(
      fc.asyncProperty(fc.integer({ min: 1, max: 2 ** 31 - 1 }), async (seed) => {
        const p = randomDay(seed);
        const r = await fill(p, EXACT);
        const mine = proposalMap(r);
        // Every proposal is one the engine accepts (no block it introduces).
        expect(acceptable(p, mine)).toBe(true);
        expect(objectiveOf(p, mine)).toEqual(r.objective);
        expect(r.optimal).toBe(true);
        // And nothing better exists.
        expect(r.objective).toEqual(bruteForce(p));
      }),
      { numRuns: Number(process.env.FILL_RUNS ?? 30) },
    );
  }, 600_000);
});

describe("fill: pure assignment days against the Hungarian method (munkres-js)", () => {
  // n single-seat orders at the same time, m ≥ n ground hands each eligible for every seat,
  // costs only from a worker–order matrix: a classic assignment problem (Kuhn 1955, Munkres 1957).
  it("reaches the Hungarian optimum", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.integer({ min: 2, max: 5 }).chain((n) =>
          fc.integer({ min: n, max: n + 2 }).chain((m) =>
            fc.array(fc.array(fc.integer({ min: 0, max: 80 }), { minLength: n, maxLength: n }), { minLength: m, maxLength: m }),
          ),
        ),
        async (matrix) => {
          const m = matrix.length;
          const n = matrix[0].length;
          const workers: Worker[] = Array.from({ length: m }, (_, i) => ({
            id: `w${i}`,
            name: `Ground hand ${i}`,
            classification: "ground_hand",
            credentials: [],
            unavailable: [],
            timeRecords: [],
          }));
          const workOrders = Array.from({ length: n }, (_, j) => mkOrder(`o${j}`, { from: "08:00", to: "12:00", energized: false, workType: "other" }));
          const extraCost: Record<string, number> = {};
          for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) extraCost[`w${i}|o${j}`] = matrix[i][j];
          const p: FillProblem = {
            snapshot: { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders, assignments: [] },
            orders: workOrders.map((o) => ({ id: o.id, number: o.id, title: o.id, priority: 3, yardId: "Y1", seats: [{ positionId: `${o.id}-g`, position: "ground", workerId: null }] })),
            workers: workers.map((w) => ({ id: w.id, name: w.name, classification: w.classification, yardId: "Y1", phone: null, overtimeHours: 0 })),
            yesterdayPairs: [],
            extraCost,
          };
          const r = await fill(p, EXACT);
          const hungarian = munkres(matrix).reduce((sum, [i, j]) => sum + matrix[i][j], 0);
          expect(r.proposals).toHaveLength(n);
          expect(r.objective.cost).toBe(hungarian);
          expect(r.optimal).toBe(true);
        },
      ),
      { numRuns: 30 },
    );
  }, 60_000);
});

describe("fill: explanations", () => {
  it("leaves a climbing order with no eligible climber open and says why", async () => {
    const cred = (types: string[], expiresOn = "2028-06-30") => types.map((type) => ({ type, expiresOn }));
    const workers: Worker[] = [
      // Two journeymen whose climbing evaluations lapsed before the day (CLIMB_CERT, employer policy under 1910.269(a)(2)).
      { id: "j1", name: "Lapsed One", classification: "journeyman", credentials: [...cred(["first_aid_cpr", "pole_top_rescue"]), { type: "climbing", expiresOn: "2027-03-01" }], unavailable: [], timeRecords: [] },
      { id: "j2", name: "Lapsed Two", classification: "journeyman", credentials: [...cred(["first_aid_cpr", "pole_top_rescue"]), { type: "climbing", expiresOn: "2027-02-10" }], unavailable: [], timeRecords: [] },
      { id: "l1", name: "Lead One", classification: "crew_lead", credentials: cred(["first_aid_cpr", "pole_top_rescue"]), unavailable: [], timeRecords: [] },
      { id: "g1", name: "Ground One", classification: "ground_hand", credentials: cred(["first_aid_cpr"]), unavailable: [], timeRecords: [] },
    ];
    const climb = mkOrder("c1", { from: "07:00", to: "15:00", workType: "pole_climb" });
    const patrol = mkOrder("p1", { from: "07:00", to: "15:00", workType: "patrol" });
    const p: FillProblem = {
      snapshot: { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders: [climb, patrol], assignments: [] },
      orders: [
        { id: "c1", number: "C1", title: "climb", priority: 1, yardId: "Y1", seats: ["lead", "climber", "observer"].map((position, k) => ({ positionId: `c1-${k}`, position: position as Position, workerId: null })) },
        { id: "p1", number: "P1", title: "patrol", priority: 5, yardId: "Y1", seats: [{ positionId: "p1-0", position: "lead", workerId: null }] },
      ],
      workers: workers.map((w) => ({ id: w.id, name: w.name, classification: w.classification, yardId: "Y1", phone: null, overtimeHours: 0 })),
      yesterdayPairs: [],
    };
    const r = await fill(p, EXACT);
    expect(r.proposals.some((x) => x.orderId === "c1")).toBe(false);
    expect(r.proposals.filter((x) => x.orderId === "p1")).toHaveLength(1);
    const why = r.openOrders.find((o) => o.orderId === "c1");
    expect(why?.reason).toMatch(/climber/);
    const seat = r.open.find((s) => s.orderId === "c1" && s.position === "climber")!;
    expect(seat.summary).toBe("2 lapsed climbing qualifications, 2 without a climbing qualification");
    expect(seat.eligibleCount).toBe(0);
    expect(seat.candidates.map((c) => c.workerId).sort()).toEqual(["g1", "j1", "j2", "l1"]);
    expect(seat.candidates.find((c) => c.workerId === "j1")?.excludedBy).toBe("CLIMB_CERT");
    expect(seat.candidates.find((c) => c.workerId === "j1")?.message).toMatch(/expired on 1 March 2027/); // dates in words (issue 18 point 8)
  });

  it("gives reasons: priority, overtime rank and home yard", async () => {
    const workers: Worker[] = ["a", "b"].map((id) => ({ id, name: `Lead ${id}`, classification: "crew_lead", credentials: [], unavailable: [], timeRecords: [] }));
    const o = mkOrder("o", { from: "08:00", to: "12:00", workType: "patrol", energized: false });
    const p: FillProblem = {
      snapshot: { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders: [o], assignments: [] },
      orders: [{ id: "o", number: "O", title: "o", priority: 1, yardId: "Y1", seats: [{ positionId: "o-1", position: "lead", workerId: null }] }],
      workers: [
        { id: "a", name: "Lead a", classification: "crew_lead", yardId: "Y2", yardCode: "MES", phone: null, overtimeHours: 2.5 },
        { id: "b", name: "Lead b", classification: "crew_lead", yardId: "Y1", yardCode: "NOR", phone: null, overtimeHours: 6 },
      ],
      yesterdayPairs: [],
    };
    const r = await fill(p, EXACT);
    expect(r.proposals).toHaveLength(1);
    // Fairness comes before the home yard: the lower-overtime worker from the other yard.
    expect(r.proposals[0].workerId).toBe("a");
    expect(r.proposals[0].reasons).toEqual(["priority 1 order", "2.5 h overtime in 28 days (lowest eligible of 2)", "from MES (not the order's yard)", "crew lead in the lead seat (crew leads are preferred for lead)"]);
  });
});

describe("overtime hours", () => {
  it("counts hours beyond the regular day, split at local midnight, over the 28 days before", () => {
    const recs = [
      { start: at("07:00", "2027-04-01"), end: at("17:30", "2027-04-01") }, // 10.5 h: 2.5 over
      { start: at("22:00", "2027-04-02"), end: at("06:00", "2027-04-03") }, // 2 h + 6 h: none over
      { start: at("07:00", "2027-04-03"), end: at("11:00", "2027-04-03") }, // with the 6 h: 10 h, 2 over
      { start: at("07:00", "2027-03-01"), end: at("20:00", "2027-03-01") }, // outside the 28 days
      { start: at("07:00", "2027-04-06"), end: at("20:00", "2027-04-06") }, // the day itself: not counted
    ];
    expect(overtimeHours(recs, { day: DAY, timezone: TZ, regularHoursDay: 8 })).toBe(4.5);
  });
});

describe("the lead seat prefers crew leads (issue 18)", () => {
  // Common practice: the crew lead is the employee in charge who holds the job briefing
  // (1910.269(c)(1)); a journeyman leads only when no rested crew lead is free.
  it("a crew lead takes the lead seat over a journeyman with up to 2 h less overtime, and the reasons say why", async () => {
    const workers: Worker[] = [
      { id: "j", name: "Journey j", classification: "journeyman", credentials: [], unavailable: [], timeRecords: [] },
      { id: "c", name: "Crew lead c", classification: "crew_lead", credentials: [], unavailable: [], timeRecords: [] },
    ];
    const o = mkOrder("o", { from: "08:00", to: "12:00", workType: "patrol", energized: false });
    const p: FillProblem = {
      snapshot: { timezone: TZ, policy: { ...DEFAULT_POLICY }, workers, workOrders: [o], assignments: [] },
      orders: [{ id: "o", number: "O", title: "o", priority: 1, yardId: "Y1", seats: [{ positionId: "o-1", position: "lead", workerId: null }] }],
      workers: [
        { id: "j", name: "Journey j", classification: "journeyman", yardId: "Y1", yardCode: "NOR", phone: null, overtimeHours: 1 },
        { id: "c", name: "Crew lead c", classification: "crew_lead", yardId: "Y1", yardCode: "NOR", phone: null, overtimeHours: 2.5 },
      ],
      yesterdayPairs: [],
    };
    const r = await fill(p, EXACT);
    expect(r.proposals.map((x) => x.workerId)).toEqual(["c"]);
    expect(r.proposals[0].reasons).toContain("crew lead in the lead seat (crew leads are preferred for lead)");
  });
  it("leadSeatCost: energized derrick work adds a cost for a lead without first aid/CPR or rescue training", () => {
    const derrick = { workType: "digger_derrick", energized: true };
    expect(leadSeatCost({ classification: "crew_lead" }, derrick, () => true)).toBe(0);
    expect(leadSeatCost({ classification: "crew_lead" }, derrick, (c) => c === "first_aid_cpr")).toBeGreaterThan(0);
    expect(leadSeatCost({ classification: "crew_lead" }, { workType: "patrol", energized: false }, () => false)).toBe(0);
    expect(leadSeatCost({ classification: "journeyman" }, derrick, () => true)).toBeGreaterThan(leadSeatCost({ classification: "crew_lead" }, derrick, () => false));
  });
});
