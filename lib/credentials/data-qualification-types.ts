import "@/lib/server-only";
import type { Knex } from "knex";
import { ApiError } from "@/lib/api/http";
import { audit, type Actor } from "@/lib/audit/data";
import { boardEvent } from "@/lib/events/data";
import { listQualificationTypes, type QualificationType } from "./data";
import { isRuleCode, type QualificationTypeCreate, type QualificationTypePatch } from "@/lib/credentials/qualification-types";

export type { QualificationType };

export const listTypes = (db: Knex | Knex.Transaction, organisationId: number) =>
  listQualificationTypes(db, organisationId, isRuleCode);

async function one(db: Knex | Knex.Transaction, organisationId: number, id: number) {
  return (await listTypes(db, organisationId)).find((t) => t.id === id) ?? null;
}

export async function createType(db: Knex, actor: Actor, input: QualificationTypeCreate) {
  try {
    return await db.transaction(async (trx) => {
      const [id] = await trx("qualification_types").insert({
        organisation_id: actor.organisationId,
        code: input.code,
        name: input.name,
        renewal_months: input.renewalMonths,
        warn_days: input.warnDays,
        needs_evidence: input.needsEvidence,
      });
      await audit(trx, actor, actor.organisationId, "qualification_type.create", "qualification_type", id, { ...input });
      return (await one(trx, actor.organisationId, Number(id)))!;
    });
  } catch (err) {
    const e = err as { code?: string } | null;
    if (e?.code === "ER_DUP_ENTRY") {
      const message = `There is already a qualification with the code ${input.code}`;
      throw new ApiError(409, message, { issues: [{ field: "code", message }] });
    }
    throw err;
  }
}

export async function updateType(db: Knex, actor: Actor, id: number, patch: QualificationTypePatch) {
  return db.transaction(async (trx) => {
    const before = await trx("qualification_types").where({ id, organisation_id: actor.organisationId }).forUpdate().first();
    if (!before) throw new ApiError(404, "No such qualification.");
    if (patch.code !== undefined && patch.code !== before.code) {
      const message = isRuleCode(before.code)
        ? `The crew rules read the code ${before.code}; it cannot be renamed. Change the name instead.`
        : "Codes are fixed once created; change the name instead, or add a new qualification.";
      throw new ApiError(422, message, { issues: [{ field: "code", message }] });
    }
    const cols: Record<string, unknown> = {};
    if (patch.name !== undefined) cols.name = patch.name;
    if (patch.renewalMonths !== undefined) cols.renewal_months = patch.renewalMonths;
    if (patch.warnDays !== undefined) cols.warn_days = patch.warnDays;
    if (patch.needsEvidence !== undefined) cols.needs_evidence = patch.needsEvidence;
    if (Object.keys(cols).length) await trx("qualification_types").where({ id }).update(cols);
    await audit(trx, actor, actor.organisationId, "qualification_type.update", "qualification_type", id, {
      code: before.code,
      before: { name: before.name, renewalMonths: before.renewal_months, warnDays: before.warn_days, needsEvidence: Boolean(before.needs_evidence) },
      after: patch,
    });
    await boardEvent(trx, { organisationId: actor.organisationId, kind: "credential", day: null, payload: { qualificationTypeId: id } });
    return (await one(trx, actor.organisationId, id))!;
  });
}

export async function deleteType(db: Knex, actor: Actor, id: number) {
  return db.transaction(async (trx) => {
    const before = await trx("qualification_types").where({ id, organisation_id: actor.organisationId }).forUpdate().first();
    if (!before) throw new ApiError(404, "No such qualification.");
    if (isRuleCode(before.code)) {
      throw new ApiError(409, `The crew rules read ${before.code}; it cannot be deleted.`);
    }
    const used = await trx("credentials").where({ qualification_type_id: id }).count({ n: "*" }).first();
    if (Number(used?.n)) {
      throw new ApiError(409, `${Number(used?.n)} credential records use ${before.name}; it cannot be deleted while they exist.`);
    }
    await trx("qualification_types").where({ id }).delete();
    await audit(trx, actor, actor.organisationId, "qualification_type.delete", "qualification_type", id, { code: before.code, name: before.name });
  });
}
