import { z } from "zod";
import { calendarDay } from "@/lib/time/days";

// Fill open positions and call-out lists (issue 9).

const id = (name: string) => z.number({ error: `${name} must be a number` }).int().positive().max(2_147_483_647);
const isoDate = calendarDay();
const yard = z.string({ error: "yard is required" }).trim().min(1, "yard is required").max(20);

export const fillRequestSchema = z.object({
  date: isoDate,
  yard,
  /** HiGHS time limit, seconds. */
  timeLimitSeconds: z.number({ error: "timeLimitSeconds must be a number" }).min(1, "At least 1 second").max(60, "At most 60 seconds").optional(),
  /** Relative MIP gap as a fraction (0.01 = 1 %). */
  gap: z.number({ error: "gap must be a number" }).min(0, "The gap cannot be negative").max(0.5, "At most 0.5 (50 %)").optional(),
});

export const fillAcceptSchema = z.object({
  date: isoDate,
  yard,
  proposals: z
    .array(z.object({ positionId: id("positionId"), workerId: id("workerId") }), { error: "proposals must be a list" })
    .min(1, "Choose at least one proposal")
    .max(2000, "At most 2000 proposals at once"),
  /** Issue 16: the trucks the fill proposed for these orders. */
  trucks: z
    .array(z.object({ workOrderId: id("workOrderId"), equipmentId: id("equipmentId") }), { error: "trucks must be a list" })
    .max(500, "At most 500 trucks at once")
    .default([]),
});

export const calloutQuerySchema = z.object({
  positionId: z.coerce.number({ error: "positionId must be a number" }).int().positive().max(2_147_483_647),
});

export const calloutPlaceSchema = z.object({
  positionId: id("positionId"),
  workerId: id("workerId"),
  /** Text them straight away (through Send crews for the day) when nothing else is waiting to be sent. */
  text: z.boolean().default(true),
});

export type FillRequest = z.infer<typeof fillRequestSchema>;
export type FillAccept = z.infer<typeof fillAcceptSchema>;
