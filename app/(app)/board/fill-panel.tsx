"use client";

// Fill open positions (issue 9): asks the server for a proposal (an integer program solved
// with HiGHS over the people the crew rules allow in each seat), shows who would go where and
// why, lets the dispatcher take it whole or seat by seat, and explains every position left
// open. Nothing is placed until "Accept"; accepted seats go through the normal assignment
// write, and the board refreshes.

import { useQueryClient } from "@tanstack/react-query";
import { useEffect, useId, useMemo, useRef, useState } from "react";
import { Badge, SafetyNote } from "@/components/status";
import { fmtDate, POSITION_LABEL } from "@/lib/format";
import type { FillPreview } from "@/lib/fill/preview";
import { CalloutButton } from "./callout-list";
import { call, HttpError } from "./use-board";

type Stage = "idle" | "solving" | "preview" | "accepting" | "accepted";

interface AcceptAnswer {
  placed: number;
  refused: number;
  results: Array<{ positionId: number; workerId: number; ok: boolean; error?: string }>;
  /** Issue 16: the proposed trucks, booked or refused. */
  trucks?: Array<{ workOrderId: number; equipmentId: number; ok: boolean; error?: string }>;
  blocks: Array<{ rule: string; workOrderId: string; workerId: string | null; message: string }>;
}

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

