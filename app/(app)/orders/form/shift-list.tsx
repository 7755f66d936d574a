"use client";

import { useFieldArray } from "react-hook-form";
import { FieldError, TextField } from "@/components/form/fields";
import { dailyShifts, fieldError, plusDays, type OrderFormApi } from "./shared";

/** A multi-day order's working shifts, inside the order and not overlapping. */
export function ShiftList({ form, start, end }: { form: OrderFormApi; start: string; end: string }) {
  const { register, watch } = form;
  const rows = useFieldArray({ control: form.control, name: "shifts" as never });
  const list = (watch("shifts") ?? []) as { start: string; end: string }[];
  const err = (name: string) => fieldError(form, name);
  return (
    <div className="space-y-2 rounded-md border border-rule bg-white p-3" data-testid="order-shifts">
      <p className="text-sm font-bold">Shifts</p>
      <p className="text-xs text-ink-500">
        A multi-day order lists the hours the crew actually works, inside the order and not overlapping. The rest rule counts these shifts,
        not the whole span; credentials must be valid on every day.
      </p>
      <ul className="space-y-1.5" aria-label="Shifts">
        {rows.fields.map((f, i) => (
          <li key={f.id} className="grid grid-cols-[1fr_1fr_auto] items-start gap-2">
            <TextField hideLabel label={`Shift ${i + 1} start`} type="datetime-local" error={err(`shifts.${i}.start`)} {...register(`shifts.${i}.start` as never)} />
            <TextField hideLabel label={`Shift ${i + 1} end`} type="datetime-local" error={err(`shifts.${i}.end`)} {...register(`shifts.${i}.end` as never)} />
            <button type="button" className="btn-quiet px-2" aria-label={`Remove shift ${i + 1}`} onClick={() => rows.remove(i)}>
              ✕
            </button>
          </li>
        ))}
      </ul>
      <div className="flex flex-wrap items-center gap-2">
        <button
          type="button"
          className="btn-quiet"
          onClick={() => {
            const last = list[list.length - 1];
            const next = last ? { start: plusDays(last.start, 1), end: plusDays(last.end, 1) } : (dailyShifts(start, end)[0] ?? { start, end });
            rows.append(next as never);
          }}
        >
          Add shift
        </button>
        {list.length === 0 && (
          <button type="button" className="text-xs font-semibold text-copper hover:underline" onClick={() => rows.replace(dailyShifts(start, end) as never)}>
            One shift a day at the order&apos;s hours
          </button>
        )}
      </div>
      <FieldError msg={err("shifts")} />
    </div>
  );
}
