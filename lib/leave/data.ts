// Leave, training and sickness on Knex. HR and supervisors enter approved entries; a
// lineworker asks for their own (requested) and a supervisor approves or refuses. Requested
// and approved entries of one person may not overlap.
import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { bumpWorkers } from "@/lib/booking/data";
import { boardEvent } from "@/lib/events/data";
import { fieldError, instant } from "@/lib/orders/data";
import { addDays } from "@/lib/time/days";
import type { Role } from "@/lib/users/roles";
import { epochToZonedDate, epochToZonedWallTime } from "@/lib/rules/time";
import type { UnavailabilityInput, UnavailabilityPatch } from "@/lib/leave/model";

type Q = Knex | Knex.Transaction;

export interface UnavailabilityView {
  id: number;
  workerId: number;
  workerName: string;
  employeeNo: string;
  yardCode: string;
  timezone: string;
  kind: "leave" | "training" | "sickness";
  status: "requested" | "approved" | "refused";
  start: string;
  end: string;
  startLocal: string;
  endLocal: string;
  note: string | null;
  requestedBy: string | null;
  decidedBy: string | null;
  createdAt: string;
}

export interface UnavailabilityFilter {
  workerId?: number;
  status?: string;
  from?: string;
  to?: string;
}

export interface UnavailabilityActor extends Actor {
  role: Role;
  workerId: number | null;
}

