import { z } from "zod";

/**
 * Codes the crew rules read (lib/rules): fixed, never renamed or deleted. Their names,
 * renewal periods, warning windows and evidence flag stay editable.
 */
export const RULE_QUALIFICATION_CODES = [
  "climbing",
  "first_aid_cpr",
  "pole_top_rescue",
  "qualified_electrical",
  "aerial_rescue",
  "equipment_operator",
  "cdl_a",
  "cdl_b",
  "traffic_control",
] as const;

export const isRuleCode = (code: string) => (RULE_QUALIFICATION_CODES as readonly string[]).includes(code);

const fields = {
  name: z.string({ error: "Enter a name" }).trim().min(1, "Enter a name").max(120, "Longer than 120 characters"),
  // null: no renewal (never expires)
  renewalMonths: z
    .number({ error: "Months, or leave empty for no renewal" })
    .int("Whole months")
    .min(1, "At least 1 month")
    .max(240, "At most 240 months")
    .nullable(),
  warnDays: z.number({ error: "Enter a number of days" }).int("Whole days").min(0, "0 or more").max(365, "At most 365 days"),
  needsEvidence: z.boolean().default(false),
};

export const qualificationTypeCreateSchema = z
  .object({
    code: z
      .string({ error: "Enter a code" })
      .trim()
      .toLowerCase()
      .min(2, "At least 2 characters")
      .max(40, "At most 40 characters")
      .regex(/^[a-z][a-z0-9_]*$/, "Lower-case letters, digits and underscores, starting with a letter"),
    ...fields,
  })
  .strict();

export const qualificationTypePatchSchema = z
  .object({
    name: fields.name.optional(),
    renewalMonths: fields.renewalMonths.optional(),
    warnDays: fields.warnDays.optional(),
    needsEvidence: z.boolean().optional(),
    // Sent by a client that tries to rename a code; refused for every type (codes are keys).
    code: z.string().optional(),
  })
  .strict();

export type QualificationTypeCreate = z.output<typeof qualificationTypeCreateSchema>;
export type QualificationTypeCreateInput = z.input<typeof qualificationTypeCreateSchema>;
export type QualificationTypePatch = z.output<typeof qualificationTypePatchSchema>;
