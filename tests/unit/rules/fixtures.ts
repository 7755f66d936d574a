// Builders for small rule scenarios. Times are wall-clock in TZ unless they carry an offset.

import type { RuleCheck } from "@/lib/rules/common";
import { SnapshotIndex } from "@/lib/rules/snapshot-index";
import { epochToZonedDate, zonedWallTimeToEpoch } from "@/lib/rules/time";
import {
  DEFAULT_POLICY,
  type Assignment,
  type Classification,
  type DaySnapshot,
  type Finding,
  type Policy,
  type Position,
  type Worker,
  type WorkOrder,
} from "@/lib/rules/types";

export const TZ = "America/Chicago";
export const DAY = "2027-04-06";

/** Every credential the rules read, valid well past DAY. */
export const ALL_CREDS: Record<string, string | null> = {
  climbing: "2028-03-31",
  first_aid_cpr: "2028-03-31",
  pole_top_rescue: "2028-03-31",
  aerial_rescue: "2028-03-31",
  equipment_operator: "2028-03-31",
  cdl_a: "2028-03-31",
  cdl_b: "2028-03-31",
};

export const t = (local: string, tz = TZ) => zonedWallTimeToEpoch(local, tz);

export interface WorkerOpts {
  name?: string;
  credentials?: Record<string, string | null>;
  unavailable?: Array<[from: string, to: string, reason: string]>;
  timeRecords?: Array<[start: string, end: string]>;
  tz?: string;
}

export function worker(id: string, classification: Classification, opts: WorkerOpts = {}): Worker {
  const tz = opts.tz ?? TZ;
  return {
    id,
    name: opts.name ?? `Worker ${id}`,
    classification,
    credentials: Object.entries(opts.credentials ?? ALL_CREDS).map(([type, expiresOn]) => ({ type, expiresOn })),
    unavailable: (opts.unavailable ?? []).map(([from, to, reason]) => ({ start: t(from, tz), end: t(to, tz), reason })),
    timeRecords: (opts.timeRecords ?? []).map(([start, end]) => ({ start: t(start, tz), end: t(end, tz) })),
  };
}

export type OrderOpts = Partial<Omit<WorkOrder, "start" | "end" | "startDate" | "endDate">> & {
  start?: string;
  end?: string;
  tz?: string;
};

export function order(id: string, opts: OrderOpts = {}): WorkOrder {
  const { start: s = `${DAY}T07:00`, end: e = `${DAY}T15:30`, tz = TZ, ...rest } = opts;
  const start = t(s, tz);
  const end = t(e, tz);
  return {
    id,
    title: `Order ${id}`,
    start,
    end,
    startDate: epochToZonedDate(start, tz),
    endDate: epochToZonedDate(end, tz),
    workType: "pole_climb",
    energized: true,
    voltageKv: 12.47,
    exception: null,
    minCrew: null,
    ...rest,
  };
}

export type A = [workOrderId: string, workerId: string, position: Position];

export function day(
  workers: Worker[],
  orders: WorkOrder[],
  assignments: A[],
  policy: Partial<Policy> = {},
  tz = TZ,
): DaySnapshot {
  return {
    timezone: tz,
    policy: { ...DEFAULT_POLICY, ...policy },
    workers,
    workOrders: orders,
    assignments: assignments.map(([workOrderId, workerId, position]): Assignment => ({ workOrderId, workerId, position })),
  };
}

/** One rule's findings over every order of the snapshot. */
export function run(rule: RuleCheck, snapshot: DaySnapshot): Finding[] {
  const ix = new SnapshotIndex(snapshot);
  return rule([...ix.orders.values()], ix);
}

/** A compact view for table assertions: "orderId/workerId/level". */
export const brief = (fs: Finding[]) => fs.map((f) => `${f.workOrderId}/${f.workerId ?? "-"}/${f.level}${f.locked ? "/locked" : ""}`);

/** The example input of CREW-CHECK.md. */
// Loosely typed on purpose: tests delete and corrupt fields to probe the parser.
export function exampleInput(): Record<string, any> {
  return {
    timezone: "America/Chicago",
    policy: { minRestHours: 8, maxShiftHours: 16, credentialWarnDays: 30 },
    workers: [
      {
        id: "w-104",
        name: "Rosa Delgado",
        classification: "journeyman",
        credentials: [
          { type: "climbing", expiresOn: "2027-05-31" },
          { type: "first_aid_cpr", expiresOn: "2027-11-30" },
          { type: "equipment_operator", expiresOn: "2028-01-15" },
          { type: "cdl_b", expiresOn: "2029-04-01" },
        ],
        unavailable: [{ from: "2027-04-12T00:00", to: "2027-04-16T00:00", reason: "leave" }],
        timeRecords: [{ start: "2027-04-05T06:00", end: "2027-04-05T19:30" }],
      },
    ],
    workOrders: [
      {
        id: "wo-2201",
        title: "Change out 50 kVA transformer, pole 17-44",
        start: "2027-04-06T07:00",
        end: "2027-04-06T15:30",
        workType: "pole_climb",
        energized: true,
        voltageKv: 12.47,
        emergency: false,
        minCrew: 3,
      },
    ],
    assignments: [{ workOrderId: "wo-2201", workerId: "w-104", position: "climber" }],
  };
}
