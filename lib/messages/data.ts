import "@/lib/server-only";
import type { Knex } from "knex";
import type { MessagesFilter } from "@/lib/notify/schema";
import { audit, type Actor } from "@/lib/audit/data";

// Reading the outbox and the inbound texts for the Messages screen and a worker's thread.

export interface MessageRow {
  key: string;
  direction: "out" | "in";
  channel: "sms" | "email";
  id: number;
  at: string; // ISO
  workerId: number | null;
  workerName: string | null;
  address: string; // to (out) or from (in)
  kind: string; // assignment, change, removal, resend, reminder… or the inbound outcome
  subject: string | null;
  body: string;
  state: string; // queued/sending/sent/failed, or the inbound outcome
  attempts: number;
  lastError: string | null;
  nextAttemptAt: string | null;
  sentAt: string | null;
  providerId: string | null;
  orderNumber: string | null;
  workDate: string | null;
  timezone: string;
  reply: string | null; // inbound: what we answered
  handled: boolean;
}

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : null);

function outboundQuery(db: Knex, organisationId: number) {
  return db("notifications as n")
    .leftJoin("workers as w", "w.id", "n.worker_id")
    .leftJoin("yards as y", "y.id", "w.yard_id")
    .leftJoin("assignments as a", "a.id", "n.assignment_id")
    .leftJoin("work_orders as o", "o.id", "a.work_order_id")
    // Issue 18: a row with no worker (a dispatcher's copy) reads in its order's yard's zone,
    // else the organisation's first yard's, never UTC.
    .leftJoin("yards as oy", "oy.id", "o.yard_id")
    .where("n.organisation_id", organisationId)
    .select(
      "n.id",
      "n.channel",
      "n.kind",
      "n.to_address",
      "n.subject",
      "n.body",
      "n.state",
      "n.attempts",
      "n.last_error",
      "n.next_attempt_at",
      "n.sent_at",
      "n.provider_id",
      "n.created_at",
      "n.worker_id",
      "w.first_name",
      "w.last_name",
      "y.timezone",
      "oy.timezone as order_timezone",
      db.raw("(SELECT y2.timezone FROM yards y2 WHERE y2.organisation_id = ? ORDER BY y2.id LIMIT 1) AS org_timezone", [organisationId]),
      "o.number",
      "o.work_date",
    );
}

function inboundQuery(db: Knex, organisationId: number) {
  return db("inbound_messages as i")
    .leftJoin("workers as w", "w.id", "i.worker_id")
    .leftJoin("yards as y", "y.id", "w.yard_id")
    .leftJoin("assignments as a", "a.id", "i.assignment_id")
    .leftJoin("work_orders as o", "o.id", "a.work_order_id")
    .leftJoin("yards as oy", "oy.id", "o.yard_id")
    .where("i.organisation_id", organisationId)
    .select(
      "i.id",
      "i.from_phone",
      "i.body",
      "i.outcome",
      "i.handled",
      "i.reply_body",
      "i.created_at",
      "i.worker_id",
      "w.first_name",
      "w.last_name",
      "y.timezone",
      "oy.timezone as order_timezone",
      db.raw("(SELECT y2.timezone FROM yards y2 WHERE y2.organisation_id = ? ORDER BY y2.id LIMIT 1) AS org_timezone", [organisationId]),
      "o.number",
      "o.work_date",
    );
}

type Row = Record<string, any>;

function fromOutbound(r: Row): MessageRow {
  return {
    key: `out-${r.id}`,
    direction: "out",
    channel: r.channel,
    id: Number(r.id),
    at: iso(r.created_at)!,
    workerId: r.worker_id ?? null,
    workerName: r.first_name ? `${r.first_name} ${r.last_name}` : null,
    address: r.to_address,
    kind: r.kind,
    subject: r.subject,
    body: r.body,
    state: r.state,
    attempts: r.attempts,
    lastError: r.last_error,
    nextAttemptAt: iso(r.next_attempt_at),
    sentAt: iso(r.sent_at),
    providerId: r.provider_id,
    orderNumber: r.number ?? null,
    workDate: r.work_date ?? null,
    timezone: r.timezone ?? r.order_timezone ?? r.org_timezone ?? "UTC",
    reply: null,
    handled: true,
  };
}

function fromInbound(r: Row): MessageRow {
  return {
    key: `in-${r.id}`,
    direction: "in",
    channel: "sms",
    id: Number(r.id),
    at: iso(r.created_at)!,
    workerId: r.worker_id ?? null,
    workerName: r.first_name ? `${r.first_name} ${r.last_name}` : null,
    address: r.from_phone,
    kind: r.outcome,
    subject: null,
    body: r.body,
    state: r.outcome,
    attempts: 0,
    lastError: null,
    nextAttemptAt: null,
    sentAt: null,
    providerId: null,
    orderNumber: r.number ?? null,
    workDate: r.work_date ?? null,
    timezone: r.timezone ?? r.order_timezone ?? r.org_timezone ?? "UTC",
    reply: r.reply_body ?? null,
    handled: Boolean(r.handled),
  };
}

