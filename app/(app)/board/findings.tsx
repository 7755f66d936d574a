"use client";

import { useState } from "react";
import type { OverrideView } from "@/lib/board/model";
import type { Finding } from "@/lib/rules/types";
import { Badge } from "@/components/status";
import { fixHint } from "@/lib/board/fix-hints";
import { ruleName } from "@/lib/rules/rule-labels";

export function FindingRow({
  finding: f,
  override,
  workerName,
  canOverride,
  onOverride,
}: {
  finding: Finding;
  override?: OverrideView;
  workerName?: string;
  canOverride: boolean;
  onOverride: (f: Finding) => void;
}) {
  const waived = override && !f.locked && f.level === "block";
  return (
    <li className="rounded-md bg-paper-200/60 px-2 py-1.5 text-xs" data-testid={`finding-${f.rule}`}>
      <div className="flex flex-wrap items-center gap-1.5">
        {waived ? (
          <Badge tone="overridden">Overridden</Badge>
        ) : f.level === "block" ? (
          <Badge tone="block">Block</Badge>
        ) : (
          <Badge tone="warn">Warn</Badge>
        )}
        <span className="font-extrabold">{ruleName(f.rule)}</span>
        <span className="text-[11px] text-ink-500">{f.rule}</span>
        {workerName && <span className="font-semibold text-ink-700">· {workerName}</span>}
        {f.locked && <span className="font-semibold text-block">· locked, no override</span>}
      </div>
      <p className="mt-0.5 text-ink-700">{f.message}</p>
      <p className="mt-0.5 text-[11px] text-ink-500">Source: {f.source}</p>
      <FixLine finding={f} />
      {waived && (
        <p className="mt-0.5 text-[11px] text-waived">
          ✎ {override.actorName}: “{override.reason}”
        </p>
      )}
      {f.level === "block" && !f.locked && !waived && (
        <div className="mt-1">
          {canOverride ? (
            <button type="button" className="btn-quiet px-2 py-0.5 text-xs" onClick={() => onOverride(f)}>
              Override with a reason…
            </button>
          ) : (
            <span className="text-[11px] text-ink-500">Only a supervisor can override this; fix the crew or ask one.</span>
          )}
        </div>
      )}
    </li>
  );
}

function FixLine({ finding: f }: { finding: Finding }) {
  const hint = fixHint(f.rule);
  if (!hint) return null;
  return (
    <p className="mt-0.5 text-[11px] text-ink-700" data-testid={`fix-${f.rule}`}>
      <span className="font-bold">What to do:</span> {hint.text}
      {hint.link && (
        <>
          {" "}
          <a className="font-semibold text-copper underline" href={hint.link.href(f.workOrderId)}>
            {hint.link.label}
          </a>
        </>
      )}
    </p>
  );
}

export function OverrideDialog({
  finding,
  orderNumber,
  onClose,
  onSubmit,
}: {
  finding: Finding;
  orderNumber: string;
  onClose: () => void;
  onSubmit: (reason: string) => Promise<string | null>;
}) {
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const short = reason.trim().length < 15;
  return (
    <div className="fixed inset-0 z-50 flex items-center justify-center bg-ink/50 p-4" role="dialog" aria-modal="true" aria-labelledby="ovr-title">
      <form
        className="card w-full max-w-md bg-paper p-5"
        onSubmit={async (e) => {
          e.preventDefault();
          setBusy(true);
          const err = await onSubmit(reason.trim());
          setBusy(false);
          if (err) setError(err);
        }}
      >
        <h2 id="ovr-title" className="text-lg font-extrabold">
          Override {finding.rule} on {orderNumber}
        </h2>
        <p className="mt-1 text-sm text-ink-700">{finding.message}</p>
        <p className="mt-1 text-xs text-ink-500">Source: {finding.source}</p>
        <label htmlFor="ovr-reason" className="label mt-4">
          Reason (at least 15 characters, kept in the audit log)
        </label>
        <textarea
          id="ovr-reason"
          name="reason"
          className="field min-h-24"
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-invalid={error ? true : undefined}
          autoFocus
        />
        <p className="mt-1 text-xs text-ink-500">{reason.trim().length} / 15 characters minimum</p>
        {error && (
          <p role="alert" className="mt-2 rounded bg-block-bg px-2 py-1 text-sm font-semibold text-block">
            ✖ {error}
          </p>
        )}
        <p className="mt-3 text-xs text-ink-500">
          The override holds for this crew only: any change to the crew lapses it.
        </p>
        <div className="mt-4 flex justify-end gap-2">
          <button type="button" className="btn-quiet" onClick={onClose}>
            Cancel
          </button>
          <button type="submit" className="btn-accent" disabled={busy || short}>
            Record override
          </button>
        </div>
      </form>
    </div>
  );
}
