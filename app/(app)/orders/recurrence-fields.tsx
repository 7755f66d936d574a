"use client";

import { useMemo, useState } from "react";
import {
  NTH_LABEL,
  WEEKDAYS,
  WEEKDAY_LABEL,
  buildRrule,
  floating,
  floatingToLocal,
  occurrences,
  parseRrule,
  type RepeatForm,
  type WeekdayCode,
} from "@/lib/recurrence-core";
import { FieldError } from "@/components/form-bits";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { fmtLocal } from "@/lib/zoned-format";

/** An occurrence's end: the same wall-clock length after its start (as the server makes it). */
const endOf = (local: string, minutes: number, tz: string) => zonedWallTimeToEpoch(floatingToLocal(floating(local) + minutes * 60_000), tz);

interface Props {
  value: RepeatForm;
  onChange: (v: RepeatForm) => void;
  exdates: string[];
  onExdatesChange: (d: string[]) => void;
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
export function RecurrenceFields({ value, onChange, exdates, onExdatesChange, start, durationMinutes, timezone, previewFrom, allowNone, error }: Props) {
  const [skipDate, setSkipDate] = useState("");
  const set = (patch: Partial<RepeatForm>) => onChange({ ...value, ...patch });
  const rrule = buildRrule(value);
  const startOk = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(start);

  const preview = useMemo(() => {
    if (!rrule || !startOk) return { list: [], problem: null as string | null };
    const parsed = parseRrule(rrule);
    if (!parsed.ok) return { list: [], problem: parsed.message };
    try {
      const from = previewFrom && previewFrom > start.slice(0, 10) ? previewFrom : undefined;
      const list = occurrences({ rrule, dtstartLocal: start, exdates }, timezone, { from, limit: 8 });
      return { list, problem: list.length ? null : "This rule gives no dates from the start on." };
    } catch (err) {
      return { list: [], problem: (err as Error).message };
    }
  }, [rrule, start, startOk, exdates, timezone, previewFrom]);

  const firstIsStart = preview.list[0]?.date === start.slice(0, 10);

  return (
    <div className="space-y-3">
      <div>
        <label className="label" htmlFor="repeat-kind">
          Repeats
        </label>
        <select
          id="repeat-kind"
          className="field"
          value={value.kind}
          onChange={(e) => set({ kind: e.target.value as RepeatForm["kind"] })}
        >
          {(Object.keys(KIND_LABEL) as RepeatForm["kind"][])
            .filter((k) => allowNone || k !== "none")
            .map((k) => (
              <option key={k} value={k}>
                {KIND_LABEL[k]}
              </option>
            ))}
        </select>
      </div>

      {value.kind !== "none" && value.kind !== "custom" && (
        <div className="flex flex-wrap items-end gap-3">
          <div className="w-28">
            <label className="label" htmlFor="repeat-interval">
              Every
            </label>
            <input
              id="repeat-interval"
              type="number"
              min={1}
              max={52}
              className="field"
              value={value.interval}
              onChange={(e) => set({ interval: Math.max(1, Number(e.target.value) || 1) })}
            />
          </div>
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
          <div>
            <label className="label" htmlFor="repeat-nth">
              On the
            </label>
            <select id="repeat-nth" className="field" value={value.nth} onChange={(e) => set({ nth: Number(e.target.value) })}>
              {Object.entries(NTH_LABEL).map(([n, label]) => (
                <option key={n} value={n}>
                  {label}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label className="label" htmlFor="repeat-weekday">
              Weekday
            </label>
            <select
              id="repeat-weekday"
              className="field"
              value={value.weekday}
              onChange={(e) => set({ weekday: e.target.value as WeekdayCode })}
            >
              {WEEKDAYS.map((d) => (
                <option key={d} value={d}>
                  {WEEKDAY_LABEL[d]}
                </option>
              ))}
            </select>
          </div>
          <span className="pb-2 text-sm text-ink-700">of the month</span>
        </div>
      )}

      {value.kind === "custom" && (
        <div>
          <label className="label" htmlFor="repeat-custom">
            RRULE (RFC 5545)
          </label>
          <input
            id="repeat-custom"
            className="field font-mono"
            placeholder="FREQ=MONTHLY;BYMONTHDAY=15;COUNT=6"
            value={value.custom}
            onChange={(e) => set({ custom: e.target.value })}
          />
          <p className="mt-1 text-xs text-ink-500">At most once a day. Times come from the order&apos;s start.</p>
        </div>
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
        <>
          <div>
            <p className="label">Skipped dates</p>
            <div className="flex flex-wrap items-center gap-2">
              {exdates.length === 0 && <span className="text-sm text-ink-500">None</span>}
              {exdates.map((d) => (
                <span key={d} className="inline-flex items-center gap-1 rounded bg-paper-200 px-2 py-1 text-xs font-semibold">
                  {d}
                  <button
                    type="button"
                    className="text-ink-500 hover:text-block"
                    aria-label={`Stop skipping ${d}`}
                    onClick={() => onExdatesChange(exdates.filter((x) => x !== d))}
                  >
                    ✕
                  </button>
                </span>
              ))}
              <input type="date" aria-label="Date to skip" className="field w-auto" value={skipDate} onChange={(e) => setSkipDate(e.target.value)} />
              <button
                type="button"
                className="btn-quiet"
                disabled={!skipDate}
                onClick={() => {
                  if (skipDate && !exdates.includes(skipDate)) onExdatesChange([...exdates, skipDate].sort());
                  setSkipDate("");
                }}
              >
                Skip date
              </button>
            </div>
          </div>

          <div className="rounded-md border border-rule bg-white p-3" aria-live="polite">
            <p className="label">Next occurrences ({timezone})</p>
            {rrule && <p className="mb-2 font-mono text-xs text-ink-500">RRULE:{rrule}</p>}
            {preview.problem && <FieldError msg={preview.problem} />}
            {!preview.problem && startOk && preview.list.length > 0 && !firstIsStart && !previewFrom && (
              <p className="mb-2 text-xs font-semibold text-warn">▲ The start date is not one of the repeat days; the first order is the first date below.</p>
            )}
            <ol className="space-y-1 text-sm" data-testid="occurrence-preview">
              {preview.list.map((o) => (
                <li key={o.date} className="flex items-center justify-between gap-2">
                  <span className="tabular-nums">
                    {fmtLocal(o.start, timezone)}
                    {durationMinutes ? ` – ${fmtLocal(endOf(o.local, durationMinutes, timezone), timezone, { weekday: undefined, month: undefined, day: undefined })}` : ""}
                  </span>
                  <button type="button" className="text-xs font-semibold text-copper hover:underline" onClick={() => onExdatesChange([...exdates, o.date].sort())}>
                    Skip
                  </button>
                </li>
              ))}
            </ol>
          </div>
        </>
      )}
    </div>
  );
}
