// On-call rotations and call-outs on Knex.
import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { fieldError, instant, yardOf } from "@/lib/orders/data";
import { recordWorkedTime } from "@/lib/time-records/data";
import { describeRrule, normaliseLocal, parseRrule } from "@/lib/time/recurrence";
import { onCallFromMembers, schedule } from "@/lib/rotations/schedule";
import { epochToZonedDate, epochToZonedWallTime } from "@/lib/rules/time";
import type { CallOutInput, RotationInput, RotationPatch } from "@/lib/rotations/model";

type Q = Knex | Knex.Transaction;

export interface RotationMember {
  workerId: number;
  name: string;
  employeeNo: string;
  sort: number;
}

export interface RotationPeriodView {
  workerId: number;
  name: string;
  from: string;
  to: string;
  fromLocal: string;
  toLocal: string;
  hours: number;
}

export interface RotationView {
  id: number;
  name: string;
  yardId: number;
  yardCode: string;
  timezone: string;
  rrule: string;
  description: string;
  dtstartLocal: string;
  active: boolean;
  version: number;
  members: RotationMember[];
  now: RotationPeriodView | null;
  upcoming: RotationPeriodView[];
  problem: string | null;
}

export async function listRotations(db: Q, organisationId: number, opts: { id?: number; periods?: number } = {}): Promise<RotationView[]> {
  const q = db("rotations as r")
    .join("yards as y", "y.id", "r.yard_id")
    .where("r.organisation_id", organisationId)
    .orderBy(["y.code", "r.name"])
    .select("r.*", "y.code as yard_code", "y.timezone");
  if (opts.id) q.where("r.id", opts.id);
  const rows = await q;
  if (rows.length === 0) return [];
  const members = await db("rotation_members as m")
    .join("workers as w", "w.id", "m.worker_id")
    .whereIn(
      "m.rotation_id",
      rows.map((r) => r.id),
    )
    .orderBy(["m.rotation_id", "m.sort"])
    .select("m.rotation_id", "m.worker_id", "m.sort", "w.first_name", "w.last_name", "w.employee_no");
  const now = Date.now();
  return rows.map((r) => {
    const tz = String(r.timezone);
    const list: RotationMember[] = members
      .filter((m) => m.rotation_id === r.id)
      .map((m) => ({ workerId: Number(m.worker_id), name: `${m.first_name} ${m.last_name}`, employeeNo: String(m.employee_no), sort: Number(m.sort) }));
    const rule = { rrule: String(r.rrule), dtstartLocal: String(r.dtstart_local), timezone: tz };
    const period = (m: RotationMember, from: number, to: number): RotationPeriodView => ({
      workerId: m.workerId,
      name: m.name,
      from: new Date(from).toISOString(),
      to: new Date(to).toISOString(),
      fromLocal: epochToZonedWallTime(from, tz),
      toLocal: epochToZonedWallTime(to, tz),
      hours: Math.round(((to - from) / 3_600_000) * 100) / 100,
    });
    let current: RotationPeriodView | null = null;
    let upcoming: RotationPeriodView[] = [];
    let problem: string | null = null;
    try {
      const hit = onCallFromMembers(rule, list, now);
      if (hit && hit.period.to !== null) current = period(hit.member, hit.period.from, hit.period.to);
      upcoming = schedule(rule, list, now, opts.periods ?? 6).map((p) => period(p.member, p.period.from, p.period.to!));
    } catch (err) {
      problem = (err as Error).message;
    }
    return {
      id: Number(r.id),
      name: String(r.name),
      yardId: Number(r.yard_id),
      yardCode: String(r.yard_code),
      timezone: tz,
      rrule: String(r.rrule),
      description: describeRrule(String(r.rrule), { subDaily: true }),
      dtstartLocal: String(r.dtstart_local),
      active: Boolean(r.active),
      version: Number(r.version ?? 1),
      members: list,
      now: r.active ? current : null,
      upcoming: r.active ? upcoming : [],
      problem,
    };
  });
}

async function checkMembers(q: Q, organisationId: number, ids: number[]) {
  const found = await q("workers").where({ organisation_id: organisationId, active: true }).whereIn("id", ids).pluck("id");
  const missing = ids.find((id) => !found.map(Number).includes(id));
  if (missing !== undefined) throw fieldError("memberIds", `Worker ${missing} is not an active worker here.`);
}

async function writeMembers(trx: Knex.Transaction, rotationId: number, ids: number[]) {
  await trx("rotation_members").where({ rotation_id: rotationId }).delete();
  await trx("rotation_members").insert(ids.map((worker_id, sort) => ({ rotation_id: rotationId, worker_id, sort })));
}

