// Recurrence (RFC 5545 RRULE) for work orders and on-call rotations, on the `rrule` package.
//
// Wall-clock first: a series stores its first start as a wall-clock time in the yard's zone
// ("dtstart_local"). The rule is expanded in "floating" time — the wall clock written as if it
// were UTC, so rrule's arithmetic never meets a daylight-saving change — and each occurrence's
// wall-clock time is then turned into an instant in the yard's zone with zonedWallTimeToEpoch
// (RFC 5545 "compatible": a time in the spring-forward gap moves forward by the gap, a time in
// the fall-back overlap takes the earlier instant). So 07:00 stays 07:00 all year.
//
// This file is the pure part and runs in the browser too: the order form's preview calls
// occurrences() with the same arguments the server uses to materialise. lib/orders/data-occurrences.ts
// re-exports it and adds ensureOccurrences (server only).

import { RRule, type Options } from "rrule";
import { epochToZonedWallTime, isIsoDate, offsetAt, parseWallTime, zonedWallTimeToEpoch } from "@/lib/rules/time";

/** Occurrences are materialised into work_orders this many days ahead of today (and lazily further). */
export const HORIZON_DAYS = 60;

const DAY_MS = 86_400_000;
const MAX_SCAN = 20_000; // occurrences an expansion may walk through before giving up

export const WEEKDAYS = ["MO", "TU", "WE", "TH", "FR", "SA", "SU"] as const;
export type WeekdayCode = (typeof WEEKDAYS)[number];
export const WEEKDAY_LABEL: Record<WeekdayCode, string> = {
  MO: "Mon",
  TU: "Tue",
  WE: "Wed",
  TH: "Thu",
  FR: "Fri",
  SA: "Sat",
  SU: "Sun",
};

export interface RecurrenceSpec {
  /** The RRULE value, e.g. "FREQ=WEEKLY;BYDAY=TU,TH;COUNT=10" ("RRULE:" prefix allowed). */
  rrule: string;
  /** First start, wall clock in the zone: "YYYY-MM-DDTHH:mm[:ss]". */
  dtstartLocal: string;
  /** Skipped dates (EXDATE), local calendar dates "YYYY-MM-DD". */
  exdates?: readonly string[] | null;
}

export interface Occurrence {
  /** Local calendar date of the start: the board's day. */
  date: string;
  /** Local wall-clock start "YYYY-MM-DDTHH:mm:ss". */
  local: string;
  /** The start instant (epoch ms). */
  start: number;
}

export interface ParseOptions {
  /** Allow HOURLY/MINUTELY/SECONDLY and BYHOUR/BYMINUTE/BYSECOND (rotations may hand over twice a day; orders may not repeat within a day). */
  subDaily?: boolean;
}

const KNOWN_PARTS = new Set([
  "FREQ",
  "INTERVAL",
  "COUNT",
  "UNTIL",
  "BYDAY",
  "BYMONTHDAY",
  "BYMONTH",
  "BYSETPOS",
  "BYYEARDAY",
  "BYWEEKNO",
  "WKST",
  "BYHOUR",
  "BYMINUTE",
  "BYSECOND",
]);
const SUB_DAILY_PARTS = new Set(["BYHOUR", "BYMINUTE", "BYSECOND"]);
const SUB_DAILY_FREQS = new Set(["HOURLY", "MINUTELY", "SECONDLY"]);

export type ParsedRule =
  | { ok: true; rule: string; options: Partial<Options>; untilUtc: boolean }
  | { ok: false; message: string };

/**
 * Checks and normalises an RRULE value. Returns the rule as stored (upper case, no "RRULE:",
 * no blanks) and rrule's options without dtstart, or a message in plain words.
 */
