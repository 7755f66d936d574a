// The supervisors' queue (issue 18, point 13). Server only (Knex and the rule engine).
// Scope: a supervisor given yards (user_yards) sees those yards only; one without any sees
// every yard of the organisation, as supervisors edit every yard (lib/auth/session.ts).
import type { Knex } from "knex";
import { findingsAfter } from "@/lib/assignments/data";
import { crewHash } from "@/lib/board/data";
import { fmtDateTimeZone, fmtLocalStart } from "./words";
import { listNotices } from "@/lib/notices/data";
import { ruleName } from "@/lib/rules/rule-labels";
import { listYards, type Yard } from "@/lib/yards/data";
import { addDays, todayIn } from "@/lib/time/days";
import { QUEUE_DAYS, type QueueBlock, type QueueLapse, type QueuePayload } from "./model";

export interface QueueUser {
  id: number;
  organisationId: number;
}

/** The yards a supervisor's queue covers: their assigned yards, or all when none are assigned. */
export async function queueYards(db: Knex, user: QueueUser): Promise<Yard[]> {
  const all = await listYards(db, user.organisationId);
  const mine = new Set(((await db("user_yards").where({ user_id: user.id }).pluck("yard_id")) as number[]).map(Number));
  return mine.size ? all.filter((y) => mine.has(Number(y.id))) : all;
}

export async function supervisorQueue(db: Knex, user: QueueUser, opts: { yardCode?: string | null } = {}): Promise<QueuePayload> {
  let yards = await queueYards(db, user);
  if (opts.yardCode) yards = yards.filter((y) => y.code.toLowerCase() === opts.yardCode!.toLowerCase());
  const blocks: QueueBlock[] = [];
  const now = new Date();
  let from = "";
  let to = "";
  for (const y of yards) {
    const first = todayIn(y.timezone);
    const last = addDays(first, QUEUE_DAYS - 1);
    if (!from || first < from) from = first;
    if (!to || last > to) to = last;
    const orders = await db("work_orders")
      .where({ organisation_id: user.organisationId, yard_id: y.id })
      .whereBetween("work_date", [first, last])
      .whereNotIn("status", ["cancelled", "done"])
      .where("end_at", ">", now)
      .orderBy([{ column: "start_at" }, { column: "number" }])
      .select("id", "number", "title", "work_date", "start_at");
    if (!orders.length) continue;
    const ids = orders.map((o) => Number(o.id));
    const seats = await db("assignments").whereIn("work_order_id", ids).whereNotNull("holds_position").select("work_order_id", "position_id", "worker_id");
    const crewed = ids.filter((id) => seats.some((s) => Number(s.work_order_id) === id));
    if (!crewed.length) continue;
    const workerIds = [...new Set(seats.map((s) => Number(s.worker_id)))];
    const { findings } = await findingsAfter(db, user.organisationId, crewed, workerIds);
    const hashOf = new Map(
      crewed.map((id) => [
        id,
        crewHash(seats.filter((s) => Number(s.work_order_id) === id).map((s) => ({ positionId: s.position_id, workerId: s.worker_id }))),
      ]),
    );
    const live = await db("overrides").whereIn("work_order_id", crewed).whereNull("lapsed_at").select("work_order_id", "rule", "worker_id", "crew_hash");
    const covered = new Set(
      live
        .filter((v) => hashOf.get(Number(v.work_order_id)) === v.crew_hash)
        .map((v) => `${v.work_order_id}|${v.rule}|${v.worker_id ?? ""}`),
    );
    const byId = new Map(orders.map((o) => [Number(o.id), o]));
    for (const f of findings) {
      const oid = Number(f.workOrderId);
      const o = byId.get(oid);
      if (!o || !crewed.includes(oid) || f.level !== "block" || f.locked) continue;
      if (covered.has(`${oid}|${f.rule}|${f.workerId ?? ""}`)) continue;
      blocks.push({
        orderId: oid,
        orderNumber: o.number,
        orderTitle: o.title,
        yardCode: y.code,
        yardName: y.name,
        day: dayString(o.work_date),
        startWords: fmtLocalStart(o.start_at, y.timezone),
        rule: f.rule,
        ruleName: ruleName(f.rule),
        workerId: f.workerId === null ? null : Number(f.workerId),
        message: f.message,
        source: f.source,
      });
    }
  }

  const yardIds = yards.map((y) => Number(y.id));
  const tzOf = new Map(yards.map((y) => [Number(y.id), y.timezone]));
  const lapsedRows = yardIds.length
    ? await db("overrides as v")
        .join("work_orders as o", "o.id", "v.work_order_id")
        .join("yards as y", "y.id", "o.yard_id")
        .join("users as u", "u.id", "v.actor_user_id")
        .leftJoin("users as c", "c.id", "v.lapsed_by_user_id")
        .leftJoin("workers as w", "w.id", "v.worker_id")
        .where("o.organisation_id", user.organisationId)
        .whereIn("o.yard_id", yardIds)
        .whereNotNull("v.lapsed_at")
        .where("v.lapsed_at", ">", new Date(now.getTime() - 14 * 86_400_000))
        .orderBy("v.lapsed_at", "desc")
        .orderBy("v.id", "desc")
        .limit(100)
        .select(
          "v.id",
          "v.work_order_id",
          "v.rule",
          "v.worker_id",
          "v.reason",
          "v.created_at",
          "v.lapsed_at",
          "v.lapse_change",
          "o.number",
          "o.title",
          "o.work_date",
          "o.yard_id",
          "y.code as yard_code",
          "u.name as given_by",
          "c.name as lapsed_by",
          "w.first_name",
          "w.last_name",
        )
    : [];
  const blockNow = new Set(blocks.map((b) => `${b.orderId}|${b.rule}|${b.workerId ?? ""}`));
  const lookedAt = new Set(blocks.map((b) => b.orderId));
  const lapsed: QueueLapse[] = lapsedRows.map((r: Record<string, any>) => {
    const tz = tzOf.get(Number(r.yard_id)) ?? "UTC";
    const key = `${r.work_order_id}|${r.rule}|${r.worker_id ?? ""}`;
    return {
      overrideId: r.id,
      orderId: r.work_order_id,
      orderNumber: r.number,
      orderTitle: r.title,
      yardCode: r.yard_code,
      day: dayString(r.work_date),
      rule: r.rule,
      ruleName: ruleName(r.rule),
      workerName: r.first_name ? `${r.first_name} ${r.last_name}` : null,
      reason: r.reason,
      givenBy: r.given_by,
      givenAt: new Date(r.created_at).toISOString(),
      givenWords: fmtDateTimeZone(r.created_at, tz),
      lapsedAt: new Date(r.lapsed_at).toISOString(),
      lapsedWords: fmtDateTimeZone(r.lapsed_at, tz),
      lapsedBy: r.lapsed_by ?? null,
      change: r.lapse_change ?? null,
      blockNow: blockNow.has(key) ? true : lookedAt.has(Number(r.work_order_id)) ? false : null,
    };
  });

  return {
    yards: yards.map((y) => ({ id: Number(y.id), code: y.code, name: y.name })),
    from,
    to,
    blocks,
    lapsed,
    notices: await listNotices(db, user.id),
  };
}

function dayString(d: string | Date): string {
  return typeof d === "string" ? d.slice(0, 10) : d.toISOString().slice(0, 10);
}
