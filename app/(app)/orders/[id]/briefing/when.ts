// Time words for the briefing screen, on the yard's clock. Pure.
export { fmtSpan } from "@/lib/time/zoned-format";

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

/** +13205550101 → (320) 555-0101 for North American numbers; anything else as stored. */
export function phoneText(e164: string) {
  const m = /^\+1(\d{3})(\d{3})(\d{4})$/.exec(e164);
  return m ? `(${m[1]}) ${m[2]}-${m[3]}` : e164;
}
