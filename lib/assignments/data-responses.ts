import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { withConflictRetry } from "@/lib/db";
import { bumpOrders } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";
import { crewHash } from "@/lib/board/data";
import { lapseOverrides } from "./data-lapses";

// A worker's answer to an assignment, by text or on My week: the one state machine.
//
//   sent | delivered  --confirm-->  confirmed
//   sent | delivered | confirmed  --decline-->  declined (holds_position = NULL: the seat opens;
//                                               the row is kept with the reason)
//   confirmed --confirm--> unchanged;  declined --any--> 409 (the seat may be refilled already:
//   call dispatch);  draft --> 409 (not sent yet);  removed --> 409 (no longer on it)
//
// Runs in the caller's transaction when given one, else in its own. Locks the order first and
// then the assignment, the same order assignment writes use, so a decline and a dispatcher's
// move of the same seat are serialised.

export type Answer = "confirm" | "decline";
export type ResponseChannel = "sms" | "web" | "email";

export interface RespondInput {
  assignmentId: number;
  workerId: number;
  answer: Answer;
  reason?: string | null;
  channel: ResponseChannel;
  /** The signed-in user for web answers; null for a text reply (the worker, not a user). */
  actor?: Actor | null;
}

export interface RespondResult {
  outcome: "confirmed" | "declined" | "unchanged";
  assignmentId: number;
  orderId: number;
  orderNumber: string;
  status: string;
}

export class ResponseRefused extends ApiError {
  constructor(
    status: number,
    message: string,
    public reason: "not_yours" | "not_sent" | "removed" | "already_declined" | "missing",
    public orderNumber: string | null = null,
  ) {
    super(status, message, { reason });
  }
}

const OPEN = new Set(["sent", "delivered"]);

export async function respond(db: Knex | Knex.Transaction, input: RespondInput): Promise<RespondResult> {
  const run = async (trx: Knex.Transaction) => {
    const peek = await trx("assignments").where({ id: input.assignmentId }).first("work_order_id");
    if (!peek) throw new ResponseRefused(404, "No such assignment.", "missing");
    // Write what is locked (work_orders.booking_seq): a reply and a crew change or a send on
    // another Galera node then collide at commit instead of both passing.
    await bumpOrders(trx, [Number(peek.work_order_id)]);
    const order = await trx("work_orders")
      .where({ id: peek.work_order_id })
      .forUpdate()
      .first("id", "organisation_id", "yard_id", "work_date", "number", "status");
    const a = await trx("assignments").where({ id: input.assignmentId }).forUpdate().first();
    if (!a || !order) throw new ResponseRefused(404, "No such assignment.", "missing");
    if (a.worker_id !== input.workerId) {
      throw new ResponseRefused(403, "That assignment belongs to someone else.", "not_yours", order.number);
    }
    if (a.status === "draft") throw new ResponseRefused(409, `${order.number} has not been sent to you yet.`, "not_sent", order.number);
    if (a.status === "removed") throw new ResponseRefused(409, `You are no longer on ${order.number}.`, "removed", order.number);
    if (a.status === "declined") {
      throw new ResponseRefused(409, `You already declined ${order.number}; call dispatch to change that.`, "already_declined", order.number);
    }
    const base = { assignmentId: a.id as number, orderId: order.id as number, orderNumber: order.number as string };
    if (input.answer === "confirm" && a.status === "confirmed") return { ...base, outcome: "unchanged" as const, status: "confirmed" };
    if (input.answer === "confirm" && !OPEN.has(a.status)) {
      throw new ResponseRefused(409, `${order.number} is not waiting for an answer.`, "not_sent", order.number);
    }

    const now = new Date();
    const reason = input.answer === "decline" ? (input.reason ?? "").trim().slice(0, 500) || null : null;
    if (input.answer === "confirm") {
      await trx("assignments").where({ id: a.id }).update({
        status: "confirmed",
        responded_at: now,
        response_channel: input.channel,
        decline_reason: null,
        updated_at: now,
      });
    } else {
      await trx("assignments").where({ id: a.id }).update({
        status: "declined",
        holds_position: null,
        responded_at: now,
        response_channel: input.channel,
        decline_reason: reason,
        version: a.version + 1,
        updated_at: now,
      });
      // The crew changed: stale board writes get a 409, and overrides given for the old crew
      // stop matching (loadBoard compares the crew hash).
      await trx("work_orders").where({ id: order.id }).increment("version", 1).update({ updated_at: now });
      // Issue 18, point 13: overrides given for the old crew lapse now, and their authors are told.
      const seats = await trx("assignments").where({ work_order_id: order.id }).whereNotNull("holds_position").select("position_id", "worker_id");
      const who = await trx("workers").where({ id: a.worker_id }).first("first_name", "last_name");
      await lapseOverrides(trx, order.id, crewHash(seats.map((s) => ({ positionId: s.position_id, workerId: s.worker_id }))), {
        change: { kind: "declined", worker: who ? `${who.first_name} ${who.last_name}` : "A crew member" },
        byUserId: null,
        byName: null,
      });
    }
    const outcome = input.answer === "confirm" ? ("confirmed" as const) : ("declined" as const);
    await audit(trx, input.actor ?? null, order.organisation_id, `assignment.${outcome === "confirmed" ? "confirm" : "decline"}`, "assignment", a.id, {
      order: order.number,
      workerId: a.worker_id,
      channel: input.channel,
      previous: a.status,
      ...(reason ? { reason } : {}),
    });
    await boardEvent(trx, {
      organisationId: order.organisation_id,
      yardId: order.yard_id,
      day: order.work_date,
      kind: "reply",
      payload: { orderId: order.id, assignmentId: a.id, answer: input.answer, channel: input.channel },
    });
    return { ...base, outcome, status: outcome };
  };
  if ((db as Knex.Transaction).isTransaction) return run(db as Knex.Transaction);
  return withConflictRetry(() => (db as Knex).transaction(run, { isolationLevel: "read committed" }), "reply");
}

/** Whose assignment this is: its worker and its order's organisation, or undefined. */
export async function assignmentOwner(db: Knex, id: number): Promise<{ worker_id: number; organisation_id: number } | undefined> {
  return db("assignments as a").join("work_orders as o", "o.id", "a.work_order_id").where("a.id", id).first("a.worker_id", "o.organisation_id");
}
