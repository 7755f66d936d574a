// Send crews: tell a yard's day what changed since it was last sent, by text and e-mail.
//
// One READ COMMITTED transaction locks the day's orders FOR UPDATE (the lock every assignment
// write takes first, so the crews cannot change underneath), re-checks that no unresolved
// block remains (409 with the list otherwise), marks what it tells and writes the outbox rows.
// What is told:
//   - new:      a draft assignment (a new placement, or the new half of a moved one) → sent;
//   - changed:  a sent/delivered/confirmed assignment whose order's time or place differs from
//               what the worker was told → a change message; it waits for a new answer (sent).
//               "What was told" is assignments.told_hash, a hash of order, start, end,
//               address, pole and position; work_orders.version is not used because every crew
//               change bumps it too (that would re-text the whole crew for one new ground hand);
//   - removed:  a removed assignment that had been sent and not yet told (sent_version <
//               version) → "you're off …"; told by setting sent_version = version. When the same
//               worker has a new seat on the same order (a move within the order), the removal
//               is folded into the new seat's message.
// Each person gets one text (when they have an E.164 phone and have not opted out) and one
// e-mail (when they have an address) per change. Outbox dedupe keys are
// kind:assignment:version:channel, so running the same send twice writes nothing twice.
import "@/lib/server-only";
import { createHash, randomUUID } from "node:crypto";
import type { Knex } from "knex";
import { parsePhoneNumberFromString } from "libphonenumber-js";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { loadBoard, unresolvedBlocks } from "@/lib/board/data";
import { bumpOrders } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";
import { withConflictRetry } from "@/lib/db";
import { pickYard } from "@/lib/yards/data";
import { prepareBoardDay } from "@/lib/board/data-extras";
import { appPublicUrl } from "@/lib/notify/config";
import { jobEmail, jobSms, removalSms, type JobFacts, type OutboundKind } from "@/lib/notify/wording";
import { unitsForOrders } from "@/lib/equipment/data";
import { enqueue, pokeDelivery, type OutboxInput } from "@/lib/notify/data-outbox";

const TX = { isolationLevel: "read committed" as const };

export { appPublicUrl };

export function isTextable(phone: string | null | undefined) {
  if (!phone || !/^\+[1-9]\d{6,14}$/.test(phone)) return false;
  return Boolean(parsePhoneNumberFromString(phone)?.isPossible());
}

interface FactRow {
  id: number;
  work_order_id: number;
  position_id: number;
  worker_id: number;
  status: string;
  version: number;
  sent_version: number | null;
  sent_at: Date | null;
  told_hash: string | null;
  reply_code: string;
  holds_position: number | null;
  position: string;
  number: string;
  title: string;
  address: string | null;
  structure_no: string | null;
  start_at: Date;
  end_at: Date;
  organisation_id: number;
  timezone: string;
  yard_name: string;
  dispatcher_phone: string | null;
  first_name: string;
  last_name: string;
  phone_e164: string | null;
  email: string | null;
  sms_opt_in: number;
}

