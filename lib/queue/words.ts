// Times in a yard's zone with the zone's abbreviation (client-safe).
export { fmtDateTimeZone } from "@/lib/format";

/** "Fri, Dec 4, 07:00 CST". */
export function fmtLocalStart(iso: string | Date, timezone: string) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    weekday: "short",
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
    timeZoneName: "short",
  }).format(typeof iso === "string" ? new Date(iso) : iso);
}
