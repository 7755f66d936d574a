"use client";

// Orders a fill leaves for the dispatcher: why, and for each open seat who the crew rules keep
// out (closest first) with the call list button.

import { useState } from "react";
import { Badge } from "@/components/status";
import { POSITION_LABEL } from "@/lib/format";
import type { FillPreview } from "@/lib/fill/preview";
import { CalloutButton } from "./callout-list";

export function LeftOpen({ preview, day, yard }: { preview: FillPreview; day: string; yard: string }) {
  return (
    <section aria-label="Left open" className="space-y-2" data-testid="fill-open-orders">
      <h3 className="text-sm font-extrabold">Left for you</h3>
      {preview.openOrders.map((o) => (
        <article key={o.orderId} className="card p-3" data-testid={`fill-left-${o.number}`}>
          <p className="text-[11px] font-bold uppercase tracking-wide text-copper">
            {o.number} · P{o.priority}
          </p>
          <p className="truncate font-bold" title={o.title}>
            {o.title}
          </p>
          <p className="mt-1 text-sm" data-testid="fill-left-reason">
            <Badge tone="block">{o.rule ?? "Not staffed"}</Badge> {o.reason}
          </p>
          <ul className="mt-2 space-y-2">
            {preview.open
              .filter((s) => s.orderId === o.orderId)
              .map((s) => (
                <OpenSeatRow key={s.positionId} seat={s} day={day} yard={yard} />
              ))}
          </ul>
        </article>
      ))}
    </section>
  );
}

function OpenSeatRow({ seat, day, yard }: { seat: FillPreview["open"][number]; day: string; yard: string }) {
  const [show, setShow] = useState(false);
  return (
    <li className="rounded-md border border-rule bg-white px-2 py-1.5 text-sm" data-testid={`fill-open-seat-${seat.positionId}`}>
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <span className="text-[11px] font-extrabold uppercase tracking-wide text-ink-500">{POSITION_LABEL[seat.position] ?? seat.position}</span>{" "}
          <span className="text-xs text-ink-700" data-testid="fill-open-summary">
            {seat.eligibleCount > 0 ? `${seat.eligibleCount} eligible` : "No one eligible"}
            {seat.summary ? `; kept out: ${seat.summary}` : ""}
          </span>
        </div>
        <CalloutButton positionId={seat.positionId} day={day} yard={yard} />
      </div>
      {seat.candidates.length > 0 && (
        <>
          <button type="button" className="mt-1 text-xs font-bold text-ink-700 underline-offset-2 hover:underline" aria-expanded={show} onClick={() => setShow((v) => !v)}>
            {show ? "Hide" : "Show"} who is closest ({seat.excludedCount})
          </button>
          {show && (
            <ul className="mt-1 space-y-1">
              {seat.candidates.map((c) => (
                <li key={c.workerId} className="text-xs">
                  <Badge tone="block">{c.excludedBy}</Badge> <span className="font-semibold">{c.name}</span> — {c.message}
                </li>
              ))}
            </ul>
          )}
        </>
      )}
    </li>
  );
}
