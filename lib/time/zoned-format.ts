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

/** "CST", "MDT": the zone's short name at that instant (the IANA rules decide summer time). */
export function zoneAbbreviation(iso: string | number | Date, timezone: string) {
  return (
    new Intl.DateTimeFormat("en-US", { timeZone: timezone, timeZoneName: "short" }).formatToParts(new Date(iso)).find((p) => p.type === "timeZoneName")?.value ??
    timezone
  );
}

/** "Tue, Dec 2 · 07:00–15:30 CST": an order's times on its yard's clock, with the zone's name. */
export function fmtSpan(start: string, end: string, timezone: string) {
  const day = new Intl.DateTimeFormat("en-US", { timeZone: timezone, weekday: "short", month: "short", day: "numeric" });
  const time = new Intl.DateTimeFormat("en-US", { timeZone: timezone, hour: "2-digit", minute: "2-digit", hour12: false });
  const s = new Date(start);
  const e = new Date(end);
  return `${day.format(s)} · ${time.format(s)}–${day.format(s) === day.format(e) ? "" : `${day.format(e)} `}${time.format(e)} ${zoneAbbreviation(start, timezone)}`;
}
