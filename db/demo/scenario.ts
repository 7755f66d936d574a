// The demo scenario's static data: one invented cooperative, two yards, ~40 invented workers
// and tomorrow's work orders. Every name, number, address and pole number is fiction.
// Dates are not here: db/seeds/01_demo.ts resolves them against "tomorrow" in each yard's zone.

export type YardCode = "NOR" | "MES";
export type Classification = "journeyman" | "apprentice" | "ground_hand" | "operator" | "crew_lead";
export type PositionName = "climber" | "aerial" | "observer" | "operator" | "ground" | "lead" | "driver";
export type QualCode =
  | "climbing"
  | "first_aid_cpr"
  | "pole_top_rescue"
  | "aerial_rescue"
  | "equipment_operator"
  | "cdl_a"
  | "cdl_b"
  | "traffic_control"
  | "qualified_electrical";

export const ORGANISATION = {
  name: "Cedar Prairie Electric Cooperative",
  slug: "cedar-prairie",
  dispatcherPhone: "+13205550190",
};

export const YARDS: { code: YardCode; name: string; timezone: string; address: string; dispatcherPhone: string }[] = [
  {
    code: "NOR",
    name: "North Yard",
    timezone: "America/Chicago",
    address: "2200 Lineyard Road, Cedar Prairie",
    dispatcherPhone: "+13205550191",
  },
  {
    code: "MES",
    name: "Mesa Yard",
    timezone: "America/Denver",
    address: "75 Caprock Service Drive, Quillan Mesa",
    dispatcherPhone: "+15055550192",
  },
];

export const QUALIFICATION_TYPES: {
  code: QualCode;
  name: string;
  renewalMonths: number | null;
  warnDays: number;
  needsEvidence: boolean;
}[] = [
  { code: "climbing", name: "Climbing evaluation", renewalMonths: 12, warnDays: 30, needsEvidence: true },
  { code: "first_aid_cpr", name: "First aid / CPR", renewalMonths: 24, warnDays: 30, needsEvidence: true },
  { code: "pole_top_rescue", name: "Pole-top rescue", renewalMonths: 12, warnDays: 30, needsEvidence: false },
  { code: "aerial_rescue", name: "Aerial-lift rescue", renewalMonths: 12, warnDays: 30, needsEvidence: false },
  { code: "equipment_operator", name: "Equipment operator", renewalMonths: 36, warnDays: 30, needsEvidence: true },
  { code: "cdl_a", name: "CDL class A", renewalMonths: 48, warnDays: 60, needsEvidence: true },
  { code: "cdl_b", name: "CDL class B", renewalMonths: 48, warnDays: 60, needsEvidence: true },
  { code: "traffic_control", name: "Traffic control / flagger", renewalMonths: 36, warnDays: 30, needsEvidence: false },
  // An equipment operator counts toward the two-worker minimum only when the employer has
  // trained and designated them a qualified electrical worker (OSHA letter of 1994-11-08;
  // ../shared/CREW-CHECK.md, Corrections 1). Journeymen and crew leads are qualified by their
  // classification. The 36-month re-check is this cooperative's policy.
  { code: "qualified_electrical", name: "Qualified electrical worker", renewalMonths: 36, warnDays: 30, needsEvidence: true },
];

export const WORK_TYPES: {
  code: string;
  name: string;
  ruleType: "pole_climb" | "bucket" | "digger_derrick" | "patrol" | "storm" | "other";
  minCrew: number;
  digs: boolean;
  positions: PositionName[];
}[] = [
  { code: "pole_climb", name: "Climbing transformer change-out", ruleType: "pole_climb", minCrew: 3, digs: false, positions: ["climber", "observer", "ground", "lead"] },
  { code: "pole_set", name: "Pole set with digger derrick", ruleType: "digger_derrick", minCrew: 4, digs: true, positions: ["operator", "observer", "ground", "lead"] },
  // Bucket work: one aloft in the bucket, one on the ground who can bring the bucket down
  // (lower controls) and watch the clearance, and the lead.
  { code: "bucket", name: "Bucket truck work", ruleType: "bucket", minCrew: 3, digs: false, positions: ["lead", "aerial", "ground"] },
  { code: "patrol", name: "Line patrol", ruleType: "patrol", minCrew: 1, digs: false, positions: ["lead"] },
  { code: "storm", name: "Storm restoration / trouble", ruleType: "storm", minCrew: 3, digs: false, positions: ["lead", "aerial", "ground"] },
  { code: "anchor", name: "Anchor and guy install", ruleType: "digger_derrick", minCrew: 3, digs: true, positions: ["operator", "observer", "lead"] },
  // Changing out a pole: the derrick sets the new pole beside the old, a lineworker on the new
  // pole transfers the conductors and hardware, then the old pole comes out.
  {
    code: "pole_changeout",
    name: "Pole change-out (transfer conductors)",
    ruleType: "digger_derrick",
    minCrew: 5,
    digs: true,
    positions: ["lead", "operator", "observer", "climber", "ground"],
  },
];