export function parseRrule(text: string, opts: ParseOptions = {}): ParsedRule {
  let rule = (text ?? "").trim();
  if (/^RRULE:/i.test(rule)) rule = rule.slice(6);
  rule = rule.replace(/\s+/g, "").toUpperCase();
  if (!rule) return { ok: false, message: "Enter a repeat rule, e.g. FREQ=WEEKLY;BYDAY=MO" };
  if (rule.length > 500) return { ok: false, message: "The repeat rule is longer than 500 characters." };
  if (rule.includes("DTSTART") || rule.includes(":"))
    return { ok: false, message: "Give only the RRULE value; the first start is set by the start time." };
  const parts = rule.split(";").filter(Boolean);
  const seen = new Set<string>();
  for (const p of parts) {
    const [key, value] = p.split("=");
    if (!key || value === undefined || value === "") return { ok: false, message: `"${p}" is not NAME=VALUE.` };
    if (!KNOWN_PARTS.has(key)) return { ok: false, message: `${key} is not a rule part Gaffline understands.` };
    if (seen.has(key)) return { ok: false, message: `${key} appears twice.` };
    seen.add(key);
    if (!opts.subDaily && SUB_DAILY_PARTS.has(key))
      return { ok: false, message: `${key} would repeat within a day; a work order repeats at most once a day.` };
  }
  const freq = parts.find((p) => p.startsWith("FREQ="))?.slice(5);
  if (!freq) return { ok: false, message: "The repeat rule needs FREQ (DAILY, WEEKLY, MONTHLY or YEARLY)." };
  if (!opts.subDaily && SUB_DAILY_FREQS.has(freq))
    return { ok: false, message: "A work order repeats at most once a day: use DAILY, WEEKLY, MONTHLY or YEARLY." };
  if (seen.has("COUNT") && seen.has("UNTIL")) return { ok: false, message: "Use COUNT or UNTIL, not both (RFC 5545)." };
  const count = parts.find((p) => p.startsWith("COUNT="))?.slice(6);
  if (count !== undefined && (!/^\d+$/.test(count) || Number(count) < 1 || Number(count) > 1000))
    return { ok: false, message: "COUNT must be a whole number from 1 to 1000." };
  const interval = parts.find((p) => p.startsWith("INTERVAL="))?.slice(9);
  if (interval !== undefined && (!/^\d+$/.test(interval) || Number(interval) < 1 || Number(interval) > 366))
    return { ok: false, message: "INTERVAL must be a whole number from 1 to 366." };
  const until = parts.find((p) => p.startsWith("UNTIL="))?.slice(6);
  if (until !== undefined && !/^\d{8}(T\d{6}Z?)?$/.test(until))
    return { ok: false, message: "UNTIL must look like 20270630 or 20270630T235959." };
  let options: Partial<Options>;
  try {
    options = RRule.parseString(parts.join(";"));
    // Build once to let rrule reject values it cannot use (BYDAY=XX, BYMONTH=13, …).
    new RRule({ ...options, dtstart: new Date(Date.UTC(2000, 0, 1)) }, true);
  } catch (err) {
    return { ok: false, message: `The repeat rule is not valid: ${(err as Error).message}` };
  }
  // A DATE-only UNTIL counts the whole of that local day.
  if (until && until.length === 8 && options.until) options.until = new Date(options.until.getTime() + DAY_MS - 1000);
  return { ok: true, rule: parts.join(";"), options, untilUtc: Boolean(until?.endsWith("Z")) };
}

/** "YYYY-MM-DDTHH:mm[:ss]" → the same wall clock as a UTC epoch ("floating"). */
export function floating(local: string): number {
  const p = parseWallTime(local);
  if (!p || p.offsetMs !== null) throw new RangeError(`expected a wall-clock time YYYY-MM-DDTHH:mm, got ${JSON.stringify(local)}`);
  const f = p.fields;
  const d = new Date(0);
  d.setUTCFullYear(f.year, f.month - 1, f.day);
  d.setUTCHours(f.hour, f.minute, f.second, 0);
  return d.getTime();
}

const pad = (n: number, w = 2) => String(n).padStart(w, "0");

/** A floating epoch back to "YYYY-MM-DDTHH:mm:ss". */
export function floatingToLocal(ms: number): string {
  const d = new Date(ms);
  return `${pad(d.getUTCFullYear(), 4)}-${pad(d.getUTCMonth() + 1)}-${pad(d.getUTCDate())}T${pad(d.getUTCHours())}:${pad(d.getUTCMinutes())}:${pad(d.getUTCSeconds())}`;
}

/** Normalises a wall-clock string to "YYYY-MM-DDTHH:mm:ss". */
export function normaliseLocal(local: string): string {
  return floatingToLocal(floating(local));
}

/** The floating-time RRule for a spec. Throws RangeError with a plain message when the rule is bad. */
export function floatingRule(spec: RecurrenceSpec, timezone: string, opts: ParseOptions = {}): RRule {
  const parsed = parseRrule(spec.rrule, opts);
  if (!parsed.ok) throw new RangeError(parsed.message);
  const options = { ...parsed.options };
  // An UNTIL in UTC (…Z, as RFC 5545 asks for with a TZID) names an instant: read it as the
  // yard's wall clock so it compares with floating occurrences.
  if (parsed.untilUtc && options.until) {
    const ms = options.until.getTime();
    options.until = new Date(ms + offsetAt(ms, timezone));
  }
  return new RRule({ ...options, dtstart: new Date(floating(spec.dtstartLocal)), tzid: null }, true);
}

