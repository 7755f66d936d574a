// Work orders on Knex: list, read, create, update, cancel. Times are stored UTC; the API and
// forms speak wall-clock time in the yard's zone (zonedWallTimeToEpoch / epochToZonedWallTime).
import "@/lib/server-only";
import type { Knex } from "knex";
import { assertNoDoubleBooking } from "@/lib/orders/data-double-booking";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { getWorkType } from "@/lib/orders/data-work-types";
import { locateWarning } from "@/lib/orders/locate";
import type { OrderStatus } from "@/lib/orders/status";
import type { OrderListItem, OrderSeat, OrderView, SeriesView } from "@/lib/orders/model";
import { editValuesFromView } from "@/lib/orders/form";
import { describeRrule } from "@/lib/time/recurrence";
import { epochToZonedDate, epochToZonedWallTime, zonedWallTimeToEpoch } from "@/lib/rules/time";
import type { Position } from "@/lib/rules/types";
import { orderEditSchema, type OrderInput, type OrderPatch } from "@/lib/orders/schema";

type Q = Knex | Knex.Transaction;

export function fieldError(field: string, message: string, status = 422): ApiError {
  return new ApiError(status, message, { issues: [{ field, message }] });
}

const iso = (d: Date | string) => (d instanceof Date ? d : new Date(d)).toISOString();
const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export interface YardRow {
  id: number;
  code: string;
  name: string;
  timezone: string;
}

export async function yardOf(q: Q, organisationId: number, yardId: number, field = "yardId"): Promise<YardRow> {
  const y = await q("yards").where({ id: yardId, organisation_id: organisationId }).first();
  if (!y) throw fieldError(field, "That yard does not exist.");
  return { id: Number(y.id), code: String(y.code), name: String(y.name), timezone: String(y.timezone) };
}

/** Epoch ms of a wall-clock time in a zone, as a 422 naming the field when it cannot be read. */
export function instant(local: string, timezone: string, field: string): number {
  try {
    return zonedWallTimeToEpoch(local, timezone);
  } catch {
    throw fieldError(field, "That date or time does not exist.");
  }
}

// --- numbers ---------------------------------------------------------------------------------

/** "WO-27" for an order whose work date is in 2027. */
export const numberPrefix = (workDate: string) => `WO-${workDate.slice(2, 4)}`;

/**
 * Takes `n` consecutive work-order numbers for a prefix under a row lock on order_counters,
 * so concurrent requests on any app instance never hand out the same number. The counter
 * starts after the highest number already used with that prefix (e.g. the demo's WO-26-0112).
 */
export async function allocateNumbers(trx: Knex.Transaction, organisationId: number, prefix: string, n: number): Promise<string[]> {
  if (n <= 0) return [];
  await trx.raw(
    `INSERT IGNORE INTO order_counters (organisation_id, prefix, last)
     SELECT ?, ?, COALESCE(MAX(CAST(SUBSTRING(number, ?) AS UNSIGNED)), 0)
       FROM work_orders WHERE organisation_id = ? AND number LIKE ?`,
    [organisationId, prefix, prefix.length + 2, organisationId, `${prefix}-%`],
  );
  const row = await trx("order_counters").where({ organisation_id: organisationId, prefix }).forUpdate().first("last");
  const last = Number(row?.last ?? 0);
  await trx("order_counters").where({ organisation_id: organisationId, prefix }).update({ last: last + n });
  return Array.from({ length: n }, (_, i) => `${prefix}-${String(last + 1 + i).padStart(4, "0")}`);
}

// --- reading ---------------------------------------------------------------------------------

export interface OrderFilter {
  yardIds?: number[];
  from?: string;
  to?: string;
  statuses?: string[];
  workTypeId?: number;
  q?: string;
  ids?: number[];
  limit?: number;
}

function baseQuery(db: Q, organisationId: number) {
  return db("work_orders as o")
    .join("yards as y", "y.id", "o.yard_id")
    .join("work_types as t", "t.id", "o.work_type_id")
    .where("o.organisation_id", organisationId)
    .select(
      "o.*",
      "y.code as yard_code",
      "y.name as yard_name",
      "y.timezone",
      "t.name as work_type_name",
      "t.code as work_type_code",
      "t.rule_type",
      "t.digs",
      db.raw("(SELECT COUNT(*) FROM positions p WHERE p.work_order_id = o.id) AS position_count"),
      db.raw("(SELECT COUNT(*) FROM assignments a WHERE a.work_order_id = o.id AND a.holds_position IS NOT NULL) AS staffed_count"),
    );
}

