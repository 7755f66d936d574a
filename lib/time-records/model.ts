// Time records (what people actually worked) and the calendar-link reset.
import { z } from "zod";
import { isoDate, wallKey, wallTime } from "@/lib/orders/schema";

const minutes = (a: string, b: string) => (Date.parse(`${wallKey(b)}Z`) - Date.parse(`${wallKey(a)}Z`)) / 60_000;

/** A manual entry: times are wall clock in the worker's yard zone; the reason is required. */
export const manualTimeRecordSchema = z
  .object({
    workerId: z.number({ error: "Pick the worker" }).int().positive("Pick the worker"),
    start: wallTime("the start"),
    end: wallTime("the end"),
    reason: z
      .string({ error: "Say why this time is entered by hand" })
      .trim()
      .min(3, "Say why this time is entered by hand")
      .max(500, "At most 500 characters"),
  })
  .superRefine((v, ctx) => {
    const m = minutes(v.start, v.end);
    if (m <= 0) ctx.addIssue({ code: "custom", path: ["end"], message: "The end must be after the start" });
    else if (m > 36 * 60) ctx.addIssue({ code: "custom", path: ["end"], message: "More than 36 hours: enter separate days" });
  });
export type ManualTimeRecordInput = z.output<typeof manualTimeRecordSchema>;
export type ManualTimeRecordValues = z.input<typeof manualTimeRecordSchema>;

/** GET /api/time-records?workerId=&week=YYYY-MM-DD (any day of the week; weeks start Monday). */
export const timeQuerySchema = z.object({
  workerId: z.coerce.number().int().positive().optional(),
  // Bounded: the week after 9999-12-27 is not a date the zone arithmetic can write (was a 500).
  week: isoDate("the week")
    .refine((s) => s >= "1900-01-01" && s <= "2199-12-31", "Pick a week between 1900 and 2199")
    .optional(),
});

/** POST /api/calendar/reset: a lineworker resets their own link; hr and admin name the worker. */
export const calendarResetSchema = z.object({
  workerId: z.number().int().positive().optional(),
});
