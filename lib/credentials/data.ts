import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { daysBetween } from "@/lib/time/days";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { assertAttachable } from "@/lib/files/data";
import { todayIn } from "@/lib/time/days";
import { inView, proposeExpiry, type CredentialCreate, type CredentialPatch, type CredentialView } from "@/lib/credentials/model";

export { inView };
import type { Role } from "@/lib/users/roles";
import type { CredentialDetail, QualificationType, CredentialStatus } from "./model";
export type { CredentialDetail, QualificationType, CredentialStatus };

export interface CredentialRow {
  id: number;
  workerId: number;
  workerName: string;
  employeeNo: string;
  yardCode: string;
  type: string;
  typeName: string;
  issuedOn: string;
  expiresOn: string | null;
  status: string;
  evidenceFileId: number | null;
}

/** Current credentials (the newest of each kind per worker), optionally for one worker. */
export async function listCurrentCredentials(db: Knex, organisationId: number, workerId?: number) {
  const q = db("credentials as c")
    .join("workers as w", "w.id", "c.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .join("qualification_types as q", "q.id", "c.qualification_type_id")
    .where("w.organisation_id", organisationId)
    .where("c.status", "current")
    .select(
      "c.id",
      "c.worker_id",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "y.code as yard_code",
      "q.code as type",
      "q.name as type_name",
      "c.issued_on",
      "c.expires_on",
      "c.status",
      "c.evidence_file_id",
    )
    .orderBy([{ column: "c.expires_on", order: "asc" }]);
  if (workerId) q.where("c.worker_id", workerId);
  const rows = await q;
  return rows.map(
    (r): CredentialRow => ({
      id: r.id,
      workerId: r.worker_id,
      workerName: `${r.first_name} ${r.last_name}`,
      employeeNo: r.employee_no,
      yardCode: r.yard_code,
      type: r.type,
      typeName: r.type_name,
      issuedOn: r.issued_on,
      expiresOn: r.expires_on,
      status: r.status,
      evidenceFileId: r.evidence_file_id,
    }),
  );
}

// --- the credentials desk -------------------------------------------------------------------

const iso = (v: unknown) => (v instanceof Date ? v.toISOString() : v ? new Date(String(v)).toISOString() : null);

function baseQuery(db: Knex | Knex.Transaction, organisationId: number) {
  return db("credentials as c")
    .join("workers as w", "w.id", "c.worker_id")
    .join("yards as y", "y.id", "w.yard_id")
    .join("qualification_types as q", "q.id", "c.qualification_type_id")
    .leftJoin("files as f", "f.id", "c.evidence_file_id")
    .leftJoin("users as vu", "vu.id", "c.verified_by")
    .leftJoin("users as cu", "cu.id", "c.created_by")
    .where("w.organisation_id", organisationId)
    .select(
      "c.id",
      "c.worker_id",
      "c.issued_on",
      "c.expires_on",
      "c.status",
      "c.evidence_file_id",
      "c.verified_at",
      "c.supersedes_id",
      "c.created_at",
      "c.note",
      "c.import_ref",
      "w.first_name",
      "w.last_name",
      "w.employee_no",
      "w.active as worker_active",
      "w.yard_id",
      "y.code as yard_code",
      "y.timezone",
      "q.id as type_id",
      "q.code as type",
      "q.name as type_name",
      "q.warn_days",
      "q.renewal_months",
      "q.needs_evidence",
      "f.original_name as evidence_name",
      "vu.name as verified_by_name",
      "cu.name as created_by_name",
    );
}

function toDetail(r: Record<string, any>, now: Date, todayCache: Map<string, string>): CredentialDetail {
  const tz = String(r.timezone);
  let today = todayCache.get(tz);
  if (!today) todayCache.set(tz, (today = todayIn(tz, now)));
  return {
    id: Number(r.id),
    workerId: Number(r.worker_id),
    workerName: `${r.first_name} ${r.last_name}`,
    employeeNo: r.employee_no,
    workerActive: Boolean(r.worker_active),
    yardId: Number(r.yard_id),
    yardCode: r.yard_code,
    timezone: tz,
    typeId: Number(r.type_id),
    type: r.type,
    typeName: r.type_name,
    warnDays: Number(r.warn_days),
    renewalMonths: r.renewal_months === null ? null : Number(r.renewal_months),
    needsEvidence: Boolean(r.needs_evidence),
    issuedOn: r.issued_on,
    expiresOn: r.expires_on ?? null,
    status: r.status,
    daysLeft: r.expires_on ? daysBetween(today, r.expires_on) : null,
    evidenceFileId: r.evidence_file_id === null ? null : Number(r.evidence_file_id),
    evidenceName: r.evidence_name ?? null,
    verifiedByName: r.verified_by_name ?? null,
    verifiedAt: iso(r.verified_at),
    createdByName: r.created_by_name ?? null,
    createdAt: iso(r.created_at)!,
    supersedesId: r.supersedes_id === null ? null : Number(r.supersedes_id),
    note: r.note ?? null,
    importRef: r.import_ref ?? null,
  };
}

export interface CredentialFilter {
  view?: CredentialView;
  yard?: string;
  qualification?: string;
  q?: string;
  workerId?: number;
}

/** The desk's list: current and pending records (never superseded or rejected), filtered. */
export async function listCredentials(db: Knex, organisationId: number, f: CredentialFilter = {}, now = new Date()) {
  const q = baseQuery(db, organisationId)
    .whereIn("c.status", ["current", "pending"])
    .orderBy([
      { column: "w.last_name", order: "asc" },
      { column: "w.first_name", order: "asc" },
      { column: "q.code", order: "asc" },
    ]);
  if (f.workerId) q.where("c.worker_id", f.workerId);
  if (f.yard) q.where("y.code", f.yard);
  if (f.qualification) q.where("q.code", f.qualification);
  if (f.q) {
    const like = `%${f.q.replace(/[\\%_]/g, (c) => "\\" + c)}%`;
    q.andWhere((w) =>
      w
        .where("w.first_name", "like", like)
        .orWhere("w.last_name", "like", like)
        .orWhere("w.employee_no", "like", like)
        .orWhere("q.name", "like", like)
        .orWhere(db.raw("CONCAT(w.first_name, ' ', w.last_name)"), "like", like),
    );
  }
  const cache = new Map<string, string>();
  return (await q).map((r) => toDetail(r, now, cache)).filter((c) => inView(c, f.view));
}

export async function getCredential(db: Knex | Knex.Transaction, organisationId: number, id: number, now = new Date()) {
  const r = await baseQuery(db, organisationId).where("c.id", id).first();
  return r ? toDetail(r, now, new Map()) : null;
}

/** Everything the per-worker page shows: current and pending first, then the history. */
export async function workerCredentials(db: Knex, organisationId: number, workerId: number, now = new Date()) {
  const rows = await baseQuery(db, organisationId)
    .where("c.worker_id", workerId)
    .orderBy([
      { column: "q.id", order: "asc" },
      { column: "c.issued_on", order: "desc" },
      { column: "c.id", order: "desc" },
    ]);
  const cache = new Map<string, string>();
  const all = rows.map((r) => toDetail(r, now, cache));
  return {
    current: all.filter((c) => c.status === "current"),
    pending: all.filter((c) => c.status === "pending"),
    history: all.filter((c) => c.status === "superseded" || c.status === "rejected"),
  };
}

// --- writes -----------------------------------------------------------------------------------

export interface CredentialActor extends Actor {
  role: Role;
  workerId: number | null;
}

const issue = (status: number, field: string, message: string) =>
  new ApiError(status, `${field}: ${message}`, { issues: [{ field, message }] });

function dupSlot(err: unknown) {
  const e = err as { code?: string; sqlMessage?: string } | null;
  if (e?.code === "ER_DUP_ENTRY" && /slot/.test(e.sqlMessage ?? "")) {
    return new ApiError(409, "Someone else changed this worker's record of that qualification just now. Reload and try again.");
  }
  return err;
}

/**
 * Adds or renews a credential. HR and admin write a current record: the worker's current
 * record of that type (if any) becomes superseded and the new one points at it
 * (supersedes_id), in one transaction. A lineworker writes a pending record for their own
 * worker, with evidence, for HR to verify. Raises a board event and an audit row.
 */
export async function createCredential(db: Knex, actor: CredentialActor, input: CredentialCreate, now = new Date()) {
  const isLineworker = actor.role === "lineworker";
  if (isLineworker && input.workerId !== actor.workerId) {
    throw new ApiError(403, "You can only send renewals of your own qualifications.");
  }
  const status = isLineworker ? "pending" : input.status;
  try {
    const id = await db.transaction(async (trx) => {
      const worker = await trx("workers as w")
        .join("yards as y", "y.id", "w.yard_id")
        .where({ "w.id": input.workerId, "w.organisation_id": actor.organisationId })
        .first("w.id", "w.first_name", "w.last_name", "y.timezone");
      if (!worker) throw issue(422, "workerId", "No such worker");
      const type = await trx("qualification_types")
        .where({ id: input.qualificationTypeId, organisation_id: actor.organisationId })
        .first();
      if (!type) throw issue(422, "qualificationTypeId", "No such qualification");
      const today = todayIn(worker.timezone, now);
      if (input.issuedOn > today) throw issue(422, "issuedOn", `The issue date is after today (${today})`);
      const expiresOn = input.expiresOn === undefined ? proposeExpiry(input.issuedOn, type.renewal_months) : input.expiresOn;
      if (expiresOn && expiresOn < input.issuedOn) throw issue(422, "expiresOn", "The expiry is before the issue date");
      if (input.evidenceFileId) await assertAttachable(trx, actor, input.evidenceFileId, { kind: "evidence", workerId: input.workerId }, "evidenceFileId");
      else if (isLineworker) throw issue(422, "evidenceFileId", "Upload a scan or photo of the new card or certificate");
      else if (type.needs_evidence)
        throw issue(422, "evidenceFileId", `${type.name} needs evidence: upload the card or certificate`);

      const base = {
        worker_id: input.workerId,
        qualification_type_id: type.id,
        issued_on: input.issuedOn,
        expires_on: expiresOn,
        evidence_file_id: input.evidenceFileId ?? null,
        created_by: actor.id,
        note: input.note || null,
      };
      const detail = { workerId: input.workerId, type: type.code, issuedOn: input.issuedOn, expiresOn };
      if (status === "pending") {
        const waiting = await trx("credentials")
          .where({ worker_id: input.workerId, qualification_type_id: type.id, status: "pending" })
          .forUpdate()
          .first("id");
        if (waiting) throw new ApiError(409, `A renewal of ${type.name} is already waiting for HR to verify.`);
        const [newId] = await trx("credentials").insert({ ...base, status: "pending" });
        await audit(trx, actor, actor.organisationId, "credential.submit", "credential", newId, detail);
        await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { workerId: input.workerId } });
        return Number(newId);
      }
      const old = await trx("credentials")
        .where({ worker_id: input.workerId, qualification_type_id: type.id, status: "current" })
        .forUpdate()
        .first("id", "issued_on", "expires_on");
      if (old) await trx("credentials").where({ id: old.id }).update({ status: "superseded" });
      const [newId] = await trx("credentials").insert({
        ...base,
        status: "current",
        supersedes_id: old?.id ?? null,
        verified_by: actor.id,
        verified_at: now,
      });
      // A renewal the worker sent is moot once HR records the card directly.
      const moot = await trx("credentials")
        .where({ worker_id: input.workerId, qualification_type_id: type.id, status: "pending" })
        .update({ status: "rejected", note: `Replaced by the record HR entered (#${newId}).` });
      await audit(trx, actor, actor.organisationId, old ? "credential.renew" : "credential.add", "credential", newId, {
        ...detail,
        supersedes: old ? { id: old.id, issuedOn: old.issued_on, expiresOn: old.expires_on } : null,
        closedPending: moot,
      });
      await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { workerId: input.workerId } });
      return Number(newId);
    });
    return (await getCredential(db, actor.organisationId, id, now))!;
  } catch (err) {
    throw dupSlot(err);
  }
}

