// The crew-check input (docs: CREW-CHECK.md) and its conversion to a DaySnapshot.
// Unknown fields are ignored; missing or ill-typed required fields are errors naming the path.

import { z } from "zod";
import { equipmentSchemas, toEquipment, toGear, toSiteFields } from "./equipment-input";
import { epochToZonedDate, isIsoDate, isValidTimeZone, isWallTime, zonedWallTimeToEpoch } from "./time";
import {
  CLASSIFICATIONS,
  DEFAULT_POLICY,
  EXCEPTIONS,
  POSITIONS,
  RULE_CODES,
  WORK_TYPES,
  type DaySnapshot,
  type Level,
  type Policy,
  type RuleCode,
  type Worker,
  type WorkOrder,
} from "./types";

const TIME_FORMAT = "expected YYYY-MM-DDTHH:mm";
const DATE_FORMAT = "expected YYYY-MM-DD";

/**
 * A received value for an error message: JSON, cut to 80 characters. A value nested thousands
 * of levels deep (JSON.stringify overflows the stack) or megabytes long is described, not echoed.
 */
export function shown(v: unknown): string {
  let s: string;
  try {
    s = JSON.stringify(v) ?? String(v);
  } catch {
    s = Array.isArray(v) ? "an array nested too deep to show" : "an object nested too deep to show";
  }
  return s.length > 80 ? `${s.slice(0, 77)}...` : s;
}

const formatError = (format: string) => (iss: { input?: unknown }) =>
  iss.input === undefined ? "required" : `${format}, got ${shown(iss.input)}`;
const wallTime = z.string({ error: formatError(TIME_FORMAT) }).refine(isWallTime, { error: formatError(TIME_FORMAT) });
const isoDate = z.string({ error: formatError(DATE_FORMAT) }).refine(isIsoDate, { error: formatError(DATE_FORMAT) });
const text = z.string();
// Equipment, gear and field figures (CREW-CHECK.md, all optional): see equipment-input.ts.
const equip = equipmentSchemas(isoDate);
const level = z.enum(["block", "warn"]);

const levelsShape = Object.fromEntries(RULE_CODES.map((c) => [c, level.optional()])) as Record<
  RuleCode,
  z.ZodOptional<typeof level>
>;

const policySchema = z.object({
  minRestHours: z.number().min(0).default(DEFAULT_POLICY.minRestHours),
  maxShiftHours: z.number().positive().default(DEFAULT_POLICY.maxShiftHours),
  credentialWarnDays: z.number().int().min(0).default(DEFAULT_POLICY.credentialWarnDays),
  /** An extension to the contract: policy levels (raising only). */
  levels: z.object(levelsShape).optional(),
});

const workerSchema = z.object({
  id: text.min(1),
  name: text,
  classification: z.enum(CLASSIFICATIONS),
  credentials: z.array(z.object({ type: text.min(1), expiresOn: isoDate.nullable() })),
  unavailable: z.array(z.object({ from: wallTime, to: wallTime, reason: text })).default([]),
  timeRecords: z.array(z.object({ start: wallTime, end: wallTime })).default([]),
  ...equip.worker,
});

const workOrderSchema = z.object({
  id: text.min(1),
  title: text,
  start: wallTime,
  end: wallTime,
  workType: z.enum(WORK_TYPES),
  energized: z.boolean().default(true),
  voltageKv: z.number().min(0).nullable().default(null),
  emergency: z.boolean().default(false),
  exception: z.enum(EXCEPTIONS).nullable().default(null),
  minCrew: z.number().int().min(1).nullable().default(null),
  driverLicence: z.enum(["cdl_a", "cdl_b"]).default("cdl_b"),
  // Corrections 2, 6 and 7 (all optional: an input without them keeps its meaning).
  nearEnergizedKv: z.number().min(0).nullable().default(null),
  shifts: z.array(z.object({ start: wallTime, end: wallTime })).optional(),
  digs: z.boolean().default(false),
  locate: z.object({ ticket: text.min(1), validThrough: isoDate }).nullable().default(null),
  ...equip.workOrder,
});

export const dayInputSchema = z.object({
  timezone: z
    .string()
    .refine(isValidTimeZone, { error: (iss) => `expected an IANA time zone name, got ${shown(iss.input)}` }),
  policy: policySchema.default({ ...DEFAULT_POLICY }),
  workers: z.array(workerSchema),
  workOrders: z.array(workOrderSchema),
  assignments: z.array(z.object({ workOrderId: text, workerId: text, position: z.enum(POSITIONS) })),
  ...equip.day,
});

export type DayInput = z.input<typeof dayInputSchema>;

export type ParseResult = { ok: true; snapshot: DaySnapshot } | { ok: false; errors: string[] };

/** `workOrders[0].start` */
export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  let out = "";
  for (const key of path) {
    if (typeof key === "number") out += `[${key}]`;
    else out += out === "" ? String(key) : `.${String(key)}`;
  }
  return out === "" ? "(root)" : out;
}

function kindOf(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "array";
  return typeof v;
}

