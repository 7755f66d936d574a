// The crew rules' shared vocabulary. Everything in lib/rules is pure: no I/O, no clock.
// Times inside a snapshot are epoch milliseconds (already resolved from wall-clock time in
// the snapshot's IANA zone); dates are YYYY-MM-DD in that zone.

import type { Equipment, EquipmentAssignment, GearItem, SiteFields } from "./equipment-types";
export * from "./equipment-types";

export const CLASSIFICATIONS = ["journeyman", "apprentice", "ground_hand", "operator", "crew_lead"] as const;
export type Classification = (typeof CLASSIFICATIONS)[number];

/** `aerial`: the worker aloft in the bucket (CREW-CHECK.md, Corrections 3). */
export const POSITIONS = ["climber", "aerial", "observer", "operator", "ground", "lead", "driver"] as const;
export type Position = (typeof POSITIONS)[number];

export const WORK_TYPES = ["pole_climb", "bucket", "digger_derrick", "patrol", "storm", "other"] as const;
export type WorkType = (typeof WORK_TYPES)[number];

export const EXCEPTIONS = ["routine_switching", "live_line_tools", "emergency"] as const;
export type CrewException = (typeof EXCEPTIONS)[number];

export const RULE_CODES = [
  "CREW_MIN",
  "OBSERVER",
  "RESCUE",
  "CLIMB_CERT",
  "FIRST_AID",
  "QUALIFIED",
  "OPERATOR_CERT",
  "REST",
  "IN_CHARGE",
  "DOUBLE_BOOKED",
  "UNAVAILABLE",
  "RUBBER_GOODS",
  "EQUIPMENT",
  "EQUIPMENT_BOOKED",
  "RIGGING",
  "LOCATE",
] as const;
export type RuleCode = (typeof RULE_CODES)[number];

export type Level = "block" | "warn";

/** Credential codes the rules read. Other codes may exist (e.g. traffic_control) and are ignored. */
export const RULE_CREDENTIALS = [
  "climbing",
  "first_aid_cpr",
  "pole_top_rescue",
  "qualified_electrical",
  "aerial_rescue",
  "equipment_operator",
  "cdl_a",
  "cdl_b",
] as const;

export interface Policy {
  minRestHours: number;
  maxShiftHours: number;
  credentialWarnDays: number;
  /** Organisation may raise a rule's level (warn -> block); lowering is ignored. */
  levels?: Partial<Record<RuleCode, Level>>;
}

export const DEFAULT_POLICY: Policy = { minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30 };

export interface Credential {
  type: string;
  /** Last valid day (YYYY-MM-DD, in the snapshot's zone); null = no expiry. */
  expiresOn: string | null;
}

export interface Interval {
  start: number; // epoch ms
  end: number; // epoch ms, exclusive
}

export interface Unavailability extends Interval {
  reason: string; // leave | training | sickness | …
}

export interface Worker {
  id: string;
  name: string;
  classification: Classification;
  credentials: Credential[];
  unavailable: Unavailability[];
  timeRecords: Interval[];
  /** Rubber gloves and sleeves; absent = gear not tracked for this worker (RUBBER_GOODS skips them). */
  gear?: GearItem[];
}

/** Site fields (altitudeM, phases, systemKv, lift): see equipment-types.ts. */
export interface WorkOrder extends SiteFields {
  id: string;
  title: string;
  start: number; // epoch ms
  end: number; // epoch ms
  /** The order's start date in the snapshot's zone (YYYY-MM-DD): the day credentials must be valid on. */
  startDate: string;
  /** The order's end date in the snapshot's zone (YYYY-MM-DD). */
  endDate: string;
  workType: WorkType;
  energized: boolean;
  /** Nominal voltage in kV; null = unknown, which counts as above 600 V. */
  voltageKv: number | null;
  exception: CrewException | null;
  /** The order's own minimum, counting everyone on site. */
  minCrew: number | null;
  /** Licence class a driver position needs (cdl_a also satisfies cdl_b). Default cdl_b. */
  driverLicence?: "cdl_a" | "cdl_b";
  /**
   * Highest voltage (kV) of exposed energized parts within reach of the work or of its
   * mechanical equipment when the work itself is de-energized; null/absent = none stated.
   */
  nearEnergizedKv?: number | null;
  /** Worked shifts inside a multi-day order (epoch ms): REST counts these instead of the whole span. */
  shifts?: Interval[];
  /** The order disturbs the ground (pole sets, anchors): it needs a locate ticket. */
  digs?: boolean;
  /** The order's one-call locate ticket; validThrough is its last valid day (YYYY-MM-DD). */
  locate?: LocateTicket | null;
}

export interface LocateTicket {
  ticket: string;
  validThrough: string;
}

export interface Assignment {
  workOrderId: string;
  workerId: string;
  position: Position;
}

export interface DaySnapshot {
  timezone: string;
  policy: Policy;
  workers: Worker[];
  workOrders: WorkOrder[];
  assignments: Assignment[];
  /** The day's equipment; absent = equipment not tracked (EQUIPMENT, EQUIPMENT_BOOKED skip). */
  equipment?: Equipment[];
  equipmentAssignments?: EquipmentAssignment[];
}

export interface Finding {
  rule: RuleCode;
  level: Level;
  workOrderId: string;
  workerId: string | null;
  message: string;
  source: string;
  /** The piece of equipment a finding is about (EQUIPMENT, EQUIPMENT_BOOKED); not in the report. */
  equipmentId?: string;
  /** A locked finding can never be overridden. */
  locked?: boolean;
}
