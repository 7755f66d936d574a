// On-call rotations and call-outs: shared by the routes, the rotations page forms and the tests.
import { z } from "zod";
import { parseRrule } from "@/lib/time/recurrence";
import { optionalText, wallKey, wallTime } from "@/lib/orders/schema";

const minutes = (a: string, b: string) => (Date.parse(`${wallKey(b)}Z`) - Date.parse(`${wallKey(a)}Z`)) / 60_000;

export const rotationFields = z.object({
  name: z.string({ error: "Give the rotation a name" }).trim().min(1, "Give the rotation a name").max(120),
  yardId: z.number({ error: "Pick a yard" }).int().positive("Pick a yard"),
  /** Hand-over recurrence, e.g. FREQ=WEEKLY;BYDAY=MO (may hand over more than once a day). */
  rrule: z.string({ error: "Enter the hand-over rule" }).max(500),
  /** The first hand-over, wall clock in the yard's zone. */
  dtstartLocal: wallTime("the first hand-over"),
  active: z.boolean().default(true),
  /** Workers in the order they take turns. */
  memberIds: z
    .array(z.number().int().positive())
    .min(1, "Add at least one worker")
    .max(60, "At most 60 workers")
    .refine((ids) => new Set(ids).size === ids.length, "A worker appears twice in the turn order"),
});

const checkRule = (v: { rrule?: string }, ctx: z.RefinementCtx) => {
  if (v.rrule === undefined) return;
  const r = parseRrule(v.rrule, { subDaily: true });
  if (!r.ok) ctx.addIssue({ code: "custom", path: ["rrule"], message: r.message });
};

export const rotationSchema = rotationFields.superRefine(checkRule);
export type RotationInput = z.output<typeof rotationSchema>;
export type RotationFormValues = z.input<typeof rotationSchema>;

export const rotationPatchSchema = rotationFields
  .partial()
  .extend({ version: z.number({ error: "Send the version you last loaded" }).int().positive() })
  .superRefine(checkRule);
export type RotationPatch = z.output<typeof rotationPatchSchema>;

/** A call-out: who was called, when (wall clock in the worker's yard zone), on which rotation. */
export const callOutSchema = z
  .object({
    workerId: z.number({ error: "Pick the worker who was called out" }).int().positive("Pick the worker who was called out"),
    start: wallTime("when the call-out started"),
    end: wallTime("when the call-out ended"),
    rotationId: z.number().int().positive().nullable().default(null),
    note: optionalText(500),
  })
  .superRefine((v, ctx) => {
    const m = minutes(v.start, v.end);
    if (m <= 0) ctx.addIssue({ code: "custom", path: ["end"], message: "The end must be after the start" });
    else if (m > 36 * 60) ctx.addIssue({ code: "custom", path: ["end"], message: "A call-out runs at most 36 hours" });
  });
export type CallOutInput = z.output<typeof callOutSchema>;
export type CallOutFormValues = z.input<typeof callOutSchema>;