function toOccurrence(f: Date, timezone: string): Occurrence {
  const local = floatingToLocal(f.getTime());
  return { date: local.slice(0, 10), local, start: zonedWallTimeToEpoch(local, timezone) };
}

export interface ExpandWindow {
  /** First local date to include (inclusive). */
  from?: string;
  /** Last local date to include (inclusive). */
  to?: string;
  /** At most this many occurrences (after skipped dates are removed). */
  limit?: number;
}

/**
 * The occurrences of a series in a window of local dates, skipped dates removed (RFC 5545
 * §3.8.5.1: EXDATE removes instances from the set the RRULE generates, so COUNT counts them).
 */
export function occurrences(spec: RecurrenceSpec, timezone: string, win: ExpandWindow = {}, opts: ParseOptions = {}): Occurrence[] {
  const rule = floatingRule(spec, timezone, opts);
  const skip = new Set(spec.exdates ?? []);
  const limit = win.limit ?? (win.to ? MAX_SCAN : 100);
  const from = win.from ? floating(`${win.from}T00:00:00`) : -Infinity;
  const to = win.to ? floating(`${win.to}T00:00:00`) + DAY_MS - 1 : Infinity;
  const out: Occurrence[] = [];
  let scanned = 0;
  const take = (d: Date) => {
    scanned++;
    const ms = d.getTime();
    if (ms > to || scanned > MAX_SCAN) return false;
    if (ms >= from) {
      const o = toOccurrence(d, timezone);
      if (!skip.has(o.date)) out.push(o);
    }
    return out.length < limit;
  };
  if (win.from && Number.isFinite(from)) {
    // Start the walk near the window: rrule still iterates from dtstart internally, but
    // between() keeps only what we ask for.
    rule.between(new Date(from), new Date(Number.isFinite(to) ? to : from + 400 * 366 * DAY_MS), true, (d) => take(d));
  } else {
    rule.all((d) => take(d));
  }
  return out;
}

/** The first `n` occurrences from a local date on (default: from the series start). */
export function nextOccurrences(spec: RecurrenceSpec, timezone: string, n: number, fromDate?: string): Occurrence[] {
  return occurrences(spec, timezone, { from: fromDate, limit: n });
}

/** True when the rule has an occurrence after the given local date (inclusive of later days only). */
export function hasOccurrenceAfter(spec: RecurrenceSpec, timezone: string, date: string, opts: ParseOptions = {}): boolean {
  const rule = floatingRule(spec, timezone, opts);
  return rule.after(new Date(floating(`${date}T00:00:00`) + DAY_MS - 1), false) !== null;
}

/** The rule in plain words ("every week on Tuesday, Thursday for 10 times"). */
export function describeRrule(rrule: string, opts: ParseOptions = {}): string {
  const parsed = parseRrule(rrule, opts);
  if (!parsed.ok) return rrule;
  try {
    const text = new RRule({ ...parsed.options, dtstart: new Date(Date.UTC(2000, 0, 1)) }, true).toText();
    return text.charAt(0).toUpperCase() + text.slice(1);
  } catch {
    return parsed.rule;
  }
}

// --- the form's usual cases ------------------------------------------------------------------

export type RepeatKind = "none" | "daily" | "weekly" | "monthly" | "custom";

export interface RepeatForm {
  kind: RepeatKind;
  /** Every n days / weeks / months. */
  interval: number;
  /** Weekly: the days. */
  weekdays: WeekdayCode[];
  /** Monthly: which one (1–4 = first … fourth, -1 last, -2 second-to-last). */
  nth: number;
  /** Monthly: the weekday. */
  weekday: WeekdayCode;
  end: "never" | "until" | "count";
  /** Last local date (inclusive) when end = until. */
  until: string;
  count: number;
  /** The RRULE value when kind = custom. */
  custom: string;
}

export const NTH_LABEL: Record<string, string> = {
  "1": "first",
  "2": "second",
  "3": "third",
  "4": "fourth",
  "-1": "last",
  "-2": "second-to-last",
};