function factQuery(q: Knex | Knex.Transaction) {
  return q("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .join("positions as p", "p.id", "a.position_id")
    .join("workers as w", "w.id", "a.worker_id")
    .join("yards as y", "y.id", "o.yard_id")
    .join("organisations as g", "g.id", "o.organisation_id")
    .select(
      "a.id",
      "a.work_order_id",
      "a.position_id",
      "a.worker_id",
      "a.status",
      "a.version",
      "a.sent_version",
      "a.sent_at",
      "a.told_hash",
      "a.reply_code",
      "a.holds_position",
      "p.position",
      "o.number",
      "o.title",
      "o.address",
      "o.structure_no",
      "o.start_at",
      "o.end_at",
      "o.organisation_id",
      "y.timezone",
      "y.name as yard_name",
      q.raw("COALESCE(y.dispatcher_phone, g.dispatcher_phone) as dispatcher_phone"),
      "w.first_name",
      "w.last_name",
      "w.phone_e164",
      "w.email",
      "w.sms_opt_in",
    );
}

/** The fingerprint of what a worker is told: which order, when, where, in which position. */
export function toldHash(r: Pick<FactRow, "work_order_id" | "start_at" | "end_at" | "address" | "structure_no" | "position">) {
  const key = JSON.stringify([
    r.work_order_id,
    new Date(r.start_at).toISOString(),
    new Date(r.end_at).toISOString(),
    (r.address ?? "").trim(),
    (r.structure_no ?? "").trim(),
    r.position,
  ]);
  return createHash("sha1").update(key).digest("hex");
}

async function crewsOf(q: Knex | Knex.Transaction, orderIds: number[]) {
  const m = new Map<number, { name: string; position: string }[]>();
  if (!orderIds.length) return m;
  const rows = await q("assignments as a")
    .join("workers as w", "w.id", "a.worker_id")
    .join("positions as p", "p.id", "a.position_id")
    .whereIn("a.work_order_id", orderIds)
    .whereNotNull("a.holds_position")
    .orderBy(["a.work_order_id", "p.sort", "p.id"])
    .select("a.work_order_id", "w.first_name", "w.last_name", "p.position");
  for (const r of rows) {
    const list = m.get(r.work_order_id) ?? [];
    list.push({ name: `${r.first_name} ${r.last_name}`, position: r.position });
    m.set(r.work_order_id, list);
  }
  return m;
}

function facts(r: FactRow, crew: { name: string; position: string }[], trucks: { unit: string; name: string }[] = []): JobFacts {
  return {
    assignmentId: r.id,
    orderNumber: r.number,
    title: r.title,
    address: r.address,
    structureNo: r.structure_no,
    start: new Date(r.start_at),
    end: new Date(r.end_at),
    timezone: r.timezone,
    position: r.position,
    replyCode: r.reply_code,
    workerFirstName: r.first_name,
    workerName: `${r.first_name} ${r.last_name}`,
    yardName: r.yard_name,
    dispatcherPhone: r.dispatcher_phone,
    crew,
    version: r.version,
    trucks,
  };
}

/** The outbox rows telling one person one thing: a text and an e-mail where they can be reached. */
export function messagesFor(
  r: FactRow,
  kind: OutboundKind,
  crew: { name: string; position: string }[],
  keyBase: string,
  trucks: { unit: string; name: string }[] = [],
): OutboxInput[] {
  const f = facts(r, crew, trucks);
  const out: OutboxInput[] = [];
  const common = { organisationId: r.organisation_id, workerId: r.worker_id, assignmentId: r.id, kind };
  if (isTextable(r.phone_e164) && r.sms_opt_in) {
    out.push({ ...common, channel: "sms", to: r.phone_e164!, body: kind === "removal" ? removalSms(f) : jobSms(kind, f), dedupeKey: `${keyBase}:sms` });
  }
  if (r.email) {
    const e = jobEmail(kind, f, appPublicUrl());
    out.push({ ...common, channel: "email", to: r.email, subject: e.subject, body: e.text, html: e.html, attachments: e.attachments, dedupeKey: `${keyBase}:email` });
  }
  return out;
}

export interface SendResult {
  assignments: number;
  messages: number;
  new: number;
  changed: number;
  removed: number;
  /** Told on the board but reachable by neither text nor e-mail: call them. */
  unreachable: { assignmentId: number; workerId: number; name: string }[];
}

type SessionActor = Actor & { name?: string };

export async function sendCrews(db: Knex, user: SessionActor, input: { date: string; yard: string }): Promise<SendResult> {
  const { yard, yards } = await pickYard(db, user.organisationId, input.yard);
  if (!yard || yard.code.toLowerCase() !== input.yard.toLowerCase()) throw new ApiError(404, `No yard with code ${input.yard}.`);
  const day = input.date;
  await prepareBoardDay(db, user.organisationId, yard.id, day);

  const result = await withConflictRetry(() => db.transaction(async (trx) => {
    const locked = await trx("work_orders")
      .where({ organisation_id: user.organisationId, yard_id: yard.id, work_date: day })
      .whereNot("status", "cancelled")
      .orderBy("id")
      .forUpdate()
      .select("id", "status");
    const orderIds = locked.filter((o) => o.status !== "done").map((o) => o.id as number);
    // The block check below relies on these locks: write the rows too (booking_seq), so a crew
    // change committed on another Galera node meanwhile, or a second Send crews there, collides
    // at commit and this send runs again on what is then committed (lib/booking/data.ts).
    await bumpOrders(trx, locked.map((o) => o.id as number));

    // The board as it stands under the lock: no unresolved block may remain.
    const board = await loadBoard(trx as unknown as Knex, { organisationId: user.organisationId, yard, yards, day });
    const blocks = unresolvedBlocks(board.findings, board.overrides);
    if (blocks.length) {
      const numberOf = new Map(board.orders.map((o) => [String(o.id), o.number]));
      const names = new Map(board.pool.map((p) => [String(p.id), p.name]));
      throw new ApiError(409, `Send crews is held back by ${blocks.length} unresolved block${blocks.length > 1 ? "s" : ""}: fix the crews or have a supervisor override.`, {
        blocks: blocks.map((b) => ({
          rule: b.rule,
          workOrderId: Number(b.workOrderId),
          order: numberOf.get(b.workOrderId) ?? null,
          workerId: b.workerId === null ? null : Number(b.workerId),
          worker: b.workerId === null ? null : (names.get(b.workerId) ?? null),
          message: b.message,
          locked: Boolean(b.locked),
        })),
      });
    }

    const live: FactRow[] = orderIds.length
      ? await factQuery(trx).whereIn("a.work_order_id", orderIds).whereNotNull("a.holds_position").orderBy("a.id").forUpdate()
      : [];
    const liveWorkers = [...new Set(live.map((r) => r.worker_id))];
    // Removed and not yet told: on this day's orders, or of a worker told something today (a
    // move from another yard's or day's order is told together with the new seat).
    const removed: FactRow[] =
      orderIds.length || liveWorkers.length
        ? await factQuery(trx)
            .where("a.status", "removed")
            .whereNotNull("a.sent_at")
            .where((w) => w.whereNull("a.sent_version").orWhereRaw("a.sent_version < a.version"))
            .where((w) => {
              if (orderIds.length) w.orWhereIn("a.work_order_id", orderIds);
              if (liveWorkers.length) w.orWhereIn("a.worker_id", liveWorkers);
            })
            .where("o.organisation_id", user.organisationId)
            .orderBy("a.id")
            .forUpdate()
        : [];

    const crews = await crewsOf(trx, [...new Set([...live, ...removed].map((r) => r.work_order_id))]);
    const trucks = await unitsForOrders(trx, [...new Set(live.map((r) => r.work_order_id))]);
    const now = new Date();
    const outbox: OutboxInput[] = [];
    const counts = { new: 0, changed: 0, removed: 0 };
    const unreachable: SendResult["unreachable"] = [];
    const told = (r: FactRow, kind: OutboundKind) => {
      const rows = messagesFor(r, kind, crews.get(r.work_order_id) ?? [], `${kind}:a${r.id}:v${r.version}`, trucks.get(r.work_order_id) ?? []);
      if (!rows.length && kind !== "removal") unreachable.push({ assignmentId: r.id, workerId: r.worker_id, name: `${r.first_name} ${r.last_name}` });
      outbox.push(...rows);
    };

    const newSeatOn = new Set(live.filter((r) => r.status === "draft").map((r) => `${r.worker_id}:${r.work_order_id}`));
    const foldedRemoval = new Set<string>();
    for (const r of removed) {
      const key = `${r.worker_id}:${r.work_order_id}`;
      if (newSeatOn.has(key)) foldedRemoval.add(key);
      else {
        told(r, "removal");
        counts.removed++;
      }
      await trx("assignments").where({ id: r.id }).update({ sent_version: r.version, updated_at: now });
    }

    for (const r of live) {
      const hash = toldHash(r);
      if (r.status === "draft") {
        told(r, foldedRemoval.has(`${r.worker_id}:${r.work_order_id}`) ? "change" : "assignment");
        counts.new++;
        await trx("assignments").where({ id: r.id }).update({
          status: "sent",
          sent_at: now,
          sent_version: r.version,
          told_hash: hash,
          responded_at: null,
          updated_at: now,
        });
      } else if (r.told_hash === null) {
        // Sent before what was told was recorded: remember it, do not re-text.
        await trx("assignments").where({ id: r.id }).update({ told_hash: hash });
      } else if (r.told_hash !== hash && ["sent", "delivered", "confirmed"].includes(r.status)) {
        told(r, "change");
        counts.changed++;
        await trx("assignments").where({ id: r.id }).update({
          status: "sent",
          sent_at: now,
          sent_version: r.version,
          told_hash: hash,
          responded_at: null,
          updated_at: now,
        });
      }
    }

    const messages = await enqueue(trx, outbox);
    const assignments = counts.new + counts.changed + counts.removed;
    await audit(trx, user, user.organisationId, "send.crews", "send", `${yard.code}:${day}`, {
      yard: yard.code,
      day,
      orders: board.orders.map((o) => o.number),
      ...counts,
      messages,
      unreachable: unreachable.map((u) => u.name),
    });
    await boardEvent(trx, {
      organisationId: user.organisationId,
      yardId: yard.id,
      day,
      kind: "send",
      payload: { assignments, messages, ...counts },
    });
    return { assignments, messages, ...counts, unreachable };
  }, TX), "send crews");

  if (result.messages) pokeDelivery();
  return result;
}

/** Re-send: a fresh text and e-mail for one assignment already sent (a worker lost the text). */
export async function resendAssignment(db: Knex, user: SessionActor, assignmentId: number) {
  const out = await withConflictRetry(() => db.transaction(async (trx) => {
    const peek = await trx("assignments").where({ id: assignmentId }).first("work_order_id");
    if (!peek) throw new ApiError(404, "No such assignment.");
    await bumpOrders(trx, [Number(peek.work_order_id)]); // write what is locked (booking_seq)
    const order = await trx("work_orders").where({ id: peek.work_order_id }).forUpdate().first("id", "organisation_id", "yard_id", "work_date", "number");
    if (!order || order.organisation_id !== user.organisationId) throw new ApiError(404, "No such assignment.");
    const [r] = (await factQuery(trx).where("a.id", assignmentId).forUpdate()) as FactRow[];
    if (!r || r.holds_position === null) throw new ApiError(404, "No such assignment on the board (it may have been removed or declined).");
    if (!["sent", "delivered", "confirmed"].includes(r.status)) {
      throw new ApiError(409, `${r.first_name} ${r.last_name} has not been sent this yet: use Send crews.`);
    }
    const recent = await trx("notifications")
      .where({ assignment_id: r.id, kind: "resend" })
      .where("created_at", ">", new Date(Date.now() - 30_000))
      .first("id");
    if (recent) throw new ApiError(409, `A re-send to ${r.first_name} ${r.last_name} was queued moments ago.`);
    const crews = await crewsOf(trx, [r.work_order_id]);
    const trucks = await unitsForOrders(trx, [r.work_order_id]);
    const rows = messagesFor(r, "resend", crews.get(r.work_order_id) ?? [], `resend:a${r.id}:${randomUUID()}`, trucks.get(r.work_order_id) ?? []);
    if (!rows.length) throw new ApiError(409, `${r.first_name} ${r.last_name} has no textable phone or e-mail on file: call them.`);
    const messages = await enqueue(trx, rows);
    await audit(trx, user, user.organisationId, "assignment.resend", "assignment", r.id, {
      order: r.number,
      workerId: r.worker_id,
      channels: rows.map((x) => x.channel),
    });
    await boardEvent(trx, { organisationId: user.organisationId, yardId: order.yard_id, day: order.work_date, kind: "send", payload: { resend: r.id } });
    return { messages, channels: rows.map((x) => x.channel) };
  }, TX), "re-send");
  pokeDelivery();
  return out;
}
