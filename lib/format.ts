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
