import "@/lib/server-only";
import { randomInt } from "node:crypto";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { withConflictRetry } from "@/lib/db";
import { findingsForOrders } from "@/lib/rules/engine";
import type { Finding } from "@/lib/rules/types";
import { audit, type Actor } from "@/lib/audit/data";
import { buildSnapshot, crewHash, liveAssignments, orderQuery, type OrderRow } from "@/lib/board/data";
import { refreshBriefingState } from "@/lib/briefings/data";
import { bumpWorkers } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";
import { lapseOverrides, type CrewChangeBy } from "./data-lapses";

// Assignment writes. Each runs in one READ COMMITTED transaction that locks the orders it
// touches (in id order) and then the worker, so two dispatchers placing the same person, or
// filling the same seat, are serialised: the second sees the first's committed row and gets a
// 409. The unique index on assignments.holds_position backs the seat check.

const TX = { isolationLevel: "read committed" as const };

export interface CrewState {
  orderId: number;
  version: number;
  seats: { positionId: number; assignmentId: number; workerId: number; status: string; version: number }[];
}

export class ConflictError extends ApiError {
  constructor(message: string, current: CrewState[]) {
    super(409, message, { current });
  }
}

async function crewState(q: Knex | Knex.Transaction, orderIds: number[]): Promise<CrewState[]> {
  const [orders, seats] = await Promise.all([
    q("work_orders").whereIn("id", orderIds).select("id", "version"),
    q("assignments")
      .whereIn("work_order_id", orderIds)
      .whereNotNull("holds_position")
      .select("work_order_id", "position_id", "id", "worker_id", "status", "version"),
  ]);
  return orders.map((o) => ({
    orderId: o.id,
    version: o.version,
    seats: seats
      .filter((s) => s.work_order_id === o.id)
      .map((s) => ({ positionId: s.position_id, assignmentId: s.id, workerId: s.worker_id, status: s.status, version: s.version })),
  }));
}

/** Locks the orders (sorted by id, so concurrent writers never wait on each other in a cycle). */
async function lockOrders(trx: Knex.Transaction, organisationId: number, ids: number[]) {
  const rows = await trx("work_orders")
    .whereIn("id", [...new Set(ids)].sort((a, b) => a - b))
    .orderBy("id")
    .forUpdate()
    .select("id", "organisation_id", "version", "status", "number", "start_at", "end_at", "yard_id", "work_date");
  for (const r of rows) if (r.organisation_id !== organisationId) throw new ApiError(404, "No such work order.");
  return new Map(rows.map((r) => [r.id as number, r]));
}

/**
 * Locks the worker by bumping their booking_seq (a write, not only FOR UPDATE: on a Galera
 * cluster a lock holds only on its own node, and two placements of one person on two nodes
 * must write the same row for certification to refuse the second; lib/booking/data.ts).
 */
async function lockWorker(trx: Knex.Transaction, organisationId: number, workerId: number) {
  await bumpWorkers(trx, [workerId]);
  const w = await trx("workers").where({ id: workerId }).forUpdate().first();
  if (!w || w.organisation_id !== organisationId) {
    throw new ApiError(422, "Invalid workerId: no such worker.", { issues: [{ field: "workerId", message: "No such worker" }] });
  }
  if (!w.active) {
    throw new ApiError(422, `Invalid workerId: ${w.first_name} ${w.last_name} is inactive.`, {
      issues: [{ field: "workerId", message: "Worker is inactive" }],
    });
  }
  return w;
}

async function seatOf(trx: Knex.Transaction, positionId: number) {
  const seat = await trx("positions").where({ id: positionId }).first();
  if (!seat) {
    throw new ApiError(422, "Invalid positionId: no such position.", { issues: [{ field: "positionId", message: "No such position" }] });
  }
  return seat as { id: number; work_order_id: number; position: string };
}

const CLOSED = new Set(["done", "cancelled"]);

function assertOpen(order: { status: string; number: string }) {
  if (CLOSED.has(order.status)) throw new ApiError(409, `${order.number} is ${order.status}; its crew can no longer change.`);
}

/**
 * Never persist a double booking: the worker may not be on another order that overlaps this one.
 * A plain read, not FOR UPDATE: the caller holds the worker's row lock, which every placement
 * of this worker takes first, and READ COMMITTED reads what the previous holder committed. A
 * locking read here would lock the other orders' rows too while holding the worker — the reverse
 * of the orders-then-worker order — and two instances placing one person on two overlapping
 * orders deadlocked (tests/reliability/two-instances.test.ts).
 */