function toListItem(r: Record<string, any>): OrderListItem {
  const tz = String(r.timezone);
  const start = new Date(r.start_at).getTime();
  const end = new Date(r.end_at).getTime();
  const item: OrderListItem = {
    id: Number(r.id),
    number: String(r.number),
    title: String(r.title),
    yardId: Number(r.yard_id),
    yardCode: String(r.yard_code),
    timezone: tz,
    workTypeId: Number(r.work_type_id),
    workTypeName: String(r.work_type_name),
    digs: Boolean(r.digs),
    address: r.address ?? null,
    structureNo: r.structure_no ?? null,
    start: iso(r.start_at),
    end: iso(r.end_at),
    startLocal: epochToZonedWallTime(start, tz),
    endLocal: epochToZonedWallTime(end, tz),
    workDate: String(r.work_date),
    lastDate: epochToZonedDate(end - 1, tz),
    status: r.status as OrderStatus,
    holdReason: r.hold_reason ?? null,
    priority: Number(r.priority),
    emergency: Boolean(r.emergency),
    energized: Boolean(r.energized),
    voltageKv: num(r.voltage_kv),
    nearEnergizedKv: num(r.near_energized_kv),
    phases: Number(r.phases) === 1 ? 1 : 3,
    systemKv: num(r.system_kv),
    altitudeM: num(r.altitude_m),
    locateTicket: r.locate_ticket ?? null,
    locateValidThrough: r.locate_valid_through ?? null,
    locateWarning: null,
    seriesId: num(r.series_id),
    positions: Number(r.position_count ?? 0),
    staffed: Number(r.staffed_count ?? 0),
    version: Number(r.version),
  };
  item.locateWarning = locateWarning(item);
  return item;
}

