import { z } from "zod";
import { MAX_USE_VOLTS, RETEST_MONTHS } from "@/lib/rules/gear";
import { addMonthsIso, isoDate, isRealDate } from "@/lib/credentials/model";
import { daysBetween } from "@/lib/time/days";

// Rubber goods: a worker's insulating gloves and sleeves. Types, labels, the schemas shared by
// the routes, the forms and the tests, and the retest arithmetic. Pure (no database).
//
// Sources: 29 CFR 1910.137 Table I-4 (AC maximum use voltage per class) and Table I-5 (rubber
// insulating gloves: retest every 6 months; sleeves: every 12 months). The crew rules
// themselves (RUBBER_GOODS) live in lib/rules; this module only keeps the register.

export const GEAR_KINDS = ["rubber_gloves", "rubber_sleeves"] as const;
export type GearKind = (typeof GEAR_KINDS)[number];

export const GEAR_CLASSES = ["00", "0", "1", "2", "3", "4"] as const;
export type GearClass = (typeof GEAR_CLASSES)[number];

export const GEAR_KIND_LABEL: Record<GearKind, string> = {
  rubber_gloves: "Rubber gloves",
  rubber_sleeves: "Rubber sleeves",
};

/** 1910.137 Table I-4 maximum use voltages and Table I-5 retest months: the crew rules' own tables. */
export { MAX_USE_VOLTS, RETEST_MONTHS };

export function classLabel(c: GearClass): string {
  const v = MAX_USE_VOLTS[c];
  return `Class ${c} (max use ${v >= 1000 ? `${v / 1000} kV` : `${v} V`} AC)`;
}

/** How far ahead the due list looks, in days. */
export const DUE_WINDOW_DAYS = 30;

/** The date the next electrical test falls due: the last test + 6 months (gloves) or 12 (sleeves). */
export function nextTestDue(kind: GearKind, testedOn: string): string {
  return addMonthsIso(testedOn, RETEST_MONTHS[kind]);
}

export type GearState = "retired" | "overdue" | "due" | "ok";

/**
 * Where an item stands on `today`: overdue once its due date has passed (it may be used on the
 * due date itself), due when the due date is within DUE_WINDOW_DAYS, retired when taken out
 * of service on or before today.
 */
export function gearState(
  item: { kind: GearKind; testedOn: string; retiredOn?: string | null },
  today: string,
): { state: GearState; dueOn: string; daysLeft: number } {
  const dueOn = nextTestDue(item.kind, item.testedOn);
  const daysLeft = daysBetween(today, dueOn);
  if (item.retiredOn && item.retiredOn <= today) return { state: "retired", dueOn, daysLeft };
  if (daysLeft < 0) return { state: "overdue", dueOn, daysLeft };
  if (daysLeft <= DUE_WINDOW_DAYS) return { state: "due", dueOn, daysLeft };
  return { state: "ok", dueOn, daysLeft };
}

export const GEAR_STATE_LABEL: Record<GearState, string> = {
  retired: "Retired",
  overdue: "Test overdue",
  due: "Test due soon",
  ok: "In test",
};

/** One item as the desk and the API show it. */
export interface GearItem {
  id: number;
  workerId: number;
  workerName: string;
  employeeNo: string;
  yardCode: string;
  kind: GearKind;
  class: GearClass;
  size: string | null;
  serial: string;
  testedOn: string;
  issuedOn: string | null;
  retiredOn: string | null;
  note: string | null;
  version: number;
  dueOn: string;
  daysLeft: number;
  state: GearState;
}

/** The rule snapshot's shape (CREW-CHECK.md, "Equipment, gear and field figures"). */
export interface RuleGear {
  kind: GearKind;
  class: GearClass;
  testedOn: string;
}

// --- schemas ----------------------------------------------------------------------------------

const classSchema = z.enum(GEAR_CLASSES, { error: `not a class (one of ${GEAR_CLASSES.join(", ")})` });
const kindSchema = z.enum(GEAR_KINDS, { error: "not a kind (rubber_gloves or rubber_sleeves)" });
const serialSchema = z
  .string({ error: "the serial or label stamped on the item" })
  .trim()
  .min(1, "the serial or label stamped on the item")
  .max(40, "at most 40 characters");
const sizeSchema = z.string().trim().max(10, "at most 10 characters");

const retiredAfterIssue = <T extends { testedOn?: string; issuedOn?: string | null; retiredOn?: string | null }>(
  v: T,
  ctx: z.RefinementCtx,
) => {
  if (v.issuedOn && v.retiredOn && v.retiredOn < v.issuedOn) {
    ctx.addIssue({ code: "custom", path: ["retiredOn"], message: "before the issue date" });
  }
};

