// The names and plain meanings of the crew rules, as people on the board and in Admin read
// them. The codes (CREW_MIN, …) stay the engine's; screens show these words beside them.

export interface RuleLabel {
  name: string;
  /** What the rule asks for, in one sentence. */
  meaning: string;
  /** When the rule only warns, so that raising it to block changes something. */
  warnsWhen?: string;
}

export const RULE_LABELS: Record<string, RuleLabel> = {
  CREW_MIN: {
    name: "Crew minimum",
    meaning: "Enough qualified workers on site for work on or near energized lines.",
    warnsWhen: "warns instead of blocking for routine switching, live-line tools out of reach, or emergency repair",
  },
  OBSERVER: {
    name: "Observer",
    meaning: "Someone other than the operator or climber watches the clearance from the ground.",
    warnsWhen: "warns for bucket work near energized parts with no one on the ground",
  },
  RESCUE: { name: "Rescue", meaning: "Someone on site besides those aloft is trained in pole-top or aerial rescue." },
  CLIMB_CERT: {
    name: "Climbing qualification",
    meaning: "Everyone who climbs holds a climbing qualification valid on the work day.",
    warnsWhen: "warns while the qualification is inside its warning window",
  },
  FIRST_AID: { name: "First aid", meaning: "Two people trained in first aid and CPR on energized work." },
  QUALIFIED: { name: "Qualified worker", meaning: "Climber and lead seats on energized work hold qualified workers." },
  OPERATOR_CERT: { name: "Operator card", meaning: "Operators and drivers hold the card or licence the truck needs." },
  REST: { name: "Rest", meaning: "Minimum rest between stretches of work, and no stretch longer than the maximum." },
  IN_CHARGE: {
    name: "Person in charge",
    meaning: "An order of two or more people has one in the lead seat, who holds the job briefing.",
    warnsWhen: "blocks under the corrected rules; kept here for policies that raised it earlier",
  },
  DOUBLE_BOOKED: { name: "Double booked", meaning: "One worker on two overlapping orders." },
  UNAVAILABLE: { name: "Unavailable", meaning: "Leave, training or sickness covers part of the order." },
  LOCATE: { name: "Locate ticket", meaning: "An order that digs has a locate ticket valid through its last day." },
  RUBBER_GOODS: {
    name: "Rubber gloves and sleeves",
    meaning: "Climber, bucket and lead seats on energized work have gloves rated for the voltage and in test.",
  },
  EQUIPMENT: { name: "Truck", meaning: "The truck the work needs is on the order; an aerial device near energized parts is insulated and tested." },
  EQUIPMENT_BOOKED: { name: "Truck double booked", meaning: "One truck on two overlapping orders." },
  RIGGING: { name: "Rigging", meaning: "A planned lift stays within the working load limit of the block, the line and each sling leg." },
};

export function ruleName(code: string): string {
  return RULE_LABELS[code]?.name ?? code;
}

/** Rules that can come out at warn, which a policy may raise to block. */
export const RAISABLE_RULES = ["CREW_MIN", "OBSERVER", "CLIMB_CERT", "IN_CHARGE"] as const;

/** The labels of the policy's fields, shared by the form and the route's error messages. */
export const POLICY_FIELD_LABELS = {
  minRestHours: "Minimum rest between stretches (h)",
  maxShiftHours: "Maximum stretch containing an order (h)",
  credentialWarnDays: "Credential warning window (days)",
  regularHoursDay: "Regular hours per day",
  regularHoursWeek: "Regular hours per week",
  replyDeadlineHours: "Flag no reply this many hours before start",
  raisedToBlock: "Raise to block",
} as const;
