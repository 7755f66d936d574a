// Time records: what each person actually worked (shifts, orders marked done, call-outs,
// manual entries). The REST rule reads them; the Time page shows a week per worker.
import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { bumpWorkers } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";
import { getPolicy } from "@/lib/policies/data";
import { fieldError, instant } from "@/lib/orders/data";
import { addDays, todayIn } from "@/lib/time/days";
import { epochToZonedDate, epochToZonedWallTime, zonedWallTimeToEpoch } from "@/lib/rules/time";
import type { ManualTimeRecordInput } from "@/lib/time-records/model";

type Q = Knex | Knex.Transaction;
const HOUR_MS = 3_600_000;
const round2 = (n: number) => Math.round(n * 100) / 100;

export type TimeKind = "shift" | "order" | "call_out" | "manual";

export interface TimeRecordView {
  id: number;
  kind: TimeKind;
  start: string;
  end: string;
  startLocal: string;
  endLocal: string;
  hours: number;
  reason: string | null;
  orderId: number | null;
  orderNumber: string | null;
  rotationName: string | null;
}

export interface WorkedInterval {
  start: number;
  end: number;
}

export interface DayTotal {
  date: string;
  records: TimeRecordView[];
  /** Hours worked, overlapping records counted once, on the day the work started. */
  hours: number;
  overRegular: number;
}

export interface WeekTotals {
  days: DayTotal[];
  hours: number;
  dailyOvertime: number;
  weeklyOvertime: number;
  overtime: number;
}

/** Monday (YYYY-MM-DD) of the week containing a date. */
export function weekStart(date: string): string {
  const d = new Date(Date.UTC(+date.slice(0, 4), +date.slice(5, 7) - 1, +date.slice(8, 10)));
  return addDays(date, -((d.getUTCDay() + 6) % 7));
}

/**
 * Daily and weekly totals. Overlapping records merge (an hour is worked once); each merged
 * stretch counts on the local day it started (common practice for shifts that cross midnight).
 * Overtime: hours beyond the regular day, plus straight-time hours beyond the regular week
 * (so no hour counts as overtime twice).
 */
export function weekTotals(
  records: { start: number; end: number; view: TimeRecordView }[],
  week: string,
  tz: string,
  regular: { day: number; week: number },
): WeekTotals {
  const dates = Array.from({ length: 7 }, (_, i) => addDays(week, i));
  const byDay = new Map(dates.map((d) => [d, { date: d, records: [] as TimeRecordView[], hours: 0, overRegular: 0 }]));
  const sorted = [...records].sort((a, b) => a.start - b.start);
  for (const r of sorted) byDay.get(epochToZonedDate(r.start, tz))?.records.push(r.view);
  const merged: WorkedInterval[] = [];
  for (const r of sorted) {
    const last = merged[merged.length - 1];
    if (last && r.start <= last.end) last.end = Math.max(last.end, r.end);
    else merged.push({ start: r.start, end: r.end });
  }
  for (const m of merged) {
    const d = byDay.get(epochToZonedDate(m.start, tz));
    if (d) d.hours += (m.end - m.start) / HOUR_MS;
  }
  let straight = 0;
  let daily = 0;
  const days = dates.map((date) => {
    const d = byDay.get(date)!;
    const over = Math.max(0, d.hours - regular.day);
    daily += over;
    straight += d.hours - over;
    return { ...d, hours: round2(d.hours), overRegular: round2(over) };
  });
  const weekly = Math.max(0, straight - regular.week);
  return {
    days,
    hours: round2(days.reduce((s, d) => s + d.hours, 0)),
    dailyOvertime: round2(daily),
    weeklyOvertime: round2(weekly),
    overtime: round2(daily + weekly),
  };
}

export interface WorkerWeek {
  worker: { id: number; name: string; employeeNo: string; yardCode: string; timezone: string };
  week: string;
  regularHoursDay: number;
  regularHoursWeek: number;
  totals: WeekTotals;
}

