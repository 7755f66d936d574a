// What the order form's parts share: its value shape, the form handle, and day arithmetic on
// "YYYY-MM-DDTHH:mm" wall-clock strings.
import type { UseFormReturn } from "react-hook-form";
import { errorAt } from "@/components/form/fields";
import type { OrderEditValues } from "@/lib/orders/schema";
import type { Position } from "@/lib/rules/types";

export interface YardOption {
  id: number;
  code: string;
  name: string;
  timezone: string;
}

export type Mode = "new" | "edit" | "series";

export type OrderFormShape = Omit<OrderEditValues, "version"> & {
  version?: number;
  recurrence?: { rrule: string; exdates: string[] } | null;
};

export type OrderFormApi = UseFormReturn<OrderFormShape>;

/** A position row of the crew list (`id` once it is a saved seat). */
export interface Row {
  id?: number;
  position: Position;
}

export const nullableNumber = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));
export const emptyToNull = (v: unknown) => v || null;

/** The message on a (dotted) field of the order form, if any. */
export const fieldError = (form: OrderFormApi, name: string) => errorAt(form.formState.errors, name);

/** "YYYY-MM-DDTHH:mm" moved by whole calendar days (wall clock, no zone). */
export function plusDays(wall: string, days: number) {
  const [y, m, d] = wall.slice(0, 10).split("-").map(Number);
  const t = new Date(Date.UTC(y, m - 1, d + days));
  return `${t.toISOString().slice(0, 10)}${wall.slice(10, 16)}`;
}

/** One shift a day from the order's first day to its last, each at the order's start and end clock times. */
export function dailyShifts(start: string, end: string): { start: string; end: string }[] {
  if (start.length < 16 || end.length < 16 || end <= start) return [];
  const out: { start: string; end: string }[] = [];
  const from = start.slice(11, 16);
  const to = end.slice(11, 16);
  for (let day = start.slice(0, 10), i = 0; day <= end.slice(0, 10) && i < 31; day = plusDays(`${day}T00:00`, 1).slice(0, 10), i++) {
    const s = `${day}T${from}`;
    const e = to > from ? `${day}T${to}` : plusDays(`${day}T${to}`, 1);
    if (s >= start.slice(0, 16) && e <= end.slice(0, 16)) out.push({ start: s, end: e });
  }
  return out;
}
