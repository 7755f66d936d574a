import { TZDate } from "@date-fns/tz";

// Small wall-clock helpers for the demo seed. Calendar dates are 'YYYY-MM-DD' strings in a
// yard's IANA zone; instants are plain JS Dates (UTC), which is what the DATETIME columns store.

const pad = (n: number, width = 2) => String(n).padStart(width, "0");

function parseDate(dateStr: string): [number, number, number] {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(dateStr);
  if (!m) throw new Error(`not a YYYY-MM-DD date: ${dateStr}`);
  return [Number(m[1]), Number(m[2]), Number(m[3])];
}

/** The wall-clock time `hhmm` ("HH:mm") on `dateStr` in zone `tz`, as a UTC instant. */
export function localToUtc(dateStr: string, hhmm: string, tz: string): Date {
  const [y, mo, d] = parseDate(dateStr);
  const t = /^(\d{2}):(\d{2})$/.exec(hhmm);
  if (!t) throw new Error(`not an HH:mm time: ${hhmm}`);
  const local = new TZDate(y, mo - 1, d, Number(t[1]), Number(t[2]), 0, 0, tz);
  return new Date(local.getTime());
}

/** The calendar date of `instant` in zone `tz`. */
export function localDateOf(instant: Date, tz: string): string {
  const local = new TZDate(instant.getTime(), tz);
  return `${pad(local.getFullYear(), 4)}-${pad(local.getMonth() + 1)}-${pad(local.getDate())}`;
}

/** Pure calendar arithmetic on a 'YYYY-MM-DD' date (no zone involved). */
export function addDays(dateStr: string, days: number): string {
  const [y, m, d] = parseDate(dateStr);
  const t = new Date(Date.UTC(y, m - 1, d + days));
  return `${pad(t.getUTCFullYear(), 4)}-${pad(t.getUTCMonth() + 1)}-${pad(t.getUTCDate())}`;
}

/** Calendar months, clamped to the month's last day (Jan 31 + 1 month = Feb 28/29). */
export function addMonths(dateStr: string, months: number): string {
  const [y, m, d] = parseDate(dateStr);
  const first = new Date(Date.UTC(y, m - 1 + months, 1));
  const lastDay = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  first.setUTCDate(Math.min(d, lastDay));
  return `${pad(first.getUTCFullYear(), 4)}-${pad(first.getUTCMonth() + 1)}-${pad(first.getUTCDate())}`;
}

/** Day of the week of a 'YYYY-MM-DD' date: 0 = Sunday … 6 = Saturday. */
export function weekday(dateStr: string): number {
  const [y, m, d] = parseDate(dateStr);
  return new Date(Date.UTC(y, m - 1, d)).getUTCDay();
}

/** Whole days from `a` to `b` (b − a). */
export function daysBetween(a: string, b: string): number {
  const [ay, am, ad] = parseDate(a);
  const [by, bm, bd] = parseDate(b);
  return Math.round((Date.UTC(by, bm - 1, bd) - Date.UTC(ay, am - 1, ad)) / 86_400_000);
}
