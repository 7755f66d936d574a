"use client";

// What an accept placed and refused, and the crew rules' re-check of the orders it touched.

import { Badge } from "@/components/status";
import type { FillPreview } from "@/lib/fill/preview";

export interface AcceptAnswer {
  placed: number;
  refused: number;
  results: Array<{ positionId: number; workerId: number; ok: boolean; error?: string }>;
  /** Issue 16: the proposed trucks, booked or refused. */
  trucks?: Array<{ workOrderId: number; equipmentId: number; ok: boolean; error?: string }>;
  blocks: Array<{ rule: string; workOrderId: string; workerId: string | null; message: string }>;
}

export function AcceptedResult({ answer, preview }: { answer: AcceptAnswer; preview: FillPreview }) {
  return (
    <section className="card p-3" data-testid="fill-result" aria-live="polite">
      <h3 className="text-sm font-extrabold">Accepted</h3>
      <p className="mt-1 text-sm">
        <Badge tone="clear">{answer.placed} placed</Badge>{" "}
        {answer.refused > 0 && <Badge tone="block">{answer.refused} refused</Badge>}
      </p>
      <ul className="mt-1 space-y-1 text-xs">
        {answer.results
          .filter((r) => !r.ok)
          .map((r) => (
            <li key={r.positionId}>
              <Badge tone="block">Refused</Badge> {preview.proposals.find((p) => p.positionId === r.positionId)?.workerName}: {r.error}
            </li>
          ))}
      </ul>
      <p className="mt-2 text-sm" data-testid="fill-recheck">
        {answer.blocks.length === 0 ? (
          <Badge tone="clear">Re-checked by the crew rules: no blocks on the orders touched</Badge>
        ) : (
          <Badge tone="block">Re-checked: {answer.blocks.length} block{answer.blocks.length > 1 ? "s" : ""} remain on the orders touched</Badge>
        )}
      </p>
      {answer.blocks.length > 0 && (
        <ul className="mt-1 space-y-1 text-xs">
          {answer.blocks.map((f, i) => (
            <li key={i}>
              <Badge tone="block">{f.rule}</Badge> {f.message}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
