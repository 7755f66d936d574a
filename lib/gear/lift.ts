import { z } from "zod";

// The lift plan of a work order: what is lifted, with which rope blocks, hand line and slings,
// and the crew lead's confirmation. Types and schemas shared by the route, the order page's
// form, the briefing and the tests; the figures themselves come from the rule engine
// (lib/rules: lead-line pull, block load, sling leg load per CREW-CHECK.md).

/**
 * Orders of a lifting kind get a lift plan without being marked: a transformer set or
 * change-out, named so in the work type or the order's title. Any other order may have one
 * when the dispatcher adds it.
 */
export function isLiftingKind(o: { workTypeCode?: string | null; workTypeName?: string | null; title?: string | null }): boolean {
  const text = `${o.workTypeCode ?? ""} ${o.workTypeName ?? ""} ${o.title ?? ""}`;
  return /transformer/i.test(text);
}

/** One stored plan, as the API and the pages show it. */
export interface LiftPlan {
  id: number;
  workOrderId: number;
  loadLabel: string | null;
  loadLb: number;
  partsOfLine: number;
  sheaves: number;
  frictionPerSheave: number;
  blockRiggingId: number | null;
  blockWllLb: number | null;
  lineRiggingId: number | null;
  lineWllLb: number | null;
  slingRiggingId: number | null;
  slingWllLb: number | null;
  slingLegs: number;
  slingAngleDeg: number;
  note: string | null;
  version: number;
  updatedAt: string | null;
  siteWeightLb: number | null;
  confirmedBy: string | null;
  confirmedAt: string | null;
  /** The plan was changed after the crew lead confirmed it. */
  confirmedStale: boolean;
}

/** A rigging item the order's truck carries (the equipment register's rows). */
export interface RiggingChoice {
  id: number;
  equipmentId: number;
  unitNumber: string;
  kind: "rope_block" | "hand_line" | "sling";
  label: string;
  partsOfLine: number | null;
  sheaves: number | null;
  wllLb: number;
  inspectedOn: string | null;
}

/**
 * The rule engine's lift input (CREW-CHECK.md, workOrders[].lift). The weight the crew lead
 * read on site counts when it is heavier than the planned nameplate weight.
 */
export function toRuleLift(p: Pick<LiftPlan, "loadLb" | "siteWeightLb" | "partsOfLine" | "sheaves" | "frictionPerSheave" | "blockWllLb" | "lineWllLb" | "slingWllLb" | "slingLegs" | "slingAngleDeg">) {
  return {
    loadLb: Math.max(p.loadLb, p.siteWeightLb ?? 0),
    partsOfLine: p.partsOfLine,
    sheaves: p.sheaves,
    frictionPerSheave: p.frictionPerSheave,
    blockWllLb: p.blockWllLb,
    lineWllLb: p.lineWllLb,
    slingWllLb: p.slingWllLb,
    slingLegs: p.slingLegs,
    slingAngleDeg: p.slingAngleDeg,
  };
}

const wll = (what: string) =>
  z
    .number({ error: `the ${what}'s working load limit in lb` })
    .int(`the ${what}'s working load limit in whole lb`)
    .positive(`the ${what}'s working load limit must be more than 0 lb`)
    .max(200_000, "more than 200,000 lb")
    .nullable()
    .optional();
const riggingId = z.number().int().positive().nullable().optional();

/** PUT /api/orders/[id]/lift (dispatcher, supervisor, admin). */
export const liftPlanSchema = z
  .object({
    version: z.number().int().positive().optional(),
    loadLabel: z.string().trim().max(120, "at most 120 characters").nullable().optional(),
    loadLb: z
      .number({ error: "the load's nameplate weight in lb" })
      .positive("the weight must be more than 0 lb (a negative or zero weight is not a load)")
      .max(100_000, "more than 100,000 lb: not a pole-line lift"),
    partsOfLine: z
      .number({ error: "the parts of line supporting the load" })
      .int("a whole number of parts of line")
      .min(1, "at least 1 part of line")
      .max(12, "at most 12 parts of line"),
    sheaves: z.number().int("a whole number of sheaves").min(0, "not negative").max(12, "at most 12 sheaves").optional(),
    frictionPerSheave: z.number().min(0, "not negative").max(0.5, "at most 0.5 per sheave").optional(),
    blockRiggingId: riggingId,
    blockWllLb: wll("block"),
    lineRiggingId: riggingId,
    lineWllLb: wll("hand line"),
    slingRiggingId: riggingId,
    slingWllLb: wll("sling"),
    slingLegs: z.number().int("a whole number of sling legs").min(1, "at least 1 sling leg").max(4, "at most 4 sling legs").default(1),
    slingAngleDeg: z
      .number({ error: "the sling angle from the horizontal in degrees" })
      .min(1, "the sling angle is measured from the horizontal: 1 to 90 degrees")
      .max(90, "the sling angle is measured from the horizontal: 1 to 90 degrees")
      .default(90),
    note: z.string().trim().max(500, "at most 500 characters").nullable().optional(),
  })
  .strict();
export type LiftPlanInput = z.input<typeof liftPlanSchema>;
export type LiftPlanBody = z.output<typeof liftPlanSchema>;

/** POST /api/briefings/[orderId]/lift: the crew lead confirms the plan and the weight read on site. */
export const liftConfirmSchema = z
  .object({
    version: z.number({ error: "the plan version you read (reload and try again)" }).int().positive(),
    siteWeightLb: z
      .number({ error: "the weight read off the nameplate on site, in lb" })
      .positive("the weight must be more than 0 lb")
      .max(100_000, "more than 100,000 lb"),
  })
  .strict();
export type LiftConfirm = z.output<typeof liftConfirmSchema>;

/** The caution shown beside every field figure. */
export const FIGURES_CAUTION =
  "These figures assist the crew; the employer's procedures, the manufacturer's ratings, the regulations (OSHA 29 CFR 1910.269, the NESC, local codes) and the crew lead's judgement decide.";
