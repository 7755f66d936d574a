// An inbound text (the provider's webhook, already signature-checked): record it once, act on
// it, and say what to answer. A repeated MessageSid (the provider retries a webhook it thinks
// failed) hits the unique key on inbound_messages.provider_sid and changes nothing.
import "@/lib/server-only";
import type { Knex } from "knex";
import { parsePhoneNumberFromString } from "libphonenumber-js";
import { audit } from "@/lib/audit/data";
import { withConflictRetry } from "@/lib/db";
import { respond, ResponseRefused, type Answer } from "@/lib/assignments/data-responses";
import { formatPhone, replyText, shortDay, whenText } from "@/lib/notify/wording";
import { parseReply } from "@/lib/notify/replies";

export interface InboundParams {
  MessageSid: string;
  From: string;
  To?: string;
  Body?: string;
}

export interface InboundResult {
  duplicate: boolean;
  outcome: string;
  reply: string | null;
  assignmentId: number | null;
  workerId: number | null;
}

const TX = { isolationLevel: "read committed" as const };

export function normalisePhone(raw: string) {
  const p = parsePhoneNumberFromString((raw ?? "").trim(), "US");
  return p ? p.number : (raw ?? "").trim();
}

interface WorkerRow {
  id: number;
  organisation_id: number;
  yard_id: number;
  first_name: string;
  last_name: string;
  active: number;
  dispatcher_phone: string | null;
}

function isDuplicate(err: unknown) {
  return (err as { code?: string })?.code === "ER_DUP_ENTRY";
}

export async function handleInbound(db: Knex, params: InboundParams): Promise<InboundResult> {
  const sid = String(params.MessageSid ?? "").slice(0, 64);
  const from = normalisePhone(String(params.From ?? ""));
  const body = String(params.Body ?? "").slice(0, 1600);
  try {
    // A repeat of the same MessageSid inserted on another Galera node at the same moment fails
    // certification (1213) rather than the unique key: the retry then finds the key.
    return await withConflictRetry(() => db.transaction(async (trx) => {
      // First, so a concurrent repeat of the same MessageSid waits here and then finds the key.
      const [inboundId] = await trx("inbound_messages").insert({
        provider_sid: sid,
        from_phone: from.slice(0, 20),
        to_phone: params.To ? String(params.To).slice(0, 20) : null,
        body,
        outcome: "received",
        handled: false,
      });
      const result = await act(trx, from, body);
      await trx("inbound_messages").where({ id: inboundId }).update({
        organisation_id: result.organisationId,
        worker_id: result.workerId,
        assignment_id: result.assignmentId,
        outcome: result.outcome,
        handled: result.outcome !== "unmatched",
        reply_body: result.reply,
      });
      if (result.organisationId && !["confirmed", "declined"].includes(result.outcome)) {
        // Confirmations and declines are audited by respond(); everything else here.
        await audit(trx, null, result.organisationId, `sms.${result.outcome}`, "inbound_message", inboundId, {
          from,
          body: body.slice(0, 200),
          workerId: result.workerId,
        });
      }
      return { duplicate: false, outcome: result.outcome, reply: result.reply, assignmentId: result.assignmentId, workerId: result.workerId };
    }, TX), "inbound text");
  } catch (err) {
    if (isDuplicate(err)) return { duplicate: true, outcome: "duplicate", reply: null, assignmentId: null, workerId: null };
    throw err;
  }
}

interface Acted {
  outcome: string;
  reply: string;
  organisationId: number | null;
  workerId: number | null;
  assignmentId: number | null;
}

