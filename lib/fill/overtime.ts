// Overtime for call-out equalisation: hours beyond the policy's regular hours per day, summed
// over the 28 days before the day being filled (common practice in utility labour agreements:
// the call-out list goes lowest hours first). Worked time is split at local midnights, so a
// call-out from 23:00 to 02:00 counts one hour on the first day and two on the next.

import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import type { Interval } from "@/lib/rules/types";
import { addDays } from "@/lib/time/days";

export const OVERTIME_WINDOW_DAYS = 28;
const HOUR = 3_600_000;

/** Local midnight (epoch ms) of a YYYY-MM-DD date in a zone. */
function midnight(date: string, tz: string, cache: Map<string, number>) {
  let ms = cache.get(date);
  if (ms === undefined) cache.set(date, (ms = zonedWallTimeToEpoch(`${date}T00:00`, tz)));
  return ms;
}

/**
 * Overtime hours in the `days` local days before `day` (day itself not included), one decimal.
 * Overlapping records are merged first, so the same hour is never counted twice.
 */
export function overtimeHours(
  records: readonly Interval[],
  opts: { day: string; timezone: string; regularHoursDay: number; days?: number },
  cache = new Map<string, number>(),
): number {
  const days = opts.days ?? OVERTIME_WINDOW_DAYS;
  const from = midnight(addDays(opts.day, -days), opts.timezone, cache);
  const to = midnight(opts.day, opts.timezone, cache);
  const clipped = records
    .filter((r) => r.end > from && r.start < to)
    .map((r) => ({ start: Math.max(r.start, from), end: Math.min(r.end, to) }))
    .sort((a, b) => a.start - b.start);
  const merged: Interval[] = [];
  for (const r of clipped) {
    const last = merged[merged.length - 1];
    if (last && r.start <= last.end) last.end = Math.max(last.end, r.end);
    else merged.push({ ...r });
  }
  const perDay = new Map<string, number>();
  for (const r of merged) {
    let s = r.start;
    while (s < r.end) {
      const date = epochToZonedDate(s, opts.timezone);
      const next = midnight(addDays(date, 1), opts.timezone, cache);
      const e = Math.min(r.end, next);
      perDay.set(date, (perDay.get(date) ?? 0) + (e - s));
      s = e;
    }
  }
  let over = 0;
  const regular = opts.regularHoursDay * HOUR;
  for (const ms of perDay.values()) if (ms > regular) over += ms - regular;
  return Math.round((over / HOUR) * 10) / 10;
}
