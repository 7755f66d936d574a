"use client";

import { FieldError, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { NTH_LABEL, WEEKDAYS, WEEKDAY_LABEL, buildRrule, type RepeatForm, type WeekdayCode } from "@/lib/time/recurrence";
import { RecurrencePreview } from "./recurrence-preview";

interface Props {
  /** The rule being edited and its skipped dates, with their setters. */
  repeat: { value: RepeatForm; set: (v: RepeatForm) => void; exdates: string[]; setExdates: (d: string[]) => void };
  /** The order's start (yard wall clock) — the series' first start. */
  start: string;
  /** Length in minutes, for the preview's end times. */
  durationMinutes: number | null;
  timezone: string;
  /** Preview from this local date on (default: the start). */
  previewFrom?: string;
  /** A series being edited must keep repeating (end it with "End series"). */
  allowNone: boolean;
  error?: string;
}

const KIND_LABEL: Record<RepeatForm["kind"], string> = {
  none: "Does not repeat",
  daily: "Daily",
  weekly: "Weekly on chosen days",
  monthly: "Monthly on the n-th weekday",
  custom: "Custom rule (RRULE)",
};

/**
 * The repeat part of the order form: the usual cases as fields, anything else as an RFC 5545
 * RRULE, skipped dates, and the next occurrences computed here with the same function the
 * server uses to materialise them.
 */
export function RecurrenceFields({ repeat, start, durationMinutes, timezone, previewFrom, allowNone, error }: Props) {
  const { value, set: onChange, exdates, setExdates: onExdatesChange } = repeat;
  const set = (patch: Partial<RepeatForm>) => onChange({ ...value, ...patch });
  const rrule = buildRrule(value);


  return (
    <div className="space-y-3">
      <SelectField id="repeat-kind" label="Repeats" value={value.kind} onChange={(e) => set({ kind: e.target.value as RepeatForm["kind"] })}>
        {(Object.keys(KIND_LABEL) as RepeatForm["kind"][])
          .filter((k) => allowNone || k !== "none")
          .map((k) => (
            <option key={k} value={k}>
              {KIND_LABEL[k]}
            </option>
          ))}
      </SelectField>

      {value.kind !== "none" && value.kind !== "custom" && (
        <div className="flex flex-wrap items-end gap-3">
          <TextField
            id="repeat-interval"
            wrapperClassName="w-28"
            label="Every"
            type="number"
            min={1}
            max={52}
            value={value.interval}
            onChange={(e) => set({ interval: Math.max(1, Number(e.target.value) || 1) })}
          />
          <span className="pb-2 text-sm text-ink-700">
            {value.kind === "daily" ? "day(s)" : value.kind === "weekly" ? "week(s)" : "month(s)"}
          </span>
        </div>
      )}

      {value.kind === "weekly" && (
        <fieldset>
          <legend className="label">On</legend>
          <div className="flex flex-wrap gap-1.5">
            {WEEKDAYS.map((d) => {
              const on = value.weekdays.includes(d);
              return (
                <label
                  key={d}
                  className={`cursor-pointer rounded-md border px-2.5 py-1.5 text-sm font-semibold ${
                    on ? "border-ink bg-ink text-paper" : "border-rule bg-white text-ink"
                  }`}
                >
                  <input
                    type="checkbox"
                    className="sr-only"
                    checked={on}
                    onChange={() =>
                      set({ weekdays: on ? value.weekdays.filter((x) => x !== d) : [...value.weekdays, d] })
                    }
                  />
                  {WEEKDAY_LABEL[d]}
                </label>
              );
            })}
          </div>
        </fieldset>
      )}

      {value.kind === "monthly" && (
        <div className="flex flex-wrap items-end gap-3">
          <SelectField id="repeat-nth" label="On the" value={value.nth} onChange={(e) => set({ nth: Number(e.target.value) })}>
            {Object.entries(NTH_LABEL).map(([n, label]) => (
              <option key={n} value={n}>
                {label}
              </option>
            ))}
          </SelectField>
          <SelectField id="repeat-weekday" label="Weekday" value={value.weekday} onChange={(e) => set({ weekday: e.target.value as WeekdayCode })}>
            <LabelOptions values={WEEKDAYS} labels={WEEKDAY_LABEL} />
          </SelectField>
          <span className="pb-2 text-sm text-ink-700">of the month</span>
        </div>
      )}

      {value.kind === "custom" && (
        <TextField
          id="repeat-custom"
          className="field font-mono"
          label="RRULE (RFC 5545)"
          placeholder="FREQ=MONTHLY;BYMONTHDAY=15;COUNT=6"
          hint="At most once a day. Times come from the order's start."
          value={value.custom}
          onChange={(e) => set({ custom: e.target.value })}
        />
      )}

      {value.kind !== "none" && value.kind !== "custom" && (
        <fieldset className="flex flex-wrap items-end gap-3">
          <legend className="label">Ends</legend>
          <select
            aria-label="Ends"
            className="field w-auto"
            value={value.end}
            onChange={(e) => set({ end: e.target.value as RepeatForm["end"] })}
          >
            <option value="never">No end date</option>
            <option value="until">On a date</option>
            <option value="count">After a number of times</option>
          </select>
          {value.end === "until" && (
            <input
              type="date"
              aria-label="Last date"
              className="field w-auto"
              value={value.until}
              onChange={(e) => set({ until: e.target.value })}
            />
          )}
          {value.end === "count" && (
            <input
              type="number"
              aria-label="Number of times"
              min={1}
              max={1000}
              className="field w-28"
              value={value.count}
              onChange={(e) => set({ count: Math.max(1, Number(e.target.value) || 1) })}
            />
          )}
        </fieldset>
      )}

      <FieldError msg={error} />

      {value.kind !== "none" && (
        <RecurrencePreview rrule={rrule} start={start} exdates={exdates} onExdatesChange={onExdatesChange} durationMinutes={durationMinutes} timezone={timezone} previewFrom={previewFrom} />
      )}
    </div>
  );
}