export async function createRotation(trx: Knex.Transaction, actor: Actor, input: RotationInput): Promise<number> {
  const org = actor.organisationId;
  const yard = await yardOf(trx, org, input.yardId);
  const r = parseRrule(input.rrule, { subDaily: true });
  if (!r.ok) throw fieldError("rrule", r.message);
  instant(input.dtstartLocal, yard.timezone, "dtstartLocal");
  await checkMembers(trx, org, input.memberIds);
  const [id] = await trx("rotations").insert({
    organisation_id: org,
    yard_id: yard.id,
    name: input.name,
    rrule: r.rule,
    dtstart_local: normaliseLocal(input.dtstartLocal),
    active: input.active,
  });
  await writeMembers(trx, id, input.memberIds);
  await audit(trx, actor, org, "rotation.create", "rotation", id, { name: input.name, rrule: r.rule, members: input.memberIds });
  await boardEvent(trx, { organisationId: org, yardId: yard.id, kind: "availability", payload: { rotationId: id } });
  return Number(id);
}

export async function updateRotation(trx: Knex.Transaction, actor: Actor, id: number, patch: RotationPatch) {
  const org = actor.organisationId;
  const cur = await trx("rotations").where({ id, organisation_id: org }).forUpdate().first();
  if (!cur) throw new ApiError(404, "No such rotation.");
  if (Number(cur.version) !== patch.version) {
    const [current] = await listRotations(trx, org, { id });
    throw new ApiError(409, "Someone else changed this rotation since you loaded it. Reload to see their changes.", { current });
  }
  const yard = await yardOf(trx, org, patch.yardId ?? Number(cur.yard_id));
  const row: Record<string, unknown> = { version: Number(cur.version) + 1 };
  if (patch.name !== undefined) row.name = patch.name;
  if (patch.yardId !== undefined) row.yard_id = yard.id;
  if (patch.active !== undefined) row.active = patch.active;
  if (patch.rrule !== undefined) {
    const r = parseRrule(patch.rrule, { subDaily: true });
    if (!r.ok) throw fieldError("rrule", r.message);
    row.rrule = r.rule;
  }
  if (patch.dtstartLocal !== undefined) {
    instant(patch.dtstartLocal, yard.timezone, "dtstartLocal");
    row.dtstart_local = normaliseLocal(patch.dtstartLocal);
  }
  await trx("rotations").where({ id }).update(row);
  if (patch.memberIds) {
    await checkMembers(trx, org, patch.memberIds);
    await writeMembers(trx, id, patch.memberIds);
  }
  const { version: _v, ...changes } = patch;
  await audit(trx, actor, org, "rotation.update", "rotation", id, changes);
  await boardEvent(trx, { organisationId: org, yardId: yard.id, kind: "availability", payload: { rotationId: id } });
  if (yard.id !== Number(cur.yard_id))
    await boardEvent(trx, { organisationId: org, yardId: Number(cur.yard_id), kind: "availability", payload: { rotationId: id } });
}

export async function deleteRotation(trx: Knex.Transaction, actor: Actor, id: number) {
  const org = actor.organisationId;
  const cur = await trx("rotations").where({ id, organisation_id: org }).forUpdate().first();
  if (!cur) throw new ApiError(404, "No such rotation.");
  await trx("rotations").where({ id }).delete(); // members cascade; call-outs keep their time, rotation_id set null
  await audit(trx, actor, org, "rotation.delete", "rotation", id, { name: cur.name, rrule: cur.rrule });
  await boardEvent(trx, { organisationId: org, yardId: Number(cur.yard_id), kind: "availability", payload: { rotationId: id } });
}

/** A call-out becomes a time record (kind call_out), which the REST rule reads. */
export async function createCallOut(trx: Knex.Transaction, actor: Actor, input: CallOutInput) {
  const org = actor.organisationId;
  const worker = await trx("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.id": input.workerId, "w.organisation_id": org })
    .forUpdate()
    .first("w.id", "w.yard_id", "w.first_name", "w.last_name", "y.timezone");
  if (!worker) throw fieldError("workerId", "No such worker.");
  let tz = String(worker.timezone);
  let yardId = Number(worker.yard_id);
  if (input.rotationId) {
    const rot = await trx("rotations as r")
      .join("yards as y", "y.id", "r.yard_id")
      .where({ "r.id": input.rotationId, "r.organisation_id": org })
      .first("r.id", "r.yard_id", "y.timezone");
    if (!rot) throw fieldError("rotationId", "No such rotation.");
    // The call-out's times are read in the rotation's yard (where the work was).
    tz = String(rot.timezone);
    yardId = Number(rot.yard_id);
  }
  const r = await recordWorkedTime(trx, actor, {
    worker,
    tz,
    yardIds: [yardId, Number(worker.yard_id)],
    start: input.start,
    end: input.end,
    kind: "call_out",
    rotationId: input.rotationId,
    reason: input.note,
    action: "call_out.create",
    detail: { workerId: worker.id, start: input.start, end: input.end, rotationId: input.rotationId },
  });
  return { id: r.id, hours: Math.round(((r.end - r.start) / 3_600_000) * 100) / 100 };
}
