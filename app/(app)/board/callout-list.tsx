"use client";

// Call-out list for one open or declined seat (issue 9): who to ring first — fewest overtime
// hours in the last 28 days, then home yard — with their phone, and the near misses with the
// rule that keeps them out. "Place and text" places the person and, when nothing else on the
// day is waiting to be sent, texts them through Send crews.

import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useId, useRef, useState } from "react";
import { Badge } from "@/components/status";
import { CLASSIFICATION_LABEL, POSITION_LABEL } from "@/lib/format";
import { call, HttpError } from "./use-board";

interface Entry {
  workerId: number;
  name: string;
  classification: string;
  yardCode: string | null;
  homeYard: boolean;
  phone: string | null;
  overtimeHours: number;
  crewBlocks: string[];
  crewMessages: string[];
}

interface CalloutPayload {
  orderId: number;
  orderNumber: string;
  positionId: number;
  position: string;
  day: string;
  yard: string;
  heldBy: { workerId: number; name: string | null } | null;
  eligible: Entry[];
  nearMisses: Array<{ workerId: number; name: string; phone: string | null; excludedBy: string; rules: string[]; message: string }>;
  nearMissCount: number;
  summary: string;
}

interface PlaceResult {
  assignmentId: number;
  text: { queued: boolean; messages?: number; reason?: string };
  recheck: { findings: Array<{ rule: string; level: string; workOrderId: string; message: string }> };
}

export function CalloutButton({
  positionId,
  label = "Call-out list",
  day,
  yard,
  onPlaced,
  compact = false,
}: {
  positionId: number;
  label?: string;
  /** The board's day and yard: the board query to refresh after a placement (all boards when left out). */
  day?: string;
  yard?: string;
  onPlaced?: (message: string) => void;
  compact?: boolean;
}) {
  const [open, setOpen] = useState(false);
  return (
    <span className="relative inline-block">
      <button
        type="button"
        className={compact ? "text-xs font-semibold text-info underline underline-offset-2" : "btn-quiet px-2 py-1 text-xs"}
        aria-expanded={open}
        aria-haspopup="dialog"
        data-testid={`callout-${positionId}`}
        onClick={() => setOpen((v) => !v)}
      >
        {label}
      </button>
      {open && <CalloutPopover positionId={positionId} day={day} yard={yard} onClose={() => setOpen(false)} onPlaced={onPlaced} />}
    </span>
  );
}