export async function listOrders(db: Q, organisationId: number, f: OrderFilter = {}): Promise<OrderListItem[]> {
  const q = baseQuery(db, organisationId)
    .orderBy([{ column: "o.start_at" }, { column: "o.priority" }, { column: "o.id" }])
    .limit(Math.min(f.limit ?? 500, 1000));
  if (f.yardIds?.length) q.whereIn("o.yard_id", f.yardIds);
  if (f.from) q.where("o.work_date", ">=", f.from);
  if (f.to) q.where("o.work_date", "<=", f.to);
  if (f.statuses?.length) q.whereIn("o.status", f.statuses);
  if (f.workTypeId) q.where("o.work_type_id", f.workTypeId);
  if (f.ids?.length) q.whereIn("o.id", f.ids);
  if (f.q?.trim()) {
    const like = `%${f.q.trim().replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    q.andWhere((w) =>
      w
        .where("o.title", "like", like)
        .orWhere("o.number", "like", like)
        .orWhere("o.address", "like", like)
        .orWhere("o.structure_no", "like", like),
    );
  }
  return (await q).map(toListItem);
}

export async function getOrder(db: Q, organisationId: number, id: number): Promise<OrderView | null> {
  const r = await baseQuery(db, organisationId).where("o.id", id).first();
  if (!r) return null;
  const item = toListItem(r);
  const tz = item.timezone;
  const seatRows = await db("positions as p")
    .leftJoin("assignments as a", "a.holds_position", "p.id")
    .leftJoin("workers as w", "w.id", "a.worker_id")
    .where("p.work_order_id", id)
    .orderBy(["p.sort", "p.id"])
    .select("p.id", "p.position", "p.sort", "a.worker_id", "a.status as assignment_status", "w.first_name", "w.last_name");
  const seats: OrderSeat[] = seatRows.map((s) => ({
    id: Number(s.id),
    position: s.position as Position,
    sort: Number(s.sort),
    worker: s.worker_id
      ? { id: Number(s.worker_id), name: `${s.first_name} ${s.last_name}`, status: String(s.assignment_status) }
      : null,
  }));
  let series: SeriesView | null = null;
  if (r.series_id) {
    const s = await db("order_series").where({ id: r.series_id }).first();
    if (s) series = seriesView(s);
  }
  const records = await db("time_records as tr")
    .join("workers as w", "w.id", "tr.worker_id")
    .where({ "tr.work_order_id": id, "tr.kind": "order" })
    .orderBy("w.last_name")
    .select("tr.id", "tr.worker_id", "tr.start_at", "tr.end_at", "w.first_name", "w.last_name");
  const local = (d: Date | null) => (d ? epochToZonedWallTime(new Date(d).getTime(), tz) : null);
  const shiftRows = await db("work_order_shifts").where("work_order_id", id).orderBy(["start_at", "id"]).select("start_at", "end_at");
  return {
    ...item,
    yardName: String(r.yard_name),
    workTypeCode: String(r.work_type_code),
    ruleType: String(r.rule_type),
    crewException: r.crew_exception ?? null,
    minCrew: num(r.min_crew),
    driverLicence: r.driver_licence ?? null,
    notes: r.notes ?? null,
    briefingState: String(r.briefing_state),
    actualStartLocal: local(r.actual_start_at),
    actualEndLocal: local(r.actual_end_at),
    occurrenceDate: r.occurrence_date ?? null,
    detached: Boolean(r.detached),
    seats,
    series,
    timeRecords: records.map((t) => ({
      id: Number(t.id),
      workerId: Number(t.worker_id),
      workerName: `${t.first_name} ${t.last_name}`,
      startLocal: epochToZonedWallTime(new Date(t.start_at).getTime(), tz),
      endLocal: epochToZonedWallTime(new Date(t.end_at).getTime(), tz),
      hours: Math.round(((new Date(t.end_at).getTime() - new Date(t.start_at).getTime()) / 3_600_000) * 100) / 100,
    })),
    shifts: shiftRows.map((s) => ({ startLocal: local(s.start_at)!, endLocal: local(s.end_at)! })),
  };
}

export function parseJson<T>(v: unknown, fallback: T): T {
  if (v === null || v === undefined) return fallback;
  if (typeof v !== "string") return v as T;
  try {
    return JSON.parse(v) as T;
  } catch {
    return fallback;
  }
}

export function seriesView(s: Record<string, any>): SeriesView {
  return {
    id: Number(s.id),
    rrule: String(s.rrule),
    description: describeRrule(String(s.rrule)),
    dtstartLocal: String(s.dtstart_local),
    durationMinutes: Number(s.duration_minutes),
    exdates: parseJson<string[]>(s.exdates, []),
    active: Boolean(s.active),
    version: Number(s.version ?? 1),
    materialisedThrough: s.materialised_through ?? null,
  };
}

// --- writing ---------------------------------------------------------------------------------

/** The order fields shared by a single order, a series template and each occurrence. */
export interface OrderTemplate {
  title: string;
  workTypeId: number;
  address: string | null;
  structureNo: string | null;
  energized: boolean;
  voltageKv: number | null;
  emergency: boolean;
  crewException: string | null;
  minCrew: number | null;
  priority: number;
  notes: string | null;
  status: OrderStatus;
  holdReason?: string | null;
  driverLicence: string | null;
  locateTicket: string | null;
  locateValidThrough: string | null;
  nearEnergizedKv?: number | null;
  phases?: 1 | 3;
  systemKv?: number | null;
  altitudeM?: number | null;
}

export function templateColumns(t: OrderTemplate) {
  return {
    title: t.title,
    work_type_id: t.workTypeId,
    address: t.address,
    structure_no: t.structureNo,
    energized: t.energized,
    voltage_kv: t.voltageKv,
    emergency: t.emergency,
    crew_exception: t.crewException,
    min_crew: t.minCrew,
    priority: t.priority,
    notes: t.notes,
    status: t.status,
    hold_reason: t.status === "on_hold" ? (t.holdReason ?? null) : null,
    driver_licence: t.driverLicence,
    locate_ticket: t.locateTicket,
    locate_valid_through: t.locateValidThrough,
    near_energized_kv: t.nearEnergizedKv ?? null,
    phases: t.phases ?? 3,
    system_kv: t.phases === 1 ? (t.systemKv ?? null) : null,
    ...(t.altitudeM !== undefined ? { altitude_m: t.altitudeM } : {}),
  };
}

/** Replaces an order's shifts (wall clock in its zone); a time that cannot be read is a 422 naming the row. */
export async function writeShifts(trx: Knex.Transaction, orderId: number, shifts: { start: string; end: string }[], timezone: string) {
  await trx("work_order_shifts").where("work_order_id", orderId).delete();
  if (!shifts.length) return;
  await trx("work_order_shifts").insert(
    shifts.map((s, i) => ({
      work_order_id: orderId,
      start_at: new Date(instant(s.start, timezone, `shifts.${i}.start`)),
      end_at: new Date(instant(s.end, timezone, `shifts.${i}.end`)),
    })),
  );
}

export interface NewOrderRow {
  columns: Record<string, unknown> & { work_date: string };
  positions: Position[];
}

/** Inserts orders with fresh numbers and their positions; returns the new ids in input order. */
export async function insertOrders(trx: Knex.Transaction, organisationId: number, rows: NewOrderRow[]): Promise<number[]> {
  if (rows.length === 0) return [];
  const byPrefix = new Map<string, number[]>();
  rows.forEach((r, i) => {
    const p = numberPrefix(r.columns.work_date);
    byPrefix.set(p, [...(byPrefix.get(p) ?? []), i]);
  });
  const numbers: string[] = new Array(rows.length);
  for (const [prefix, idx] of byPrefix) {
    const got = await allocateNumbers(trx, organisationId, prefix, idx.length);
    idx.forEach((i, k) => (numbers[i] = got[k]));
  }
  const inserts = rows.map((r, i) => ({ ...r.columns, organisation_id: organisationId, number: numbers[i] }));
  for (let i = 0; i < inserts.length; i += 200) await trx("work_orders").insert(inserts.slice(i, i + 200));
  const idRows = await trx("work_orders").where({ organisation_id: organisationId }).whereIn("number", numbers).select("id", "number");
  const idOf = new Map(idRows.map((r) => [String(r.number), Number(r.id)]));
  const ids = numbers.map((n) => idOf.get(n)!);
  const positions = rows.flatMap((r, i) => r.positions.map((position, sort) => ({ work_order_id: ids[i], position, sort })));
  for (let i = 0; i < positions.length; i += 500) await trx("positions").insert(positions.slice(i, i + 500));
  return ids;
}

/**
 * Keeps the 'order' time records of an order in step with its status: when it is done with
 * actual times, one record per worker holding a seat (live assignments); otherwise none.
 */
export async function syncOrderTimeRecords(
  trx: Knex.Transaction,
  orderId: number,
  status: string,
  actualStart: Date | null,
  actualEnd: Date | null,
  actorId: number | null,
): Promise<number[]> {
  await trx("time_records").where({ work_order_id: orderId, kind: "order" }).delete();
  if (status !== "done" || !actualStart || !actualEnd) return [];
  const crew = await trx("assignments")
    .where({ work_order_id: orderId })
    .whereNotNull("holds_position")
    .distinct("worker_id")
    .pluck("worker_id");
  if (crew.length === 0) return [];
  await trx("time_records").insert(
    crew.map((w: number) => ({
      worker_id: w,
      start_at: actualStart,
      end_at: actualEnd,
      kind: "order",
      work_order_id: orderId,
      reason: null,
      created_by: actorId,
    })),
  );
  return crew.map(Number);
}

/** Creates a single (non-repeating) order. Repeating orders go through lib/orders/data-series.ts. */
export async function createOrder(trx: Knex.Transaction, actor: Actor, input: OrderInput) {
  const org = actor.organisationId;
  const yard = await yardOf(trx, org, input.yardId);
  const type = await getWorkType(trx, org, input.workTypeId);
  if (!type) throw fieldError("workTypeId", "That work type does not exist.");
  const start = instant(input.start, yard.timezone, "start");
  const end = instant(input.end, yard.timezone, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  const workDate = epochToZonedDate(start, yard.timezone);
  const actualStart = input.actualStart ? new Date(instant(input.actualStart, yard.timezone, "actualStart")) : null;
  const actualEnd = input.actualEnd ? new Date(instant(input.actualEnd, yard.timezone, "actualEnd")) : null;
  const [id] = await insertOrders(trx, org, [
    {
      columns: {
        ...templateColumns(input),
        yard_id: yard.id,
        start_at: new Date(start),
        end_at: new Date(end),
        work_date: workDate,
        actual_start_at: actualStart,
        actual_end_at: actualEnd,
        created_by: actor.id,
      },
      positions: input.positions.map((p) => p.position),
    },
  ]);
  await writeShifts(trx, id, input.shifts ?? [], yard.timezone);
  await audit(trx, actor, org, "order.create", "work_order", id, { title: input.title, workDate, yard: yard.code, ...(input.shifts?.length ? { shifts: input.shifts.length } : {}) });
  await boardEvent(trx, { organisationId: org, yardId: yard.id, day: workDate, kind: "order", payload: { orderId: id } });
  return { id, workDate };
}

const CHANGE_KEYS = [
  "title",
  "yardId",
  "workTypeId",
  "address",
  "structureNo",
  "start",
  "end",
  "energized",
  "voltageKv",
  "emergency",
  "crewException",
  "minCrew",
  "priority",
  "notes",
  "status",
  "holdReason",
  "driverLicence",
  "locateTicket",
  "locateValidThrough",
  "actualStart",
  "actualEnd",
  "nearEnergizedKv",
  "phases",
  "systemKv",
  "altitudeM",
  "shifts",
] as const;

/**
 * Applies a PATCH: stale version → 409 with the current order; the merged order is checked
 * with the same schema as the form (422 naming the field). Positions keep their ids; a
 * position someone holds cannot be removed (take them off on the board first).
 */
export async function updateOrder(trx: Knex.Transaction, actor: Actor, id: number, patch: OrderPatch): Promise<OrderView> {
  const org = actor.organisationId;
  const locked = await trx("work_orders").where({ id, organisation_id: org }).forUpdate().first("id", "version");
  if (!locked) throw new ApiError(404, "No such work order.");
  const current = (await getOrder(trx, org, id))!;
  if (Number(locked.version) !== patch.version) {
    throw new ApiError(409, "Someone else changed this order since you loaded it. Reload to see their changes.", { current });
  }
  const before = editValuesFromView(current);
  const merged = orderEditSchema.parse({ ...before, ...stripUndefined(patch) });
  const yard = merged.yardId === current.yardId ? { id: current.yardId, timezone: current.timezone, code: current.yardCode } : await yardOf(trx, org, merged.yardId);
  if (merged.workTypeId !== current.workTypeId && !(await getWorkType(trx, org, merged.workTypeId)))
    throw fieldError("workTypeId", "That work type does not exist.");
  const start = instant(merged.start, yard.timezone, "start");
  const end = instant(merged.end, yard.timezone, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  const actualStart = merged.actualStart ? new Date(instant(merged.actualStart, yard.timezone, "actualStart")) : null;
  const actualEnd = merged.actualEnd ? new Date(instant(merged.actualEnd, yard.timezone, "actualEnd")) : null;
  if (actualStart && actualEnd && actualEnd <= actualStart) throw fieldError("actualEnd", "The actual end must be after the actual start.");
  const workDate = epochToZonedDate(start, yard.timezone);

  // Positions: keep by id, add new ones, remove the rest unless someone holds them.
  let positionsChanged = false;
  if (patch.positions) {
    const currentIds = new Set(current.seats.map((s) => s.id));
    for (const p of merged.positions) {
      if (p.id !== undefined && !currentIds.has(p.id)) throw fieldError("positions", `Position ${p.id} is not on this order.`);
    }
    const keep = new Set(merged.positions.filter((p) => p.id !== undefined).map((p) => p.id!));
    const removed = current.seats.filter((s) => !keep.has(s.id));
    const held = removed.find((s) => s.worker);
    if (held)
      throw fieldError(
        "positions",
        `${held.worker!.name} holds the ${held.position} position; take them off on the board before removing it.`,
      );
    if (removed.length) {
      await trx("positions").whereIn("id", removed.map((s) => s.id)).delete();
      positionsChanged = true;
    }
    for (const [sort, p] of merged.positions.entries()) {
      if (p.id === undefined) {
        await trx("positions").insert({ work_order_id: id, position: p.position, sort });
        positionsChanged = true;
      } else {
        const seat = current.seats.find((s) => s.id === p.id)!;
        if (seat.position !== p.position || seat.sort !== sort) {
          await trx("positions").where({ id: p.id }).update({ position: p.position, sort });
          positionsChanged = true;
        }
      }
    }
  }

  const changed: string[] = CHANGE_KEYS.filter((k) => JSON.stringify(before[k] ?? null) !== JSON.stringify(merged[k] ?? null));
  if (positionsChanged) changed.push("positions");
  if (changed.length === 0) return current; // nothing to write: no new version, audit row or event
  // New times or a cancelled order brought back: its crew may not be elsewhere then.
  if (changed.some((k) => k === "start" || k === "end" || k === "status" || k === "yardId")) {
    await assertNoDoubleBooking(trx, id, { startMs: start, endMs: end, status: merged.status });
  }
  await trx("work_orders")
    .where({ id })
    .update({
      ...templateColumns({ ...merged, status: merged.status }),
      yard_id: yard.id,
      start_at: new Date(start),
      end_at: new Date(end),
      work_date: workDate,
      actual_start_at: actualStart,
      actual_end_at: actualEnd,
      // An occurrence edited on its own keeps its edits when the series changes.
      detached: current.seriesId ? current.detached || changed.length > 0 : false,
      version: current.version + 1,
      updated_at: new Date(),
    });
  if (changed.includes("shifts") || yard.timezone !== current.timezone) await writeShifts(trx, id, merged.shifts ?? [], yard.timezone);
  const wasDone = current.status === "done";
  const timeTouched = changed.some((k) => k === "status" || k === "actualStart" || k === "actualEnd");
  let crew: number[] = [];
  if (timeTouched || (merged.status === "done" && positionsChanged) || wasDone !== (merged.status === "done")) {
    crew = await syncOrderTimeRecords(trx, id, merged.status, actualStart, actualEnd, actor.id);
  }
  const action = merged.status !== current.status ? `order.${merged.status === "done" ? "done" : "status"}` : "order.update";
  await audit(trx, actor, org, action, "work_order", id, {
    changed,
    from: pick(before, changed),
    to: pick(merged, changed),
    ...(crew.length ? { timeRecordsFor: crew } : {}),
  });
  const days = new Set([current.workDate, workDate]);
  for (const day of days) {
    await boardEvent(trx, { organisationId: org, yardId: yard.id, day, kind: "order", payload: { orderId: id } });
  }
  if (yard.id !== current.yardId)
    await boardEvent(trx, { organisationId: org, yardId: current.yardId, day: current.workDate, kind: "order", payload: { orderId: id } });
  return (await getOrder(trx, org, id))!;
}

/** DELETE: cancels (the row and its history stay). A version, when given, must match. */
export async function cancelOrder(trx: Knex.Transaction, actor: Actor, id: number, version?: number): Promise<OrderView> {
  const org = actor.organisationId;
  const locked = await trx("work_orders").where({ id, organisation_id: org }).forUpdate().first("id", "version", "status");
  if (!locked) throw new ApiError(404, "No such work order.");
  const current = (await getOrder(trx, org, id))!;
  if (version !== undefined && Number(locked.version) !== version)
    throw new ApiError(409, "Someone else changed this order since you loaded it. Reload to see their changes.", { current });
  if (current.status === "cancelled") return current;
  await trx("work_orders")
    .where({ id })
    .update({ status: "cancelled", hold_reason: null, detached: current.seriesId !== null, version: current.version + 1, updated_at: new Date() });
  await syncOrderTimeRecords(trx, id, "cancelled", null, null, actor.id);
  await audit(trx, actor, org, "order.cancel", "work_order", id, { from: current.status });
  await boardEvent(trx, { organisationId: org, yardId: current.yardId, day: current.workDate, kind: "order", payload: { orderId: id } });
  return (await getOrder(trx, org, id))!;
}

function stripUndefined<T extends Record<string, unknown>>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
}

function pick(o: Record<string, unknown>, keys: readonly string[]) {
  return Object.fromEntries(keys.filter((k) => k !== "positions").map((k) => [k, o[k] ?? null]));
}

/** An order's id by its number (WO-26-0101), or null. */
export async function orderIdByNumber(db: Q, organisationId: number, number: string): Promise<number | null> {
  const o = await db("work_orders").where({ organisation_id: organisationId, number }).first("id");
  return o ? Number(o.id) : null;
}

/** Order numbers by id, for the orders among `ids` that belong to the organisation. */
export async function orderNumbers(db: Q, organisationId: number, ids: number[]): Promise<Map<number, string>> {
  if (!ids.length) return new Map();
  const rows = await db("work_orders").where({ organisation_id: organisationId }).whereIn("id", ids).select("id", "number");
  return new Map(rows.map((o: { id: number; number: string }) => [Number(o.id), o.number]));
}

/** The positions `ids` with their order's organisation, yard, day and number (Fill: accept). */
export async function positionsWithOrders(db: Knex, ids: number[]) {
  return db("positions as p")
    .join("work_orders as o", "o.id", "p.work_order_id")
    .whereIn("p.id", ids)
    .select("p.id", "p.work_order_id", "o.organisation_id", "o.yard_id", "o.work_date", "o.number");
}

/** An order's organisation, yard and day, or undefined. */
export async function orderPlace(db: Knex, id: number): Promise<{ organisation_id: number; yard_id: number; work_date: string } | undefined> {
  return db("work_orders").where({ id }).first("organisation_id", "yard_id", "work_date");
}
