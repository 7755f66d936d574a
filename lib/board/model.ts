// The board's payload, shared by the route handler and the client. Plain JSON only.
import type { DaySnapshot, Finding, Position } from "@/lib/rules/types";
import type { Equipment } from "@/lib/equipment/model";

export interface EquipmentBooking {
  id: number;
  workOrderId: number;
  equipmentId: number;
  version: number;
}

export type AssignmentStatus = "draft" | "sent" | "delivered" | "confirmed" | "declined" | "removed";

export interface SeatAssignment {
  id: number;
  workerId: number;
  status: AssignmentStatus;
  version: number;
  replyCode: string;
  sentAt: string | null;
  respondedAt: string | null;
  /** Sent, no answer, and the reply deadline before the start has passed: call them. */
  noReply: boolean;
}

export interface Seat {
  id: number; // position id
  position: Position;
  sort: number;
  assignment: SeatAssignment | null;
  /** The last decline on this seat, when the seat is open again because of it. */
  declinedBy: { workerId: number; name: string; reason: string | null; at: string | null } | null;
}

export interface OrderCard {
  id: number;
  number: string;
  title: string;
  workTypeCode: string;
  workTypeName: string;
  ruleType: string;
  address: string | null;
  structureNo: string | null;
  start: string; // ISO instant
  end: string;
  energized: boolean;
  voltageKv: number | null;
  /** Issue 14: 1 for a single-phase tap (voltageKv to ground), its system voltage, and live parts nearby. */
  phases?: number;
  systemKv?: number | null;
  nearEnergizedKv?: number | null;
  /** A multi-day order's worked shifts (ISO instants). */
  shifts?: { start: string; end: string }[];
  emergency: boolean;
  crewException: string | null;
  minCrew: number | null;
  priority: number;
  status: string;
  holdReason: string | null;
  briefingState: string;
  locateTicket: string | null;
  locateValidThrough: string | null;
  digs: boolean;
  /** Underground-locate warning for orders that dig (missing ticket, lapses before the day). */
  locateWarning: string | null;
  version: number;
  crewHash: string;
  seats: Seat[];
}

export interface PoolWorker {
  id: number;
  name: string;
  employeeNo: string;
  classification: string;
  yardId: number;
  yardCode: string;
  phone: string | null;
  /** Hours of rest before the day's first start, from the last worked time; null = none recorded. */
  restHours: number | null;
  lastWorkedEnd: string | null;
  unavailableReason: string | null;
  onCallTonight: boolean;
}

export interface OverrideView {
  id: number;
  workOrderId: number;
  rule: string;
  workerId: number | null;
  reason: string;
  actorName: string;
  createdAt: string;
  /** Still valid: given for the crew the order has now. */
  valid: boolean;
}

export interface BoardPayload {
  day: string;
  yard: { id: number; code: string; name: string; timezone: string };
  yards: { id: number; code: string; name: string }[];
  orders: OrderCard[];
  pool: PoolWorker[];
  /** What the client's rule engine needs (worker and order ids are strings of the numeric ids). */
  snapshot: DaySnapshot;
  /** The orders of this yard and day (ids as strings): findings are shown for these only. */
  boardOrderIds: string[];
  findings: Finding[];
  overrides: OverrideView[];
  /** On call the night before this day, per rotation. */
  onCall: { rotationName: string; workerId: number; workerName: string; from: string; to: string }[];
  policy: { minRestHours: number; maxShiftHours: number; credentialWarnDays: number; replyDeadlineHours: number };
  cursor: number;
  /** Equipment (issue 16): the organisation's trucks and trailers, and the bookings on this board's orders. */
  equipment?: Equipment[];
  equipmentBookings?: EquipmentBooking[];
  /** Issue 18: pool workers held on other yards' orders that day (shown as placed there). */
  placedElsewhere?: PlacedElsewhere[];
  fakesEnabled: boolean;
  generatedAt: string;
}

/** A worker held on another yard's order that overlaps the board's day. */
export interface PlacedElsewhere {
  workerId: number;
  orderId: number;
  number: string;
  yardCode: string;
  yardName: string;
  start: string;
  end: string;
}

export const findingKey = (f: { rule: string; workOrderId: string | number; workerId: string | number | null }) =>
  `${f.rule}|${f.workOrderId}|${f.workerId ?? ""}`;
