// Work-order shapes passed from server pages and routes to the client. Plain JSON only.
import type { Position } from "@/lib/rules/types";
import type { OrderStatus } from "./status";

export interface OrderSeat {
  id: number;
  position: Position;
  sort: number;
  /** The live assignment holding this seat, if any. */
  worker: { id: number; name: string; status: string } | null;
}

export interface SeriesView {
  id: number;
  rrule: string;
  description: string;
  dtstartLocal: string;
  durationMinutes: number;
  exdates: string[];
  active: boolean;
  version: number;
  materialisedThrough: string | null;
}

export interface OrderListItem {
  id: number;
  number: string;
  title: string;
  yardId: number;
  yardCode: string;
  timezone: string;
  workTypeId: number;
  workTypeName: string;
  digs: boolean;
  address: string | null;
  structureNo: string | null;
  start: string; // ISO instant
  end: string;
  startLocal: string; // YYYY-MM-DDTHH:mm in the yard's zone
  endLocal: string;
  workDate: string;
  /** The order's last day in the yard's zone (its work date unless it runs past midnight). */
  lastDate: string;
  status: OrderStatus;
  holdReason: string | null;
  priority: number;
  emergency: boolean;
  energized: boolean;
  voltageKv: number | null;
  /** Highest voltage of energized parts within reach when the work is de-energized (kV). */
  nearEnergizedKv: number | null;
  /** 1: a single-phase tap (voltageKv is to ground); 3 otherwise. */
  phases: 1 | 3;
  /** A single-phase tap's system voltage, phase to phase (kV). */
  systemKv: number | null;
  /** The site's elevation (m) when it overrides the yard's; null = the yard's (issue 16). */
  altitudeM: number | null;
  locateTicket: string | null;
  locateValidThrough: string | null;
  locateWarning: string | null;
  seriesId: number | null;
  positions: number;
  staffed: number;
  version: number;
}

export interface OrderView extends OrderListItem {
  yardName: string;
  workTypeCode: string;
  ruleType: string;
  crewException: string | null;
  minCrew: number | null;
  driverLicence: "cdl_a" | "cdl_b" | null;
  notes: string | null;
  briefingState: string;
  actualStartLocal: string | null;
  actualEndLocal: string | null;
  occurrenceDate: string | null;
  detached: boolean;
  seats: OrderSeat[];
  series: SeriesView | null;
  timeRecords: { id: number; workerId: number; workerName: string; startLocal: string; endLocal: string; hours: number }[];
  /** A multi-day order's worked shifts, wall clock in the yard's zone. */
  shifts: { startLocal: string; endLocal: string }[];
}

export interface WorkTypeView {
  id: number;
  code: string;
  name: string;
  ruleType: string;
  minCrew: number;
  digs: boolean;
  positions: Position[];
}