/** HR verifies a pending renewal (it becomes current, superseding the old record) or stamps a current one; or rejects a pending one. */
export async function patchCredential(db: Knex, actor: CredentialActor, id: number, patch: CredentialPatch, now = new Date()) {
  try {
    await db.transaction(async (trx) => {
      const row = await trx("credentials as c")
        .join("workers as w", "w.id", "c.worker_id")
        .join("yards as y", "y.id", "w.yard_id")
        .join("qualification_types as q", "q.id", "c.qualification_type_id")
        .where({ "c.id": id, "w.organisation_id": actor.organisationId })
        .forUpdate()
        .first("c.*", "q.code as type", "q.name as type_name", "q.renewal_months", "y.timezone");
      if (!row) throw new ApiError(404, "No such credential.");
      if (patch.action === "reject") {
        if (row.status !== "pending") throw new ApiError(409, "Only a renewal waiting for verification can be rejected.");
        await trx("credentials").where({ id }).update({ status: "rejected", note: patch.reason, verified_by: actor.id, verified_at: now });
        await audit(trx, actor, actor.organisationId, "credential.reject", "credential", id, { reason: patch.reason, workerId: row.worker_id, type: row.type });
        await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { workerId: row.worker_id } });
        return;
      }
      if (row.status !== "pending" && row.status !== "current") {
        throw new ApiError(409, "This record has been superseded or rejected; verify the worker's current record instead.", {
          status: row.status,
        });
      }
      const issuedOn = patch.issuedOn ?? row.issued_on;
      const today = todayIn(row.timezone, now);
      if (issuedOn > today) throw issue(422, "issuedOn", `The issue date is after today (${today})`);
      const expiresOn =
        patch.expiresOn !== undefined
          ? patch.expiresOn
          : patch.issuedOn && patch.issuedOn !== row.issued_on
            ? proposeExpiry(issuedOn, row.renewal_months)
            : row.expires_on;
      if (expiresOn && expiresOn < issuedOn) throw issue(422, "expiresOn", "The expiry is before the issue date");
      let supersedes: number | null = row.supersedes_id;
      if (row.status === "pending") {
        const old = await trx("credentials")
          .where({ worker_id: row.worker_id, qualification_type_id: row.qualification_type_id, status: "current" })
          .forUpdate()
          .first("id");
        if (old) {
          await trx("credentials").where({ id: old.id }).update({ status: "superseded" });
          supersedes = old.id;
        }
      }
      await trx("credentials").where({ id }).update({
        status: "current",
        issued_on: issuedOn,
        expires_on: expiresOn,
        supersedes_id: supersedes,
        verified_by: actor.id,
        verified_at: now,
      });
      await audit(trx, actor, actor.organisationId, "credential.verify", "credential", id, {
        workerId: row.worker_id,
        type: row.type,
        wasPending: row.status === "pending",
        supersedes,
        issuedOn,
        expiresOn,
      });
      await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { workerId: row.worker_id } });
    });
  } catch (err) {
    throw dupSlot(err);
  }
  return (await getCredential(db, actor.organisationId, id, now))!;
}

// --- qualification types ----------------------------------------------------------------------

export async function listQualificationTypes(db: Knex | Knex.Transaction, organisationId: number, isLocked: (code: string) => boolean) {
  const rows = await db("qualification_types as q")
    .leftJoin("credentials as c", "c.qualification_type_id", "q.id")
    .where("q.organisation_id", organisationId)
    .groupBy("q.id")
    .orderBy("q.id")
    .select("q.*", db.raw("COUNT(c.id) as in_use"));
  return rows.map(
    (r: Record<string, any>): QualificationType => ({
      id: Number(r.id),
      code: r.code,
      name: r.name,
      renewalMonths: r.renewal_months === null ? null : Number(r.renewal_months),
      warnDays: Number(r.warn_days),
      needsEvidence: Boolean(r.needs_evidence),
      locked: isLocked(r.code),
      inUse: Number(r.in_use),
    }),
  );
}
