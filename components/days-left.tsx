import { Badge } from "./status";

/** Days left on a credential, as a badge with a word: lapsed, lapsing (within the window), valid. */
export function DaysLeft({ days, warnDays = 30 }: { days: number | null; warnDays?: number }) {
  if (days === null) return <Badge tone="clear">No expiry</Badge>;
  if (days < 0) return <Badge tone="block">Lapsed {-days} d ago</Badge>;
  if (days < warnDays) return <Badge tone="warn">{days} d left</Badge>;
  return <Badge tone="clear">{days} d left</Badge>;
}
