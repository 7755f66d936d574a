import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import type { WorkerInput, WorkerPatch } from "@/lib/workers/model";
import type { WorkerRow } from "./model";
export type { WorkerRow };

export const toWorker = (r: Record<string, unknown>): WorkerRow => ({
  id: Number(r.id),
  employeeNo: String(r.employee_no),
  firstName: String(r.first_name),
  lastName: String(r.last_name),
  name: `${r.first_name} ${r.last_name}`,
  classification: String(r.classification),
  yardId: Number(r.yard_id),
  yardCode: String(r.yard_code ?? ""),
  phone: (r.phone_e164 as string) ?? null,
  email: (r.email as string) ?? null,
  smsOptIn: Boolean(r.sms_opt_in),
  active: Boolean(r.active),
  version: Number(r.version ?? 1),
});

export interface WorkerFilter {
  activeOnly?: boolean;
  q?: string;
  yardCode?: string;
}

export async function listWorkers(db: Knex, organisationId: number, opts: WorkerFilter = {}) {
  const q = db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where("w.organisation_id", organisationId)
    .select("w.*", "y.code as yard_code")
    .orderBy(["w.last_name", "w.first_name"]);
  if (opts.activeOnly) q.where("w.active", true);
  if (opts.yardCode) q.where("y.code", opts.yardCode);
  if (opts.q) {
    const like = `%${opts.q.replace(/[\\%_]/g, (c) => "\\" + c)}%`;
    q.andWhere((w) =>
      w
        .where("w.first_name", "like", like)
        .orWhere("w.last_name", "like", like)
        .orWhere("w.employee_no", "like", like)
        .orWhere(db.raw("CONCAT(w.first_name, ' ', w.last_name)"), "like", like),
    );
  }
  return (await q).map(toWorker);
}

export async function getWorker(db: Knex | Knex.Transaction, organisationId: number, id: number, forUpdate = false) {
  const q = db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.organisation_id": organisationId, "w.id": id })
    .select("w.*", "y.code as yard_code", "y.timezone as yard_timezone", "y.name as yard_name")
    .first();
  if (forUpdate) q.forUpdate();
  const r = await q;
  return r ? { ...toWorker(r), timezone: String(r.yard_timezone), yardName: String(r.yard_name) } : null;
}

async function checkYard(q: Knex | Knex.Transaction, organisationId: number, yardId: number) {
  const yard = await q("yards").where({ id: yardId, organisation_id: organisationId }).first("id");
  if (!yard) throw new ApiError(422, "Invalid yardId: no such yard", { issues: [{ field: "yardId", message: "No such yard" }] });
}

function duplicateNumber(err: unknown, employeeNo: string | undefined) {
  const e = err as { code?: string; sqlMessage?: string } | null;
  if (e?.code === "ER_DUP_ENTRY" && /employee_no/.test(e.sqlMessage ?? "")) {
    const message = `Another worker already has employee number ${employeeNo}`;
    return new ApiError(409, message, { issues: [{ field: "employeeNo", message }] });
  }
  return err;
}

const columns = (w: Partial<WorkerInput>) => {
  const out: Record<string, unknown> = {};
  if (w.employeeNo !== undefined) out.employee_no = w.employeeNo;
  if (w.firstName !== undefined) out.first_name = w.firstName;
  if (w.lastName !== undefined) out.last_name = w.lastName;
  if (w.classification !== undefined) out.classification = w.classification;
  if (w.yardId !== undefined) out.yard_id = w.yardId;
  if (w.phone !== undefined) out.phone_e164 = w.phone;
  if (w.email !== undefined) out.email = w.email;
  if (w.smsOptIn !== undefined) out.sms_opt_in = w.smsOptIn;
  if (w.active !== undefined) out.active = w.active;
  return out;
};