/** What each classification normally holds. Ground hands add `extra` per worker. */
export const STANDARD_CREDENTIALS: Record<Classification, QualCode[]> = {
  crew_lead: ["climbing", "first_aid_cpr", "pole_top_rescue", "aerial_rescue", "cdl_b"],
  journeyman: ["climbing", "first_aid_cpr", "pole_top_rescue", "aerial_rescue", "cdl_b"],
  operator: ["equipment_operator", "cdl_a", "first_aid_cpr"],
  apprentice: ["climbing", "first_aid_cpr"],
  ground_hand: ["first_aid_cpr", "traffic_control"],
};

export interface DemoWorker {
  no: string;
  first: string;
  last: string;
  yard: YardCode;
  cls: Classification;
  noPhone?: boolean;
  noEmail?: boolean;
  smsOptOut?: boolean;
  /** Credentials beyond the classification's standard set. */
  extra?: QualCode[];
  /** One-line reason this worker is interesting in the scenario. */
  role?: string;
}

export const WORKERS: DemoWorker[] = [
  // North Yard (America/Chicago): 24
  { no: "CP-1001", first: "Marcus", last: "Whitfield", yard: "NOR", cls: "crew_lead", role: "lineworker sign-in; leads WO-26-0101" },
  { no: "CP-1002", first: "Renata", last: "Okafor", yard: "NOR", cls: "crew_lead", role: "leads WO-26-0103" },
  { no: "CP-1003", first: "Tomas", last: "Lindqvist", yard: "NOR", cls: "crew_lead", role: "rested, fully qualified, unassigned" },
  { no: "CP-1004", first: "Shauna", last: "McReady", yard: "NOR", cls: "crew_lead", role: "patrols WO-26-0106" },
  { no: "CP-1005", first: "Lyle", last: "Kowalczyk", yard: "NOR", cls: "journeyman", role: "climbing lapsed ~6 weeks ago" },
  { no: "CP-1006", first: "Brent", last: "Haugland", yard: "NOR", cls: "journeyman", role: "climbing lapsed ~10 days ago" },
  { no: "CP-1007", first: "Jesse", last: "Navarro", yard: "NOR", cls: "journeyman", role: "rested, fully qualified, unassigned" },
  { no: "CP-1008", first: "Priya", last: "Raman", yard: "NOR", cls: "journeyman", role: "climbs WO-26-0101; renewed climbing (history row)" },
  { no: "CP-1009", first: "Owen", last: "Tillman", yard: "NOR", cls: "journeyman", role: "short of rest: long shift + on-call call-out" },
  { no: "CP-1010", first: "Curtis", last: "Fairbanks", yard: "NOR", cls: "journeyman", role: "short of rest: overnight call-out" },
  { no: "CP-1011", first: "Noah", last: "Feldkamp", yard: "NOR", cls: "journeyman", role: "on approved leave tomorrow" },
  { no: "CP-1012", first: "Andre", last: "Beauchamp", yard: "NOR", cls: "journeyman", role: "climbing lapses within the warning window" },
  { no: "CP-1013", first: "Kayla", last: "Sorensen", yard: "NOR", cls: "apprentice", extra: ["pole_top_rescue"], role: "observes WO-26-0101; holds pole-top rescue" },
  { no: "CP-1014", first: "Mateo", last: "Quintana", yard: "NOR", cls: "apprentice" },
  { no: "CP-1015", first: "Tyler", last: "Nakamura", yard: "NOR", cls: "apprentice", noPhone: true, role: "no phone on file" },
  { no: "CP-1016", first: "Bethany", last: "Greer", yard: "NOR", cls: "apprentice", role: "first aid / CPR lapsed" },
  { no: "CP-1017", first: "Roy", last: "Delacroix", yard: "NOR", cls: "operator", extra: ["qualified_electrical"], role: "operates WO-26-0103; a qualified electrical worker" },
  { no: "CP-1018", first: "Gus", last: "Halvorsen", yard: "NOR", cls: "operator", role: "leave requested next week (pending)" },
  { no: "CP-1019", first: "Denise", last: "Abernathy", yard: "NOR", cls: "operator", role: "operator only: not a qualified electrical worker" },
  { no: "CP-1020", first: "Wendell", last: "Pike", yard: "NOR", cls: "operator", extra: ["qualified_electrical"], role: "CDL class A lapses soon; a qualified electrical worker" },
  { no: "CP-1021", first: "Luis", last: "Carrasco", yard: "NOR", cls: "ground_hand", extra: ["cdl_b", "aerial_rescue"], role: "ground on WO-26-0101" },
  { no: "CP-1022", first: "Jamal", last: "Whitaker", yard: "NOR", cls: "ground_hand", smsOptOut: true, extra: ["aerial_rescue"], role: "opted out of texts" },
  { no: "CP-1023", first: "Cody", last: "Brandvold", yard: "NOR", cls: "ground_hand", noEmail: true, extra: ["cdl_b"], role: "no e-mail on file" },
  { no: "CP-1024", first: "Hannah", last: "Voss", yard: "NOR", cls: "ground_hand", role: "first aid / CPR lapses soon" },

  // Mesa Yard (America/Denver): 16
  { no: "CP-2001", first: "Harlan", last: "Begay", yard: "MES", cls: "crew_lead", role: "leads WO-26-0109" },
  { no: "CP-2002", first: "Rosalind", last: "Tafoya", yard: "MES", cls: "crew_lead", role: "rested, fully qualified, unassigned" },
  { no: "CP-2003", first: "Everett", last: "Crane", yard: "MES", cls: "crew_lead", role: "leads WO-26-0111" },
  { no: "CP-2004", first: "Ignacio", last: "Montoya", yard: "MES", cls: "journeyman", role: "climbs WO-26-0109" },
  { no: "CP-2005", first: "Wade", last: "Sutter", yard: "MES", cls: "journeyman", role: "training the day after tomorrow" },
  { no: "CP-2006", first: "Leah", last: "Yazzie", yard: "MES", cls: "journeyman", role: "pole-top rescue lapses soon" },
  { no: "CP-2007", first: "Darnell", last: "Fisk", yard: "MES", cls: "journeyman", role: "first aid / CPR lapses soon" },
  { no: "CP-2008", first: "Colby", last: "Arnett", yard: "MES", cls: "journeyman", role: "1-hour call-out overnight, still rested; patrols WO-26-0112" },
  { no: "CP-2009", first: "Sierra", last: "Lujan", yard: "MES", cls: "apprentice", extra: ["pole_top_rescue"], role: "observes WO-26-0109; holds pole-top rescue" },
  { no: "CP-2010", first: "Dominic", last: "Pruett", yard: "MES", cls: "apprentice" },
  { no: "CP-2011", first: "Ava", last: "Castellano", yard: "MES", cls: "apprentice" },
  { no: "CP-2012", first: "Travis", last: "Enright", yard: "MES", cls: "operator", extra: ["qualified_electrical"], role: "a qualified electrical worker" },
  { no: "CP-2013", first: "Marisol", last: "Vigil", yard: "MES", cls: "operator", smsOptOut: true, role: "opted out of texts; operator only" },
  { no: "CP-2014", first: "Eli", last: "Westbrook", yard: "MES", cls: "ground_hand", extra: ["aerial_rescue", "cdl_b"], role: "ground on WO-26-0109" },
  { no: "CP-2015", first: "Ruben", last: "Archuleta", yard: "MES", cls: "ground_hand", noEmail: true, extra: ["cdl_b", "aerial_rescue"], role: "ground on WO-26-0113" },
  { no: "CP-2016", first: "Jada", last: "Holloway", yard: "MES", cls: "ground_hand", noPhone: true, role: "no phone; traffic control lapsed" },
];

