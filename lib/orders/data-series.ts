// Repeating work orders: an order_series row (RRULE, first start as yard wall clock, length,
// skipped dates, the order template) and its occurrences materialised into work_orders
// (series_id + occurrence_date unique), each with its own positions from the template, so it
// is on the board of its day and is staffed day by day.
//
// Editing a series regenerates only future occurrences nobody has touched: start still ahead,
// status draft or planned, no assignment rows at all (live or past), not edited on their own
// (detached). Everything else is kept as it is — an occurrence with assignments is never
// deleted — and reported back so the dispatcher can review it.

import "@/lib/server-only";
import type { Knex } from "knex";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { getWorkType } from "@/lib/orders/data-work-types";
import { ApiError } from "@/lib/api/http";
import {
  fieldError,
  insertOrders,
  instant,
  parseJson,
  templateColumns,
  yardOf,
  type NewOrderRow,
  type OrderTemplate,
  type YardRow,
} from "@/lib/orders/data";
import { todayIn, addDays } from "@/lib/time/days";
import {
  HORIZON_DAYS,
  floating,
  floatingToLocal,
  hasOccurrenceAfter,
  normaliseLocal,
  occurrences,
  parseRrule,
  type Occurrence,
} from "@/lib/time/recurrence";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import type { Position } from "@/lib/rules/types";
import type { OrderInput, SeriesEditInput } from "@/lib/orders/schema";

/** materialised_through for a series whose rule has no further dates. */
const DONE = "9999-12-31";

export interface SeriesTemplate extends OrderTemplate {
  positions: Position[];
}

interface SeriesRow {
  id: number;
  organisation_id: number;
  yard_id: number;
  rrule: string;
  dtstart_local: string;
  duration_minutes: number;
  exdates: unknown;
  template: unknown;
  materialised_through: string | null;
  active: number | boolean;
  version: number;
}

function templateFrom(input: OrderInput | SeriesEditInput): SeriesTemplate {
  return {
    title: input.title,
    workTypeId: input.workTypeId,
    address: input.address,
    structureNo: input.structureNo,
    energized: input.energized,
    voltageKv: input.voltageKv,
    emergency: input.emergency,
    crewException: input.crewException,
    minCrew: input.minCrew,
    priority: input.priority,
    notes: input.notes,
    status: input.status === "draft" ? "draft" : "planned",
    driverLicence: input.driverLicence,
    locateTicket: input.locateTicket,
    locateValidThrough: input.locateValidThrough,
    nearEnergizedKv: input.nearEnergizedKv ?? null,
    phases: input.phases ?? 3,
    systemKv: input.systemKv ?? null,
    positions: input.positions.map((p) => p.position),
  };
}

/** Start and end instants of an occurrence: the end keeps the template's wall-clock length. */
function occurrenceTimes(o: Occurrence, durationMinutes: number, tz: string) {
  const endLocal = floatingToLocal(floating(o.local) + durationMinutes * 60_000);
  return { start: o.start, end: zonedWallTimeToEpoch(endLocal, tz) };
}

/**
 * Inserts the occurrences of a series in [fromDate, throughDate] that are not there yet.
 * The caller holds the series row lock. Returns the new orders' ids and days.
 */
async function materialise(
  trx: Knex.Transaction,
  s: SeriesRow,
  yard: YardRow,
  fromDate: string,
  throughDate: string,
  createdBy: number | null,
): Promise<{ id: number; day: string }[]> {
  if (throughDate < fromDate) return [];
  const exdates = parseJson<string[]>(s.exdates, []);
  const template = parseJson<SeriesTemplate | null>(s.template, null);
  if (!template) return [];
  const occ = occurrences({ rrule: s.rrule, dtstartLocal: s.dtstart_local, exdates }, yard.timezone, { from: fromDate, to: throughDate });
  if (occ.length === 0) return [];
  const existing = new Set(
    (
      await trx("work_orders")
        .where({ series_id: s.id })
        .whereBetween("occurrence_date", [fromDate, throughDate])
        .pluck("occurrence_date")
    ).map(String),
  );
  const todo = occ.filter((o) => !existing.has(o.date));
  const rows: NewOrderRow[] = todo.map((o) => {
    const t = occurrenceTimes(o, s.duration_minutes, yard.timezone);
    return {
      columns: {
        ...templateColumns(template),
        yard_id: yard.id,
        start_at: new Date(t.start),
        end_at: new Date(t.end),
        work_date: o.date,
        series_id: s.id,
        occurrence_date: o.date,
        created_by: createdBy,
      },
      positions: template.positions,
    };
  });
  const ids = await insertOrders(trx, s.organisation_id, rows);
  return ids.map((id, i) => ({ id, day: todo[i].date }));
}

/** How far a series should reach for `day`: the day itself, and always the horizon. */
function targetFor(yard: YardRow, day: string) {
  const horizon = addDays(todayIn(yard.timezone), HORIZON_DAYS);
  return day > horizon ? day : horizon;
}

