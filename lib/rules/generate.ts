// A deterministic synthetic day for benchmarks and property tests: workers with credentials,
// leave and weeks of time records, and the day's work orders with realistic crews. Pure: the
// same options always give the same snapshot. All names are invented.

import { addEquipmentAndGear } from "./generate-equipment";
import { epochToOffsetTime, zonedWallTimeToEpoch } from "./time";
import {
  DEFAULT_POLICY,
  type Assignment,
  type Classification,
  type Credential,
  type DaySnapshot,
  type Interval,
  type Position,
  type Unavailability,
  type Worker,
  type WorkOrder,
  type WorkType,
} from "./types";

export interface GenerateOptions {
  workers: number;
  orders: number;
  /** Days of time records before the day. */
  days: number;
  seed: number;
  /** The day being dispatched (default 2027-04-06). */
  date?: string;
  /** IANA zone (default America/Chicago). */
  timezone?: string;
  /**
   * Equipment in the fleet; when given, the day also carries every worker's rubber goods, the
   * trucks' assignments and the orders' elevation, phases and lifts (generate-equipment.ts).
   */
  trucks?: number;
}

/** mulberry32: a small, fast, seeded PRNG returning floats in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function addDays(date: string, n: number): string {
  const d = new Date(Date.UTC(Number(date.slice(0, 4)), Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10)) + n));
  return d.toISOString().slice(0, 10);
}

const FIRST = ["Ada", "Bram", "Cato", "Dela", "Edo", "Fen", "Gia", "Hale", "Ines", "Jory", "Kit", "Lume", "Mira", "Noor", "Oren", "Pia", "Quill", "Rhea", "Sol", "Tam", "Uma", "Vale", "Wren", "Yara", "Zed"];
const LAST_A = ["Ash", "Bel", "Cor", "Dun", "Fal", "Gar", "Hol", "Kes", "Lin", "Mor", "Pel", "Rook", "Sand", "Thorn", "Vey", "Wick"];
const LAST_B = ["by", "den", "ford", "ley", "mere", "ton", "ward", "holt"];

const pad = (n: number, w: number) => String(n).padStart(w, "0");
const hhmm = (minutes: number) => `${pad(Math.floor(minutes / 60), 2)}:${pad(minutes % 60, 2)}`;

export function generateDay(opts: GenerateOptions): DaySnapshot {
  const rnd = mulberry32(opts.seed);
  const tz = opts.timezone ?? "America/Chicago";
  const date = opts.date ?? "2027-04-06";
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)];
  const chance = (p: number) => rnd() < p;
  const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));

  const epochCache = new Map<string, number>();
  // Wall time on `day` at `minutes` past midnight (may run past 24:00 into the next day).
  const at = (day: string, minutes: number): number => {
    const d = addDays(day, Math.floor(minutes / 1440));
    const key = `${d}T${hhmm(minutes % 1440)}`;
    let ms = epochCache.get(key);
    if (ms === undefined) epochCache.set(key, (ms = zonedWallTimeToEpoch(key, tz)));
    return ms;
  };
  const expiry = () => (chance(0.05) ? null : addDays(date, int(-60, 720)));

  const workers: Worker[] = [];
  for (let i = 0; i < opts.workers; i++) {
    const r = rnd();
    const classification: Classification =
      r < 0.12 ? "crew_lead" : r < 0.47 ? "journeyman" : r < 0.65 ? "apprentice" : r < 0.85 ? "ground_hand" : "operator";
    const credentials: Credential[] = [];
    const give = (type: string, p: number) => {
      if (chance(p)) credentials.push({ type, expiresOn: expiry() });
    };
    const climbs = classification === "crew_lead" || classification === "journeyman" || classification === "apprentice";
    give("climbing", climbs ? 0.9 : 0.05);
    give("first_aid_cpr", classification === "ground_hand" ? 0.6 : 0.85);
    give("pole_top_rescue", climbs ? 0.65 : 0.3);
    give("aerial_rescue", classification === "apprentice" ? 0.3 : 0.55);
    give("equipment_operator", classification === "operator" ? 0.95 : 0.15);
    // Corrections 1: some operators are also qualified electrical workers.
    give("qualified_electrical", classification === "operator" ? 0.4 : classification === "ground_hand" ? 0.05 : 0.2);
    give(chance(0.4) ? "cdl_a" : "cdl_b", classification === "apprentice" ? 0.4 : 0.7);
    if (chance(0.1)) credentials.push({ type: "traffic_control", expiresOn: expiry() });

    const unavailable: Unavailability[] = [];
    if (chance(0.04)) {
      const from = int(-3, 0);
      unavailable.push({ start: at(date, from * 1440), end: at(date, int(1, 5) * 1440), reason: "leave" });
    }
    if (chance(0.03)) {
      const d = addDays(date, int(-10, 10));
      unavailable.push({ start: at(d, 8 * 60), end: at(d, 16 * 60), reason: pick(["training", "sickness"]) });
    }

    const timeRecords: Interval[] = [];
    const restDay = int(0, 6);
    for (let back = opts.days; back >= 1; back--) {
      const day = addDays(date, -back);
      if ((back + restDay) % 7 < 2 && !chance(0.1)) continue; // two days off most weeks
      const start = int(24, 32) * 15; // 06:00-08:00
      const long = back === 1 && chance(0.03); // a storm day yesterday, running late
      const len = long ? int(56, 64) * 15 : int(32, 42) * 15; // 14-16 h or 8-10.5 h
      timeRecords.push({ start: at(day, start), end: at(day, start + len) });
      if (chance(0.04)) {
        const call = int(84, 100) * 15; // 21:00-01:00
        timeRecords.push({ start: at(day, call), end: at(day, call + int(4, 16) * 15) });
      }
    }

    workers.push({
      id: `w-${pad(i + 1, 4)}`,
      name: `${pick(FIRST)} ${pick(LAST_A)}${pick(LAST_B)}`,
      classification,
      credentials,
      unavailable,
      timeRecords,
    });
  }

  // Pools by classification, consumed in a shuffled order so most people work one order.
  const shuffled = <T>(xs: T[]): T[] => {
    const a = xs.slice();
    for (let i = a.length - 1; i > 0; i--) {
      const j = Math.floor(rnd() * (i + 1));
      [a[i], a[j]] = [a[j], a[i]];
    }
    return a;
  };
  const pools = new Map<string, Worker[]>();
  for (const w of shuffled(workers)) {
    const key = w.classification === "crew_lead" || w.classification === "journeyman" ? "journey" : w.classification;
    let pool = pools.get(key);
    if (!pool) pools.set(key, (pool = []));
    pool.push(w);
  }
  const anyone = shuffled(workers);
  const workersById = new Map(workers.map((w) => [w.id, w]));
  const used = new Set<string>();
  const draw = (key: string): Worker | undefined => {
    const pool = pools.get(key) ?? [];
    let w: Worker | undefined;
    while (!w && pool.length > 0) {
      const next = pool.pop()!;
      if (!used.has(next.id)) w = next;
    }
    while (!w && anyone.length > 0) {
      const next = anyone.pop()!;
      if (!used.has(next.id)) w = next;
    }
    if (w) used.add(w.id);
    return w;
  };

  const workOrders: WorkOrder[] = [];
  const assignments: Assignment[] = [];
  const types: WorkType[] = ["pole_climb", "pole_climb", "pole_climb", "bucket", "bucket", "bucket", "digger_derrick", "digger_derrick", "patrol", "storm", "other"];
  const templates: Record<WorkType, Array<[Position, string]>> = {
    pole_climb: [["lead", "journey"], ["climber", "apprentice"], ["observer", "ground_hand"]],
    bucket: [["lead", "journey"], ["aerial", "journey"], ["ground", "ground_hand"], ["driver", "operator"]],
    digger_derrick: [["lead", "journey"], ["operator", "operator"], ["observer", "ground_hand"], ["ground", "apprentice"]],
    patrol: [["lead", "journey"]],
    storm: [["lead", "journey"], ["climber", "journey"], ["observer", "apprentice"], ["driver", "operator"]],
    other: [["lead", "journey"], ["ground", "ground_hand"]],
  };

  for (let i = 0; i < opts.orders; i++) {
    const workType = pick(types);
    const startMin = int(12, 20) * 30; // 06:00-10:00
    const start = at(date, startMin);
    const lenMin = int(8, 20) * 30; // 4-10 h
    // Corrections 6: a few storm orders run over two or three days, worked in daily shifts.
    const days = workType === "storm" && chance(0.4) ? int(2, 3) : 1;
    const end = at(date, startMin + (days - 1) * 1440 + lenMin);
    const shifts = days > 1 && chance(0.75) ? Array.from({ length: days }, (_, d) => ({ start: at(date, startMin + d * 1440), end: at(date, startMin + d * 1440 + lenMin) })) : undefined;
    const energized = chance(0.85);
    // Corrections 2: de-energized work often has live parts within reach.
    const nearEnergizedKv = !energized && chance(0.6) ? pick([12.47, 7.2, 0.24]) : null;
    // Corrections 7: derrick work digs; most have a ticket, a few lapse early or have none.
    const digs = workType === "digger_derrick" && chance(0.7);
    const endDate = addDays(date, days - 1);
    const locate = digs && chance(0.85) ? { ticket: `T${int(100000, 999999)}`, validThrough: chance(0.85) ? addDays(endDate, int(0, 10)) : addDays(endDate, -1) } : null;
    const order: WorkOrder = {
      id: `wo-${pad(i + 1, 4)}`,
      title: `${workType.replace("_", " ")} job ${i + 1}, feeder ${int(1, 60)}`,
      start,
      end,
      startDate: date,
      endDate,
      workType,
      energized,
      voltageKv: pick([12.47, 12.47, 7.2, 24.94, 34.5, 0.24, null]),
      exception: chance(0.03) ? "emergency" : chance(0.02) ? "routine_switching" : null,
      minCrew: chance(0.3) ? int(3, 4) : null,
      driverLicence: chance(0.2) ? "cdl_a" : "cdl_b",
      nearEnergizedKv,
      ...(shifts ? { shifts } : {}),
      digs,
      locate,
    };
    workOrders.push(order);

    const crew: Array<[Position, Worker]> = [];
    for (const [position, wanted] of templates[workType]) {
      if (position === "lead" && chance(0.06)) continue; // nobody named in charge yet
      const pool = position === "climber" && chance(0.03) ? "ground_hand" : wanted;
      const w = draw(pool);
      if (w) crew.push([position, w]);
    }
    if (workType === "bucket" && chance(0.15)) {
      const w = draw("journey"); // a second person aloft
      if (w) crew.push(["aerial", w]);
    }
    if (workType === "pole_climb" && chance(0.3)) {
      const w = draw("journey");
      if (w) crew.push(["climber", w]);
    }
    if (crew.length > 0 && chance(0.15)) crew.push(["climber", crew[0][1]]); // the lead also climbs
    if (assignments.length > 0 && chance(0.02)) crew.push(["ground", workersById.get(pick(assignments).workerId)!]); // booked twice
    for (const [position, w] of crew) assignments.push({ workOrderId: order.id, workerId: w.id, position });
  }

  const generated: DaySnapshot = {
    timezone: tz,
    policy: { ...DEFAULT_POLICY },
    workers,
    workOrders,
    assignments,
  };
  return opts.trucks === undefined ? generated : addEquipmentAndGear(generated, { trucks: opts.trucks, seed: opts.seed, date });
}

/** The snapshot as crew-check input JSON (times with explicit offsets, so they round-trip exactly). */
export function toDayInput(s: DaySnapshot): Record<string, unknown> {
  const t = (ms: number) => epochToOffsetTime(ms, s.timezone);
  return {
    timezone: s.timezone,
    policy: s.policy,
    workers: s.workers.map((w) => ({
      id: w.id,
      name: w.name,
      classification: w.classification,
      credentials: w.credentials,
      unavailable: w.unavailable.map((u) => ({ from: t(u.start), to: t(u.end), reason: u.reason })),
      timeRecords: w.timeRecords.map((r) => ({ start: t(r.start), end: t(r.end) })),
      ...(w.gear ? { gear: w.gear } : {}),
    })),
    workOrders: s.workOrders.map((o) => ({
      id: o.id,
      title: o.title,
      start: t(o.start),
      end: t(o.end),
      workType: o.workType,
      energized: o.energized,
      voltageKv: o.voltageKv,
      exception: o.exception,
      minCrew: o.minCrew,
      driverLicence: o.driverLicence ?? "cdl_b",
      altitudeM: o.altitudeM ?? 0,
      phases: o.phases ?? 3,
      systemKv: o.systemKv ?? null,
      lift: o.lift ?? null,
      nearEnergizedKv: o.nearEnergizedKv ?? null,
      ...(o.shifts ? { shifts: o.shifts.map((sh) => ({ start: t(sh.start), end: t(sh.end) })) } : {}),
      digs: o.digs ?? false,
      locate: o.locate ?? null,
    })),
    assignments: s.assignments,
    ...(s.equipment ? { equipment: s.equipment, equipmentAssignments: s.equipmentAssignments ?? [] } : {}),
  };
}
