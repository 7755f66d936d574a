"use client";

// The briefing's head (split from screen.tsx): the order, where and when, the round's and the
// board's state, the hold, the rule it rests on and the caution, then the field figures.
import Link from "next/link";
import { Badge, SafetyNote, StateIcon, type Tone } from "@/components/status";
import { energyLabel } from "@/lib/orders/voltage";
import type { ScreenView } from "./editor-sections";
import { fmtSpan, fmtStamp } from "./when";

const ROUND_STATE: Record<string, { tone: Tone; word: string }> = {
  none: { tone: "muted", word: "Not started" },
  draft: { tone: "info", word: "Draft" },
  briefed: { tone: "clear", word: "Completed" },
  on_hold: { tone: "block", word: "On hold" },
};

const BOARD_STATE: Record<string, { tone: Tone; word: string }> = {
  not_started: { tone: "muted", word: "Board: not briefed yet" },
  briefed: { tone: "clear", word: "Board: briefed" },
  on_hold: { tone: "block", word: "Board: on hold" },
};

export function BriefingHead({ view, backHref, figures }: { view: ScreenView; backHref: string; figures?: React.ReactNode }) {
  const { order, briefing } = view;
  const rs = ROUND_STATE[briefing?.state ?? "none"];
  const bs = BOARD_STATE[order.briefingState] ?? BOARD_STATE.not_started;
  const place = [order.address, order.structureNo ? `pole ${order.structureNo}` : null].filter(Boolean).join(" · ");
  return (
    <>
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div className="min-w-0">
          <p className="text-xs font-bold uppercase tracking-widest text-copper">Job briefing · {order.number}</p>
          <h1 className="text-xl font-extrabold leading-tight tracking-tight">{order.title}</h1>
          <p className="mt-1 text-sm text-ink-700">{fmtSpan(order.start, order.end, order.timezone)}</p>
          {place && (
            <p className="text-sm">
              {order.address ? (
                <a href={`https://www.openstreetmap.org/search?query=${encodeURIComponent(order.address)}`} target="_blank" rel="noopener noreferrer" className="font-semibold text-copper underline underline-offset-2">
                  {place}
                  <span className="print:hidden" aria-hidden="true">
                    {" "}
                    ↗
                  </span>
                </a>
              ) : (
                place
              )}
            </p>
          )}
          <p className="text-sm text-ink-700">
            {order.workTypeName} · {energyLabel(order)}
          </p>
        </div>
        <div className="flex flex-wrap gap-2 print:hidden">
          <Link href={backHref} className="btn-quiet min-h-11">
            Back
          </Link>
          <a href={`/api/briefings/${order.id}/pdf`} className="btn-quiet min-h-11" download data-testid="pdf-link">
            Download PDF
          </a>
          <button type="button" className="btn-quiet min-h-11" onClick={() => window.print()}>
            Print
          </button>
        </div>
      </div>

      <div className="mb-3 flex flex-wrap items-center gap-2" data-testid="briefing-state">
        <Badge tone={rs.tone}>
          {briefing ? `Round ${briefing.round}: ` : ""}
          {rs.word}
        </Badge>
        <Badge tone={bs.tone}>{bs.word}</Badge>
        {order.actualStartAt && <Badge tone="info">Started {fmtStamp(order.actualStartAt, order.timezone)}</Badge>}
        {briefing?.completedAt && <span className="text-xs text-ink-500">completed {fmtStamp(briefing.completedAt, order.timezone)}</span>}
      </div>
      {briefing?.reason && <p className="mb-3 text-sm text-ink-700">Re-brief: {briefing.reason}</p>}
      {order.status === "on_hold" && (
        <p className="mb-3 rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block" role="status" data-testid="hold-banner">
          <StateIcon tone="block" className="mr-1 inline h-3 w-3" />
          On hold{order.holdReason ? `: ${order.holdReason.replace(/[.\s]+$/, "")}` : ""}. Nobody starts until dispatch lifts the hold.
        </p>
      )}

      <p className="mb-3 text-xs text-ink-500">
        29 CFR 1910.269(c): the employee in charge holds a job briefing with the crew before each job (hazards, work procedures, special
        precautions, energy-source controls, protective equipment); at least one before the first job of each day or shift, and another when
        conditions change.
      </p>
      <SafetyNote className="mb-4" />
      {figures}
    </>
  );
}