/** POST /api/gear (hr, admin). */
export const gearCreateSchema = z
  .object({
    workerId: z.number({ error: "Pick a worker" }).int().positive(),
    kind: kindSchema,
    class: classSchema,
    size: sizeSchema.nullable().optional(),
    serial: serialSchema,
    testedOn: isoDate,
    issuedOn: isoDate.nullable().optional(),
    note: z.string().trim().max(500, "at most 500 characters").nullable().optional(),
  })
  .strict()
  .superRefine(retiredAfterIssue);
export type GearCreate = z.output<typeof gearCreateSchema>;

/** PATCH /api/gear/[id] (hr, admin): a new test date, a correction, or retirement. */
export const gearPatchSchema = z
  .object({
    version: z.number({ error: "the version you edited (reload and try again)" }).int().positive(),
    kind: kindSchema.optional(),
    class: classSchema.optional(),
    size: sizeSchema.nullable().optional(),
    serial: serialSchema.optional(),
    testedOn: isoDate.optional(),
    issuedOn: isoDate.nullable().optional(),
    retiredOn: isoDate.nullable().optional(),
    note: z.string().trim().max(500, "at most 500 characters").nullable().optional(),
  })
  .strict()
  .superRefine(retiredAfterIssue);
export type GearPatch = z.output<typeof gearPatchSchema>;

export const GEAR_VIEWS = ["all", "due", "overdue", "retired"] as const;
export type GearView = (typeof GEAR_VIEWS)[number];

export const gearQuerySchema = z.object({
  view: z.enum(GEAR_VIEWS).optional(),
  yard: z.string().trim().max(20).optional(),
  workerId: z.coerce.number().int().positive().optional(),
  q: z.string().trim().max(80).optional(),
});
export type GearQuery = z.output<typeof gearQuerySchema>;

/** Whether an item belongs to a view: "due" = overdue or due within the window (in service). */
export function inGearView(item: { state: GearState }, view: GearView | undefined): boolean {
  switch (view ?? "all") {
    case "all":
      return item.state !== "retired";
    case "due":
      return item.state === "due" || item.state === "overdue";
    case "overdue":
      return item.state === "overdue";
    case "retired":
      return item.state === "retired";
  }
}

// --- CSV --------------------------------------------------------------------------------------

/** The import's columns, in the export's order (the export adds read-only columns after them). */
export const GEAR_CSV_COLUMNS = ["serial", "employee_no", "kind", "class", "size", "tested_on", "issued_on", "retired_on"] as const;
export type GearCsvColumn = (typeof GEAR_CSV_COLUMNS)[number];
export const GEAR_CSV_REQUIRED: readonly GearCsvColumn[] = ["serial", "employee_no", "kind", "class", "tested_on"];
export const GEAR_CSV_ALIASES: Record<string, GearCsvColumn> = {
  serial: "serial",
  label: "serial",
  serial_no: "serial",
  employee_no: "employee_no",
  employee_number: "employee_no",
  emp_no: "employee_no",
  kind: "kind",
  class: "class",
  size: "size",
  tested_on: "tested_on",
  last_test: "tested_on",
  issued_on: "issued_on",
  retired_on: "retired_on",
};
export const GEAR_CSV_MAX_ROWS = 10_000;

const optionalCsvDate = z
  .string()
  .trim()
  .optional()
  .transform((s) => (s ? s : null))
  .refine((s) => s === null || isRealDate(s), "not a date (YYYY-MM-DD)");

/** One CSV row's own checks (no database). Kind accepts "gloves"/"sleeves" as well. */
export const gearCsvRowSchema = z.object({
  serial: serialSchema,
  employee_no: z.string().trim().min(1, "empty (the worker's employee number)").max(20, "longer than 20 characters"),
  kind: z
    .string()
    .trim()
    .transform((s) => s.toLowerCase().replace(/\s+/g, "_"))
    .transform((s) => (s === "gloves" ? "rubber_gloves" : s === "sleeves" ? "rubber_sleeves" : s))
    .pipe(kindSchema),
  class: z
    .string()
    .trim()
    .transform((s) => s.replace(/^class\s*/i, ""))
    .pipe(classSchema),
  size: z
    .string()
    .trim()
    .max(10, "at most 10 characters")
    .optional()
    .transform((s) => (s ? s : null)),
  tested_on: isoDate,
  issued_on: optionalCsvDate,
  retired_on: optionalCsvDate,
});
export type GearCsvRow = z.output<typeof gearCsvRowSchema>;

export const gearImportRequestSchema = z
  .object({
    csv: z.string({ error: "csv is required (the file's text)" }).min(1, "The file is empty"),
    dryRun: z.boolean().default(false),
  })
  .strict();
