import { z } from "zod";
import { isIsoDate } from "@/lib/rules/time";

// A real calendar day in a sane range: 2026-02-30 or 0000-00-00 would reach the zone arithmetic
// and fail there (a 500) instead of here (a 422 naming the field).
export const calendarDay = (required = "date is required") =>
  z
    .string({ error: required })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Use YYYY-MM-DD")
    .refine((s) => isIsoDate(s) && s >= "1900-01-01" && s <= "2199-12-31", "Not a day on the calendar (YYYY-MM-DD, 1900 to 2199)");

// Calendar-day arithmetic on "YYYY-MM-DD" strings, the one home for the app (the rules engine
// keeps its own in lib/rules/time.ts, by its contract; the benchmark generator its own). Pure.

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

/** The day `days` after `date` (negative: before), on the proleptic Gregorian calendar. */
export function addDays(date: string, days: number): string {
  const [y, m, d] = date.split("-").map(Number);
  const t = new Date(0);
  t.setUTCFullYear(y, m - 1, d + days); // setUTCFullYear keeps years 0-99 literal
  return `${pad(t.getUTCFullYear(), 4)}-${pad(t.getUTCMonth() + 1)}-${pad(t.getUTCDate())}`;
}

/** Whole days from `from` to `to` (both YYYY-MM-DD). */
export function daysBetween(from: string, to: string): number {
  const a = Date.UTC(+from.slice(0, 4), +from.slice(5, 7) - 1, +from.slice(8, 10));
  const b = Date.UTC(+to.slice(0, 4), +to.slice(5, 7) - 1, +to.slice(8, 10));
  return Math.round((b - a) / 86_400_000);
}

/** Today's date (YYYY-MM-DD) in an IANA zone. */
export function todayIn(timezone: string, now = new Date()): string {
  return new Intl.DateTimeFormat("en-CA", { timeZone: timezone, year: "numeric", month: "2-digit", day: "2-digit" }).format(now);
}

/** Tomorrow's date (YYYY-MM-DD) in an IANA zone. */
export function tomorrowIn(timezone: string, now = new Date()): string {
  return addDays(todayIn(timezone, now), 1);
}
