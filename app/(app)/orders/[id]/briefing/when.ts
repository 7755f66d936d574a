// Time words for the briefing screen, on the yard's clock. Pure.

/** "Dec 2, 06:48 CST" */
export function fmtStamp(iso: string, timezone: string) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hour12: false,
    timeZoneName: "short",
  }).format(new Date(iso));
}

/** "Tue, Dec 2 · 07:00–15:30 CST" */
export function fmtSpan(start: string, end: string, timezone: string) {
  const day = new Intl.DateTimeFormat("en-US", { timeZone: timezone, weekday: "short", month: "short", day: "numeric" });
  const time = new Intl.DateTimeFormat("en-US", { timeZone: timezone, hour: "2-digit", minute: "2-digit", hour12: false });
  const zone = new Intl.DateTimeFormat("en-US", { timeZone: timezone, timeZoneName: "short" }).formatToParts(new Date(start)).find((p) => p.type === "timeZoneName")?.value ?? "";
  const s = new Date(start);
  const e = new Date(end);
  return `${day.format(s)} · ${time.format(s)}–${day.format(s) === day.format(e) ? "" : `${day.format(e)} `}${time.format(e)} ${zone}`;
}

/** +13205550101 → (320) 555-0101 for North American numbers; anything else as stored. */
export function phoneText(e164: string) {
  const m = /^\+1(\d{3})(\d{3})(\d{4})$/.exec(e164);
  return m ? `(${m[1]}) ${m[2]}-${m[3]}` : e164;
}
