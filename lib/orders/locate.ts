// The underground-utility locate warning for orders that dig (pole sets, anchors). Pure, so
// the orders list, the order page and the board show the same words.

export interface LocateInput {
  digs: boolean;
  locateTicket: string | null;
  /** Last day the locate marks are valid (YYYY-MM-DD, yard-local). */
  locateValidThrough: string | null;
  /** The order's start date (YYYY-MM-DD, yard-local). */
  workDate: string;
  /** The order's last day (YYYY-MM-DD, yard-local) when it runs past its first: the ticket must cover it too. */
  lastDate?: string | null;
}

function day(date: string) {
  const [y, m, d] = date.split("-").map(Number);
  return new Intl.DateTimeFormat("en-US", { timeZone: "UTC", month: "short", day: "numeric", year: "numeric" }).format(
    new Date(Date.UTC(y, m - 1, d)),
  );
}

/**
 * A warning in plain words when an order that digs has no locate ticket, or its ticket has no
 * valid-through date, or lapses before the work day; null when there is nothing to warn about.
 */
export function locateWarning(order: LocateInput): string | null {
  if (!order.digs) return null;
  const ticket = order.locateTicket?.trim();
  if (!ticket) return "No locate ticket: this order digs. Get underground utilities located before the work day.";
  if (!order.locateValidThrough) return `Locate ticket ${ticket} has no valid-through date: check it covers ${day(order.workDate)}.`;
  if (order.locateValidThrough < order.workDate)
    return `Locate ticket ${ticket} is valid only through ${day(order.locateValidThrough)}, before the work day ${day(order.workDate)}: ask for a re-mark before digging.`;
  // A multi-day order digs on its last day too (CREW-CHECK.md, Corrections 7: valid through the last day).
  if (order.lastDate && order.lastDate > order.workDate && order.locateValidThrough < order.lastDate)
    return `Locate ticket ${ticket} is valid only through ${day(order.locateValidThrough)}, before the order's last day ${day(order.lastDate)}: ask for a re-mark or an extension before then.`;
  return null;
}

/** A short label for the badge beside the full warning (list rows, board cards). */
export function locateBadgeLabel(order: LocateInput): string | null {
  const w = locateWarning(order);
  if (!w) return null;
  if (!order.locateTicket?.trim()) return "No locate ticket";
  if (!order.locateValidThrough) return "Locate date missing";
  return "Locate lapses";
}
