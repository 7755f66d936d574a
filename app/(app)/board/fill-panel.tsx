"use client";

// Fill open positions (issue 9): asks the server for a proposal (an integer program solved
// with HiGHS over the people the crew rules allow in each seat), shows who would go where and
// why, lets the dispatcher take it whole or seat by seat, and explains every position left
// open. Nothing is placed until "Accept"; accepted seats go through the normal assignment
// write, and the board refreshes.

import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useId, useMemo, useRef, useState } from "react";
import { Badge, SafetyNote } from "@/components/status";
import { fmtDate } from "@/lib/format";
import type { FillPreview } from "@/lib/fill/preview";
import { AcceptedResult, type AcceptAnswer } from "./fill-accepted";
import { LeftOpen } from "./fill-left-open";
import { FillProgressCard, SolverSettings } from "./fill-progress";
import { ProposedCrews } from "./fill-proposed";
import { call, HttpError } from "./use-board";
import { useFillRun } from "./use-fill-run";

type Stage = "idle" | "solving" | "preview" | "accepting" | "accepted";

const pct = (g: number | null) => (g === null ? "unknown" : `${(Math.round(g * 1000) / 10).toFixed(1)} %`);

export function FillPanel({ day, yard, role }: { day: string; yard: string; role: string }) {
  const allowed = role === "dispatcher" || role === "supervisor";
  const [open, setOpen] = useState(false);
  if (!allowed) return null;
  return (
    <>
      <button type="button" className="btn-primary" data-testid="fill-open" onClick={() => setOpen(true)} aria-haspopup="dialog">
        Fill open positions
      </button>
      {open && <FillDialog day={day} yard={yard} onClose={() => setOpen(false)} />}
    </>
  );
}

