"use client";

import { TextField } from "@/components/form/fields";
import { defaultRepeatForm, type RepeatForm } from "@/lib/time/recurrence";
import { RecurrenceFields } from "../recurrence-fields";
import { fieldError, type Mode, type OrderFormApi, type YardOption } from "./shared";
import { ShiftList } from "./shift-list";

/** Start and end on the yard's wall clock, the repeat rule, and a multi-day order's shifts. */
export function WhenSection({
  form,
  mode,
  yard,
  repeat: rec,
  durationMinutes,
  today,
}: {
  form: OrderFormApi;
  mode: Mode;
  yard: YardOption | undefined;
  /** The repeat rule and its skipped dates, kept by the order form. */
  repeat: { value: RepeatForm; set: (r: RepeatForm) => void; exdates: string[]; setExdates: (d: string[]) => void };
  durationMinutes: number | null;
  today?: string;
}) {
  const { register, watch } = form;
  const err = (name: string) => fieldError(form, name);
  const start = watch("start") ?? "";
  const end = watch("end") ?? "";
  const multiDay = start.length >= 10 && end.length >= 10 && end.slice(0, 10) > start.slice(0, 10);
  const shiftCount = ((watch("shifts") ?? []) as unknown[]).length;
  return (
    <section className="card space-y-3 p-4">
      <h2 className="font-bold">When</h2>
      <p className="text-xs text-ink-500">
        Wall-clock time at {yard?.name ?? "the yard"} ({yard?.timezone}). A repeating order keeps the same clock time across daylight-saving changes.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField
          type="datetime-local"
          label={mode === "series" ? "First start" : "Start"}
          error={err("start")}
          {...register("start", {
            onChange: (e) => {
              if (mode !== "edit" && rec.value.kind === "none") rec.set(defaultRepeatForm(String(e.target.value).slice(0, 10)));
            },
          })}
        />
        <TextField type="datetime-local" label={mode === "series" ? "First end" : "End"} error={err("end")} {...register("end")} />
      </div>
      {mode !== "edit" && yard && (
        <RecurrenceFields
          repeat={rec}
          start={start}
          durationMinutes={durationMinutes}
          timezone={yard.timezone}
          previewFrom={mode === "series" ? today : undefined}
          allowNone={mode === "new"}
          error={err("recurrence.rrule") ?? err("recurrence")}
        />
      )}
      {mode !== "series" && (multiDay || shiftCount > 0) && <ShiftList form={form} start={start} end={end} />}
    </section>
  );
}