async function act(trx: Knex.Transaction, from: string, body: string): Promise<Acted> {
  const workers = (await trx("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .join("organisations as g", "g.id", "w.organisation_id")
    .where("w.phone_e164", from)
    .orderBy([{ column: "w.active", order: "desc" }, { column: "w.id" }])
    .select("w.id", "w.organisation_id", "w.yard_id", "w.first_name", "w.last_name", "w.active", trx.raw("COALESCE(y.dispatcher_phone, g.dispatcher_phone) as dispatcher_phone"))) as WorkerRow[];
  const parsed = parseReply(body);
  const worker = workers[0];
  const none = { organisationId: worker?.organisation_id ?? null, workerId: worker?.id ?? null, assignmentId: null };

  if (parsed.kind === "stop" || parsed.kind === "start") {
    const optIn = parsed.kind === "start";
    if (workers.length) {
      await trx("workers")
        .whereIn("id", workers.map((w) => w.id))
        .update({ sms_opt_in: optIn, updated_at: new Date() });
    }
    return { ...none, outcome: optIn ? "opt_in" : "opt_out", reply: optIn ? replyText.started() : replyText.stopped() };
  }
  if (!worker) return { ...none, outcome: "unmatched", reply: replyText.unknownNumber() };
  const dispatcher = formatPhone(worker.dispatcher_phone);
  if (parsed.kind === "help") return { ...none, outcome: "help", reply: replyText.help(dispatcher) };
  if (parsed.kind === "unknown") return { ...none, outcome: "unmatched", reply: replyText.unknown() };

  const ids = workers.map((w) => w.id);
  const answer: Answer = parsed.kind;
  const reason = parsed.kind === "decline" ? parsed.reason : null;
  let target: { id: number; worker_id: number } | undefined;

  const candidates = trx("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("yards as y", "y.id", "o.yard_id")
    .whereIn("a.worker_id", ids)
    .select("a.id", "a.worker_id", "a.status", "a.reply_code", "o.number", "o.start_at", "o.end_at", "y.timezone");
  if (parsed.code) {
    const rows = await candidates.where("a.reply_code", parsed.code).orderBy("a.id", "desc");
    // The live one first (a code is unique among live assignments), else the latest with that code.
    target = rows.find((r) => ["sent", "delivered", "confirmed"].includes(r.status)) ?? rows[0];
    if (!target) return { ...none, outcome: "unmatched", reply: replyText.noSuchCode(parsed.code) };
  } else {
    const open = await candidates
      .whereIn("a.status", ["sent", "delivered"])
      .where("o.end_at", ">", new Date(Date.now() - 12 * 3_600_000))
      .orderBy("o.start_at");
    if (open.length === 0) return { ...none, outcome: "unmatched", reply: replyText.nothingOpen(dispatcher) };
    if (open.length > 1) {
      return {
        ...none,
        outcome: "unmatched",
        reply: replyText.ambiguous(open.map((o) => ({ code: o.reply_code, number: o.number, day: shortDay(new Date(o.start_at), o.timezone) }))),
      };
    }
    target = open[0];
  }

  try {
    const r = await respond(trx, { assignmentId: target!.id, workerId: target!.worker_id, answer, reason, channel: "sms", actor: null });
    const who = workers.find((w) => w.id === target!.worker_id) ?? worker;
    const acted = { organisationId: who.organisation_id, workerId: who.id, assignmentId: r.assignmentId };
    if (r.outcome === "unchanged") return { ...acted, outcome: "unchanged", reply: replyText.alreadyConfirmed(r.orderNumber) };
    if (r.outcome === "declined") return { ...acted, outcome: "declined", reply: replyText.declined(who.first_name, r.orderNumber, Boolean(reason)) };
    const info = await trx("assignments as a")
      .join("work_orders as o", "o.id", "a.work_order_id")
      .join("positions as p", "p.id", "a.position_id")
      .join("yards as y", "y.id", "o.yard_id")
      .where("a.id", r.assignmentId)
      .first("p.position", "o.start_at", "o.end_at", "y.timezone");
    return {
      ...acted,
      outcome: "confirmed",
      reply: replyText.confirmed(who.first_name, r.orderNumber, info.position, whenText(new Date(info.start_at), new Date(info.end_at), info.timezone)),
    };
  } catch (err) {
    if (!(err instanceof ResponseRefused)) throw err;
    const acted = { ...none, assignmentId: target!.id };
    const number = err.orderNumber ?? "that job";
    if (err.reason === "already_declined") return { ...acted, outcome: "unmatched", reply: replyText.alreadyDeclined(number, dispatcher) };
    return { ...acted, outcome: "unmatched", reply: replyText.notOpen(number, dispatcher) };
  }
}