/**
 * Credentials that differ from the ordinary "valid for months yet". `expiresIn` is the last
 * valid day counted in days from tomorrow in the worker's yard (negative: lapsed before tomorrow).
 * `renewedDaysAgo` writes a superseded older row plus a current renewal issued that many days ago.
 */
export const CREDENTIAL_CASES: { no: string; code: QualCode; expiresIn?: number; renewedDaysAgo?: number }[] = [
  { no: "CP-1005", code: "climbing", expiresIn: -43 }, // Lyle Kowalczyk: lapsed
  { no: "CP-1006", code: "climbing", expiresIn: -10 }, // Brent Haugland: lapsed
  { no: "CP-1012", code: "climbing", expiresIn: 12 }, // Andre Beauchamp: warn window
  { no: "CP-1016", code: "first_aid_cpr", expiresIn: -4 }, // Bethany Greer: lapsed
  { no: "CP-1020", code: "cdl_a", expiresIn: 21 }, // Wendell Pike: CDL warn (60 days)
  { no: "CP-1024", code: "first_aid_cpr", expiresIn: 25 }, // Hannah Voss
  { no: "CP-2006", code: "pole_top_rescue", expiresIn: 18 }, // Leah Yazzie
  { no: "CP-2007", code: "first_aid_cpr", expiresIn: 8 }, // Darnell Fisk
  { no: "CP-2016", code: "traffic_control", expiresIn: -30 }, // Jada Holloway
  { no: "CP-1008", code: "climbing", renewedDaysAgo: 35 }, // Priya Raman: history
  { no: "CP-1001", code: "first_aid_cpr", renewedDaysAgo: 120 }, // Marcus Whitfield: history
];

