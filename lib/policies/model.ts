import { z } from "zod";
import { RULE_CODES } from "@/lib/rules/types";
import { POLICY_FIELD_LABELS as L } from "@/lib/rules/rule-labels";

/** A number field whose every message names the field by the label people see. */
function num(label: string, min: number, max: number, int = false) {
  const range = `${label} must be ${int ? "a whole number" : "a number"} from ${min} to ${max}`;
  let n = z.number({ error: `${label} must be a number` });
  if (int) n = n.int({ error: range });
  return n.min(min, { error: range }).max(max, { error: range });
}

export const policySchema = z.strictObject(
  {
    minRestHours: num(L.minRestHours, 0, 24),
    maxShiftHours: num(L.maxShiftHours, 1, 36),
    credentialWarnDays: num(L.credentialWarnDays, 0, 365, true),
    regularHoursWeek: num(L.regularHoursWeek, 0, 100),
    regularHoursDay: num(L.regularHoursDay, 0, 24),
    replyDeadlineHours: num(L.replyDeadlineHours, 0, 72, true),
    // Organisations may raise a rule to block; lowering is not offered.
    raisedToBlock: z
      .array(z.enum(RULE_CODES, { error: `${L.raisedToBlock}: not a rule this product knows` }))
      .max(RULE_CODES.length)
      .default([]),
  },
  { error: (iss) => (iss.code === "unrecognized_keys" ? "Unknown field: the policy has only the fields shown on the Admin page" : undefined) },
);

export type PolicyInput = z.infer<typeof policySchema>;

/** Only the policy's own fields (the stored policy also carries the engine's derived rules). */
export function policyFields(p: PolicyInput & Record<string, unknown>): PolicyInput {
  return {
    minRestHours: p.minRestHours,
    maxShiftHours: p.maxShiftHours,
    credentialWarnDays: p.credentialWarnDays,
    regularHoursWeek: p.regularHoursWeek,
    regularHoursDay: p.regularHoursDay,
    replyDeadlineHours: p.replyDeadlineHours,
    raisedToBlock: [...p.raisedToBlock],
  };
}