async function assertNoClash(
  trx: Knex.Transaction,
  workerId: number,
  order: { id: number; start_at: Date; end_at: Date },
  workerName: string,
  exceptAssignmentId?: number,
) {
  const q = trx("assignments as a")
    .join("work_orders as o", "o.id", "a.work_order_id")
    .where("a.worker_id", workerId)
    .whereNotNull("a.holds_position")
    .whereNot("o.id", order.id)
    .whereNot("o.status", "cancelled")
    .where("o.start_at", "<", order.end_at)
    .where("o.end_at", ">", order.start_at)
    .select("o.number", "o.start_at", "o.end_at")
    .first();
  if (exceptAssignmentId) q.whereNot("a.id", exceptAssignmentId);
  const clash = await q;
  if (clash) {
    throw new ConflictError(
      `${workerName} is already on ${clash.number} at that time (DOUBLE_BOOKED). Take them off it first.`,
      await crewState(trx, [order.id]),
    );
  }
}

async function newReplyCode(trx: Knex.Transaction): Promise<string> {
  for (let i = 0; i < 20; i++) {
    const code = String(randomInt(1000, 10000));
    const used = await trx("assignments").where({ reply_code: code }).whereIn("status", ["draft", "sent", "delivered", "confirmed"]).first("id");
    if (!used) return code;
  }
  return String(randomInt(10000, 100000));
}

/** After a crew changes: bump the order's version and lapse overrides given for another crew. */
async function crewChanged(trx: Knex.Transaction, orderId: number, by: CrewChangeBy) {
  const seats = await trx("assignments").where({ work_order_id: orderId }).whereNotNull("holds_position").select("position_id", "worker_id");
  const hash = crewHash(seats.map((s) => ({ positionId: s.position_id, workerId: s.worker_id })));
  await trx("work_orders").where({ id: orderId }).increment("version", 1).update({ updated_at: new Date() });
  // Issue 18, point 13: the supervisor who gave a lapsing override is told (notice + e-mail).
  const lapsed = await lapseOverrides(trx, orderId, hash, by);
  // A new crew member has not acknowledged the briefing yet: the order is no longer "briefed".
  await refreshBriefingState(trx, orderId);
  return { hash, lapsed };
}

const changedBy = (user: SessionActor, change: CrewChangeBy["change"]): CrewChangeBy => ({ change, byUserId: user.id ?? null, byName: user.name ?? null });

/** Deadlocks and Galera certification failures: retried with jitter, counted, then 409/503. */
const withRetry = <T>(fn: () => Promise<T>) => withConflictRetry(fn, "assignment");

export interface WriteResult {
  assignmentId: number | null;
  orderIds: number[];
  workerIds: number[];
  current: CrewState[];
}

type SessionActor = Actor & { name?: string };

export async function createAssignment(
  db: Knex,
  user: SessionActor,
  input: { positionId: number; workerId: number; orderVersion?: number },
): Promise<WriteResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      const seat = await seatOf(trx, input.positionId);
      const orders = await lockOrders(trx, user.organisationId, [seat.work_order_id]);
      const order = orders.get(seat.work_order_id);
      if (!order) throw new ApiError(404, "No such work order.");
      assertOpen(order);
      if (input.orderVersion !== undefined && input.orderVersion !== order.version) {
        throw new ConflictError(`${order.number} was changed by someone else; the card has been refreshed.`, await crewState(trx, [order.id]));
      }
      const worker = await lockWorker(trx, user.organisationId, input.workerId);
      const name = `${worker.first_name} ${worker.last_name}`;
      const taken = await trx("assignments").where({ holds_position: seat.id }).forUpdate().first("id");
      if (taken) throw new ConflictError(`That ${seat.position} position on ${order.number} was just filled.`, await crewState(trx, [order.id]));
      await assertNoClash(trx, worker.id, order, name);

      const [id] = await trx("assignments").insert({
        work_order_id: order.id,
        position_id: seat.id,
        worker_id: worker.id,
        holds_position: seat.id,
        status: "draft",
        reply_code: await newReplyCode(trx),
        created_by: user.id,
      });
      const { lapsed } = await crewChanged(trx, order.id, changedBy(user, { kind: "placed", worker: name, position: seat.position }));
      await audit(trx, user, user.organisationId, "assignment.create", "assignment", id, {
        order: order.number,
        position: seat.position,
        workerId: worker.id,
        worker: name,
        overridesLapsed: lapsed,
      });
      await boardEvent(trx, {
        organisationId: user.organisationId,
        yardId: order.yard_id,
        day: order.work_date,
        kind: "assignment",
        payload: { orderId: order.id },
      });
      return { assignmentId: id, orderIds: [order.id], workerIds: [worker.id], current: await crewState(trx, [order.id]) };
    }, TX),
  );
}

