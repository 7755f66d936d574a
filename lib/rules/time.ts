// Wall-clock time <-> epoch milliseconds in an IANA zone, using only Intl (pure, no clock).
//
// Disambiguation follows RFC 5545 / Temporal "compatible": a local time inside the
// spring-forward gap moves forward by the length of the gap; a local time inside the
// fall-back overlap takes the earlier instant.

const DAY_MS = 86_400_000;

const WALL_TIME_RE =
  /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,3}))?)?(Z|[+-]\d{2}:\d{2})?$/;
const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

interface WallFields {
  year: number;
  month: number; // 1-12
  day: number;
  hour: number;
  minute: number;
  second: number;
  millisecond: number;
}

interface ParsedTime {
  fields: WallFields;
  /** Offset from UTC in ms when the string carries one (Z or ±HH:MM), else null. */
  offsetMs: number | null;
}

function daysInMonth(year: number, month: number): number {
  if (month !== 2) return [31, 0, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31][month - 1];
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
}

/** Parses "YYYY-MM-DDTHH:mm[:ss[.sss]][Z|±HH:MM]"; null when malformed or out of range. */
export function parseWallTime(text: string): ParsedTime | null {
  const m = WALL_TIME_RE.exec(text);
  if (!m) return null;
  const fields: WallFields = {
    year: Number(m[1]),
    month: Number(m[2]),
    day: Number(m[3]),
    hour: Number(m[4]),
    minute: Number(m[5]),
    second: m[6] === undefined ? 0 : Number(m[6]),
    millisecond: m[7] === undefined ? 0 : Number(m[7].padEnd(3, "0")),
  };
  if (fields.month < 1 || fields.month > 12) return null;
  if (fields.day < 1 || fields.day > daysInMonth(fields.year, fields.month)) return null;
  if (fields.hour > 23 || fields.minute > 59 || fields.second > 59) return null;
  let offsetMs: number | null = null;
  if (m[8] !== undefined) {
    if (m[8] === "Z") offsetMs = 0;
    else {
      const sign = m[8][0] === "-" ? -1 : 1;
      const oh = Number(m[8].slice(1, 3));
      const om = Number(m[8].slice(4, 6));
      if (oh > 23 || om > 59) return null;
      offsetMs = sign * (oh * 60 + om) * 60_000;
    }
  }
  return { fields, offsetMs };
}

export function isWallTime(text: string): boolean {
  return parseWallTime(text) !== null;
}

export function isIsoDate(text: string): boolean {
  const m = DATE_RE.exec(text);
  if (!m) return false;
  const month = Number(m[2]);
  const day = Number(m[3]);
  return month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(Number(m[1]), month);
}

/** The wall fields read as if they were UTC. setUTCFullYear keeps years 0-99 literal. */
function fieldsAsUtc(f: WallFields): number {
  const d = new Date(0);
  d.setUTCFullYear(f.year, f.month - 1, f.day);
  d.setUTCHours(f.hour, f.minute, f.second, f.millisecond);
  return d.getTime();
}

const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(tz: string): Intl.DateTimeFormat {
  let f = formatters.get(tz);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", {
      timeZone: tz,
      hourCycle: "h23",
      era: "short",
      year: "numeric",
      month: "2-digit",
      day: "2-digit",
      hour: "2-digit",
      minute: "2-digit",
      second: "2-digit",
    });
    formatters.set(tz, f);
  }
  return f;
}

/** Wall-clock fields of an instant in tz (millisecond carried over from the instant). */
function wallFieldsAt(ms: number, tz: string): WallFields {
  const parts = formatter(tz).formatToParts(new Date(ms));
  const out: WallFields = { year: 0, month: 0, day: 0, hour: 0, minute: 0, second: 0, millisecond: 0 };
  let bc = false;
  for (const p of parts) {
    switch (p.type) {
      case "year": out.year = Number(p.value); break;
      case "month": out.month = Number(p.value); break;
      case "day": out.day = Number(p.value); break;
      case "hour": out.hour = Number(p.value); break;
      case "minute": out.minute = Number(p.value); break;
      case "second": out.second = Number(p.value); break;
      case "era": bc = p.value === "BC" || p.value === "B"; break;
    }
  }
  if (bc) out.year = 1 - out.year;
  out.millisecond = ((ms % 1000) + 1000) % 1000;
  return out;
}

