// The supervisors' queue (issue 18, point 13): blocks waiting on a supervisor, and overrides
// that lapsed when their crew changed. Plain JSON, client-safe.
import { z } from "zod";
import type { NoticeView } from "@/lib/notices/model";

export interface QueueBlock {
  orderId: number;
  orderNumber: string;
  orderTitle: string;
  yardCode: string;
  yardName: string;
  /** The order's day (YYYY-MM-DD, the yard's calendar) and its start in words with the zone. */
  day: string;
  startWords: string;
  rule: string;
  ruleName: string;
  workerId: number | null;
  message: string;
  source: string;
}

export interface QueueLapse {
  overrideId: number;
  orderId: number;
  orderNumber: string;
  orderTitle: string;
  yardCode: string;
  day: string;
  rule: string;
  ruleName: string;
  workerName: string | null;
  reason: string;
  givenBy: string;
  givenAt: string;
  givenWords: string;
  lapsedAt: string;
  lapsedWords: string;
  lapsedBy: string | null;
  change: string | null;
  /** Whether the block is back on the order now (the crew as it is still raises it). */
  blockNow: boolean | null;
}

export interface QueuePayload {
  yards: { id: number; code: string; name: string }[];
  /** From (today in the first yard's zone) and the last day looked at. */
  from: string;
  to: string;
  blocks: QueueBlock[];
  lapsed: QueueLapse[];
  notices: NoticeView[];
}

/** How many days ahead the queue looks for blocks (today included). */
export const QUEUE_DAYS = 8;

export const queueQuerySchema = z.object({
  yard: z
    .string()
    .trim()
    .regex(/^[A-Za-z0-9_-]{1,10}$/, "yard must be a yard code such as NOR")
    .optional(),
});

export const noticesReadSchema = z.strictObject({
  ids: z.union([z.literal("all"), z.array(z.number({ error: "ids must be notice ids" }).int().positive()).min(1).max(200)], {
    error: 'ids must be "all" or a list of notice ids',
  }),
});