export async function createWorker(db: Knex, actor: Actor, input: WorkerInput) {
  try {
    return await db.transaction(async (trx) => {
      await checkYard(trx, actor.organisationId, input.yardId);
      const [id] = await trx("workers").insert({ organisation_id: actor.organisationId, ...columns(input) });
      await audit(trx, actor, actor.organisationId, "worker.create", "worker", id, { ...input });
      await boardEvent(trx, { organisationId: actor.organisationId, kind: "worker", day: null, payload: { workerId: Number(id) } });
      return (await getWorker(trx, actor.organisationId, Number(id)))!;
    });
  } catch (err) {
    throw duplicateNumber(err, input.employeeNo);
  }
}

/** Applies a PATCH when `version` is still the stored one; 409 with the current record otherwise. */
export async function updateWorker(db: Knex, actor: Actor, id: number, patch: WorkerPatch) {
  const { version, ...fields } = patch;
  try {
    return await db.transaction(async (trx) => {
      const before = await getWorker(trx, actor.organisationId, id, true);
      if (!before) throw new ApiError(404, "No such worker.");
      if (before.version !== version) {
        throw new ApiError(409, "Someone else changed this worker since you opened it. Review their change and try again.", {
          current: before,
        });
      }
      if (fields.yardId !== undefined) await checkYard(trx, actor.organisationId, fields.yardId);
      const cols = columns(fields as Partial<WorkerInput>);
      const changed: Record<string, { from: unknown; to: unknown }> = {};
      const beforeCols = columns({
        employeeNo: before.employeeNo,
        firstName: before.firstName,
        lastName: before.lastName,
        classification: before.classification as WorkerInput["classification"],
        yardId: before.yardId,
        phone: before.phone,
        email: before.email,
        smsOptIn: before.smsOptIn,
        active: before.active,
      });
      for (const [k, v] of Object.entries(cols)) if (beforeCols[k] !== v) changed[k] = { from: beforeCols[k], to: v };
      const n = await trx("workers")
        .where({ id, organisation_id: actor.organisationId, version })
        .update({ ...cols, version: version + 1, updated_at: trx.fn.now(3) });
      if (n !== 1) throw new ApiError(409, "Someone else changed this worker since you opened it.", { current: before });
      await audit(trx, actor, actor.organisationId, "worker.update", "worker", id, { changed, version: version + 1 });
      await boardEvent(trx, { organisationId: actor.organisationId, kind: "worker", day: null, payload: { workerId: id } });
      return (await getWorker(trx, actor.organisationId, id))!;
    });
  } catch (err) {
    throw duplicateNumber(err, fields.employeeNo);
  }
}

/** Active workers as choices for a form (a user's linked worker), by name. */
export async function activeWorkerChoices(db: Knex, organisationId: number) {
  return db("workers")
    .where({ organisation_id: organisationId, active: true })
    .orderBy(["last_name", "first_name"])
    .select("id", "employee_no", "first_name", "last_name") as Promise<{ id: number; employee_no: string; first_name: string; last_name: string }[]>;
}

/** Active workers with a phone number, with their yard, for the phone simulator. */
export async function workersWithPhones(db: Knex, organisationId: number) {
  return db("workers as w")
    .join("yards as y", "y.id", "w.yard_id")
    .where({ "w.organisation_id": organisationId, "w.active": true })
    .whereNotNull("w.phone_e164")
    .orderBy(["y.code", "w.last_name", "w.first_name"])
    .select("w.id", "w.first_name", "w.last_name", "w.phone_e164", "w.sms_opt_in", "y.code as yard_code", "y.timezone") as Promise<
    { id: number; first_name: string; last_name: string; phone_e164: string; sms_opt_in: number | boolean; yard_code: string; timezone: string }[]
  >;
}

/** The id of the organisation's worker with this phone (E.164), or null. */
export async function workerIdByPhone(db: Knex, organisationId: number, phoneE164: string): Promise<number | null> {
  const w = await db("workers").where({ organisation_id: organisationId, phone_e164: phoneE164 }).first("id");
  return w ? Number(w.id) : null;
}

/** Ids of the organisation's workers whose home yard is one of `yardIds`. */
export async function workerIdsInYards(db: Knex, organisationId: number, yardIds: number[]): Promise<number[]> {
  const ids = await db("workers").where({ organisation_id: organisationId }).whereIn("yard_id", yardIds).pluck("id");
  return ids.map(Number);
}
