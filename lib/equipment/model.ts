// The equipment register's vocabulary: kinds, labels, the zod schemas the routes and the form
// share, and the shape the crew rules read (CREW-CHECK.md, "Equipment, gear and field figures").
// Client-safe: no database, no Node modules.
import { z } from "zod";
import { calendarDay } from "@/lib/time/days";

export const EQUIPMENT_KINDS = ["bucket_truck", "digger_derrick", "pickup", "trailer", "other"] as const;
export type EquipmentKind = (typeof EQUIPMENT_KINDS)[number];

export const EQUIPMENT_KIND_LABEL: Record<EquipmentKind, string> = {
  bucket_truck: "Bucket truck",
  digger_derrick: "Digger derrick",
  pickup: "Pickup",
  trailer: "Trailer",
  other: "Other",
};

export const RIGGING_KINDS = ["rope_block", "hand_line", "sling"] as const;
export type RiggingKind = (typeof RIGGING_KINDS)[number];

export const RIGGING_KIND_LABEL: Record<RiggingKind, string> = {
  rope_block: "Rope blocks",
  hand_line: "Hand line",
  sling: "Sling",
};

export const LICENCES = ["cdl_a", "cdl_b"] as const;
export type Licence = (typeof LICENCES)[number];
export const LICENCE_LABEL: Record<Licence, string> = { cdl_a: "CDL class A", cdl_b: "CDL class B" };

/** The truck a rule work type needs on the order (CREW-CHECK.md, EQUIPMENT). */
export const REQUIRED_KIND: Partial<Record<string, EquipmentKind>> = {
  bucket: "bucket_truck",
  digger_derrick: "digger_derrick",
};

/** An aerial device's dielectric test is due every 12 months (policy; common practice). */
export const DIELECTRIC_TEST_MONTHS = 12;

export interface RiggingItem {
  id: number;
  equipmentId: number;
  kind: RiggingKind;
  label: string;
  partsOfLine: number | null;
  sheaves: number | null;
  wllLb: number;
  inspectedOn: string | null;
}

export interface Equipment {
  id: number;
  yardId: number;
  yardCode: string;
  kind: EquipmentKind;
  unitNumber: string;
  name: string;
  insulated: boolean;
  dielectricTestedOn: string | null;
  annualInspectionOn: string | null;
  licence: Licence | null;
  outOfService: boolean;
  outOfServiceReason: string | null;
  version: number;
  rigging: RiggingItem[];
}

/** One piece of equipment as crew-check reads it (ids are strings of the numeric ids). */
export interface RuleEquipment {
  id: string;
  name: string;
  kind: EquipmentKind;
  insulated: boolean;
  dielectricTestedOn?: string | null;
  licence?: Licence | null;
}
export interface RuleEquipmentAssignment {
  workOrderId: string;
  equipmentId: string;
}

export function toRuleEquipment(e: Pick<Equipment, "id" | "name" | "unitNumber" | "kind" | "insulated" | "dielectricTestedOn" | "licence">): RuleEquipment {
  return {
    id: String(e.id),
    name: `${e.unitNumber} ${e.name}`,
    kind: e.kind,
    insulated: e.insulated,
    dielectricTestedOn: e.dielectricTestedOn,
    licence: e.licence,
  };
}

/** Adds `months` calendar months to a YYYY-MM-DD day (clamped to the month's last day). */
export function addMonths(day: string, months: number): string {
  const [y, m, d] = day.split("-").map(Number);
  const first = new Date(Date.UTC(y, m - 1 + months, 1));
  const last = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  return new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth(), Math.min(d, last))).toISOString().slice(0, 10);
}

/** The dielectric test state on a day: null when the equipment is not an aerial device. */
export function dielectricState(e: Pick<Equipment, "kind" | "dielectricTestedOn">, day: string): "ok" | "overdue" | "missing" | null {
  if (e.kind !== "bucket_truck" && e.kind !== "digger_derrick") return null;
  if (!e.dielectricTestedOn) return "missing";
  return addMonths(e.dielectricTestedOn, DIELECTRIC_TEST_MONTHS) >= day ? "ok" : "overdue";
}

// --- schemas (routes and the form) -------------------------------------------------------

const id = (name: string) => z.number({ error: `${name} must be a number` }).int(`${name} must be a whole number`).positive().max(2_147_483_647);
const optionalDay = calendarDay().nullable().default(null);