/** One worker's week (the week of `anyDay`, default today in the worker's yard). */
export async function workerWeek(db: Q, organisationId: number, workerId: number, anyDay?: string): Promise<WorkerWeek | null> {
  const w = await db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": workerId, "w.organisation_id": organisationId })
    .first("w.id", "w.first_name", "w.last_name", "w.employee_no", "y.code", "y.timezone");
  if (!w) return null;
  const tz = String(w.timezone);
  const week = weekStart(anyDay ?? todayIn(tz));
  const from = zonedWallTimeToEpoch(`${week}T00:00`, tz);
  const to = zonedWallTimeToEpoch(`${addDays(week, 7)}T00:00`, tz);
  const rows = await db("time_records as t")
    .leftJoin("work_orders as o", "o.id", "t.work_order_id")
    .leftJoin("rotations as r", "r.id", "t.rotation_id")
    .where("t.worker_id", workerId)
    .where("t.start_at", ">=", new Date(from))
    .where("t.start_at", "<", new Date(to))
    .orderBy("t.start_at")
    .select("t.*", "o.number as order_number", "r.name as rotation_name");
  const policy = await getPolicy(db, organisationId);
  const records = rows.map((r) => {
    const s = new Date(r.start_at).getTime();
    const e = new Date(r.end_at).getTime();
    return {
      start: s,
      end: e,
      view: {
        id: Number(r.id),
        kind: r.kind as TimeKind,
        start: new Date(s).toISOString(),
        end: new Date(e).toISOString(),
        startLocal: epochToZonedWallTime(s, tz),
        endLocal: epochToZonedWallTime(e, tz),
        hours: round2((e - s) / HOUR_MS),
        reason: r.reason ?? null,
        orderId: r.work_order_id ? Number(r.work_order_id) : null,
        orderNumber: r.order_number ?? null,
        rotationName: r.rotation_name ?? null,
      },
    };
  });
  return {
    worker: { id: Number(w.id), name: `${w.first_name} ${w.last_name}`, employeeNo: String(w.employee_no), yardCode: String(w.code), timezone: tz },
    week,
    regularHoursDay: policy.regularHoursDay,
    regularHoursWeek: policy.regularHoursWeek,
    totals: weekTotals(records, week, tz, { day: policy.regularHoursDay, week: policy.regularHoursWeek }),
  };
}

/** A manual entry (reason required). Times are wall clock in the worker's yard zone. */
/** Days a worked interval can change findings on: from its start date to the day after it ends. */
export function daysTouched(start: number, end: number, tz: string): string[] {
  const first = epochToZonedDate(start, tz);
  const last = addDays(epochToZonedDate(end, tz), 1);
  const out: string[] = [];
  for (let d = first; d <= last && out.length < 40; d = addDays(d, 1)) out.push(d);
  return out;
}

interface WorkedTime {
  worker: { id: number; first_name: string; last_name: string };
  /** The zone the wall-clock times are read in (where the work was). */
  tz: string;
  /** Yards whose boards this time can change. */
  yardIds: number[];
  start: string;
  end: string;
  kind: "call_out" | "manual";
  rotationId?: number | null;
  reason: string | null;
  action: string;
  detail: Record<string, unknown>;
}

/**
 * Records worked time the REST rule reads (a call-out or a manual entry): refuses an end before
 * the start and an overlap with time already recorded, audits it and tells the boards.
 */