/** The RRULE value for the form's usual cases; null for "does not repeat". */
export function buildRrule(f: RepeatForm): string | null {
  if (f.kind === "none") return null;
  if (f.kind === "custom") return f.custom.trim();
  const parts: string[] = [];
  const interval = Math.max(1, Math.floor(Number(f.interval) || 1));
  if (f.kind === "daily") parts.push("FREQ=DAILY");
  if (f.kind === "weekly") {
    parts.push("FREQ=WEEKLY");
    const days = WEEKDAYS.filter((d) => f.weekdays.includes(d));
    if (days.length) parts.push(`BYDAY=${days.join(",")}`);
  }
  if (f.kind === "monthly") parts.push("FREQ=MONTHLY", `BYDAY=${f.nth}${f.weekday}`);
  if (interval > 1) parts.splice(1, 0, `INTERVAL=${interval}`);
  if (f.end === "until" && isIsoDate(f.until)) parts.push(`UNTIL=${f.until.replace(/-/g, "")}T235959`);
  if (f.end === "count") parts.push(`COUNT=${Math.max(1, Math.floor(Number(f.count) || 1))}`);
  return parts.join(";");
}

/** The form state for a stored rule (kind "custom" when the rule is not one of the usual cases). */
export function repeatFormFrom(rrule: string | null | undefined, startDate?: string): RepeatForm {
  const base = defaultRepeatForm(startDate);
  if (!rrule) return base;
  const parsed = parseRrule(rrule);
  if (!parsed.ok) return { ...base, kind: "custom", custom: rrule };
  const map = Object.fromEntries(parsed.rule.split(";").map((p) => p.split("=") as [string, string]));
  const keys = Object.keys(map).filter((k) => !["FREQ", "INTERVAL", "COUNT", "UNTIL", "BYDAY"].includes(k));
  const custom = { ...base, kind: "custom" as const, custom: parsed.rule };
  if (keys.length) return custom;
  const form: RepeatForm = { ...base, interval: Number(map.INTERVAL ?? 1) };
  if (map.COUNT) {
    form.end = "count";
    form.count = Number(map.COUNT);
  } else if (map.UNTIL) {
    if (!/^\d{8}(T235959)?$/.test(map.UNTIL)) return custom;
    form.end = "until";
    form.until = `${map.UNTIL.slice(0, 4)}-${map.UNTIL.slice(4, 6)}-${map.UNTIL.slice(6, 8)}`;
  }
  if (map.FREQ === "DAILY" && !map.BYDAY) return { ...form, kind: "daily" };
  if (map.FREQ === "WEEKLY") {
    const days = (map.BYDAY ?? "").split(",").filter(Boolean);
    if (!days.every((d) => (WEEKDAYS as readonly string[]).includes(d))) return custom;
    return { ...form, kind: "weekly", weekdays: days as WeekdayCode[] };
  }
  if (map.FREQ === "MONTHLY") {
    const m = /^(-?\d)(MO|TU|WE|TH|FR|SA|SU)$/.exec(map.BYDAY ?? "");
    if (!m || !NTH_LABEL[m[1]]) return custom;
    return { ...form, kind: "monthly", nth: Number(m[1]), weekday: m[2] as WeekdayCode };
  }
  return custom;
}

/** Weekday code of a local date. */
export function weekdayOf(date: string): WeekdayCode {
  const d = new Date(Date.UTC(+date.slice(0, 4), +date.slice(5, 7) - 1, +date.slice(8, 10)));
  return WEEKDAYS[(d.getUTCDay() + 6) % 7];
}

/** Which n-th weekday of its month a date is (1–4, or -1 when it is the last). */
export function nthOfMonth(date: string): number {
  const day = +date.slice(8, 10);
  const n = Math.ceil(day / 7);
  const y = +date.slice(0, 4);
  const m = +date.slice(5, 7);
  const last = new Date(Date.UTC(y, m, 0)).getUTCDate();
  return day + 7 > last && n >= 4 ? -1 : Math.min(n, 4);
}

export function defaultRepeatForm(startDate?: string): RepeatForm {
  const wd = startDate && isIsoDate(startDate) ? weekdayOf(startDate) : "MO";
  return {
    kind: "none",
    interval: 1,
    weekdays: [wd],
    nth: startDate && isIsoDate(startDate) ? nthOfMonth(startDate) : 1,
    weekday: wd,
    end: "never",
    until: "",
    count: 10,
    custom: "",
  };
}


/** Local wall time of an instant, seconds included ("YYYY-MM-DDTHH:mm:ss"). */
export function localOf(ms: number, timezone: string): string {
  return `${epochToZonedWallTime(ms, timezone)}:${pad(new Date(ms).getUTCSeconds())}`;
}
