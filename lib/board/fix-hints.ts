// What the dispatcher does about a finding, in plain words, with where to do it. Client-safe.
// The engine's message already says what is wrong and what would satisfy the rule; these add
// the step on this product's screens (issue 14: the board shows LOCATE and the IN_CHARGE block
// with a fix).

export interface FixHint {
  text: string;
  /** A page where the fix is made, for the order the finding is on. */
  link?: { href: (workOrderId: string) => string; label: string };
}

const orderPage = (id: string) => `/orders/${encodeURIComponent(id)}`;

export const FIX_HINTS: Partial<Record<string, FixHint>> = {
  LOCATE: {
    text: "Call the one-call center for a new or extended ticket that covers every day of digging, then record its number and valid-through date on the order. Nobody digs until then.",
    link: { href: orderPage, label: "Update the locate ticket" },
  },
  IN_CHARGE: {
    text: "Put a journeyman or crew lead in the Lead seat (they may also hold one other seat). If the order has no Lead seat, add one on the order.",
    link: { href: orderPage, label: "Open the order's positions" },
  },
  RESCUE: {
    text: "Whoever is In the bucket or climbing cannot rescue themselves: seat someone on the ground who holds the rescue training.",
  },
  OBSERVER: {
    text: "Seat an observer on the ground who is not the operator or a climber, and who watches the whole lift or climb.",
  },
  CREW_MIN: {
    text: "Add qualified workers: journeymen, crew leads, apprentices with a journeyman on the order, or operators who hold the qualified-electrical credential.",
  },
};

export function fixHint(rule: string): FixHint | null {
  return FIX_HINTS[rule] ?? null;
}