export async function moveAssignment(
  db: Knex,
  user: SessionActor,
  assignmentId: number,
  input: { positionId: number; version: number },
): Promise<WriteResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      const current = await trx("assignments").where({ id: assignmentId }).first();
      if (!current || current.holds_position === null) throw new ApiError(404, "No such assignment on the board (it may have been removed).");
      const target = await seatOf(trx, input.positionId);
      const orders = await lockOrders(trx, user.organisationId, [current.work_order_id, target.work_order_id]);
      const from = orders.get(current.work_order_id);
      const to = orders.get(target.work_order_id);
      if (!from || !to) throw new ApiError(404, "No such work order.");
      assertOpen(from);
      assertOpen(to);
      const locked = await trx("assignments").where({ id: assignmentId }).forUpdate().first();
      if (!locked || locked.holds_position === null || locked.version !== input.version) {
        throw new ConflictError("This assignment was changed by someone else; the card has been refreshed.", await crewState(trx, [from.id, to.id]));
      }
      const worker = await lockWorker(trx, user.organisationId, locked.worker_id);
      const name = `${worker.first_name} ${worker.last_name}`;
      if (target.id === locked.position_id) {
        return { assignmentId, orderIds: [from.id], workerIds: [worker.id], current: await crewState(trx, [from.id]) };
      }
      const taken = await trx("assignments").where({ holds_position: target.id }).forUpdate().first("id");
      if (taken) throw new ConflictError(`That ${target.position} position on ${to.number} is already filled.`, await crewState(trx, [from.id, to.id]));
      await assertNoClash(trx, worker.id, to, name, assignmentId);

      let id = assignmentId;
      if (locked.status === "draft") {
        await trx("assignments").where({ id: assignmentId }).update({
          work_order_id: to.id,
          position_id: target.id,
          holds_position: target.id,
          version: locked.version + 1,
          updated_at: new Date(),
        });
      } else {
        // The worker was already told: the old seat ends (they get a change message on the
        // next send) and the new seat starts as a fresh draft with its own reply code.
        await trx("assignments")
          .where({ id: assignmentId })
          .update({ status: "removed", holds_position: null, version: locked.version + 1, updated_at: new Date() });
        [id] = await trx("assignments").insert({
          work_order_id: to.id,
          position_id: target.id,
          worker_id: worker.id,
          holds_position: target.id,
          status: "draft",
          reply_code: await newReplyCode(trx),
          created_by: user.id,
        });
      }
      const moved = changedBy(user, { kind: "moved", worker: name, position: target.position, fromOrder: from.number, toOrder: to.number });
      const lapsed = (await crewChanged(trx, from.id, moved)).lapsed + (to.id !== from.id ? (await crewChanged(trx, to.id, moved)).lapsed : 0);
      await audit(trx, user, user.organisationId, "assignment.move", "assignment", id, {
        worker: name,
        workerId: worker.id,
        from: { order: from.number, positionId: locked.position_id },
        to: { order: to.number, position: target.position },
        overridesLapsed: lapsed,
      });
      for (const o of new Map([from, to].map((x) => [x.id, x])).values()) {
        await boardEvent(trx, { organisationId: user.organisationId, yardId: o.yard_id, day: o.work_date, kind: "assignment", payload: { orderId: o.id } });
      }
      return { assignmentId: id, orderIds: [...new Set([from.id, to.id])], workerIds: [worker.id], current: await crewState(trx, [from.id, to.id]) };
    }, TX),
  );
}

