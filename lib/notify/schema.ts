import { z } from "zod";
import { calendarDay } from "@/lib/time/days";

const isoDate = calendarDay();
const e164 = z.string().trim().regex(/^\+[1-9]\d{6,14}$/, "Use an E.164 number such as +13205550101");

export const sendCrewsSchema = z.object({
  date: isoDate,
  yard: z.string({ error: "yard is required" }).trim().min(1, "yard is required").max(20),
});

export const respondSchema = z.object({
  answer: z.enum(["confirm", "decline"], { error: "answer must be confirm or decline" }),
  reason: z.string().trim().max(500, "Keep the reason under 500 characters").optional().nullable(),
});

export const phoneQuerySchema = z.object({ phone: e164 });

export const phoneReplySchema = z.object({
  from: e164,
  body: z.string().trim().min(1, "Type a reply").max(1600, "A text is at most 1600 characters"),
});

export const messagesFilterSchema = z.object({
  channel: z.enum(["sms", "email", "inbound"]).optional().catch(undefined),
  state: z.enum(["queued", "sending", "sent", "failed"]).optional().catch(undefined),
  worker: z.coerce.number().int().positive().optional().catch(undefined),
  day: isoDate.optional().catch(undefined),
});

export type SendCrewsInput = z.infer<typeof sendCrewsSchema>;
export type RespondBody = z.infer<typeof respondSchema>;
export type MessagesFilter = z.infer<typeof messagesFilterSchema>;
