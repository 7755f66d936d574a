// Work orders, order series and crew templates: one schema per boundary, shared by the route
// handlers, the forms (react-hook-form + zodResolver) and the tests.
import { z } from "zod";
import { EXCEPTIONS, POSITIONS } from "@/lib/rules/types";
import { isIsoDate, isWallTime } from "@/lib/rules/time";
import { ORDER_STATUSES } from "@/lib/orders/status";
import { parseRrule } from "@/lib/time/recurrence";

const WALL_RE = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/;

/** A wall-clock time in the yard's zone, "YYYY-MM-DDTHH:mm" (seconds optional, no offset). */
export const wallTime = (what = "a date and time") =>
  z
    .string({ error: `Enter ${what}` })
    .min(1, `Enter ${what}`)
    .regex(WALL_RE, `Enter ${what} as YYYY-MM-DD HH:mm`)
    .refine(isWallTime, "That date or time does not exist");

export const isoDate = (what = "a date") =>
  z.string({ error: `Enter ${what}` }).refine(isIsoDate, `Enter ${what} as YYYY-MM-DD`);

/** Optional text: trimmed, empty becomes null. */
export const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .nullable()
    .optional()
    .transform((v) => (v ? v : null));

/** "YYYY-MM-DDTHH:mm" and "…:ss" compared as the same clock. */
export const wallKey = (s: string) => (s.length === 16 ? `${s}:00` : s);

const MAX_ORDER_MS = 7 * 86_400_000;
const minutesBetween = (a: string, b: string) => (Date.parse(`${wallKey(b)}Z`) - Date.parse(`${wallKey(a)}Z`)) / 60_000;

export const positionList = z
  .array(z.object({ id: z.number().int().positive().optional(), position: z.enum(POSITIONS) }))
  .min(1, "An order needs at least one position")
  .max(16, "At most 16 positions");

export const shiftList = z
  .array(z.object({ start: wallTime("the shift's start"), end: wallTime("the shift's end") }))
  .max(31, "At most 31 shifts");

export const recurrenceInput = z.object({
  rrule: z.string().max(500, "At most 500 characters"),
  exdates: z.array(isoDate("a skipped date")).max(366).default([]),
});

const fieldShapes = {
  title: z.string({ error: "Give the order a title" }).trim().min(1, "Give the order a title").max(200),
  yardId: z.number({ error: "Pick a yard" }).int().positive("Pick a yard"),
  workTypeId: z.number({ error: "Pick a work type" }).int().positive("Pick a work type"),
  address: optionalText(255),
  structureNo: optionalText(60),
  start: wallTime("the start"),
  end: wallTime("the end"),
  energized: z.boolean(),
  voltageKv: z.number({ error: "Voltage must be a number of kV" }).min(0).max(800).nullable(),
  emergency: z.boolean(),
  crewException: z.enum(EXCEPTIONS).nullable(),
  minCrew: z.number({ error: "Minimum crew must be a number" }).int().min(1).max(30).nullable(),
  positions: positionList,
  priority: z.number({ error: "Priority is 1 to 5" }).int().min(1, "Priority is 1 to 5").max(5, "Priority is 1 to 5"),
  notes: optionalText(4000),
  status: z.enum(ORDER_STATUSES),
  holdReason: optionalText(500),
  driverLicence: z.enum(["cdl_a", "cdl_b"]).nullable(),
  locateTicket: optionalText(40),
  locateValidThrough: isoDate("the valid-through date").nullable().optional().transform((v) => v ?? null),
  actualStart: wallTime("the actual start").nullable().optional().transform((v) => v ?? null),
  actualEnd: wallTime("the actual end").nullable().optional().transform((v) => v ?? null),
  recurrence: recurrenceInput.nullable().optional(),
  // Issue 14 (../shared/CREW-CHECK.md, Corrections 2, 6 and 8).
  /** Highest voltage of exposed energized parts within reach when the work itself is de-energized. */
  nearEnergizedKv: z.number({ error: "Nearby voltage must be a number of kV" }).min(0).max(800).nullable().optional().transform((v) => v ?? null),
  /** 1 for a single-phase tap (its voltage is then to ground), 3 otherwise. */
  phases: z.union([z.literal(1), z.literal(3)], { error: "Phases is 1 (single-phase tap) or 3" }).optional().transform((v) => v ?? 3),
  /** The phase-to-phase voltage of the system a single-phase tap comes off. */
  systemKv: z.number({ error: "System voltage must be a number of kV" }).min(0).max(800).nullable().optional().transform((v) => v ?? null),
  /** Issue 16: the site's elevation (m) when it differs from its yard's (Table R-5); null = the yard's. */
  altitudeM: z
    .number({ error: "Site elevation must be a whole number of metres" })
    .int("Site elevation must be a whole number of metres")
    .min(-500, "Site elevation must be at least -500 m")
    .max(6000, "Site elevation above 6,000 m is beyond 1910.269 Table R-5")
    .nullable()
    .optional()
    .transform((v) => v ?? null),
  /** A multi-day order's worked shifts, wall clock in the yard's zone. */
  shifts: shiftList.optional().transform((v) => v ?? []),
};

