"use client";

import { useMemo, useState } from "react";
import { FieldError } from "@/components/form/fields";
import { floating, floatingToLocal, occurrences, parseRrule } from "@/lib/time/recurrence";
import { zonedWallTimeToEpoch } from "@/lib/rules/time";
import { fmtLocal } from "@/lib/time/zoned-format";

/** An occurrence's end: the same wall-clock length after its start (as the server makes it). */
const endOf = (local: string, minutes: number, tz: string) => zonedWallTimeToEpoch(floatingToLocal(floating(local) + minutes * 60_000), tz);

/**
 * The repeat's skipped dates and its next occurrences, computed here with the same function the
 * server uses to materialise them.
 */
export function RecurrencePreview({
  rrule,
  start,
  exdates,
  onExdatesChange,
  durationMinutes,
  timezone,
  previewFrom,
}: {
  rrule: string | null;
  start: string;
  exdates: string[];
  onExdatesChange: (d: string[]) => void;
  durationMinutes: number | null;
  timezone: string;
  previewFrom?: string;
}) {
  const [skipDate, setSkipDate] = useState("");
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
    <>
      <div>
        <p className="label">Skipped dates</p>
        <div className="flex flex-wrap items-center gap-2">
          {exdates.length === 0 && <span className="text-sm text-ink-500">None</span>}
          {exdates.map((d) => (
            <span key={d} className="inline-flex items-center gap-1 rounded bg-paper-200 px-2 py-1 text-xs font-semibold">
              {d}
              <button type="button" className="text-ink-500 hover:text-block" aria-label={`Stop skipping ${d}`} onClick={() => onExdatesChange(exdates.filter((x) => x !== d))}>
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
  );
}