/** After materialising through `through`: DONE when the rule has nothing later. */
function nextMark(s: SeriesRow, tz: string, through: string) {
  try {
    return hasOccurrenceAfter({ rrule: s.rrule, dtstartLocal: s.dtstart_local }, tz, through) ? through : DONE;
  } catch {
    return DONE;
  }
}

async function postDays(trx: Knex.Transaction, organisationId: number, yardId: number, days: Iterable<string>, seriesId: number) {
  for (const day of new Set(days)) {
    await boardEvent(trx, { organisationId, yardId, day, kind: "order", payload: { seriesId } });
  }
}

/**
 * Extends one series through `day` (at least the horizon). Its own transaction, under a row
 * lock on the series, so two instances extending at once do not both insert. Returns how many
 * occurrences it created.
 */
export async function extendSeries(db: Knex, seriesId: number, day: string): Promise<number> {
  return db.transaction(async (trx) => {
    const s = (await trx("order_series").where({ id: seriesId }).forUpdate().first()) as SeriesRow | undefined;
    if (!s || !s.active) return 0;
    const yard = await yardOf(trx, s.organisation_id, s.yard_id);
    const target = targetFor(yard, day);
    if (s.materialised_through && s.materialised_through >= target) return 0;
    const from = s.materialised_through ? addDays(s.materialised_through, 1) : s.dtstart_local.slice(0, 10);
    const created = await materialise(trx, s, yard, from, target, null);
    await trx("order_series").where({ id: s.id }).update({ materialised_through: nextMark(s, yard.timezone, target) });
    if (created.length) {
      await audit(trx, null, s.organisation_id, "series.materialise", "order_series", s.id, {
        created: created.length,
        through: target,
      });
      await postDays(trx, s.organisation_id, yard.id, created.map((c) => c.day), s.id);
    }
    return created.length;
  });
}

