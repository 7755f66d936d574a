import "@/lib/server-only";
import { createHash } from "node:crypto";
import type { Knex } from "knex";
import type { AssignmentStatus, BoardPayload, OrderCard, OverrideView, PoolWorker, Seat } from "@/lib/board/model";
import { findingKey } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import type { Assignment, DaySnapshot, Finding, Position, Worker, WorkOrder, WorkType } from "@/lib/rules/types";
import { locateWarning } from "@/lib/orders/locate";
import { attachEquipment, boardEquipment } from "@/lib/equipment/data-snapshot";
import { attachGear } from "@/lib/gear/data-snapshot";
import { latestEventId } from "@/lib/events/data";
import { placedElsewhere } from "./data-placed-elsewhere";
import { getPolicy } from "@/lib/policies/data";
import { type Yard } from "@/lib/yards/data";
import { addDays } from "@/lib/time/days";

const HOUR = 3_600_000;
/** Worked time this far either side of the day can still join a stretch that touches it. */
const CONTEXT_HOURS = 48;

export interface DayWindow {
  day: string;
  start: number; // local midnight, epoch ms
  end: number; // next local midnight
}

export function dayWindow(day: string, timezone: string): DayWindow {
  return {
    day,
    start: zonedWallTimeToEpoch(`${day}T00:00`, timezone),
    end: zonedWallTimeToEpoch(`${addDays(day, 1)}T00:00`, timezone),
  };
}

/** A crew's fingerprint: the seats and who holds them. An override is given for one crew. */
export function crewHash(seats: { positionId: number; workerId: number }[]) {
  const key = seats
    .map((s) => `${s.positionId}:${s.workerId}`)
    .sort()
    .join(",");
  return createHash("sha1").update(key).digest("hex");
}

const ms = (d: Date | string) => (d instanceof Date ? d.getTime() : new Date(d).getTime());

interface OrderRow {
  id: number;
  yard_id: number;
  number: string;
  title: string;
  work_type_code: string;
  work_type_name: string;
  rule_type: WorkType;
  digs: number;
  address: string | null;
  structure_no: string | null;
  start_at: Date;
  end_at: Date;
  energized: number;
  voltage_kv: string | null;
  emergency: number;
  crew_exception: string | null;
  min_crew: number | null;
  driver_licence: "cdl_a" | "cdl_b" | null;
  priority: number;
  status: string;
  hold_reason: string | null;
  briefing_state: string;
  locate_ticket: string | null;
  locate_valid_through: string | null;
  near_energized_kv: string | null;
  phases: number;
  system_kv: string | null;
  altitude_m: number | null;
  elevation_m: number | null;
  version: number;
  timezone: string;
}

const ORDER_COLUMNS = [
  "o.id",
  "o.yard_id",
  "o.number",
  "o.title",
  "wt.code as work_type_code",
  "wt.name as work_type_name",
  "wt.rule_type",
  "wt.digs",
  "o.address",
  "o.structure_no",
  "o.start_at",
  "o.end_at",
  "o.energized",
  "o.voltage_kv",
  "o.emergency",
  "o.crew_exception",
  "o.min_crew",
  "o.driver_licence",
  "o.priority",
  "o.status",
  "o.hold_reason",
  "o.briefing_state",
  "o.locate_ticket",
  "o.locate_valid_through",
  "o.near_energized_kv",
  "o.phases",
  "o.system_kv",
  "o.altitude_m",
  "y.elevation_m",
  "o.version",
  "y.timezone",
];

function orderQuery(db: Knex | Knex.Transaction) {
  return db("work_orders as o")
    .join("work_types as wt", "wt.id", "o.work_type_id")
    .join("yards as y", "y.id", "o.yard_id")
    .select(ORDER_COLUMNS);
}

/** A multi-day order's worked shifts (epoch ms), by order id. */
type ShiftMap = Map<number, { start: number; end: number }[]>;

async function orderShifts(db: Knex | Knex.Transaction, orderIds: number[]): Promise<ShiftMap> {
  const m: ShiftMap = new Map();
  if (!orderIds.length) return m;
  const rows = await db("work_order_shifts").whereIn("work_order_id", orderIds).orderBy(["work_order_id", "start_at"]).select("work_order_id", "start_at", "end_at");
  for (const r of rows) {
    const list = m.get(r.work_order_id) ?? [];
    list.push({ start: ms(r.start_at), end: ms(r.end_at) });
    m.set(r.work_order_id, list);
  }
  return m;
}

