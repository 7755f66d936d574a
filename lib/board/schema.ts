import { z } from "zod";
import { RULE_CODES } from "@/lib/rules/types";
import { calendarDay } from "@/lib/time/days";

const id = (name: string) => z.number({ error: `${name} must be a number` }).int().positive().max(2_147_483_647);
const isoDate = calendarDay();

export const boardQuerySchema = z.object({
  date: isoDate.optional(),
  yard: z.string().trim().max(20).optional(),
});

export const eventsQuerySchema = z.object({
  after: z.coerce.number().int().min(0),
  date: isoDate,
  yard: z.string().trim().min(1).max(20),
});

export const createAssignmentSchema = z.object({
  positionId: id("positionId"),
  workerId: id("workerId"),
  orderVersion: z.number().int().min(0).optional(),
});

export const moveAssignmentSchema = z.object({
  positionId: id("positionId"),
  version: z.number({ error: "version is required" }).int().min(0),
});

export const removeAssignmentSchema = z.object({
  version: z.coerce.number({ error: "version is required" }).int().min(0),
});

export const overrideSchema = z.object({
  workOrderId: id("workOrderId"),
  rule: z.enum(RULE_CODES),
  workerId: id("workerId").nullable().default(null),
  reason: z
    .string({ error: "reason is required" })
    .trim()
    .min(15, "Give a reason of at least 15 characters: what makes this safe")
    .max(1000),
});

export type CreateAssignmentInput = z.infer<typeof createAssignmentSchema>;
export type OverrideInput = z.infer<typeof overrideSchema>;

const assignmentRef = (name: string) =>
  z.object({
    id: id(`${name}.id`),
    version: z.number({ error: `${name}.version is required` }).int().min(0),
  });

/** Swap two placed workers (issue 18): each side names its assignment and the version seen. */
export const swapAssignmentsSchema = z.object({ a: assignmentRef("a"), b: assignmentRef("b") }).strict();