export async function recordWorkedTime(trx: Knex.Transaction, actor: Actor, t: WorkedTime) {
  const org = actor.organisationId;
  const start = instant(t.start, t.tz, "start");
  const end = instant(t.end, t.tz, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  // The overlap check below relies on the worker's lock: write it too (lib/booking/data.ts).
  await bumpWorkers(trx, [Number(t.worker.id)]);
  const clash = await trx("time_records")
    .where({ worker_id: t.worker.id })
    .whereIn("kind", ["call_out", "manual"])
    .where("start_at", "<", new Date(end))
    .where("end_at", ">", new Date(start))
    .first("id", "start_at", "end_at");
  if (clash) {
    const at = (d: Date) => epochToZonedWallTime(new Date(d).getTime(), t.tz).replace("T", " ");
    throw new ApiError(409, `${t.worker.first_name} ${t.worker.last_name} already has time recorded ${at(clash.start_at)} to ${at(clash.end_at)}.`, {
      issues: [{ field: "start", message: "Overlaps time already recorded" }],
    });
  }
  const [id] = await trx("time_records").insert({
    worker_id: t.worker.id,
    start_at: new Date(start),
    end_at: new Date(end),
    kind: t.kind,
    rotation_id: t.rotationId ?? null,
    reason: t.reason,
    created_by: actor.id,
  });
  await audit(trx, actor, org, t.action, "time_record", id, t.detail);
  for (const yardId of new Set(t.yardIds)) {
    for (const day of daysTouched(start, end, t.tz)) {
      await boardEvent(trx, { organisationId: org, yardId, day, kind: "availability", payload: { workerId: Number(t.worker.id), timeRecordId: Number(id) } });
    }
  }
  return { id: Number(id), start, end };
}

export async function createManualRecord(trx: Knex.Transaction, actor: Actor, input: ManualTimeRecordInput) {
  const w = await trx("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": input.workerId, "w.organisation_id": actor.organisationId })
    .forUpdate()
    .first("w.id", "w.yard_id", "w.first_name", "w.last_name", "y.timezone");
  if (!w) throw fieldError("workerId", "No such worker.");
  const r = await recordWorkedTime(trx, actor, {
    worker: w,
    tz: String(w.timezone),
    yardIds: [Number(w.yard_id)],
    start: input.start,
    end: input.end,
    kind: "manual",
    reason: input.reason,
    action: "time_record.create",
    detail: { workerId: Number(w.id), start: input.start, end: input.end, reason: input.reason },
  });
  return r.id;
}

/** Removes a manual entry or a call-out (order records follow their order's status). */
export async function deleteRecord(trx: Knex.Transaction, actor: Actor, id: number) {
  const org = actor.organisationId;
  const r = await trx("time_records as t")
    .join("workers as w", "w.id", "t.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "t.id": id, "w.organisation_id": org })
    .first("t.*", "w.yard_id", "y.timezone");
  if (!r) throw new ApiError(404, "No such time record.");
  if (!["manual", "call_out"].includes(r.kind))
    throw new ApiError(409, r.kind === "order" ? "This time comes from a work order marked done; change the order's actual times instead." : "Shift records are not removed here.");
  await trx("time_records").where({ id }).delete();
  const s = new Date(r.start_at).getTime();
  const e = new Date(r.end_at).getTime();
  await audit(trx, actor, org, "time_record.delete", "time_record", id, {
    workerId: Number(r.worker_id),
    kind: r.kind,
    start: new Date(s).toISOString(),
    end: new Date(e).toISOString(),
    reason: r.reason ?? null,
  });
  for (const day of daysTouched(s, e, String(r.timezone))) {
    await boardEvent(trx, { organisationId: org, yardId: Number(r.yard_id), day, kind: "availability", payload: { workerId: Number(r.worker_id), timeRecordId: id } });
  }
}

/** The organisation's call-outs of the last 14 days, newest first (at most 30), for Rotations. */
export async function recentCallOuts(db: Knex, organisationId: number) {
  return db("time_records as t")
    .join("workers as w", "w.id", "t.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .leftJoin("rotations as r", "r.id", "t.rotation_id")
    .where("w.organisation_id", organisationId)
    .where("t.kind", "call_out")
    .where("t.start_at", ">=", new Date(Date.now() - 14 * 86_400_000))
    .orderBy("t.start_at", "desc")
    .limit(30)
    .select("t.id", "t.worker_id", "t.start_at", "t.end_at", "t.reason", "w.first_name", "w.last_name", "y.timezone", "r.name as rotation_name");
}