const kv = (v: string | number | null | undefined) => (v === null || v === undefined ? null : Number(v));

function toRuleOrder(o: OrderRow, shifts?: ShiftMap): WorkOrder {
  const start = ms(o.start_at);
  const end = ms(o.end_at);
  const exception = (o.crew_exception as WorkOrder["exception"]) ?? (o.emergency ? "emergency" : null);
  const ticket = o.locate_ticket?.trim();
  // Issue 14 (CREW-CHECK.md, Corrections 2, 6, 7 and 8): the site's nearby voltage, a
  // single-phase tap's phases and system voltage, the order's shifts and its locate ticket.
  const site = {
    nearEnergizedKv: kv(o.near_energized_kv),
    phases: o.phases === 1 ? 1 : 3,
    systemKv: kv(o.system_kv),
    // Issue 16: the site's elevation (the order's own, else its yard's) for Table R-5.
    altitudeM: o.altitude_m ?? o.elevation_m ?? 0,
    digs: Boolean(o.digs),
    locate: ticket && o.locate_valid_through ? { ticket, validThrough: o.locate_valid_through } : null,
    ...(shifts?.get(o.id)?.length ? { shifts: shifts.get(o.id) } : {}),
  };
  return {
    ...site,
    id: String(o.id),
    title: o.title,
    start,
    end,
    startDate: epochToZonedDate(start, o.timezone),
    endDate: epochToZonedDate(end - 1, o.timezone),
    workType: o.rule_type,
    energized: Boolean(o.energized),
    voltageKv: o.voltage_kv === null ? null : Number(o.voltage_kv),
    exception,
    minCrew: o.min_crew,
    driverLicence: o.driver_licence ?? "cdl_b",
  };
}

interface LiveAssignment {
  id: number;
  work_order_id: number;
  position_id: number;
  worker_id: number;
  status: string;
  version: number;
  reply_code: string;
  sent_at: Date | null;
  responded_at: Date | null;
  position: Position;
}

async function liveAssignments(db: Knex | Knex.Transaction, where: (q: Knex.QueryBuilder) => void) {
  const q = db("assignments as a")
    .join("positions as p", "p.id", "a.position_id")
    .whereNotNull("a.holds_position")
    .select(
      "a.id",
      "a.work_order_id",
      "a.position_id",
      "a.worker_id",
      "a.status",
      "a.version",
      "a.reply_code",
      "a.sent_at",
      "a.responded_at",
      "p.position",
    );
  where(q);
  return (await q) as LiveAssignment[];
}

/**
 * Builds the rule snapshot for a set of workers and orders: their credentials, leave and
 * worked time near the window, and every other order those workers are on near the window
 * (so REST and DOUBLE_BOOKED see across yards and days).
 */