const base = {
  yardId: id("yardId"),
  kind: z.enum(EQUIPMENT_KINDS, { error: `Choose one of ${EQUIPMENT_KINDS.join(", ")}` }),
  unitNumber: z
    .string({ error: "Enter a unit number" })
    .trim()
    .min(1, "Enter a unit number")
    .max(20, "At most 20 characters")
    .regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, "Letters, digits, spaces and . _ / - only"),
  name: z.string({ error: "Enter a name" }).trim().min(1, "Enter a name").max(120, "At most 120 characters"),
  insulated: z.boolean({ error: "insulated must be true or false" }).default(false),
  dielectricTestedOn: optionalDay,
  annualInspectionOn: optionalDay,
  licence: z.enum(LICENCES, { error: "Choose cdl_a, cdl_b or null" }).nullable().default(null),
  outOfService: z.boolean({ error: "outOfService must be true or false" }).default(false),
  outOfServiceReason: z.string().trim().max(500, "At most 500 characters").nullable().default(null),
};

const needsReason = (v: { outOfService?: boolean; outOfServiceReason?: string | null }, ctx: z.RefinementCtx) => {
  if (v.outOfService && !(v.outOfServiceReason && v.outOfServiceReason.length >= 3)) {
    ctx.addIssue({ code: "custom", path: ["outOfServiceReason"], message: "Say why it is out of service (at least 3 characters)" });
  }
};

export const equipmentCreateSchema = z.object(base).strict().superRefine(needsReason);
export type EquipmentCreate = z.output<typeof equipmentCreateSchema>;
export type EquipmentCreateInput = z.input<typeof equipmentCreateSchema>;

export const equipmentPatchSchema = z
  .object({
    yardId: base.yardId.optional(),
    kind: base.kind.optional(),
    unitNumber: base.unitNumber.optional(),
    name: base.name.optional(),
    insulated: z.boolean({ error: "insulated must be true or false" }).optional(),
    dielectricTestedOn: calendarDay().nullable().optional(),
    annualInspectionOn: calendarDay().nullable().optional(),
    licence: z.enum(LICENCES, { error: "Choose cdl_a, cdl_b or null" }).nullable().optional(),
    outOfService: z.boolean({ error: "outOfService must be true or false" }).optional(),
    outOfServiceReason: z.string().trim().max(500, "At most 500 characters").nullable().optional(),
    version: z.number({ error: "version is required" }).int().min(0),
  })
  .strict()
  .superRefine(needsReason);
export type EquipmentPatch = z.output<typeof equipmentPatchSchema>;

export const equipmentListQuerySchema = z.object({
  yard: z.string().trim().max(20).optional(),
  kind: z.enum(EQUIPMENT_KINDS, { error: `Choose one of ${EQUIPMENT_KINDS.join(", ")}` }).optional(),
  inService: z.enum(["1", "0"], { error: "inService is 1 or 0" }).optional(),
});

const wll = z
  .number({ error: "wllLb must be a number of pounds" })
  .int("wllLb in whole pounds")
  .positive("wllLb must be more than 0 lb")
  .max(100_000, "wllLb at most 100,000 lb");
const rigBase = {
  label: z.string({ error: "Enter a label" }).trim().min(1, "Enter a label").max(120, "At most 120 characters"),
  wllLb: wll,
  inspectedOn: optionalDay,
};

export const riggingCreateSchema = z
  .discriminatedUnion(
    "kind",
    [
      z
        .object({
          kind: z.literal("rope_block"),
          ...rigBase,
          partsOfLine: z
            .number({ error: "partsOfLine must be a number" })
            .int("partsOfLine must be a whole number")
            .min(1, "partsOfLine must be at least 1")
            .max(12, "partsOfLine at most 12"),
          sheaves: z.number({ error: "sheaves must be a number" }).int("sheaves must be a whole number").min(1, "sheaves must be at least 1").max(12, "sheaves at most 12").optional(),
        })
        .strict(),
      z.object({ kind: z.literal("hand_line"), ...rigBase }).strict(),
      z.object({ kind: z.literal("sling"), ...rigBase }).strict(),
    ],
    { error: `kind is one of ${RIGGING_KINDS.join(", ")}` },
  );
export type RiggingCreate = z.output<typeof riggingCreateSchema>;

export const equipmentAssignSchema = z
  .object({
    workOrderId: id("workOrderId"),
    equipmentId: id("equipmentId"),
    /** The order's version the client saw; a stale one is a 409. */
    orderVersion: z.number().int().min(0).optional(),
  })
  .strict();
export type EquipmentAssignInput = z.output<typeof equipmentAssignSchema>;

export const equipmentMoveSchema = z
  .object({
    workOrderId: id("workOrderId"),
    version: z.number({ error: "version is required" }).int().min(0),
  })
  .strict();
export type EquipmentMoveInput = z.output<typeof equipmentMoveSchema>;

export const equipmentUnassignSchema = z.object({
  version: z.coerce.number({ error: "version is required" }).int().min(0),
});
