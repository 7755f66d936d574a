// Display helpers shared by server and client components.

export function fmtTime(iso: string | Date, timezone: string) {
  return new Intl.DateTimeFormat("en-US", { timeZone: timezone, hour: "2-digit", minute: "2-digit", hour12: false }).format(
    typeof iso === "string" ? new Date(iso) : iso,
  );
}

export function fmtDate(date: string, opts: Intl.DateTimeFormatOptions = { weekday: "short", month: "short", day: "numeric" }) {
  const [y, m, d] = date.split("-").map(Number);
  return new Intl.DateTimeFormat("en-US", { ...opts, timeZone: "UTC" }).format(new Date(Date.UTC(y, m - 1, d)));
}

export function fmtDateTime(iso: string | Date, timezone: string) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hour12: false,
  }).format(typeof iso === "string" ? new Date(iso) : iso);
}

/** "Dec 3, 14:05 CST": fmtDateTime with the zone's abbreviation, for lists that mix people and yards. */
export function fmtDateTimeZone(iso: string | Date, timezone: string) {
  return new Intl.DateTimeFormat("en-US", {
    timeZone: timezone,
    month: "short",
    day: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    hourCycle: "h23",
    timeZoneName: "short",
  }).format(typeof iso === "string" ? new Date(iso) : iso);
}

/** Whole days from `from` to `to` (both YYYY-MM-DD). */
export function daysBetween(from: string, to: string) {
  const a = Date.UTC(+from.slice(0, 4), +from.slice(5, 7) - 1, +from.slice(8, 10));
  const b = Date.UTC(+to.slice(0, 4), +to.slice(5, 7) - 1, +to.slice(8, 10));
  return Math.round((b - a) / 86_400_000);
}

export const CLASSIFICATION_LABEL: Record<string, string> = {
  journeyman: "Journeyman",
  apprentice: "Apprentice",
  ground_hand: "Ground hand",
  operator: "Operator",
  crew_lead: "Crew lead",
};

export const POSITION_LABEL: Record<string, string> = {
  climber: "Climber",
  aerial: "In the bucket",
  observer: "Observer",
  operator: "Operator",
  ground: "Ground",
  lead: "Lead",
  driver: "Driver",
};