export async function buildSnapshot(
  db: Knex | Knex.Transaction,
  opts: {
    organisationId: number;
    timezone: string;
    windowStart: number;
    windowEnd: number;
    orders: OrderRow[];
    assignments: LiveAssignment[];
    workerIds: number[];
  },
) {
  const { organisationId, timezone } = opts;
  const from = new Date(opts.windowStart - CONTEXT_HOURS * HOUR);
  const to = new Date(opts.windowEnd + CONTEXT_HOURS * HOUR);
  const workerIds = [...new Set([...opts.workerIds, ...opts.assignments.map((a) => a.worker_id)])];
  const policy = await getPolicy(db, organisationId);
  const shiftsOf = await orderShifts(db, opts.orders.map((o) => o.id));
  if (workerIds.length === 0) {
    return {
      policy,
      snapshot: await attachGear(db, await attachEquipment(db, organisationId, opts.orders.map((o) => o.id), from, to, {
        timezone,
        policy: policy.rules,
        workers: [],
        workOrders: opts.orders.map((o) => toRuleOrder(o, shiftsOf)),
        assignments: [],
      } satisfies DaySnapshot, ruleOrdersOf(db))),
      workerRows: [] as Record<string, unknown>[],
      contextAssignments: [] as LiveAssignment[],
    };
  }
  const orderIds = new Set(opts.orders.map((o) => o.id));
  const inList = (q: Knex.QueryBuilder, col: string) => q.whereIn(col, workerIds);

  type Row = Record<string, any>;
  const [workerRows, creds, unavail, records, context]: Row[][] = await Promise.all([
    db("workers as w")
      .join("yards as y", "y.id", "w.yard_id")
      .where("w.organisation_id", organisationId)
      .whereIn("w.id", workerIds)
      .select("w.id", "w.first_name", "w.last_name", "w.employee_no", "w.classification", "w.yard_id", "y.code as yard_code", "w.phone_e164", "w.active"),
    inList(
      db("credentials as c")
        .join("qualification_types as q", "q.id", "c.qualification_type_id")
        .where("c.status", "current")
        .select("c.worker_id", "q.code", "c.expires_on"),
      "c.worker_id",
    ),
    inList(
      db("unavailability")
        .where("status", "approved")
        .where("start_at", "<", to)
        .where("end_at", ">", from)
        .select("worker_id", "start_at", "end_at", "kind"),
      "worker_id",
    ),
    inList(
      db("time_records").where("start_at", "<", to).where("end_at", ">", from).select("worker_id", "start_at", "end_at"),
      "worker_id",
    ),
    // The same workers' live assignments on other orders near the window.
    db("assignments as a")
      .join("positions as p", "p.id", "a.position_id")
      .join("work_orders as o", "o.id", "a.work_order_id")
      .whereNotNull("a.holds_position")
      .whereIn("a.worker_id", workerIds)
      .whereNotIn("o.status", ["cancelled"])
      .where("o.start_at", "<", to)
      .where("o.end_at", ">", from)
      .select("a.id", "a.work_order_id", "a.position_id", "a.worker_id", "a.status", "a.version", "a.reply_code", "a.sent_at", "a.responded_at", "p.position"),
  ]);

  const contextAssignments = (context as LiveAssignment[]).filter((a) => !orderIds.has(a.work_order_id));
  const contextOrderIds = [...new Set(contextAssignments.map((a) => a.work_order_id))];
  const contextOrders = contextOrderIds.length
    ? ((await orderQuery(db).whereIn("o.id", contextOrderIds)) as OrderRow[])
    : [];
  for (const [id, list] of await orderShifts(db, contextOrderIds)) shiftsOf.set(id, list);

  const credsBy = groupBy(creds, (c) => c.worker_id);
  const unavailBy = groupBy(unavail, (u) => u.worker_id);
  const recordsBy = groupBy(records, (r) => r.worker_id);

  const workers: Worker[] = workerRows.map((w) => ({
    id: String(w.id),
    name: `${w.first_name} ${w.last_name}`,
    classification: w.classification,
    credentials: (credsBy.get(w.id) ?? []).map((c) => ({ type: c.code, expiresOn: c.expires_on ?? null })),
    unavailable: (unavailBy.get(w.id) ?? []).map((u) => ({ start: ms(u.start_at), end: ms(u.end_at), reason: u.kind })),
    timeRecords: (recordsBy.get(w.id) ?? []).map((r) => ({ start: ms(r.start_at), end: ms(r.end_at) })),
  }));

  const all = [...opts.assignments, ...contextAssignments];
  const snapshot: DaySnapshot = {
    timezone,
    policy: policy.rules,
    workers,
    workOrders: [...opts.orders, ...contextOrders].map((o) => toRuleOrder(o, shiftsOf)),
    assignments: all.map(
      (a): Assignment => ({ workOrderId: String(a.work_order_id), workerId: String(a.worker_id), position: a.position }),
    ),
  };
  await attachEquipment(db, organisationId, opts.orders.map((o) => o.id), from, to, snapshot, ruleOrdersOf(db));
  // Issue 16: every worker's rubber goods (empty when none) and the orders' lift plans.
  await attachGear(db, snapshot, epochToZonedDate(opts.windowStart, timezone));
  return { policy, snapshot, workerRows, contextAssignments };
}

/** Orders as the rules read them, by id (the equipment's context orders; lib/equipment/data-snapshot.ts). */
function ruleOrdersOf(db: Knex | Knex.Transaction) {
  return async (ids: number[]) => ((await orderQuery(db).whereIn("o.id", ids)) as OrderRow[]).map((o) => toRuleOrder(o));
}

function groupBy<T>(rows: T[], key: (r: T) => number) {
  const m = new Map<number, T[]>();
  for (const r of rows) {
    const k = key(r);
    const list = m.get(k);
    if (list) list.push(r);
    else m.set(k, [r]);
  }
  return m;
}