export async function removeAssignment(
  db: Knex,
  user: SessionActor,
  assignmentId: number,
  input: { version: number },
): Promise<WriteResult> {
  return withRetry(() =>
    db.transaction(async (trx) => {
      const current = await trx("assignments").where({ id: assignmentId }).first();
      if (!current || current.holds_position === null) throw new ApiError(404, "No such assignment on the board (it may have been removed).");
      const orders = await lockOrders(trx, user.organisationId, [current.work_order_id]);
      const order = orders.get(current.work_order_id)!;
      assertOpen(order);
      const locked = await trx("assignments").where({ id: assignmentId }).forUpdate().first();
      if (!locked || locked.holds_position === null || locked.version !== input.version) {
        throw new ConflictError("This assignment was changed by someone else; the card has been refreshed.", await crewState(trx, [order.id]));
      }
      if (locked.status === "draft" && !locked.sent_at) {
        await trx("assignments").where({ id: assignmentId }).delete();
      } else {
        // Told already: keep the row so the next send tells them they are off the order.
        await trx("assignments")
          .where({ id: assignmentId })
          .update({ status: "removed", holds_position: null, version: locked.version + 1, updated_at: new Date() });
      }
      const off = await trx("workers").where({ id: locked.worker_id }).first("first_name", "last_name");
      const { lapsed } = await crewChanged(trx, order.id, changedBy(user, { kind: "removed", worker: off ? `${off.first_name} ${off.last_name}` : "a worker" }));
      await audit(trx, user, user.organisationId, "assignment.remove", "assignment", assignmentId, {
        order: order.number,
        workerId: locked.worker_id,
        overridesLapsed: lapsed,
      });
      await boardEvent(trx, { organisationId: user.organisationId, yardId: order.yard_id, day: order.work_date, kind: "assignment", payload: { orderId: order.id } });
      return { assignmentId, orderIds: [order.id], workerIds: [locked.worker_id], current: await crewState(trx, [order.id]) };
    }, TX),
  );
}

/**
 * The server's own re-check after a write: findings for the touched orders and for the other
 * orders of the touched workers near them (REST and DOUBLE_BOOKED cross orders).
 */
export async function findingsAfter(
  db: Knex,
  organisationId: number,
  orderIds: number[],
  workerIds: number[],
): Promise<{ orderIds: string[]; findings: Finding[] }> {
  const touched = (await orderQuery(db).whereIn("o.id", orderIds)) as OrderRow[];
  if (!touched.length) return { orderIds: [], findings: [] };
  const start = Math.min(...touched.map((o) => new Date(o.start_at).getTime()));
  const end = Math.max(...touched.map((o) => new Date(o.end_at).getTime()));
  // The touched workers' other orders near these: their REST and DOUBLE_BOOKED may change too.
  const near = workerIds.length
    ? await db("assignments as a")
        .join("work_orders as o", "o.id", "a.work_order_id")
        .whereIn("a.worker_id", workerIds)
        .whereNotNull("a.holds_position")
        .whereNot("o.status", "cancelled")
        .where("o.start_at", "<", new Date(end + 48 * 3_600_000))
        .where("o.end_at", ">", new Date(start - 48 * 3_600_000))
        .distinct("o.id")
        .pluck("o.id")
    : [];
  const ids = [...new Set([...orderIds, ...(near as number[])])];
  const orders = ids.length > touched.length ? ((await orderQuery(db).whereIn("o.id", ids)) as OrderRow[]) : touched;
  const assignments = await liveAssignments(db, (q) => q.whereIn("a.work_order_id", ids));
  const { snapshot } = await buildSnapshot(db, {
    organisationId,
    timezone: touched[0].timezone,
    windowStart: start,
    windowEnd: end,
    orders,
    assignments,
    workerIds,
  });
  const out = ids.map(String);
  return { orderIds: out, findings: findingsForOrders(snapshot, out) };
}

/**
 * Swaps two placed workers (issue 18): A takes B's seat and B takes A's, in one transaction on
 * the same locked path as a move — both orders locked in id order, then both workers in id
 * order, each assignment's version checked, each worker checked against double booking on the
 * order they go to. A seat already told (sent, delivered, confirmed) ends and a fresh draft
 * starts, as a move does.
 */