/** POST /api/orders with a repeat rule: the series and its occurrences through the horizon. */
export async function createSeries(trx: Knex.Transaction, actor: Actor, input: OrderInput) {
  const org = actor.organisationId;
  if (!input.recurrence) throw fieldError("recurrence", "No repeat rule.");
  const yard = await yardOf(trx, org, input.yardId);
  if (!(await getWorkType(trx, org, input.workTypeId))) throw fieldError("workTypeId", "That work type does not exist.");
  const parsed = parseRrule(input.recurrence.rrule);
  if (!parsed.ok) throw fieldError("recurrence.rrule", parsed.message);
  const start = instant(input.start, yard.timezone, "start");
  const end = instant(input.end, yard.timezone, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  const dtstartLocal = normaliseLocal(input.start);
  const duration = Math.round((floating(input.end) - floating(input.start)) / 60_000);
  const exdates = [...new Set(input.recurrence.exdates)].sort();
  const first = occurrences({ rrule: parsed.rule, dtstartLocal, exdates }, yard.timezone, { limit: 1 });
  if (first.length === 0) throw fieldError("recurrence.rrule", "The repeat rule gives no dates from the start on.");
  const [seriesId] = await trx("order_series").insert({
    organisation_id: org,
    yard_id: yard.id,
    rrule: parsed.rule,
    dtstart_local: dtstartLocal,
    duration_minutes: duration,
    exdates: JSON.stringify(exdates),
    template: JSON.stringify(templateFrom(input)),
    materialised_through: null,
    created_by: actor.id,
  });
  const s = (await trx("order_series").where({ id: seriesId }).first()) as SeriesRow;
  const target = targetFor(yard, first[0].date);
  const created = await materialise(trx, s, yard, dtstartLocal.slice(0, 10), target, actor.id);
  await trx("order_series").where({ id: seriesId }).update({ materialised_through: nextMark(s, yard.timezone, target) });
  await audit(trx, actor, org, "series.create", "order_series", seriesId, {
    title: input.title,
    rrule: parsed.rule,
    dtstartLocal,
    exdates,
    created: created.length,
  });
  await postDays(trx, org, yard.id, created.map((c) => c.day), seriesId);
  return { seriesId: Number(seriesId), firstOrderId: created[0]?.id ?? null, created: created.length, firstDate: first[0].date };
}

/** Future occurrences a series change may replace: untouched, unstaffed, not started. */
async function replaceable(trx: Knex.Transaction, seriesId: number) {
  return trx("work_orders as o")
    .where("o.series_id", seriesId)
    .where("o.start_at", ">", new Date())
    .whereIn("o.status", ["draft", "planned"])
    .where("o.detached", false)
    .whereNotExists((q) => q.select(trx.raw("1")).from("assignments as a").whereRaw("a.work_order_id = o.id"))
    .select("o.id", "o.work_date");
}

async function keptFuture(trx: Knex.Transaction, seriesId: number) {
  return trx("work_orders")
    .where({ series_id: seriesId })
    .where("start_at", ">", new Date())
    .whereNot("status", "cancelled")
    .orderBy("start_at")
    .select("id", "number", "work_date");
}

export interface SeriesChange {
  seriesId: number;
  removed: number;
  created: number;
  /** Future occurrences kept as they were (staffed, edited on their own, or under way). */
  kept: { id: number; number: string; workDate: string }[];
}

/** PATCH /api/order-series/[id]: new template, times, rule or skipped dates. */
export async function updateSeries(trx: Knex.Transaction, actor: Actor, id: number, input: SeriesEditInput): Promise<SeriesChange> {
  const org = actor.organisationId;
  const s = (await trx("order_series").where({ id, organisation_id: org }).forUpdate().first()) as SeriesRow | undefined;
  if (!s) throw new ApiError(404, "No such series.");
  if (Number(s.version) !== input.version)
    throw new ApiError(409, "Someone else changed this series since you loaded it. Reload to see their changes.", {
      current: { version: Number(s.version) },
    });
  if (!s.active) throw new ApiError(409, "This series has ended; start a new repeating order instead.");
  if (input.yardId !== s.yard_id) throw fieldError("yardId", "A series stays in its yard; end it and start a new one.");
  const yard = await yardOf(trx, org, s.yard_id);
  if (!(await getWorkType(trx, org, input.workTypeId))) throw fieldError("workTypeId", "That work type does not exist.");
  const parsed = parseRrule(input.recurrence.rrule);
  if (!parsed.ok) throw fieldError("recurrence.rrule", parsed.message);
  const start = instant(input.start, yard.timezone, "start");
  const end = instant(input.end, yard.timezone, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  const dtstartLocal = normaliseLocal(input.start);
  const duration = Math.round((floating(input.end) - floating(input.start)) / 60_000);
  const exdates = [...new Set(input.recurrence.exdates)].sort();

  const gone = await replaceable(trx, id);
  if (gone.length) await trx("work_orders").whereIn("id", gone.map((g) => g.id)).delete();
  const today = todayIn(yard.timezone);
  const next: SeriesRow = {
    ...s,
    rrule: parsed.rule,
    dtstart_local: dtstartLocal,
    duration_minutes: duration,
    exdates: JSON.stringify(exdates),
    template: JSON.stringify(templateFrom(input)),
    version: Number(s.version) + 1,
  };
  await trx("order_series")
    .where({ id })
    .update({
      rrule: next.rrule,
      dtstart_local: next.dtstart_local,
      duration_minutes: duration,
      exdates: next.exdates,
      template: next.template,
      version: next.version,
      updated_at: new Date(),
    });
  // Regenerate from today on (past days stay as they were); the unique (series, date) key
  // skips every day where a kept occurrence still stands.
  const target = targetFor(yard, today);
  const created = await materialise(trx, next, yard, today, target, actor.id);
  await trx("order_series").where({ id }).update({ materialised_through: nextMark(next, yard.timezone, target) });
  const createdIds = new Set(created.map((c) => c.id));
  const kept = (await keptFuture(trx, id))
    .filter((k) => !createdIds.has(Number(k.id)))
    .map((k) => ({ id: Number(k.id), number: String(k.number), workDate: String(k.work_date) }));
  await audit(trx, actor, org, "series.update", "order_series", id, {
    rrule: parsed.rule,
    dtstartLocal,
    exdates,
    removed: gone.length,
    created: created.length,
    kept: kept.map((k) => k.number),
  });
  await postDays(trx, org, yard.id, [...gone.map((g) => String(g.work_date)), ...created.map((c) => c.day)], id);
  return { seriesId: id, removed: gone.length, created: created.length, kept };
}

/** DELETE /api/order-series/[id]: ends the series; future untouched occurrences go, the rest stay. */
export async function endSeries(trx: Knex.Transaction, actor: Actor, id: number): Promise<SeriesChange> {
  const org = actor.organisationId;
  const s = (await trx("order_series").where({ id, organisation_id: org }).forUpdate().first()) as SeriesRow | undefined;
  if (!s) throw new ApiError(404, "No such series.");
  const gone = await replaceable(trx, id);
  if (gone.length) await trx("work_orders").whereIn("id", gone.map((g) => g.id)).delete();
  await trx("order_series").where({ id }).update({ active: false, version: Number(s.version) + 1, updated_at: new Date() });
  const kept = (await keptFuture(trx, id)).map((k) => ({ id: Number(k.id), number: String(k.number), workDate: String(k.work_date) }));
  await audit(trx, actor, org, "series.end", "order_series", id, { removed: gone.length, kept: kept.map((k) => k.number) });
  await postDays(trx, org, s.yard_id, gone.map((g) => String(g.work_date)), id);
  return { seriesId: id, removed: gone.length, created: 0, kept };
}

/** A series row of the organisation with the ids of its occurrences, or null. */
export async function seriesWithOrderIds(db: Knex, organisationId: number, id: number) {
  const s = await db("order_series").where({ id, organisation_id: organisationId }).first();
  if (!s) return null;
  const orderIds = (await db("work_orders").where({ series_id: id }).pluck("id")) as number[];
  return { series: s as Record<string, any>, orderIds };
}

/** A series' stored template (the JSON text as stored), or undefined. */
export async function seriesTemplateText(db: Knex, seriesId: number): Promise<unknown> {
  const row = await db("order_series").where({ id: seriesId }).first("template");
  return row?.template;
}