export interface DemoOrder {
  number: string;
  yard: YardCode;
  workType: string;
  title: string;
  address: string;
  structureNo: string | null;
  start: string; // HH:mm on the start day, yard-local
  end: string; // HH:mm on the end day (the start day, or the next when it is earlier), yard-local
  /** The start day in days from tomorrow: -1 is today (tonight's trouble call). Default 0. */
  dayOffset?: number;
  /** The end day in days after the start day, for multi-day orders. */
  endDayOffset?: number;
  /** A multi-day order's shifts: day in days after the start day, wall clock in the yard's zone. */
  shifts?: { day: number; start: string; end: string }[];
  /** Voltage of the work: phase to phase, or to ground for a single-phase tap (`phases: 1`). */
  voltageKv: number;
  /** 1 for a single-phase tap off a wye feeder; its system voltage (phase to phase) in systemKv. */
  phases?: 1 | 3;
  systemKv?: number;
  /** De-energized work beside live parts: their voltage (CREW-CHECK.md, Corrections 2). */
  nearEnergizedKv?: number;
  /** Positions when they differ from the work type's crew template. */
  positions?: PositionName[];
  priority: number;
  energized?: boolean;
  emergency?: boolean;
  crewException?: "routine_switching" | "live_line_tools" | "emergency";
  /** Last valid day of the locate ticket, in days from tomorrow (negative or -1: lapsed). */
  locate?: { ticket: string; validThroughIn: number };
  notes?: string;
  /** Pre-placed draft assignments: position → employee number. */
  crew?: Partial<Record<PositionName, string>>;
}

