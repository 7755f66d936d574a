import { z } from "zod";
import { isIsoDate } from "@/lib/rules/time";

// A real calendar day in a sane range: 2026-02-30 or 0000-00-00 would reach the zone arithmetic
// and fail there (a 500) instead of here (a 422 naming the field).
export const calendarDay = (required = "date is required") =>
  z
    .string({ error: required })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Use YYYY-MM-DD")
    .refine((s) => isIsoDate(s) && s >= "1900-01-01" && s <= "2199-12-31", "Not a day on the calendar (YYYY-MM-DD, 1900 to 2199)");