function CalloutPopover({
  positionId,
  day,
  yard,
  onClose,
  onPlaced,
}: {
  positionId: number;
  day?: string;
  yard?: string;
  onClose: () => void;
  onPlaced?: (message: string) => void;
}) {
  const qc = useQueryClient();
  const titleId = useId();
  const ref = useRef<HTMLDivElement>(null);
  const [data, setData] = useState<CalloutPayload | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<number | null>(null);
  const [done, setDone] = useState<{ tone: "clear" | "warn" | "block"; msg: string } | null>(null);
  const [showMisses, setShowMisses] = useState(false);

  useEffect(() => {
    let live = true;
    call<CalloutPayload>(`/api/call-list?positionId=${positionId}`)
      .then((d) => live && setData(d))
      .catch((e) => live && setError(e instanceof HttpError ? e.message : "The call-out list could not be loaded."));
    return () => {
      live = false;
    };
  }, [positionId]);

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && onClose();
    document.addEventListener("keydown", onKey);
    ref.current?.focus();
    return () => document.removeEventListener("keydown", onKey);
  }, [onClose]);

  async function place(e: Entry, text: boolean) {
    setBusy(e.workerId);
    setDone(null);
    try {
      const r = await call<PlaceResult>("/api/call-list", { method: "POST", body: JSON.stringify({ positionId, workerId: e.workerId, text }) });
      const blocks = r.recheck.findings.filter((f) => f.level === "block" && f.workOrderId === String(data?.orderId));
      const textPart = text ? (r.text.queued ? `Text and e-mail queued (${r.text.messages}).` : `Not texted: ${r.text.reason}`) : "Text it with Send crews.";
      const msg = `${e.name} placed. ${textPart}${blocks.length ? ` The order still has ${blocks.length} block${blocks.length > 1 ? "s" : ""}.` : ""}`;
      setDone({ tone: blocks.length ? "block" : text && !r.text.queued ? "warn" : "clear", msg });
      onPlaced?.(msg);
      await qc.invalidateQueries({ queryKey: day && yard ? ["board", day, yard] : ["board"] });
    } catch (err) {
      setDone({ tone: "block", msg: err instanceof HttpError ? err.message : "Not placed; try again." });
    } finally {
      setBusy(null);
    }
  }

  return (
    <div
      ref={ref}
      tabIndex={-1}
      role="dialog"
      aria-labelledby={titleId}
      data-testid="callout-popover"
      className="card fixed right-4 top-20 z-[60] flex max-h-[80vh] w-[min(92vw,28rem)] flex-col overflow-y-auto p-3 text-left shadow-2xl outline-none"
    >
      <div className="flex items-start justify-between gap-2">
        <div>
          <p className="text-xs font-bold uppercase tracking-widest text-copper">Call-out list</p>
          <h3 id={titleId} className="text-sm font-extrabold">
            {data ? `${POSITION_LABEL[data.position] ?? data.position} on ${data.orderNumber}` : "Loading…"}
          </h3>
        </div>
        <button type="button" className="btn-quiet px-2 py-1 text-xs" onClick={onClose} aria-label="Close the call-out list">
          Close
        </button>
      </div>
      {error && (
        <p role="alert" className="mt-2 text-sm font-semibold text-block">
          ✖ {error}
        </p>
      )}
      {!data && !error && <p className="mt-2 text-sm text-ink-500">Checking the crew rules for everyone in the pool…</p>}
      {data && (
        <>
          <p className="mt-1 text-xs text-ink-700">
            Fewest overtime hours in the last 28 days first, then home yard (call-out equalisation).
            {data.heldBy ? ` Replaces ${data.heldBy.name ?? "the current holder"}, who has not answered.` : ""}
          </p>
          {done && (
            <p role="status" className="mt-2">
              <Badge tone={done.tone}>{done.msg}</Badge>
            </p>
          )}
          <ol className="mt-2 max-h-72 space-y-1.5 overflow-y-auto pr-1" data-testid="callout-eligible">
            {data.eligible.length === 0 && <li className="text-sm text-ink-500">No one in the pool is eligible for this seat.</li>}
            {data.eligible.slice(0, 30).map((e, i) => (
              <li key={e.workerId} className="rounded-md border border-rule bg-white px-2 py-1.5 text-sm" data-testid={`callout-entry-${e.workerId}`}>
                <div className="flex items-start justify-between gap-2">
                  <div className="min-w-0">
                    <span className="mr-1 text-xs font-bold text-ink-500">{i + 1}.</span>
                    <span className="font-bold">{e.name}</span>{" "}
                    <span className="text-xs text-ink-500">
                      {CLASSIFICATION_LABEL[e.classification] ?? e.classification} · {e.overtimeHours} h overtime · {e.homeYard ? "home yard" : `from ${e.yardCode ?? "another yard"}`}
                    </span>
                    <div className="text-xs">
                      {e.phone ? (
                        <a className="font-semibold text-info underline" href={`tel:${e.phone}`}>
                          {e.phone}
                        </a>
                      ) : (
                        <span className="text-ink-500">No phone on file</span>
                      )}
                    </div>
                    {e.crewBlocks.length > 0 && (
                      <div className="mt-0.5 text-xs text-ink-700" title={e.crewMessages.join("\n")}>
                        <Badge tone="warn">Still blocked</Badge> with them the order still has {e.crewBlocks.join(", ")}
                      </div>
                    )}
                  </div>
                  <div className="flex shrink-0 flex-col gap-1">
                    <button type="button" className="btn-accent px-2 py-1 text-xs" disabled={busy !== null} onClick={() => place(e, true)} aria-label={`Place ${e.name} and text them`}>
                      {busy === e.workerId ? "Placing…" : "Place and text"}
                    </button>
                    <button type="button" className="btn-quiet px-2 py-1 text-xs" disabled={busy !== null} onClick={() => place(e, false)} aria-label={`Place ${e.name} without texting`}>
                      Place only
                    </button>
                  </div>
                </div>
              </li>
            ))}
          </ol>
          {data.eligible.length > 30 && <p className="mt-1 text-xs text-ink-500">…and {data.eligible.length - 30} more eligible.</p>}
          {data.nearMissCount > 0 && (
            <div className="mt-2 border-t border-rule pt-2">
              <button type="button" className="text-xs font-bold text-ink-700 underline-offset-2 hover:underline" aria-expanded={showMisses} onClick={() => setShowMisses((v) => !v)}>
                {showMisses ? "Hide" : "Show"} who is kept out ({data.nearMissCount}): {data.summary}
              </button>
              {showMisses && (
                <ul className="mt-1 max-h-48 space-y-1 overflow-y-auto pr-1">
                  {data.nearMisses.map((n) => (
                    <li key={n.workerId} className="text-xs">
                      <Badge tone="block">{n.excludedBy}</Badge> <span className="font-semibold">{n.name}</span> — {n.message}
                    </li>
                  ))}
                </ul>
              )}
            </div>
          )}
        </>
      )}
    </div>
  );
}
