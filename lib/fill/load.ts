// The fill problem for a yard and day, from the database: the day's orders and seats, the
// rule snapshot (lib/board/data.ts's buildSnapshot: credentials, leave, worked time and the
// workers' other orders near the day), every active worker of the organisation as the pool,
// their overtime over the last 28 days and yesterday's crews. Reads only.
//
// "Worked together yesterday" proxy: two workers held live assignments on the same work order
// dated the day before (any yard), or both have time records tied to the same work order that
// started the day before. Either is a crew that went out together.

import type { Knex } from "knex";
import { buildSnapshot, crewHash, dayOrders, dayWindow, liveAssignments, type OrderRow } from "@/lib/board/data";
import { type Yard } from "@/lib/yards/data";
import { addDays } from "@/lib/time/days";
import type { Position } from "@/lib/rules/types";
import { OVERTIME_WINDOW_DAYS, overtimeHours } from "./overtime";
import type { FillOrder, FillProblem, FillWorker } from "./types";

const HOUR = 3_600_000;
/** Orders the fill may staff: not started, not finished, not held or cancelled. */
export const FILLABLE_STATUSES = new Set(["draft", "planned", "sent"]);

export interface FillMeta {
  day: string;
  yard: { id: number; code: string; name: string; timezone: string };
  orders: Map<string, { id: number; number: string; title: string; priority: number; status: string; start: string; end: string; crewHash?: string }>;
  workers: Map<string, { id: number; name: string; classification: string; yardCode: string; phone: string | null; overtimeHours: number; active: boolean }>;
  /** Orders with a valid supervisor override: it lapses when the crew changes. */
  overridden: Map<string, Array<{ rule: string; workerId: number | null; reason: string }>>;
  positions: Map<string, { orderId: number; position: Position }>;
}