function byDay(q: Knex.QueryBuilder, alias: string, day: string) {
  // The order's board day when the message is about an assignment, else the day it was written (UTC).
  q.where((w) => w.where("o.work_date", day).orWhere((x) => x.whereNull("o.id").whereRaw(`DATE(${alias}.created_at) = ?`, [day])));
}

export async function listMessages(db: Knex, organisationId: number, f: MessagesFilter, limit = 300): Promise<MessageRow[]> {
  const wantOut = f.channel !== "inbound";
  const wantIn = !f.channel || f.channel === "inbound";
  const out = wantOut ? outboundQuery(db, organisationId).orderBy("n.id", "desc").limit(limit) : null;
  if (out) {
    if (f.channel === "sms" || f.channel === "email") out.where("n.channel", f.channel);
    if (f.state) out.where("n.state", f.state);
    if (f.worker) out.where("n.worker_id", f.worker);
    if (f.day) byDay(out, "n", f.day);
  }
  // An outbound state filter leaves inbound texts out (they have no delivery state).
  const inq = wantIn && !f.state ? inboundQuery(db, organisationId).orderBy("i.id", "desc").limit(limit) : null;
  if (inq) {
    if (f.worker) inq.where("i.worker_id", f.worker);
    if (f.day) byDay(inq, "i", f.day);
  }
  const [o, i] = await Promise.all([out ?? Promise.resolve([]), inq ?? Promise.resolve([])]);
  return [...(o as Row[]).map(fromOutbound), ...(i as Row[]).map(fromInbound)]
    .sort((a, b) => b.at.localeCompare(a.at) || b.id - a.id)
    .slice(0, limit);
}

/** Replies that matched nothing and no dispatcher has dealt with yet (unknown numbers too). */
export async function unmatchedReplies(db: Knex, organisationId: number) {
  const rows = await db("inbound_messages as i")
    .leftJoin("workers as w", "w.id", "i.worker_id")
    .leftJoin("yards as y", "y.id", "w.yard_id")
    .leftJoin("assignments as a", "a.id", "i.assignment_id")
    .leftJoin("work_orders as o", "o.id", "a.work_order_id")
    .where("i.outcome", "unmatched")
    .where("i.handled", false)
    .where((w) => w.where("i.organisation_id", organisationId).orWhereNull("i.organisation_id"))
    .orderBy("i.id", "desc")
    .limit(100)
    .select("i.id", "i.from_phone", "i.body", "i.outcome", "i.handled", "i.reply_body", "i.created_at", "i.worker_id", "w.first_name", "w.last_name", "y.timezone", "o.number", "o.work_date", db.raw("(SELECT y2.timezone FROM yards y2 WHERE y2.organisation_id = ? ORDER BY y2.id LIMIT 1) AS org_timezone", [organisationId]));
  return rows.map(fromInbound);
}

export async function markHandled(db: Knex, actor: Actor, id: number) {
  return db.transaction(async (trx) => {
    const row = await trx("inbound_messages").where({ id }).forUpdate().first();
    if (!row || (row.organisation_id !== null && row.organisation_id !== actor.organisationId)) return null;
    if (row.handled) return { id, handled: true, changed: false };
    await trx("inbound_messages").where({ id }).update({ handled: true, handled_by: actor.id, handled_at: new Date() });
    await audit(trx, actor, actor.organisationId, "sms.handled", "inbound_message", id, { from: row.from_phone, body: String(row.body).slice(0, 200) });
    return { id, handled: true, changed: true };
  });
}

export async function workerThread(db: Knex, organisationId: number, workerId: number) {
  const worker = await db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": workerId, "w.organisation_id": organisationId })
    .first("w.id", "w.first_name", "w.last_name", "w.employee_no", "w.phone_e164", "w.email", "w.sms_opt_in", "w.classification", "y.name as yard_name", "y.timezone");
  if (!worker) return null;
  const [o, i] = await Promise.all([
    outboundQuery(db, organisationId).where("n.worker_id", workerId).orderBy("n.id", "desc").limit(400),
    inboundQuery(db, organisationId).where("i.worker_id", workerId).orderBy("i.id", "desc").limit(400),
  ]);
  const items = [...(o as Row[]).map(fromOutbound), ...(i as Row[]).map(fromInbound)].sort((a, b) => a.at.localeCompare(b.at) || a.id - b.id);
  return { worker, items };
}

export async function messageWorkers(db: Knex, organisationId: number) {
  return db("workers").where({ organisation_id: organisationId }).orderBy(["last_name", "first_name"]).select("id", "first_name", "last_name", "phone_e164");
}

/** The stored inbound text with this provider message id (the phone simulator's own), or null. */
export async function inboundBySid(db: Knex, providerSid: string): Promise<{ id: number; worker_id: number | null; outcome: string | null } | null> {
  const row = await db("inbound_messages").where({ provider_sid: providerSid }).first("id", "worker_id", "outcome");
  return row ? { id: Number(row.id), worker_id: row.worker_id ?? null, outcome: row.outcome ?? null } : null;
}