export async function swapAssignments(
  db: Knex,
  user: SessionActor,
  input: { a: { id: number; version: number }; b: { id: number; version: number } },
): Promise<WriteResult> {
  if (input.a.id === input.b.id) {
    throw new ApiError(422, "Invalid b.id: a worker cannot swap with themselves.", { issues: [{ field: "b.id", message: "Same assignment as a.id" }] });
  }
  return withRetry(() =>
    db.transaction(async (trx) => {
      const [ra, rb] = await Promise.all([
        trx("assignments").where({ id: input.a.id }).first(),
        trx("assignments").where({ id: input.b.id }).first(),
      ]);
      if (!ra || ra.holds_position === null || !rb || rb.holds_position === null) {
        throw new ApiError(404, "No such assignment on the board (it may have been removed).");
      }
      const orders = await lockOrders(trx, user.organisationId, [ra.work_order_id, rb.work_order_id]);
      const oa = orders.get(ra.work_order_id);
      const ob = orders.get(rb.work_order_id);
      if (!oa || !ob) throw new ApiError(404, "No such work order.");
      assertOpen(oa);
      assertOpen(ob);
      const lockedRows = await trx("assignments").whereIn("id", [input.a.id, input.b.id].sort((x, y) => x - y)).orderBy("id").forUpdate();
      const la = lockedRows.find((r) => r.id === input.a.id);
      const lb = lockedRows.find((r) => r.id === input.b.id);
      if (!la || !lb || la.holds_position === null || lb.holds_position === null || la.version !== input.a.version || lb.version !== input.b.version) {
        throw new ConflictError("One of these assignments was changed by someone else; the cards have been refreshed.", await crewState(trx, [oa.id, ob.id]));
      }
      if (la.worker_id === lb.worker_id) {
        throw new ApiError(422, "Invalid b.id: both seats hold the same worker.", { issues: [{ field: "b.id", message: "Same worker as a.id" }] });
      }
      const ids = [la.worker_id, lb.worker_id].sort((x: number, y: number) => x - y);
      const workers = new Map<number, { first_name: string; last_name: string }>();
      for (const wid of ids) workers.set(wid, await lockWorker(trx, user.organisationId, wid));
      const nameOf = (wid: number) => `${workers.get(wid)!.first_name} ${workers.get(wid)!.last_name}`;
      const [seatA, seatB] = await Promise.all([seatOf(trx, la.position_id), seatOf(trx, lb.position_id)]);
      // A goes to B's order, B to A's: neither may be on a third order that overlaps where they go.
      await assertNoClash(trx, la.worker_id, ob, nameOf(la.worker_id), la.id);
      await assertNoClash(trx, lb.worker_id, oa, nameOf(lb.worker_id), lb.id);

      // Free both seats first (holds_position is unique), then take the other one.
      await trx("assignments").whereIn("id", [la.id, lb.id]).update({ holds_position: null });
      const place = async (row: typeof la, seat: { id: number; work_order_id: number }) => {
        if (row.status === "draft") {
          await trx("assignments").where({ id: row.id }).update({
            work_order_id: seat.work_order_id,
            position_id: seat.id,
            holds_position: seat.id,
            version: row.version + 1,
            updated_at: new Date(),
          });
          return row.id as number;
        }
        await trx("assignments").where({ id: row.id }).update({ status: "removed", version: row.version + 1, updated_at: new Date() });
        const [id] = await trx("assignments").insert({
          work_order_id: seat.work_order_id,
          position_id: seat.id,
          worker_id: row.worker_id,
          holds_position: seat.id,
          status: "draft",
          reply_code: await newReplyCode(trx),
          created_by: user.id,
        });
        return id as number;
      };
      const newA = await place(la, seatB);
      const newB = await place(lb, seatA);
      const swapped = changedBy(user, { kind: "swapped", a: nameOf(la.worker_id), b: nameOf(lb.worker_id) });
      const lapsed = (await crewChanged(trx, oa.id, swapped)).lapsed + (ob.id !== oa.id ? (await crewChanged(trx, ob.id, swapped)).lapsed : 0);
      await audit(trx, user, user.organisationId, "assignment.swap", "assignment", newA, {
        a: { worker: nameOf(la.worker_id), workerId: la.worker_id, from: { order: oa.number, position: seatA.position }, to: { order: ob.number, position: seatB.position } },
        b: { worker: nameOf(lb.worker_id), workerId: lb.worker_id, from: { order: ob.number, position: seatB.position }, to: { order: oa.number, position: seatA.position } },
        assignmentIds: [newA, newB],
        overridesLapsed: lapsed,
      });
      for (const o of new Map([oa, ob].map((x) => [x.id, x])).values()) {
        await boardEvent(trx, { organisationId: user.organisationId, yardId: o.yard_id, day: o.work_date, kind: "assignment", payload: { orderId: o.id } });
      }
      return {
        assignmentId: newA,
        orderIds: [...new Set([oa.id, ob.id])],
        workerIds: ids,
        current: await crewState(trx, [...new Set([oa.id, ob.id])]),
      };
    }, TX),
  );
}

/** The workers seated on an order (assignments holding a position). */
export async function seatedWorkerIds(db: Knex, orderId: number): Promise<number[]> {
  return (await db("assignments").where({ work_order_id: orderId }).whereNotNull("holds_position").pluck("worker_id")).map(Number);
}