/** UTC offset (ms) of tz at the instant ms: local wall time minus UTC. */
export function offsetAt(ms: number, tz: string): number {
  return fieldsAsUtc(wallFieldsAt(ms, tz)) - ms;
}

export function isValidTimeZone(tz: string): boolean {
  if (tz.trim() === "") return false;
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: tz });
    return true;
  } catch {
    return false;
  }
}

function wallToEpoch(f: WallFields, tz: string): number {
  const asUtc = fieldsAsUtc(f);
  // Offsets a day either side bracket any single transition near this wall time.
  const before = offsetAt(asUtc - DAY_MS, tz);
  const after = offsetAt(asUtc + DAY_MS, tz);
  if (before === after) return asUtc - before;
  const candidates = [asUtc - before, asUtc - after].filter((t) => offsetAt(t, tz) === asUtc - t);
  if (candidates.length > 0) return Math.min(...candidates); // ambiguous: earlier instant
  // In the gap: read the wall time with the offset in force before the transition, which
  // lands the same distance past the transition as the gap is long (02:30 -> 03:30).
  return asUtc - before;
}

/**
 * Epoch ms of a wall-clock time ("YYYY-MM-DDTHH:mm", seconds optional) in tz. A string with
 * an explicit offset (Z or ±HH:MM) names its instant directly and tz is not consulted.
 * Throws RangeError on a malformed time or an unknown zone.
 */
export function zonedWallTimeToEpoch(local: string, tz: string): number {
  const parsed = parseWallTime(local);
  if (!parsed) throw new RangeError(`expected YYYY-MM-DDTHH:mm, got ${JSON.stringify(local)}`);
  if (parsed.offsetMs !== null) return fieldsAsUtc(parsed.fields) - parsed.offsetMs;
  if (!isValidTimeZone(tz)) throw new RangeError(`unknown IANA time zone ${JSON.stringify(tz)}`);
  return wallToEpoch(parsed.fields, tz);
}

const pad = (n: number, w = 2) => String(n).padStart(w, "0");

/** The calendar date ("YYYY-MM-DD") of an instant in tz. */
export function epochToZonedDate(ms: number, tz: string): string {
  const f = wallFieldsAt(ms, tz);
  return `${pad(f.year, 4)}-${pad(f.month)}-${pad(f.day)}`;
}

/** The wall-clock time ("YYYY-MM-DDTHH:mm") of an instant in tz. */
export function epochToZonedWallTime(ms: number, tz: string): string {
  const f = wallFieldsAt(ms, tz);
  return `${pad(f.year, 4)}-${pad(f.month)}-${pad(f.day)}T${pad(f.hour)}:${pad(f.minute)}`;
}

/** The instant as an ISO string with tz's offset, e.g. "2027-04-06T07:00-05:00" (exact to the minute). */
export function epochToOffsetTime(ms: number, tz: string): string {
  const f = wallFieldsAt(ms, tz);
  const off = Math.round((fieldsAsUtc(f) - ms) / 60_000);
  const sign = off < 0 ? "-" : "+";
  const a = Math.abs(off);
  return `${pad(f.year, 4)}-${pad(f.month)}-${pad(f.day)}T${pad(f.hour)}:${pad(f.minute)}${sign}${pad(Math.floor(a / 60))}:${pad(a % 60)}`;
}

/** Whole calendar days from date a to date b (both "YYYY-MM-DD"): b - a. */
export function daysBetween(a: string, b: string): number {
  const ua = Date.UTC(Number(a.slice(0, 4)), Number(a.slice(5, 7)) - 1, Number(a.slice(8, 10)));
  const ub = Date.UTC(Number(b.slice(0, 4)), Number(b.slice(5, 7)) - 1, Number(b.slice(8, 10)));
  return Math.round((ub - ua) / DAY_MS);
}
