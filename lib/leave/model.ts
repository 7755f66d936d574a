// Leave, training and sickness: shared by the route, the leave page form and the tests.
import { z } from "zod";
import { optionalText, wallKey, wallTime } from "@/lib/orders/schema";

export const UNAVAILABILITY_KINDS = ["leave", "training", "sickness"] as const;
export const UNAVAILABILITY_STATUSES = ["requested", "approved", "refused"] as const;

const minutes = (a: string, b: string) => (Date.parse(`${wallKey(b)}Z`) - Date.parse(`${wallKey(a)}Z`)) / 60_000;

const fields = z.object({
  workerId: z.number({ error: "Pick the worker" }).int().positive("Pick the worker"),
  kind: z.enum(UNAVAILABILITY_KINDS, { error: "Pick leave, training or sickness" }),
  /** From, wall clock in the worker's yard zone. */
  start: wallTime("the first day and time"),
  /** Until (exclusive), wall clock in the worker's yard zone. */
  end: wallTime("the last day and time"),
  note: optionalText(500),
});

const checkRange = (v: { start?: string; end?: string }, ctx: z.RefinementCtx) => {
  if (!v.start || !v.end) return;
  const m = minutes(v.start, v.end);
  if (!Number.isFinite(m)) return;
  if (m <= 0) ctx.addIssue({ code: "custom", path: ["end"], message: "The end must be after the start" });
  else if (m > 366 * 24 * 60) ctx.addIssue({ code: "custom", path: ["end"], message: "At most a year at a time" });
};

export const unavailabilitySchema = fields.superRefine(checkRange);
export type UnavailabilityInput = z.output<typeof unavailabilitySchema>;
export type UnavailabilityFormValues = z.input<typeof unavailabilitySchema>;

/** PATCH: a supervisor's decision on a request, or corrections to the dates, kind or note. */
export const unavailabilityPatchSchema = fields
  .omit({ workerId: true })
  .partial()
  .extend({ status: z.enum(["approved", "refused"]).optional() })
  .superRefine(checkRange);
export type UnavailabilityPatch = z.output<typeof unavailabilityPatchSchema>;

export const unavailabilityQuerySchema = z.object({
  workerId: z.coerce.number().int().positive().optional(),
  status: z.enum(UNAVAILABILITY_STATUSES).optional(),
  from: z.string().regex(/^\d{4}-\d{2}-\d{2}$/).optional(),
  to: z.string().regex(/^\d{4}-\d{2}-\d{2}$/).optional(),
});
