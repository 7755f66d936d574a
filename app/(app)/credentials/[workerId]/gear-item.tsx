"use client";

import { useState } from "react";
import { FieldError, TextField } from "@/components/form/fields";
import { GearStateBadge } from "@/components/gear-state";
import { useApiMutation } from "@/lib/api/mutations";
import { GEAR_KIND_LABEL, classLabel, type GearItem } from "@/lib/gear/model";

/** One item in service: its test state, and for HR a new test date or retirement (PATCH /api/gear/:id with its version). */
export function GearItemCard({ g, today, canEdit }: { g: GearItem; today: string; canEdit: boolean }) {
  const [testing, setTesting] = useState<string | null>(null);
  const patch = useApiMutation<Record<string, unknown>>({
    request: (body) => ({ url: `/api/gear/${g.id}`, method: "PATCH", body: { version: g.version, ...body } }),
    refresh: true,
    onSuccess: () => setTesting(null),
  });
  return (
    <li className="card p-3" data-testid={`gear-${g.serial}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <p className="font-semibold">
          {GEAR_KIND_LABEL[g.kind]} · {classLabel(g.class)}
        </p>
        <GearStateBadge state={g.state} dueOn={g.dueOn} daysLeft={g.daysLeft} />
      </div>
      <p className="text-sm tabular-nums text-ink-700">
        Serial {g.serial}
        {g.size ? ` · size ${g.size}` : ""} · tested {g.testedOn}
        {g.issuedOn ? ` · issued ${g.issuedOn}` : ""}
      </p>
      {canEdit && (
        <div className="mt-2 flex flex-wrap items-end gap-2">
          {testing !== null ? (
            <>
              <TextField id={`gear-test-${g.id}`} type="date" label="New test date" value={testing} max={today} onChange={(e) => setTesting(e.target.value)} />
              <button type="button" className="btn-primary" disabled={patch.isPending} onClick={() => patch.submit({ testedOn: testing })}>
                Save test
              </button>
              <button type="button" className="btn-quiet" onClick={() => setTesting(null)}>
                Cancel
              </button>
            </>
          ) : (
            <>
              <button type="button" className="btn-quiet" onClick={() => setTesting(today)}>
                Record a test
              </button>
              <button
                type="button"
                className="btn-quiet"
                disabled={patch.isPending}
                onClick={() => window.confirm(`Retire ${g.serial}? It stays on record but no longer counts.`) && patch.submit({ retiredOn: today })}
              >
                Retire
              </button>
            </>
          )}
        </div>
      )}
      {patch.errorText && <FieldError msg={patch.errorText} />}
    </li>
  );
}