/** The fields of a work order as the form edits them (no defaults). Times are wall clock in the yard's zone. */
export const orderFields = z.object(fieldShapes);

/** The same with defaults for what an API caller may leave out. */
const orderFieldsWithDefaults = orderFields.extend({
  energized: fieldShapes.energized.default(true),
  voltageKv: fieldShapes.voltageKv.default(null),
  emergency: fieldShapes.emergency.default(false),
  crewException: fieldShapes.crewException.default(null),
  minCrew: fieldShapes.minCrew.default(null),
  priority: fieldShapes.priority.default(3),
  status: fieldShapes.status.default("planned"),
  driverLicence: fieldShapes.driverLicence.default(null),
});

type OrderFieldsOut = z.output<typeof orderFields>;

/** Cross-field checks shared by create, update and series edits. */
export function checkOrder(v: Partial<OrderFieldsOut>, ctx: z.RefinementCtx) {
  if (v.start && v.end && WALL_RE.test(v.start) && WALL_RE.test(v.end)) {
    const minutes = minutesBetween(v.start, v.end);
    if (minutes <= 0) ctx.addIssue({ code: "custom", path: ["end"], message: "The end must be after the start" });
    else if (minutes * 60_000 > MAX_ORDER_MS)
      ctx.addIssue({ code: "custom", path: ["end"], message: "An order runs at most 7 days; split longer work" });
  }
  checkSite(v, ctx);
  if (v.status === "on_hold" && !v.holdReason)
    ctx.addIssue({ code: "custom", path: ["holdReason"], message: "Say why the order is on hold" });
  if (v.status === "done") {
    if (!v.actualStart) ctx.addIssue({ code: "custom", path: ["actualStart"], message: "Enter when the work actually started" });
    if (!v.actualEnd) ctx.addIssue({ code: "custom", path: ["actualEnd"], message: "Enter when the work actually ended" });
  }
  if (v.actualStart && v.actualEnd && WALL_RE.test(v.actualStart) && WALL_RE.test(v.actualEnd)) {
    const minutes = minutesBetween(v.actualStart, v.actualEnd);
    if (minutes <= 0) ctx.addIssue({ code: "custom", path: ["actualEnd"], message: "The actual end must be after the actual start" });
    else if (minutes > 36 * 60)
      ctx.addIssue({ code: "custom", path: ["actualEnd"], message: "More than 36 hours: enter the work as separate days" });
  }
  if (v.positions && v.positions.filter((p) => p.position === "lead").length > 1)
    ctx.addIssue({ code: "custom", path: ["positions"], message: "An order has one lead position (the employee in charge)" });
  if (v.recurrence) {
    const r = parseRrule(v.recurrence.rrule);
    if (!r.ok) ctx.addIssue({ code: "custom", path: ["recurrence", "rrule"], message: r.message });
    if (v.status && !["draft", "planned"].includes(v.status))
      ctx.addIssue({ code: "custom", path: ["status"], message: "A repeating order starts as draft or planned" });
  }
}

/**
 * Shifts lie inside the order and do not overlap (touching is fine); a single-phase tap's system
 * voltage is above its voltage to ground. Paths name the row: `shifts.0.end`.
 */
