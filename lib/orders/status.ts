// Order statuses and their words. Pure: shared by server pages, client forms and the board.
import type { Tone } from "@/lib/tone";

export const ORDER_STATUSES = ["draft", "planned", "sent", "in_progress", "done", "on_hold", "cancelled"] as const;
export type OrderStatus = (typeof ORDER_STATUSES)[number];

export const STATUS_LABEL: Record<OrderStatus, string> = {
  draft: "Draft",
  planned: "Planned",
  sent: "Sent",
  in_progress: "In progress",
  done: "Done",
  on_hold: "On hold",
  cancelled: "Cancelled",
};

export const STATUS_TONE: Record<OrderStatus, Tone> = {
  draft: "muted",
  planned: "info",
  sent: "info",
  in_progress: "info",
  done: "clear",
  on_hold: "warn",
  cancelled: "muted",
};

export const CREW_EXCEPTION_LABEL: Record<string, string> = {
  routine_switching: "Routine switching",
  live_line_tools: "Live-line tools, out of reach",
  emergency: "Emergency repair (public safety)",
};

export const LICENCE_LABEL: Record<string, string> = { cdl_a: "CDL class A", cdl_b: "CDL class B" };

export const PRIORITY_LABEL: Record<number, string> = {
  1: "1 · urgent",
  2: "2 · high",
  3: "3 · normal",
  4: "4 · low",
  5: "5 · whenever",
};