function FillDialog({ day, yard, onClose: close }: { day: string; yard: string; onClose: () => void }) {
  const qc = useQueryClient();
  const titleId = useId();
  const panel = useRef<HTMLDivElement>(null);
  const [stage, setStage] = useState<Stage>("idle");
  const [limit, setLimit] = useState(10);
  const [gap, setGap] = useState(0.01);
  const [preview, setPreview] = useState<FillPreview | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [chosen, setChosen] = useState<Set<number>>(new Set());
  const [elapsed, setElapsed] = useState(0);
  const [answer, setAnswer] = useState<AcceptAnswer | null>(null);
  const [note, setNote] = useState<string | null>(null);
  const fill = useFillRun();
  const started = useRef(false);
  // Closing the panel mid-run cancels the run too (the server stops the fill).
  const { cancel } = fill;
  const onClose = useCallback(() => {
    cancel();
    close();
  }, [cancel, close]);

  async function solve() {
    setStage("solving");
    setError(null);
    setNote(null);
    setAnswer(null);
    setElapsed(0);
    const t0 = Date.now();
    const tick = setInterval(() => setElapsed((Date.now() - t0) / 1000), 200);
    const before = preview;
    try {
      const r = await fill.run({ date: day, yard, timeLimitSeconds: limit, gap });
      if (r.kind === "cancelled") {
        setNote("Cancelled: the server stopped the fill; nothing was proposed or placed.");
        setStage(before ? "preview" : "idle");
        return;
      }
      setPreview(r.preview);
      setChosen(new Set(r.preview.proposals.map((x) => x.positionId)));
      setStage("preview");
    } catch (err) {
      setError(err instanceof HttpError ? err.message : "The fill did not answer; check the connection and try again.");
      setStage(before ? "preview" : "idle");
    } finally {
      clearInterval(tick);
    }
  }

  useEffect(() => {
    if (started.current) return;
    started.current = true;
    void solve();
  }); // eslint-disable-line react-hooks/exhaustive-deps

  useEffect(() => {
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && stage !== "accepting" && onClose();
    document.addEventListener("keydown", onKey);
    panel.current?.focus();
    return () => document.removeEventListener("keydown", onKey);
  }, [onClose, stage]);

  const byOrder = useMemo(() => {
    const m = new Map<number, FillPreview["proposals"]>();
    for (const p of preview?.proposals ?? []) m.set(p.orderId, [...(m.get(p.orderId) ?? []), p]);
    return m;
  }, [preview]);

  async function accept(all: boolean) {
    if (!preview) return;
    const list = preview.proposals.filter((p) => all || chosen.has(p.positionId)).map((p) => ({ positionId: p.positionId, workerId: p.workerId }));
    if (!list.length) return;
    // A proposed truck goes with its order's crew (any chosen seat of the order takes it).
    const taken = new Set(preview.proposals.filter((p) => all || chosen.has(p.positionId)).map((p) => p.orderId));
    const trucks = (preview.trucks ?? []).filter((t) => taken.has(t.orderId)).map((t) => ({ workOrderId: t.orderId, equipmentId: t.equipmentId }));
    setStage("accepting");
    setError(null);
    try {
      const r = await call<AcceptAnswer>("/api/fill/accept", { method: "POST", body: JSON.stringify({ date: day, yard, proposals: list, trucks }) });
      setAnswer(r);
      setStage("accepted");
      await qc.invalidateQueries({ queryKey: ["board", day, yard] });
    } catch (err) {
      setError(err instanceof HttpError ? err.message : "Not accepted; nothing was placed. Try again.");
      setStage("preview");
    }
  }

  const toggle = (ids: number[], on: boolean) =>
    setChosen((prev) => {
      const next = new Set(prev);
      for (const id of ids) if (on) next.add(id);
      else next.delete(id);
      return next;
    });

  return (
    <div className="fixed inset-0 z-50 flex justify-end bg-ink/40" onMouseDown={(e) => e.target === e.currentTarget && stage !== "accepting" && onClose()}>
      <div
        ref={panel}
        tabIndex={-1}
        role="dialog"
        aria-modal="true"
        aria-labelledby={titleId}
        data-testid="fill-panel"
        className="flex h-full w-full max-w-2xl flex-col bg-paper shadow-2xl outline-none"
      >
        <header className="flex items-start justify-between gap-3 border-b border-rule px-4 py-3">
          <div>
            <p className="text-xs font-bold uppercase tracking-widest text-copper">Fill open positions · {yard}</p>
            <h2 id={titleId} className="text-lg font-extrabold tracking-tight">
              Proposed crews for {fmtDate(day, { weekday: "long", day: "numeric", month: "long", year: "numeric" })}
            </h2>
          </div>
          <button type="button" className="btn-quiet" onClick={onClose} disabled={stage === "accepting"}>
            Close
          </button>
        </header>

        <div className="flex-1 space-y-3 overflow-y-auto px-4 py-3">
          <div className="flex flex-wrap items-end gap-3">
            <button type="button" className="btn-quiet" onClick={solve} disabled={stage === "solving" || stage === "accepting"}>
              {preview ? "Propose again" : "Propose crews"}
            </button>
            <SolverSettings limit={limit} gap={gap} setLimit={setLimit} setGap={setGap} disabled={stage === "solving"} />
          </div>

          {error && (
            <p role="alert" className="rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block">
              ✖ {error}
            </p>
          )}

          {note && (
            <p role="status" className="rounded-md bg-info-bg px-3 py-2 text-sm font-semibold text-info" data-testid="fill-note">
              {note}
            </p>
          )}

          {stage === "solving" && <FillProgressCard progress={fill.progress} elapsed={elapsed} limit={limit} onCancel={fill.cancel} />}

          {preview && stage !== "solving" && (
            <>
              <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="fill-status">
                {preview.status === "Optimal" && preview.optimal ? (
                  <Badge tone="clear">Best crews found</Badge>
                ) : preview.status === "Nothing to fill" ? (
                  <Badge tone="info">Nothing to fill</Badge>
                ) : preview.proposals.length || preview.status === "Optimal" ? (
                  <Badge tone="warn">Best found in the time allowed</Badge>
                ) : (
                  <Badge tone="block">No proposal found</Badge>
                )}
                {preview.status !== "Nothing to fill" && (
                  <details className="text-xs text-ink-500" data-testid="fill-details">
                    <summary className="cursor-pointer">details</summary>
                    Solver (HiGHS): {preview.status}, optimality gap {pct(preview.gap)}
                  </details>
                )}
                <span className="text-ink-700">
                  {preview.proposals.length} position{preview.proposals.length === 1 ? "" : "s"} on {preview.staffed.length} order
                  {preview.staffed.length === 1 ? "" : "s"} proposed · {preview.openOrders.length} order{preview.openOrders.length === 1 ? "" : "s"} left open ·{" "}
                  {preview.solveMs < 1000 ? `${preview.solveMs} ms` : `${(preview.solveMs / 1000).toFixed(1)} s`}
                </span>
              </div>
              <SafetyNote />

              {preview.staffed.length > 0 && <ProposedCrews preview={preview} byOrder={byOrder} chosen={chosen} enabled={stage === "preview"} toggle={toggle} />}
              {preview.openOrders.length > 0 && <LeftOpen preview={preview} day={day} yard={yard} />}
              {stage === "accepted" && answer && <AcceptedResult answer={answer} preview={preview} />}
            </>
          )}
        </div>

        {preview && (stage === "preview" || stage === "accepting") && preview.proposals.length > 0 && (
          <footer className="flex flex-wrap items-center justify-end gap-2 border-t border-rule px-4 py-3">
            <span className="mr-auto text-xs text-ink-500">Accepted seats are placed as drafts; Send crews tells the people.</span>
            <button type="button" className="btn-quiet" onClick={() => accept(true)} disabled={stage === "accepting"} data-testid="fill-accept-all">
              Accept all ({preview.proposals.length})
            </button>
            <button type="button" className="btn-accent" onClick={() => accept(false)} disabled={stage === "accepting" || chosen.size === 0} data-testid="fill-accept">
              {stage === "accepting" ? "Placing…" : `Accept selected (${chosen.size})`}
            </button>
          </footer>
        )}
      </div>
    </div>
  );
}
