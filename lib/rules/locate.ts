// LOCATE (block, Corrections 7): an order that digs (pole sets, anchors) needs a one-call locate
// ticket valid through the order's last day. How long a ticket lives is set by each state's
// one-call (dig-safe) law, so the rule reads the ticket's own validThrough and quotes no number.

import { dateWords, finding, type RuleCheck } from "./common";
import type { Finding } from "./types";

export const LOCATE_SOURCE =
  "the state's one-call (dig-safe) law, which sets how long a locate ticket stays valid; check the ticket's own dates";

export const locate: RuleCheck = (orders, ix) => {
  const out: Finding[] = [];
  for (const order of orders) {
    if (!order.digs) continue;
    const last = ix.lastDay(order);
    const ticket = order.locate;
    if (!ticket) {
      out.push(
        finding(
          "LOCATE",
          "block",
          order,
          null,
          "This order digs and has no locate ticket. Call the one-call center for a locate before anyone digs, and enter the ticket.",
          LOCATE_SOURCE,
        ),
      );
    } else if (ticket.validThrough < last) {
      out.push(
        finding(
          "LOCATE",
          "block",
          order,
          null,
          `Locate ticket ${ticket.ticket} is valid through ${dateWords(ticket.validThrough)}, before the order's last day, ${dateWords(last)}. ` +
            "Renew or extend the ticket with the one-call center before digging on the later days.",
          LOCATE_SOURCE,
        ),
      );
    }
  }
  return out;
};
