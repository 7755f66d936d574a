"use client";

// The fill's progress while it runs (issue 19): the step the server reports, the time against
// the limit, the solver's gap while it prices, and a cancel button that stops the server's work.

import { FILL_PHASES, type FillProgress } from "@/lib/fill/types";

const pct = (g: number) => `${g >= 10 ? ">1000" : (Math.round(g * 1000) / 10).toFixed(1)} %`;

export function FillProgressCard({ progress, elapsed, limit, onCancel }: { progress: FillProgress | null; elapsed: number; limit: number; onCancel: () => void }) {
  const step = progress ? FILL_PHASES.findIndex((p) => p.phase === progress.phase) : -1;
  const label = step >= 0 ? FILL_PHASES[step].label : "Asking the server";
  // The bar follows the steps; within the solve (steps 3 and 4) it follows the time against
  // the limit, where the solver stops.
  const n = FILL_PHASES.length;
  const base = step < 0 ? 0 : step / n;
  const solving = progress?.phase === "staffing" || progress?.phase === "cost";
  const share = solving ? Math.max(base, 2 / n + Math.min(1, elapsed / limit) * (2 / n)) : base;
  const width = Math.round(Math.min(1, share) * 100);
  return (
    <div className="card p-4" data-testid="fill-progress">
      <div className="flex items-start justify-between gap-3">
        <p className="text-sm font-bold" data-testid="fill-phase" aria-live="polite">
          {step >= 0 ? `Step ${step + 1} of ${FILL_PHASES.length}: ` : ""}
          {label}…
        </p>
        <button type="button" className="btn-quiet" onClick={onCancel} data-testid="fill-cancel">
          Cancel
        </button>
      </div>
      <div
        role="progressbar"
        aria-label="Fill progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={width}
        aria-valuetext={`${label}, ${elapsed.toFixed(0)} s`}
        className="mt-2 h-2 w-full overflow-hidden rounded bg-paper-200"
      >
        <div className="h-full bg-copper transition-all" style={{ width: `${width}%` }} />
      </div>
      <p className="mt-1 text-xs text-ink-500">
        {elapsed.toFixed(0)} s of about {limit} s (the time limit covers the whole fill; the crew rules re-check the answer)
        {progress?.gap !== null && progress?.gap !== undefined ? ` · gap to the bound ${pct(progress.gap)}` : ""}. Cancel stops the work on the server; nothing is
        placed until you accept.
      </p>
    </div>
  );
}

/** The time limit and the optimality gap the fill is asked for. */
export function SolverSettings({
  limit,
  gap,
  setLimit,
  setGap,
  disabled,
}: {
  limit: number;
  gap: number;
  setLimit: (n: number) => void;
  setGap: (n: number) => void;
  disabled: boolean;
}) {
  return (
    <details className="text-sm">
      <summary className="cursor-pointer text-ink-700">Solver settings</summary>
      <div className="mt-2 flex flex-wrap items-end gap-3">
        <label className="text-sm">
          <span className="label">Time limit</span>
          <select className="field w-auto" value={limit} onChange={(e) => setLimit(Number(e.target.value))} disabled={disabled}>
            {[5, 10, 30, 60].map((s) => (
              <option key={s} value={s}>
                {s} s
              </option>
            ))}
          </select>
        </label>
        <label className="text-sm">
          <span className="label">Optimality gap</span>
          <select className="field w-auto" value={gap} onChange={(e) => setGap(Number(e.target.value))} disabled={disabled}>
            {[0, 0.01, 0.05].map((g) => (
              <option key={g} value={g}>
                {g === 0 ? "0 % (proven best)" : `${g * 100} %`}
              </option>
            ))}
          </select>
        </label>
      </div>
    </details>
  );
}