export const ORDERS: DemoOrder[] = [
  // North Yard
  {
    number: "WO-26-0101", yard: "NOR", workType: "pole_climb",
    title: "Change out 25 kVA transformer, pole N-1187",
    address: "1187 Bluestem Road, Cedar Prairie", structureNo: "N-1187",
    start: "07:00", end: "15:30", voltageKv: 12.47, priority: 2,
    notes: "Overloaded pot; members notified of a 2-hour outage 09:00–11:00.",
    crew: { climber: "CP-1008", observer: "CP-1013", ground: "CP-1021", lead: "CP-1001" },
  },
  {
    number: "WO-26-0102", yard: "NOR", workType: "pole_climb",
    title: "Change out 50 kVA transformer, pole N-2204",
    address: "640 Harrow Flats Lane, Cedar Prairie", structureNo: "N-2204",
    start: "07:00", end: "15:30", voltageKv: 7.2, phases: 1, systemKv: 12.47, priority: 3,
    notes: "Back-lot pole, no truck access — climb only.",
  },
  {
    number: "WO-26-0103", yard: "NOR", workType: "pole_changeout",
    title: "Change out rejected pole N-0931 with 45 ft class 3",
    address: "County Road 14 at Millrace Creek", structureNo: "N-0931",
    start: "07:00", end: "15:30", voltageKv: 12.47, priority: 2,
    locate: { ticket: "LT-4471-2093", validThroughIn: 6 },
    notes: "Pole failed sound test and dig at the ground line last week. Set the new pole alongside, transfer the three-phase conductors and the crossarm, then pull the old pole.",
    crew: { operator: "CP-1017", lead: "CP-1002" },
  },
  {
    number: "WO-26-0104", yard: "NOR", workType: "pole_set",
    title: "Set 40 ft pole for new service, N-3310",
    address: "3310 Sorghum Mill Road, Cedar Prairie", structureNo: "N-3310",
    start: "08:00", end: "14:30", voltageKv: 7.2, phases: 1, systemKv: 12.47, priority: 4,
    locate: { ticket: "LT-4468-1157", validThroughIn: -1 },
    notes: "Locate ticket runs out today — request a re-mark before digging.",
  },
  {
    number: "WO-26-0105", yard: "NOR", workType: "bucket",
    title: "Replace crossarm and insulators, pole N-1452",
    address: "1452 Dunmore Ridge Road, Cedar Prairie", structureNo: "N-1452",
    start: "08:00", end: "14:00", voltageKv: 12.47, priority: 3,
  },
  {
    number: "WO-26-0106", yard: "NOR", workType: "patrol",
    title: "Feeder 3 line patrol, Cedar Prairie substation to N-3900",
    address: "Cedar Prairie substation, 90 Relay Road", structureNo: null,
    start: "07:30", end: "15:30", voltageKv: 24.9, priority: 4,
    notes: "Visual patrol after last week's wind; note leaning poles and broken ties.",
    crew: { lead: "CP-1004" },
  },
  {
    // Tonight's trouble call, not tomorrow's planned work: it starts this evening.
    number: "WO-26-0107", yard: "NOR", workType: "storm",
    title: "Trouble call: conductor down on Feeder 4 near N-4420",
    address: "Route 9 at Tallgrass Crossing", structureNo: "N-4420",
    dayOffset: -1, start: "19:00", end: "03:00", voltageKv: 12.47, priority: 1,
    emergency: true, crewException: "emergency",
    notes: "Called in this evening: broken crossarm, one phase on the ground across the ditch; sheriff's deputy holding the scene. Treat the wire as energized until it is isolated, tested and grounded; make safe, then repair.",
  },
  {
    number: "WO-26-0108", yard: "NOR", workType: "anchor",
    title: "Install anchor and down guy, pole N-2766",
    address: "2766 Prairie Dog Town Road, Cedar Prairie", structureNo: "N-2766",
    start: "09:00", end: "15:00", voltageKv: 12.47, priority: 3,
    locate: { ticket: "LT-4475-0388", validThroughIn: 9 },
  },

  // Mesa Yard
  {
    number: "WO-26-0109", yard: "MES", workType: "pole_climb",
    title: "Change out 15 kVA transformer, pole M-0412",
    address: "412 Juniper Wash Road, Quillan Mesa", structureNo: "M-0412",
    start: "07:00", end: "15:30", voltageKv: 7.2, phases: 1, systemKv: 12.47, priority: 2,
    crew: { climber: "CP-2004", observer: "CP-2009", ground: "CP-2014", lead: "CP-2001" },
  },
  {
    number: "WO-26-0110", yard: "MES", workType: "pole_changeout",
    title: "Change out woodpecker-damaged pole M-0588 with a 45 ft pole",
    address: "588 Caprock Canyon Road, Quillan Mesa", structureNo: "M-0588",
    start: "07:00", end: "15:30", voltageKv: 24.9, priority: 3,
    locate: { ticket: "LT-8812-5540", validThroughIn: 4 },
  },
  {
    number: "WO-26-0111", yard: "MES", workType: "bucket",
    title: "Replace cutout and lightning arrester, pole M-0733",
    address: "733 Piñon Flats Road, Quillan Mesa", structureNo: "M-0733",
    start: "08:00", end: "12:00", voltageKv: 12.47, priority: 3,
    crew: { lead: "CP-2003" },
  },
  {
    number: "WO-26-0112", yard: "MES", workType: "patrol",
    title: "Feeder 7 line patrol, Redrock tap to M-1250",
    address: "Redrock tap, Mesa Loop Road", structureNo: null,
    start: "07:00", end: "15:00", voltageKv: 24.9, priority: 5,
    crew: { lead: "CP-2008" },
  },
  {
    // A multi-day order with its shifts: the rest rule counts the shifts, not the whole span.
    // Feeder 5's circuit stays energized on the same poles, so the crew works beside live parts.
    number: "WO-26-0113", yard: "MES", workType: "bucket",
    title: "Reconductor Feeder 7 from M-1300 to M-1324 (1/0 ACSR to 336 AAC)",
    address: "Mesa Loop Road, M-1300 to M-1324", structureNo: "M-1300",
    start: "07:00", end: "17:30", endDayOffset: 2, voltageKv: 24.9, energized: false, nearEnergizedKv: 24.9, priority: 3,
    shifts: [
      { day: 0, start: "07:00", end: "17:30" },
      { day: 1, start: "07:00", end: "17:30" },
      { day: 2, start: "07:00", end: "17:30" },
    ],
    notes: "Feeder 7 section isolated, tested and grounded each morning; the Feeder 5 circuit on the same poles stays energized. Three days.",
    crew: { lead: "CP-2007", aerial: "CP-2006", ground: "CP-2015" },
  },
  {
    // Two days of digging whose locate ticket runs out after the first: LOCATE blocks.
    number: "WO-26-0114", yard: "NOR", workType: "pole_set",
    title: "Line extension: set three poles for the Hollis Draw lots, N-3401 to N-3403",
    address: "Hollis Draw Road, Cedar Prairie", structureNo: "N-3401",
    start: "07:00", end: "15:30", endDayOffset: 1, voltageKv: 7.2, phases: 1, systemKv: 12.47, priority: 4,
    shifts: [
      { day: 0, start: "07:00", end: "15:30" },
      { day: 1, start: "07:00", end: "15:30" },
    ],
    locate: { ticket: "LT-4480-2210", validThroughIn: 0 },
    notes: "New single-phase tap for three lots. The locate ticket covers the first day only: ask for an extension before the second.",
  },
];