export async function loadFillProblem(
  db: Knex,
  opts: { organisationId: number; yard: Yard; day: string; orderIds?: number[]; statuses?: ReadonlySet<string> },
): Promise<{ problem: FillProblem; meta: FillMeta }> {
  const { organisationId, yard, day } = opts;
  const window = dayWindow(day, yard.timezone);
  const orders = (await dayOrders(db, organisationId, yard.id, day)) as OrderRow[];
  const orderIds = orders.map((o) => o.id);
  const statuses = opts.statuses ?? FILLABLE_STATUSES;
  const fillable = orders.filter((o) => statuses.has(o.status) && (!opts.orderIds || opts.orderIds.includes(o.id)));

  const [positions, assignments, active, declines, overrides] = await Promise.all([
    fillable.length
      ? db("positions").whereIn("work_order_id", fillable.map((o) => o.id)).orderBy(["work_order_id", "sort", "id"]).select("id", "work_order_id", "position")
      : [],
    orderIds.length ? liveAssignments(db, (q) => q.whereIn("a.work_order_id", orderIds)) : [],
    db("workers").where({ organisation_id: organisationId, active: true }).pluck("id"),
    fillable.length
      ? db("assignments")
          .whereIn("work_order_id", fillable.map((o) => o.id))
          .where("status", "declined")
          .orderBy("responded_at", "desc")
          .select("position_id", "worker_id")
      : [],
    fillable.length
      ? db("overrides as v")
          .join("work_orders as o", "o.id", "v.work_order_id")
          .whereIn("v.work_order_id", fillable.map((o) => o.id))
          .whereNull("v.lapsed_at")
          .select("v.work_order_id", "v.rule", "v.worker_id", "v.reason", "v.crew_hash")
      : [],
  ]);

  const { policy, snapshot, workerRows } = await buildSnapshot(db, {
    organisationId,
    timezone: yard.timezone,
    windowStart: window.start,
    windowEnd: window.end,
    orders,
    assignments,
    workerIds: active as number[],
  });

  // Overtime: worked time over the 28 days before the day.
  const activeIds = new Set((active as number[]).map(Number));
  const poolRows = (workerRows as Record<string, any>[]).filter((w) => activeIds.has(Number(w.id)));
  const from = new Date(window.start - (OVERTIME_WINDOW_DAYS + 1) * 24 * HOUR);
  const records = poolRows.length
    ? await db("time_records")
        .whereIn("worker_id", poolRows.map((w) => w.id))
        .where("start_at", "<", new Date(window.start))
        .where("end_at", ">", from)
        .select("worker_id", "start_at", "end_at")
    : [];
  const recordsBy = new Map<number, { start: number; end: number }[]>();
  for (const r of records) {
    const list = recordsBy.get(r.worker_id) ?? [];
    list.push({ start: new Date(r.start_at).getTime(), end: new Date(r.end_at).getTime() });
    recordsBy.set(r.worker_id, list);
  }
  const cache = new Map<string, number>();
  const workers: FillWorker[] = poolRows.map((w) => ({
    id: String(w.id),
    name: `${w.first_name} ${w.last_name}`,
    classification: w.classification,
    yardId: String(w.yard_id),
    yardCode: w.yard_code,
    phone: w.phone_e164 ?? null,
    overtimeHours: overtimeHours(recordsBy.get(Number(w.id)) ?? [], { day, timezone: yard.timezone, regularHoursDay: policy.regularHoursDay }, cache),
  }));

  // Yesterday's crews.
  const yesterday = addDays(day, -1);
  const [onOrders, byRecords] = await Promise.all([
    db("assignments as a")
      .join("work_orders as o", "o.id", "a.work_order_id")
      .where("o.organisation_id", organisationId)
      .where("o.work_date", yesterday)
      .whereNot("o.status", "cancelled")
      .whereNotNull("a.holds_position")
      .select("a.work_order_id as order_id", "a.worker_id"),
    db("time_records as t")
      .join("work_orders as o", "o.id", "t.work_order_id")
      .where("o.organisation_id", organisationId)
      .where("t.start_at", ">=", new Date(window.start - 24 * HOUR))
      .where("t.start_at", "<", new Date(window.start))
      .select("t.work_order_id as order_id", "t.worker_id"),
  ]);
  const crews = new Map<number, Set<string>>();
  for (const r of [...onOrders, ...byRecords]) {
    const set = crews.get(r.order_id) ?? new Set<string>();
    set.add(String(r.worker_id));
    crews.set(r.order_id, set);
  }
  const pairKeys = new Set<string>();
  const yesterdayPairs: Array<[string, string]> = [];
  for (const set of crews.values()) {
    const ids = [...set].sort();
    for (let i = 0; i < ids.length; i++) {
      for (let j = i + 1; j < ids.length; j++) {
        const k = `${ids[i]}|${ids[j]}`;
        if (!pairKeys.has(k)) {
          pairKeys.add(k);
          yesterdayPairs.push([ids[i], ids[j]]);
        }
      }
    }
  }

  // Seats.
  const holder = new Map<number, number>(assignments.map((a) => [a.position_id, a.worker_id]));
  const declinedBy = new Map<number, number>();
  for (const d of declines as { position_id: number; worker_id: number }[]) if (!declinedBy.has(d.position_id)) declinedBy.set(d.position_id, d.worker_id);
  const seatsBy = new Map<number, { id: number; position: Position }[]>();
  for (const p of positions as { id: number; work_order_id: number; position: Position }[]) {
    const list = seatsBy.get(p.work_order_id) ?? [];
    list.push({ id: p.id, position: p.position });
    seatsBy.set(p.work_order_id, list);
  }
  const fillOrders: FillOrder[] = fillable.map((o) => ({
    id: String(o.id),
    number: o.number,
    title: o.title,
    priority: o.priority,
    yardId: String(o.yard_id),
    seats: (seatsBy.get(o.id) ?? []).map((p) => {
      const h = holder.get(p.id);
      const d = declinedBy.get(p.id);
      return { positionId: String(p.id), position: p.position, workerId: h === undefined ? null : String(h), declinedBy: h === undefined && d !== undefined ? String(d) : null };
    }),
  }));

  const otOf = new Map(workers.map((w) => [w.id, w.overtimeHours]));
  const meta: FillMeta = {
    day,
    yard: { id: yard.id, code: yard.code, name: yard.name, timezone: yard.timezone },
    orders: new Map(
      orders.map((o) => [
        String(o.id),
        { id: o.id, number: o.number, title: o.title, priority: o.priority, status: o.status, start: new Date(o.start_at).toISOString(), end: new Date(o.end_at).toISOString() },
      ]),
    ),
    workers: new Map(
      (workerRows as Record<string, any>[]).map((w) => [
        String(w.id),
        {
          id: Number(w.id),
          name: `${w.first_name} ${w.last_name}`,
          classification: w.classification,
          yardCode: w.yard_code,
          phone: w.phone_e164 ?? null,
          overtimeHours: otOf.get(String(w.id)) ?? 0,
          active: Boolean(w.active),
        },
      ]),
    ),
    overridden: new Map(),
    positions: new Map((positions as { id: number; work_order_id: number; position: Position }[]).map((p) => [String(p.id), { orderId: p.work_order_id, position: p.position }])),
  };
  // Only overrides still valid for the crew as it is: a change to the crew lapses them.
  const hashOf = new Map<number, string>();
  for (const o of fillable) {
    const seated = (seatsBy.get(o.id) ?? []).filter((p) => holder.has(p.id)).map((p) => ({ positionId: p.id, workerId: holder.get(p.id)! }));
    hashOf.set(o.id, crewHash(seated));
  }
  for (const v of overrides as { work_order_id: number; rule: string; worker_id: number | null; reason: string; crew_hash: string }[]) {
    if (hashOf.get(v.work_order_id) !== v.crew_hash) continue;
    const list = meta.overridden.get(String(v.work_order_id)) ?? [];
    list.push({ rule: v.rule, workerId: v.worker_id, reason: v.reason });
    meta.overridden.set(String(v.work_order_id), list);
  }
  return { problem: { snapshot, orders: fillOrders, workers, yesterdayPairs }, meta };
}
