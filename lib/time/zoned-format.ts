// Formatting an instant as the wall clock of a zone, for server and client components alike.

/** "Mon, Jan 12, 07:00 CST": a wall-clock time in a zone, with the zone's short name. */
export function fmtLocal(iso: string | number | Date, timezone: string, opts: Intl.DateTimeFormatOptions = {}) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    weekday: "short",
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
    timeZoneName: "short",
    ...opts,
  }).format(new Date(iso));
}