/** On-call rotations: members in sort order; the last member is on call this week. */
export const ROTATIONS: { yard: YardCode; name: string; members: string[] }[] = [
  { yard: "NOR", name: "North on-call", members: ["CP-1010", "CP-1007", "CP-1012", "CP-1009"] },
  { yard: "MES", name: "Mesa on-call", members: ["CP-2005", "CP-2007", "CP-2006", "CP-2008"] },
];

/**
 * Handy references for tests (look workers up by employee_no, orders by number; ids are also
 * deterministic after a fresh seed: workers 1–40 in WORKERS order, orders 1–12 in ORDERS order).
 */
export const DEMO_FIXTURES = {
  organisationSlug: "cedar-prairie",
  yards: { north: "NOR", mesa: "MES" },
  lineworker: "CP-1001", // Marcus Whitfield, crew lead, lead on WO-26-0101
  restedNorthJourneyman: "CP-1007", // Jesse Navarro: valid climbing, rested, unassigned
  restedNorthCrewLead: "CP-1003", // Tomas Lindqvist: rested, unassigned
  restedNorthApprentice: "CP-1014", // Mateo Quintana
  restedNorthOperator: "CP-1019", // Denise Abernathy
  restedNorthGroundHand: "CP-1023", // Cody Brandvold (no e-mail)
  restedMesaCrewLead: "CP-2002", // Rosalind Tafoya
  lapsedClimbersNorth: ["CP-1005", "CP-1006"], // Lyle Kowalczyk, Brent Haugland
  climbingInWarnWindow: "CP-1012", // Andre Beauchamp
  shortOfRestNorth: ["CP-1009", "CP-1010"], // Owen Tillman, Curtis Fairbanks
  callOutButRested: "CP-2008", // Colby Arnett
  onLeaveTomorrow: "CP-1011", // Noah Feldkamp
  leaveRequestedNextWeek: "CP-1018", // Gus Halvorsen
  orders: {
    fullyCrewedNorthClimb: "WO-26-0101",
    openNorthClimb: "WO-26-0102",
    partialNorthPoleSet: "WO-26-0103",
    lapsedLocate: "WO-26-0104",
    openNorthBucket: "WO-26-0105",
    northPatrol: "WO-26-0106",
    emergencyStorm: "WO-26-0107",
    openNorthAnchor: "WO-26-0108",
    fullyCrewedMesaClimb: "WO-26-0109",
    openMesaPoleSet: "WO-26-0110",
    partialMesaBucket: "WO-26-0111",
    mesaPatrol: "WO-26-0112",
    multiDayReconductor: "WO-26-0113",
    locateLapsesBeforeLastDay: "WO-26-0114",
  },
} as const;