function checkSite(v: Partial<OrderFieldsOut>, ctx: z.RefinementCtx) {
  if (v.phases === 1 && v.systemKv != null && v.voltageKv != null && v.systemKv <= v.voltageKv)
    ctx.addIssue({ code: "custom", path: ["systemKv"], message: "A single-phase tap's system voltage (phase to phase) is above its voltage to ground" });
  if (v.phases === 3 && v.systemKv != null && v.voltageKv != null && v.systemKv !== v.voltageKv)
    ctx.addIssue({ code: "custom", path: ["systemKv"], message: "System voltage is only for a single-phase tap; a three-phase order's voltage is the system's" });
  const shifts = v.shifts ?? [];
  if (!shifts.length) return;
  if (v.recurrence)
    ctx.addIssue({ code: "custom", path: ["shifts"], message: "A repeating order has no shifts; give a multi-day order its shifts as a single order" });
  const ok = (t: string | undefined) => !!t && WALL_RE.test(t);
  const orderOk = ok(v.start) && ok(v.end);
  const rows = shifts.map((sh, i) => ({ i, start: ok(sh.start) ? wallKey(sh.start) : null, end: ok(sh.end) ? wallKey(sh.end) : null }));
  for (const r of rows) {
    if (!r.start || !r.end) continue;
    if (r.end <= r.start) {
      ctx.addIssue({ code: "custom", path: ["shifts", r.i, "end"], message: "The shift must end after it starts" });
      continue;
    }
    if (orderOk && r.start < wallKey(v.start!))
      ctx.addIssue({ code: "custom", path: ["shifts", r.i, "start"], message: "The shift starts before the order does" });
    if (orderOk && r.end > wallKey(v.end!))
      ctx.addIssue({ code: "custom", path: ["shifts", r.i, "end"], message: "The shift ends after the order does" });
  }
  const sorted = rows.filter((r) => r.start && r.end && r.end > r.start).sort((a, b) => (a.start! < b.start! ? -1 : a.start! > b.start! ? 1 : a.i - b.i));
  for (let k = 1; k < sorted.length; k++) {
    const prev = sorted[k - 1];
    const cur = sorted[k];
    if (cur.start! < prev.end!)
      ctx.addIssue({ code: "custom", path: ["shifts", cur.i, "start"], message: `The shift overlaps shift ${prev.i + 1}` });
  }
}

/** POST /api/orders and the new-order form. */
export const orderInputSchema = orderFieldsWithDefaults.superRefine(checkOrder);
export type OrderInput = z.output<typeof orderInputSchema>;
export type OrderFormValues = z.input<typeof orderInputSchema>;

/** PATCH /api/orders/[id]: any subset of the fields plus the version the client last saw. */
export const orderPatchSchema = orderFields
  .omit({ recurrence: true })
  .partial()
  .extend({ version: z.number({ error: "Send the version you last loaded" }).int().positive() });
export type OrderPatch = z.output<typeof orderPatchSchema>;

/** The form for an existing order (same fields and checks, with the version). */
export const orderEditSchema = orderFields
  .omit({ recurrence: true })
  .extend({ version: z.number().int().positive() })
  .superRefine(checkOrder);
export type OrderEditValues = z.input<typeof orderEditSchema>;

/** PATCH /api/order-series/[id]: the series' template, first start, length and repeat rule. */
export const seriesEditSchema = orderFieldsWithDefaults
  .omit({ status: true, holdReason: true, actualStart: true, actualEnd: true, recurrence: true })
  .extend({
    status: z.enum(["draft", "planned"]).default("planned"),
    recurrence: recurrenceInput,
    version: z.number().int().positive(),
  })
  .superRefine(checkOrder);
export type SeriesEditInput = z.output<typeof seriesEditSchema>;
export type SeriesEditValues = z.input<typeof seriesEditSchema>;

/** List filters (query string). */
export const orderQuerySchema = z.object({
  yard: z.string().max(20).optional(),
  from: isoDate("from").optional(),
  to: isoDate("to").optional(),
  status: z
    .string()
    .max(200)
    .optional()
    .refine((s) => !s || s.split(",").every((x) => (ORDER_STATUSES as readonly string[]).includes(x)), "Unknown status"),
  workType: z.string().max(40).optional(),
  q: z.string().max(100).optional(),
  limit: z.coerce.number().int().min(1).max(1000).optional(),
});
export type OrderQuery = z.output<typeof orderQuerySchema>;

// --- crew templates (work types) -------------------------------------------------------------

/** A work type's crew template: exactly one lead position (who may also hold one other). */
export const crewTemplateSchema = z
  .object({
    name: z.string().trim().min(1, "Give the work type a name").max(120),
    minCrew: z.number({ error: "Minimum crew must be a number" }).int().min(1, "At least 1").max(30),
    digs: z.boolean(),
    positions: z.array(z.enum(POSITIONS)).min(1, "A template needs at least the lead position").max(16),
  })
  .superRefine((v, ctx) => {
    const leads = v.positions.filter((p) => p === "lead").length;
    if (leads !== 1)
      ctx.addIssue({
        code: "custom",
        path: ["positions"],
        message:
          leads === 0
            ? "A crew template needs exactly one lead position (the employee in charge)"
            : "A crew template has exactly one lead position; the lead may also hold one other position",
      });
  });
export type CrewTemplateInput = z.output<typeof crewTemplateSchema>;

export const crewTemplatesSchema = z.object({
  workTypes: z.array(crewTemplateSchema.and(z.object({ id: z.number().int().positive() }))).min(1).max(100),
});