/** Orders of one yard and day (cancelled ones left out), in start order. */
export async function dayOrders(db: Knex | Knex.Transaction, organisationId: number, yardId: number, day: string) {
  return (await orderQuery(db)
    .where("o.organisation_id", organisationId)
    .where("o.yard_id", yardId)
    .where("o.work_date", day)
    .whereNot("o.status", "cancelled")
    .orderBy([{ column: "o.start_at" }, { column: "o.priority" }, { column: "o.number" }])) as OrderRow[];
}

export async function loadBoard(
  db: Knex,
  opts: { organisationId: number; yard: Yard; yards: Yard[]; day: string },
): Promise<BoardPayload> {
  const { organisationId, yard, day } = opts;
  const window = dayWindow(day, yard.timezone);
  const orders = await dayOrders(db, organisationId, yard.id, day);
  const orderIds = orders.map((o) => o.id);

  const [positions, assignments, activeWorkers, overrideRows, declines, cursor] = await Promise.all([
    orderIds.length
      ? db("positions").whereIn("work_order_id", orderIds).orderBy(["work_order_id", "sort", "id"]).select("id", "work_order_id", "position", "sort")
      : [],
    orderIds.length ? liveAssignments(db, (q) => q.whereIn("a.work_order_id", orderIds)) : [],
    db("workers").where({ organisation_id: organisationId, active: true }).pluck("id"),
    orderIds.length
      ? db("overrides as v")
          .join("users as u", "u.id", "v.actor_user_id")
          .whereIn("v.work_order_id", orderIds)
          .whereNull("v.lapsed_at")
          .select("v.*", "u.name as actor_name")
      : [],
    orderIds.length
      ? db("assignments as a")
          .join("workers as w", "w.id", "a.worker_id")
          .whereIn("a.work_order_id", orderIds)
          .where("a.status", "declined")
          .orderBy("a.responded_at", "desc")
          .select("a.position_id", "a.worker_id", "a.decline_reason", "a.responded_at", "w.first_name", "w.last_name")
      : [],
    latestEventId(db, organisationId),
  ]);

  const { policy, snapshot, workerRows } = await buildSnapshot(db, {
    organisationId,
    timezone: yard.timezone,
    windowStart: window.start,
    windowEnd: window.end,
    orders,
    assignments,
    workerIds: activeWorkers as number[],
  });

  const boardOrderIds = orderIds.map(String);
  const ruleShifts = new Map(snapshot.workOrders.map((w) => [Number(w.id), w.shifts ?? []]));
  const findings = findingsForOrders(snapshot, boardOrderIds);

  const byPosition = new Map(assignments.map((a) => [a.position_id, a]));
  const lastDecline = new Map<number, (typeof declines)[number]>();
  for (const d of declines) if (!lastDecline.has(d.position_id)) lastDecline.set(d.position_id, d);
  const positionsBy = groupBy(positions as { id: number; work_order_id: number; position: Position; sort: number }[], (p) => p.work_order_id);
  const now = Date.now();

  const cards: OrderCard[] = orders.map((o) => {
    const seats: Seat[] = (positionsBy.get(o.id) ?? []).map((p) => {
      const a = byPosition.get(p.id);
      const d = !a ? lastDecline.get(p.id) : undefined;
      return {
        id: p.id,
        position: p.position,
        sort: p.sort,
        assignment: a
          ? {
              id: a.id,
              workerId: a.worker_id,
              status: a.status as AssignmentStatus,
              version: a.version,
              replyCode: a.reply_code,
              sentAt: a.sent_at ? new Date(a.sent_at).toISOString() : null,
              respondedAt: a.responded_at ? new Date(a.responded_at).toISOString() : null,
              noReply:
                (a.status === "sent" || a.status === "delivered") &&
                now >= ms(o.start_at) - policy.replyDeadlineHours * HOUR,
            }
          : null,
        declinedBy: d
          ? {
              workerId: d.worker_id,
              name: `${d.first_name} ${d.last_name}`,
              reason: d.decline_reason,
              at: d.responded_at ? new Date(d.responded_at).toISOString() : null,
            }
          : null,
      };
    });
    return {
      id: o.id,
      number: o.number,
      title: o.title,
      workTypeCode: o.work_type_code,
      workTypeName: o.work_type_name,
      ruleType: o.rule_type,
      address: o.address,
      structureNo: o.structure_no,
      start: new Date(o.start_at).toISOString(),
      end: new Date(o.end_at).toISOString(),
      energized: Boolean(o.energized),
      voltageKv: o.voltage_kv === null ? null : Number(o.voltage_kv),
      phases: o.phases === 1 ? 1 : 3,
      systemKv: kv(o.system_kv),
      nearEnergizedKv: kv(o.near_energized_kv),
      shifts: (ruleShifts.get(o.id) ?? []).map((s) => ({ start: new Date(s.start).toISOString(), end: new Date(s.end).toISOString() })),
      emergency: Boolean(o.emergency),
      crewException: o.crew_exception,
      minCrew: o.min_crew,
      priority: o.priority,
      status: o.status,
      holdReason: o.hold_reason,
      briefingState: o.briefing_state,
      locateTicket: o.locate_ticket,
      locateValidThrough: o.locate_valid_through,
      digs: Boolean(o.digs),
      locateWarning: locateWarning({
        digs: Boolean(o.digs),
        locateTicket: o.locate_ticket,
        locateValidThrough: o.locate_valid_through,
        workDate: day,
        lastDate: epochToZonedDate(ms(o.end_at) - 1, o.timezone),
      }),
      version: o.version,
      crewHash: crewHash(seats.filter((s) => s.assignment).map((s) => ({ positionId: s.id, workerId: s.assignment!.workerId }))),
      seats,
    };
  });

  const hashOf = new Map(cards.map((c) => [c.id, c.crewHash]));
  const overrides: OverrideView[] = overrideRows.map((v: Record<string, any>) => ({
    id: v.id,
    workOrderId: v.work_order_id,
    rule: v.rule,
    workerId: v.worker_id,
    reason: v.reason,
    actorName: v.actor_name,
    createdAt: new Date(v.created_at).toISOString(),
    valid: hashOf.get(v.work_order_id) === v.crew_hash,
  }));

  const firstStart = orders.length ? Math.min(...orders.map((o) => ms(o.start_at))) : window.start + 7 * HOUR;
  const ruleWorkers = new Map(snapshot.workers.map((x) => [x.id, x]));
  const pool: PoolWorker[] = workerRows.map((w: Record<string, any>) =>
    poolEntry(w, ruleWorkers.get(String(w.id)), firstStart, window),
  );
  pool.sort((a, b) => (a.yardId === yard.id ? 0 : 1) - (b.yardId === yard.id ? 0 : 1) || a.name.localeCompare(b.name));

  return {
    day,
    yard: { id: yard.id, code: yard.code, name: yard.name, timezone: yard.timezone },
    yards: opts.yards.map((y) => ({ id: y.id, code: y.code, name: y.name })),
    orders: cards,
    pool,
    snapshot,
    boardOrderIds,
    findings,
    overrides,
    onCall: [],
    policy: {
      minRestHours: policy.minRestHours,
      maxShiftHours: policy.maxShiftHours,
      credentialWarnDays: policy.credentialWarnDays,
      replyDeadlineHours: policy.replyDeadlineHours,
    },
    cursor,
    ...(await boardEquipment(db, organisationId, orderIds)),
    placedElsewhere: await placedElsewhere(db, organisationId, yard.id, window),
    fakesEnabled: process.env.FAKES_ENABLED === "1",
    generatedAt: new Date().toISOString(),
  };
}