function FillDialog({ day, yard, onClose }: { day: string; yard: string; onClose: () => void }) {
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
  const started = useRef(false);

  async function solve() {
    setStage("solving");
    setError(null);
    setAnswer(null);
    setElapsed(0);
    const t0 = Date.now();
    const tick = setInterval(() => setElapsed((Date.now() - t0) / 1000), 200);
    try {
      const p = await call<FillPreview>("/api/fill", { method: "POST", body: JSON.stringify({ date: day, yard, timeLimitSeconds: limit, gap }) });
      setPreview(p);
      setChosen(new Set(p.proposals.map((x) => x.positionId)));
      setStage("preview");
    } catch (err) {
      setError(err instanceof HttpError ? err.message : "The fill did not answer; check the connection and try again.");
      setStage("idle");
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
            <details className="text-sm">
              <summary className="cursor-pointer text-ink-700">Solver settings</summary>
              <div className="mt-2 flex flex-wrap items-end gap-3">
            <label className="text-sm">
              <span className="label">Time limit</span>
              <select className="field w-auto" value={limit} onChange={(e) => setLimit(Number(e.target.value))} disabled={stage === "solving"}>
                {[5, 10, 30, 60].map((s) => (
                  <option key={s} value={s}>
                    {s} s
                  </option>
                ))}
              </select>
            </label>
            <label className="text-sm">
              <span className="label">Optimality gap</span>
              <select className="field w-auto" value={gap} onChange={(e) => setGap(Number(e.target.value))} disabled={stage === "solving"}>
                {[0, 0.01, 0.05].map((g) => (
                  <option key={g} value={g}>
                    {g === 0 ? "0 % (proven best)" : `${g * 100} %`}
                  </option>
                ))}
              </select>
            </label>
              </div>
            </details>
          </div>

          {error && (
            <p role="alert" className="rounded-md bg-block-bg px-3 py-2 text-sm font-semibold text-block">
              ✖ {error}
            </p>
          )}

          {stage === "solving" && (
            <div className="card p-4" data-testid="fill-progress">
              <p className="text-sm font-bold">Checking the crew rules for every seat and solving…</p>
              <div
                role="progressbar"
                aria-label="Solving"
                aria-valuemin={0}
                aria-valuemax={limit}
                aria-valuenow={Math.min(limit, Math.round(elapsed))}
                className="mt-2 h-2 w-full overflow-hidden rounded bg-paper-200"
              >
                <div className="h-full bg-copper transition-all" style={{ width: `${Math.min(100, (elapsed / limit) * 100)}%` }} />
              </div>
              <p className="mt-1 text-xs text-ink-500">
                {elapsed.toFixed(0)} s of at most {limit} s, then the crew rules re-check the answer.
              </p>
            </div>
          )}

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

              {preview.staffed.length > 0 && (
                <section aria-label="Proposed crews" className="space-y-2">
                  <h3 className="text-sm font-extrabold">Proposed</h3>
                  {preview.staffed.map((o) => {
                    const seats = byOrder.get(o.orderId) ?? [];
                    const ids = seats.map((s) => s.positionId);
                    const on = ids.filter((id) => chosen.has(id)).length;
                    const partial = on > 0 && on < ids.length;
                    return (
                      <article key={o.orderId} className="card p-3" data-testid={`fill-order-${o.number}`}>
                        <label className="flex items-start gap-2">
                          <input
                            type="checkbox"
                            className="mt-1"
                            checked={on === ids.length && ids.length > 0}
                            ref={(el) => {
                              if (el) el.indeterminate = partial;
                            }}
                            disabled={stage !== "preview"}
                            onChange={(e) => toggle(ids, e.target.checked)}
                            aria-label={`Take the whole crew for ${o.number}`}
                          />
                          <span className="min-w-0">
                            <span className="text-[11px] font-bold uppercase tracking-wide text-copper">
                              {o.number} · P{o.priority}
                            </span>
                            <span className="block truncate font-bold" title={o.title}>
                              {o.title}
                            </span>
                          </span>
                        </label>
                        {partial && (
                          <p className="mt-1">
                            <Badge tone="warn">Part of a crew: the order stays short and the crew rules will block it</Badge>
                          </p>
                        )}
                        {(preview.trucks ?? [])
                          .filter((t) => t.orderId === o.orderId)
                          .map((t) => (
                            <p key={`t${t.equipmentId}`} className="mt-1 text-xs text-ink-700" data-testid={`fill-truck-${o.number}`}>
                              <span className="font-extrabold uppercase tracking-wide text-ink-500">Truck</span> <span className="font-bold">{t.unitNumber}</span> {t.name} · {t.reason}
                            </p>
                          ))}
                        {o.carried.map((f, i) => (
                          <p key={i} className="mt-1 text-xs text-ink-700">
                            <Badge tone="block">{f.rule}</Badge>{" "}
                            {["EQUIPMENT", "EQUIPMENT_BOOKED", "RIGGING", "LOCATE"].includes(f.rule) ? "stays on the order (no crew change fixes it)" : "kept from a placement made before the fill"}: {f.message}
                          </p>
                        ))}
                        {o.overridesLapse.map((v, i) => (
                          <p key={`v${i}`} className="mt-1 text-xs text-ink-700">
                            <Badge tone="waived">{v.rule} override lapses</Badge> it was given for the crew as it is now; a supervisor must give it again after this change.
                          </p>
                        ))}
                        <ul className="mt-2 space-y-1.5">
                          {seats.map((s) => (
                            <li key={s.positionId} data-testid={`fill-seat-${s.positionId}`}>
                              <label className="flex items-start gap-2 text-sm">
                                <input
                                  type="checkbox"
                                  className="mt-1"
                                  checked={chosen.has(s.positionId)}
                                  disabled={stage !== "preview"}
                                  onChange={(e) => toggle([s.positionId], e.target.checked)}
                                  aria-label={`${POSITION_LABEL[s.position] ?? s.position} on ${o.number}: ${s.workerName}`}
                                />
                                <span>
                                  <span className="text-[11px] font-extrabold uppercase tracking-wide text-ink-500">{POSITION_LABEL[s.position] ?? s.position}</span>{" "}
                                  <span className="font-bold">{s.workerName}</span>
                                  <span className="block text-xs text-ink-700">{s.reasons.join(" · ")}</span>
                                </span>
                              </label>
                            </li>
                          ))}
                        </ul>
                      </article>
                    );
                  })}
                </section>
              )}

              {preview.openOrders.length > 0 && (
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
              )}

              {stage === "accepted" && answer && (
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
              )}
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