export async function listUnavailability(db: Q, organisationId: number, f: UnavailabilityFilter = {}): Promise<UnavailabilityView[]> {
  const q = db("unavailability as u")
    .join("workers as w", "w.id", "u.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .leftJoin("users as rq", "rq.id", "u.requested_by")
    .leftJoin("users as dc", "dc.id", "u.decided_by")
    .where("w.organisation_id", organisationId)
    .orderBy([{ column: "u.start_at" }, { column: "u.id" }])
    .limit(500)
    .select("u.*", "w.first_name", "w.last_name", "w.employee_no", "y.code as yard_code", "y.timezone", "rq.name as requested_name", "dc.name as decided_name");
  if (f.workerId) q.where("u.worker_id", f.workerId);
  if (f.status) q.where("u.status", f.status);
  // Dates are yard-local; a day's margin either side covers every zone.
  if (f.from) q.where("u.end_at", ">", new Date(Date.parse(`${f.from}T00:00:00Z`) - 86_400_000));
  if (f.to) q.where("u.start_at", "<", new Date(Date.parse(`${addDays(f.to, 1)}T00:00:00Z`) + 86_400_000));
  const rows = await q;
  return rows.map(toView);
}

function toView(r: Record<string, any>): UnavailabilityView {
  const tz = String(r.timezone);
  const s = new Date(r.start_at).getTime();
  const e = new Date(r.end_at).getTime();
  return {
    id: Number(r.id),
    workerId: Number(r.worker_id),
    workerName: `${r.first_name} ${r.last_name}`,
    employeeNo: String(r.employee_no),
    yardCode: String(r.yard_code),
    timezone: tz,
    kind: r.kind,
    status: r.status,
    start: new Date(s).toISOString(),
    end: new Date(e).toISOString(),
    startLocal: epochToZonedWallTime(s, tz),
    endLocal: epochToZonedWallTime(e, tz),
    note: r.note ?? null,
    requestedBy: r.requested_name ?? null,
    decidedBy: r.decided_name ?? null,
    createdAt: new Date(r.created_at).toISOString(),
  };
}

export async function getUnavailability(db: Q, organisationId: number, id: number) {
  const rows = await db("unavailability as u")
    .join("workers as w", "w.id", "u.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .leftJoin("users as rq", "rq.id", "u.requested_by")
    .leftJoin("users as dc", "dc.id", "u.decided_by")
    .where("w.organisation_id", organisationId)
    .where("u.id", id)
    .select("u.*", "w.first_name", "w.last_name", "w.employee_no", "y.code as yard_code", "y.timezone", "rq.name as requested_name", "dc.name as decided_name");
  return rows[0] ? toView(rows[0]) : null;
}

const KIND_WORD: Record<string, string> = { leave: "leave", training: "training", sickness: "sickness" };

/** Throws 409 when the worker already has requested or approved leave overlapping [start, end). */
async function refuseOverlap(trx: Knex.Transaction, worker: { id: number; name: string; tz: string }, start: number, end: number, exceptId?: number) {
  const q = trx("unavailability")
    .where({ worker_id: worker.id })
    .whereIn("status", ["requested", "approved"])
    .where("start_at", "<", new Date(end))
    .where("end_at", ">", new Date(start))
    .orderBy("start_at")
    .first("id", "kind", "status", "start_at", "end_at");
  if (exceptId) q.whereNot("id", exceptId);
  const clash = await q;
  if (!clash) return;
  const at = (d: Date) => epochToZonedWallTime(new Date(d).getTime(), worker.tz).replace("T", " ");
  const message = `${worker.name} already has ${clash.status} ${KIND_WORD[clash.kind]} from ${at(clash.start_at)} to ${at(clash.end_at)}; the dates overlap. Change or withdraw that entry first.`;
  throw new ApiError(409, message, { issues: [{ field: "start", message }], conflictId: Number(clash.id) });
}

/** One board event per day covered (a long absence: one event for every day). */
async function postDays(trx: Knex.Transaction, org: number, yardId: number, start: number, end: number, tz: string, id: number) {
  const first = epochToZonedDate(start, tz);
  const last = epochToZonedDate(end - 1, tz);
  const days: string[] = [];
  for (let d = first; d <= last && days.length <= 31; d = addDays(d, 1)) days.push(d);
  if (days.length > 31) {
    await boardEvent(trx, { organisationId: org, yardId, day: null, kind: "availability", payload: { unavailabilityId: id } });
    return;
  }
  for (const day of days) await boardEvent(trx, { organisationId: org, yardId, day, kind: "availability", payload: { unavailabilityId: id } });
}

async function lockWorker(trx: Knex.Transaction, org: number, workerId: number) {
  // Write what is locked (workers.booking_seq): on Galera two overlapping entries for one
  // person on two nodes then collide at commit instead of both passing the overlap check.
  await bumpWorkers(trx, [workerId]);
  const w = await trx("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": workerId, "w.organisation_id": org })
    .forUpdate()
    .first("w.id", "w.yard_id", "w.first_name", "w.last_name", "y.timezone");
  if (!w) throw fieldError("workerId", "No such worker.");
  return { id: Number(w.id), yardId: Number(w.yard_id), name: `${w.first_name} ${w.last_name}`, tz: String(w.timezone) };
}

export async function createUnavailability(trx: Knex.Transaction, actor: UnavailabilityActor, input: UnavailabilityInput) {
  const org = actor.organisationId;
  const asks = actor.role === "lineworker";
  if (asks && input.workerId !== actor.workerId) throw new ApiError(403, "You can ask for leave only for yourself.");
  // The worker row lock serialises two requests for the same person (overlap check + insert).
  const worker = await lockWorker(trx, org, input.workerId);
  const start = instant(input.start, worker.tz, "start");
  const end = instant(input.end, worker.tz, "end");
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  await refuseOverlap(trx, worker, start, end);
  const status = asks ? "requested" : "approved";
  const [id] = await trx("unavailability").insert({
    worker_id: worker.id,
    start_at: new Date(start),
    end_at: new Date(end),
    kind: input.kind,
    status,
    note: input.note,
    requested_by: actor.id,
    decided_by: asks ? null : actor.id,
  });
  await audit(trx, actor, org, asks ? "unavailability.request" : "unavailability.create", "unavailability", id, {
    workerId: worker.id,
    kind: input.kind,
    start: input.start,
    end: input.end,
    status,
  });
  await postDays(trx, org, worker.yardId, start, end, worker.tz, Number(id));
  return Number(id);
}

export async function updateUnavailability(trx: Knex.Transaction, actor: UnavailabilityActor, id: number, patch: UnavailabilityPatch) {
  const org = actor.organisationId;
  const cur = await trx("unavailability as u")
    .join("workers as w", "w.id", "u.worker_id")
    .where({ "u.id": id, "w.organisation_id": org })
    .first("u.*");
  if (!cur) throw new ApiError(404, "No such entry.");
  if (patch.status && actor.role !== "supervisor") throw new ApiError(403, "Only a supervisor approves or refuses leave.");
  const editing = patch.start !== undefined || patch.end !== undefined || patch.kind !== undefined || patch.note !== undefined;
  if (editing && !["supervisor", "hr"].includes(actor.role)) throw new ApiError(403, "Only HR or a supervisor changes entries.");
  const worker = await lockWorker(trx, org, Number(cur.worker_id));
  const startLocal = patch.start ?? epochToZonedWallTime(new Date(cur.start_at).getTime(), worker.tz);
  const endLocal = patch.end ?? epochToZonedWallTime(new Date(cur.end_at).getTime(), worker.tz);
  const start = patch.start ? instant(patch.start, worker.tz, "start") : new Date(cur.start_at).getTime();
  const end = patch.end ? instant(patch.end, worker.tz, "end") : new Date(cur.end_at).getTime();
  if (end <= start) throw fieldError("end", "The end must be after the start.");
  const status = patch.status ?? cur.status;
  if (status !== "refused") await refuseOverlap(trx, worker, start, end, id);
  const row: Record<string, unknown> = { start_at: new Date(start), end_at: new Date(end), status };
  if (patch.kind) row.kind = patch.kind;
  if (patch.note !== undefined) row.note = patch.note;
  if (patch.status) row.decided_by = actor.id;
  await trx("unavailability").where({ id }).update(row);
  const action = patch.status === "approved" ? "unavailability.approve" : patch.status === "refused" ? "unavailability.refuse" : "unavailability.update";
  await audit(trx, actor, org, action, "unavailability", id, {
    from: { status: cur.status, start: epochToZonedWallTime(new Date(cur.start_at).getTime(), worker.tz), end: epochToZonedWallTime(new Date(cur.end_at).getTime(), worker.tz), kind: cur.kind },
    to: { status, start: startLocal, end: endLocal, kind: patch.kind ?? cur.kind },
  });
  await postDays(trx, org, worker.yardId, Math.min(start, new Date(cur.start_at).getTime()), Math.max(end, new Date(cur.end_at).getTime()), worker.tz, id);
}

export async function deleteUnavailability(trx: Knex.Transaction, actor: UnavailabilityActor, id: number) {
  const org = actor.organisationId;
  const cur = await trx("unavailability as u")
    .join("workers as w", "w.id", "u.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "u.id": id, "w.organisation_id": org })
    .first("u.*", "w.yard_id", "y.timezone");
  if (!cur) throw new ApiError(404, "No such entry.");
  if (actor.role === "lineworker") {
    if (Number(cur.worker_id) !== actor.workerId) throw new ApiError(403, "You can withdraw only your own requests.");
    if (cur.status !== "requested") throw new ApiError(409, "This entry has been decided; ask a supervisor to change it.");
  } else if (!["supervisor", "hr"].includes(actor.role)) {
    throw new ApiError(403, "Only HR or a supervisor removes entries.");
  }
  await trx("unavailability").where({ id }).delete();
  await audit(trx, actor, org, "unavailability.delete", "unavailability", id, {
    workerId: Number(cur.worker_id),
    kind: cur.kind,
    status: cur.status,
    start: new Date(cur.start_at).toISOString(),
    end: new Date(cur.end_at).toISOString(),
  });
  await postDays(trx, org, Number(cur.yard_id), new Date(cur.start_at).getTime(), new Date(cur.end_at).getTime(), String(cur.timezone), id);
}
