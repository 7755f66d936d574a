import { z } from "zod";
import { RULE_CODES } from "@/lib/rules/types";

export const policySchema = z
  .object({
    minRestHours: z.number({ error: "minRestHours must be a number of hours" }).min(0).max(24),
    maxShiftHours: z.number({ error: "maxShiftHours must be a number of hours" }).min(1).max(36),
    credentialWarnDays: z.number().int().min(0).max(365),
    regularHoursWeek: z.number().min(0).max(100),
    regularHoursDay: z.number().min(0).max(24),
    replyDeadlineHours: z.number().int().min(0).max(72),
    // Organisations may raise a rule to block; lowering is not offered.
    raisedToBlock: z.array(z.enum(RULE_CODES)).max(RULE_CODES.length).default([]),
  })
  .strict();

export type PolicyInput = z.infer<typeof policySchema>;