function poolEntry(w: Record<string, any>, sw: Worker | undefined, firstStart: number, window: DayWindow): PoolWorker {
  let lastEnd: number | null = null;
  for (const r of sw?.timeRecords ?? []) if (r.end <= firstStart && (lastEnd === null || r.end > lastEnd)) lastEnd = r.end;
  const away = (sw?.unavailable ?? []).find((u) => u.start < window.end && u.end > window.start);
  return {
    id: w.id,
    name: `${w.first_name} ${w.last_name}`,
    employeeNo: w.employee_no,
    classification: w.classification,
    yardId: w.yard_id,
    yardCode: w.yard_code,
    phone: w.phone_e164,
    restHours: lastEnd === null ? null : Math.round(((firstStart - lastEnd) / HOUR) * 10) / 10,
    lastWorkedEnd: lastEnd === null ? null : new Date(lastEnd).toISOString(),
    unavailableReason: away ? away.reason : null,
    onCallTonight: false,
  };
}

/** Block findings with no valid override: what stops Send crews. */
export function unresolvedBlocks(findings: Finding[], overrides: OverrideView[]) {
  const valid = new Set(overrides.filter((o) => o.valid).map((o) => findingKey(o)));
  return findings.filter((f) => f.level === "block" && (f.locked || !valid.has(findingKey(f))));
}

export { orderQuery, liveAssignments, toRuleOrder, orderShifts };
export type { OrderRow, LiveAssignment };