// Plain-words messages for zod's built-in issues; schema-level messages (the time formats) win.
const messages: z.core.$ZodErrorMap = (iss) => {
  switch (iss.code) {
    case "invalid_type":
      return iss.input === undefined ? "required" : `expected ${iss.expected}, got ${kindOf(iss.input)}`;
    case "invalid_value":
      if (iss.input === undefined) return "required";
      return `expected one of ${iss.values.map((v) => JSON.stringify(v)).join(", ")}, got ${shown(iss.input)}`;
    case "too_small":
      if (iss.origin === "string") return "must not be empty";
      return `must be ${iss.inclusive ? "at least" : "greater than"} ${String(iss.minimum)}`;
    case "too_big":
      return `must be ${iss.inclusive ? "at most" : "less than"} ${String(iss.maximum)}`;
    default:
      return undefined;
  }
};

/** Parses crew-check input (already JSON-decoded) into a snapshot, or lists every error with its path. */
export function parseDayInput(json: unknown): ParseResult {
  const parsed = dayInputSchema.safeParse(json, { error: messages });
  if (!parsed.success) {
    return { ok: false, errors: parsed.error.issues.map((i) => `${formatPath(i.path)}: ${i.message}`) };
  }
  const input = parsed.data;
  const tz = input.timezone;
  const errors: string[] = [];
  const epoch = (local: string) => zonedWallTimeToEpoch(local, tz);
  const interval = (start: string, end: string, path: string, startName: string, endName: string) => {
    const s = epoch(start);
    const e = epoch(end);
    if (e <= s) errors.push(`${path}.${endName}: must be after ${startName}`);
    return { start: s, end: e };
  };

  const workerIds = new Set<string>();
  const workers: Worker[] = input.workers.map((w, i) => {
    if (workerIds.has(w.id)) errors.push(`workers[${i}].id: duplicate worker id ${JSON.stringify(w.id)}`);
    workerIds.add(w.id);
    return {
      id: w.id,
      name: w.name,
      classification: w.classification,
      credentials: w.credentials.map((c) => ({ type: c.type, expiresOn: c.expiresOn })),
      unavailable: w.unavailable.map((u, j) => ({
        ...interval(u.from, u.to, `workers[${i}].unavailable[${j}]`, "from", "to"),
        reason: u.reason,
      })),
      timeRecords: w.timeRecords.map((r, j) => interval(r.start, r.end, `workers[${i}].timeRecords[${j}]`, "start", "end")),
      ...toGear(w.gear),
    };
  });

  const orderIds = new Set<string>();
  const workOrders: WorkOrder[] = input.workOrders.map((o, i) => {
    if (orderIds.has(o.id)) errors.push(`workOrders[${i}].id: duplicate work order id ${JSON.stringify(o.id)}`);
    orderIds.add(o.id);
    const { start, end } = interval(o.start, o.end, `workOrders[${i}]`, "start", "end");
    const shifts = o.shifts?.map((sh, j) => {
      const path = `workOrders[${i}].shifts[${j}]`;
      const iv = interval(sh.start, sh.end, path, "start", "end");
      if (iv.start < start || iv.start >= end) errors.push(`${path}.start: must be inside the order (${o.start} to ${o.end})`);
      else if (iv.end > end) errors.push(`${path}.end: must be inside the order (${o.start} to ${o.end})`);
      return iv;
    });
    return {
      id: o.id,
      title: o.title,
      start,
      end,
      startDate: epochToZonedDate(start, tz),
      endDate: epochToZonedDate(end, tz),
      workType: o.workType,
      energized: o.energized,
      voltageKv: o.voltageKv,
      exception: o.exception ?? (o.emergency ? "emergency" : null),
      minCrew: o.minCrew,
      driverLicence: o.driverLicence,
      nearEnergizedKv: o.nearEnergizedKv,
      ...(shifts ? { shifts } : {}),
      digs: o.digs,
      locate: o.locate ? { ticket: o.locate.ticket, validThrough: o.locate.validThrough } : null,
      ...toSiteFields(o),
    };
  });

  input.assignments.forEach((a, i) => {
    if (!orderIds.has(a.workOrderId)) {
      errors.push(`assignments[${i}].workOrderId: unknown work order ${JSON.stringify(a.workOrderId)}`);
    }
    if (!workerIds.has(a.workerId)) errors.push(`assignments[${i}].workerId: unknown worker ${JSON.stringify(a.workerId)}`);
  });

  const equipment = toEquipment(input, orderIds, errors);

  if (errors.length > 0) return { ok: false, errors };

  const policy: Policy = {
    minRestHours: input.policy.minRestHours,
    maxShiftHours: input.policy.maxShiftHours,
    credentialWarnDays: input.policy.credentialWarnDays,
  };
  if (input.policy.levels) {
    const levels: Partial<Record<RuleCode, Level>> = {};
    for (const code of RULE_CODES) {
      const l = input.policy.levels[code];
      if (l) levels[code] = l;
    }
    policy.levels = levels;
  }

  return {
    ok: true,
    snapshot: {
      timezone: tz,
      policy,
      workers,
      workOrders,
      assignments: input.assignments.map((a) => ({ workOrderId: a.workOrderId, workerId: a.workerId, position: a.position })),
      ...equipment,
    },
  };
}
