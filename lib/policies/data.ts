import "@/lib/server-only";
import type { Knex } from "knex";
import type { Policy, RuleCode } from "@/lib/rules/types";
import type { PolicyInput } from "@/lib/policies/model";

export interface OrgPolicy extends PolicyInput {
  rules: Policy;
}

export async function getPolicy(db: Knex | Knex.Transaction, organisationId: number): Promise<OrgPolicy> {
  const row = await db("policies").where({ organisation_id: organisationId }).first();
  const levels = parseLevels(row?.rule_levels);
  const p = {
    minRestHours: Number(row?.min_rest_hours ?? 8),
    maxShiftHours: Number(row?.max_shift_hours ?? 16),
    credentialWarnDays: Number(row?.credential_warn_days ?? 30),
    regularHoursWeek: Number(row?.regular_hours_week ?? 40),
    regularHoursDay: Number(row?.regular_hours_day ?? 8),
    replyDeadlineHours: Number(row?.reply_deadline_hours ?? 10),
    raisedToBlock: Object.keys(levels) as RuleCode[],
  };
  return {
    ...p,
    rules: {
      minRestHours: p.minRestHours,
      maxShiftHours: p.maxShiftHours,
      credentialWarnDays: p.credentialWarnDays,
      levels,
    },
  };
}

function parseLevels(raw: unknown): Partial<Record<RuleCode, "block">> {
  const v = typeof raw === "string" ? safeJson(raw) : raw;
  const out: Partial<Record<RuleCode, "block">> = {};
  if (v && typeof v === "object") for (const [k, lvl] of Object.entries(v)) if (lvl === "block") out[k as RuleCode] = "block";
  return out;
}

function safeJson(s: string) {
  try {
    return JSON.parse(s);
  } catch {
    return null;
  }
}

export async function savePolicy(db: Knex | Knex.Transaction, organisationId: number, p: PolicyInput) {
  const row = {
    organisation_id: organisationId,
    min_rest_hours: p.minRestHours,
    max_shift_hours: p.maxShiftHours,
    credential_warn_days: p.credentialWarnDays,
    regular_hours_week: p.regularHoursWeek,
    regular_hours_day: p.regularHoursDay,
    reply_deadline_hours: p.replyDeadlineHours,
    rule_levels: JSON.stringify(Object.fromEntries(p.raisedToBlock.map((r) => [r, "block"]))),
    updated_at: new Date(),
  };
  await db("policies").insert(row).onConflict("organisation_id").merge();
}
