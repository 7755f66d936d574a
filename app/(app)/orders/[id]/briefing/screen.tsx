"use client";

import Link from "next/link";
import { useCallback, useEffect, useState } from "react";
import { Badge, SafetyNote, StateIcon, type Tone } from "@/components/status";
import { FormAlert, sendJson } from "@/components/form-bits";
import { energyLabel } from "@/lib/orders/voltage";
import { AckForm } from "./ack-form";
import { BriefingEditor, type ScreenView } from "./editor";
import { BriefingSheet } from "./sheet";
import { fmtSpan, fmtStamp, phoneText } from "./when";

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

export function BriefingScreen({ initial, backHref, figures }: { initial: ScreenView; backHref: string; figures?: React.ReactNode }) {
  const [view, setView] = useState<ScreenView>(initial);
  const [notice, setNotice] = useState<{ tone: "clear" | "block" | "warn"; text: string } | null>(null);
  const [recording, setRecording] = useState<number | null>(null);
  const [rebriefOpen, setRebriefOpen] = useState(false);
  const [rebriefReason, setRebriefReason] = useState("");
  const [liftNote, setLiftNote] = useState("");
  const [busy, setBusy] = useState(false);
  const { order, briefing, mode } = view;
  const me = mode === "viewer" ? undefined : view.crew.find((c) => c.workerId === view.me);
  const roundState = briefing?.state ?? "none";
  const editing = mode === "lead" && (!briefing || briefing.state === "draft") && order.status !== "on_hold";
  const acked = new Set(view.acks.map((a) => a.workerId));
  const myAckDue = me && briefing?.state === "briefed" && !acked.has(me.workerId);

  const reload = useCallback(async () => {
    const r = await sendJson<ScreenView>(`/api/briefings/${order.id}`, "GET");
    if (r.ok) setView(r.body);
  }, [order.id]);

  // While acknowledgements are outstanding, the lead's and dispatch's screens follow them.
  useEffect(() => {
    if (editing || view.briefing?.state !== "briefed" || view.pending.length === 0) return;
    const t = setInterval(() => void reload(), 10_000);
    return () => clearInterval(t);
  }, [editing, view.briefing?.state, view.pending.length, reload]);

  async function start() {
    setBusy(true);
    const r = await sendJson<{ error?: string }>(`/api/briefings/${order.id}/start`, "POST", { round: briefing?.round ?? 1 });
    setBusy(false);
    if (!r.ok) setNotice({ tone: "block", text: r.body?.error ?? "Not started." });
    else {
      setNotice({ tone: "clear", text: "Work marked started." });
      await reload();
    }
  }

  async function rebrief() {
    setBusy(true);
    const r = await sendJson<ScreenView & { error?: string }>(`/api/briefings/${order.id}`, "PUT", {
      action: "rebrief",
      version: briefing?.version ?? 0,
      reason: rebriefReason,
    });
    setBusy(false);
    if (!r.ok) setNotice({ tone: "block", text: r.body?.error ?? "Not started." });
    else {
      setView(r.body);
      setRebriefOpen(false);
      setRebriefReason("");
      setNotice({ tone: "clear", text: "New round started. Change what changed, complete it, and the crew acknowledges again." });
    }
  }

  async function lift() {
    setBusy(true);
    const r = await sendJson<ScreenView & { error?: string }>(`/api/briefings/${order.id}/hold`, "DELETE", { note: liftNote });
    setBusy(false);
    if (!r.ok) setNotice({ tone: "block", text: r.body?.error ?? "Not lifted." });
    else {
      setView(r.body);
      setNotice({ tone: "clear", text: "Hold lifted. The crew lead briefs again before work." });
    }
  }

  const rs = ROUND_STATE[roundState];
  const bs = BOARD_STATE[order.briefingState] ?? BOARD_STATE.not_started;
  const place = [order.address, order.structureNo ? `pole ${order.structureNo}` : null].filter(Boolean).join(" · ");

  return (
    <div className="mx-auto max-w-3xl [font-feature-settings:'liga'_0,'calt'_0] print:max-w-none">
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

      {notice && (
        <div className="mb-3 print:hidden">
          <FormAlert tone={notice.tone}>{notice.text}</FormAlert>
        </div>
      )}

      {mode === "lead" && !view.leadWorkerId && <FormAlert tone="warn">Nobody holds the lead seat on this order.</FormAlert>}

      {editing ? (
        <>
          <CrewCard view={view} />
          <div className="mt-3 print:hidden">
            <BriefingEditor
              view={view}
              onChange={(v) => {
                setView(v);
                if (v.briefing?.state === "on_hold") setNotice({ tone: "warn", text: "Order on hold. Dispatch has been told by text and e-mail." });
                else if (v.briefing?.state === "briefed") {
                  setNotice({ tone: "clear", text: "Briefing completed. Each crew member now acknowledges it from their own phone, you too." });
                  window.scrollTo({ top: 0 });
                }
              }}
            />
          </div>
          <div className="hidden print:block">
            <BriefingSheet view={view} data={view.data} photoUrl={(id) => `/api/briefings/${order.id}/photo/${id}`} />
          </div>
        </>
      ) : (
        <BriefingSheet view={view} data={view.data} photoUrl={(id) => `/api/briefings/${order.id}/photo/${id}`} />
      )}

      {myAckDue && me && (
        <section className="card mt-4 border-copper p-4 print:hidden" aria-labelledby="ack-h" data-testid="my-ack">
          <h2 id="ack-h" className="text-base font-bold">
            Your gear check and acknowledgement
          </h2>
          <div className="mt-2">
            <AckForm
              orderId={order.id}
              round={briefing!.round}
              workDate={order.workDate}
              climbing={me.climbs}
              onDone={async () => {
                setNotice({ tone: "clear", text: "Acknowledged. Thank you." });
                await reload();
              }}
            />
          </div>
        </section>
      )}
      {me && briefing?.state === "briefed" && acked.has(me.workerId) && (
        <p className="mt-4 rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear print:hidden" data-testid="my-ack-done">
          ✓ You acknowledged this briefing.
        </p>
      )}

      {mode === "lead" && briefing?.state === "briefed" && (
        <section className="card mt-4 space-y-3 p-4 print:hidden" aria-labelledby="lead-h">
          <h2 id="lead-h" className="text-base font-bold">
            Crew lead
          </h2>
          {view.pending.length > 0 && (
            <div>
              <p className="text-sm text-ink-700">Waiting for: {view.pending.map((p) => p.name).join(", ")}.</p>
              <ul className="mt-2 space-y-2">
                {view.pending
                  .filter((p) => p.workerId !== me?.workerId)
                  .map((p) => (
                    <li key={p.workerId} className="rounded-md border border-rule bg-white p-3">
                      <div className="flex flex-wrap items-center justify-between gap-2">
                        <span className="text-sm">
                          <strong>{p.name}</strong> · {p.positionLabel}
                          {!p.hasSignIn && <span className="text-ink-500"> · no sign-in</span>}
                        </span>
                        {recording !== p.workerId && (
                          <button type="button" className="btn-quiet min-h-11" onClick={() => setRecording(p.workerId)}>
                            Record in person
                          </button>
                        )}
                      </div>
                      {recording === p.workerId && (
                        <div className="mt-3">
                          <AckForm
                            orderId={order.id}
                            round={briefing.round}
                            workDate={order.workDate}
                            climbing={p.climbs}
                            forWorker={{ id: p.workerId, name: p.name }}
                            onDone={async () => {
                              setRecording(null);
                              await reload();
                            }}
                          />
                        </div>
                      )}
                    </li>
                  ))}
              </ul>
            </div>
          )}
          <div className="flex flex-wrap items-center gap-2">
            <button type="button" className="btn-primary min-h-11" disabled={busy || !view.start.allowed} onClick={start} data-testid="start-work">
              Mark work started
            </button>
            <button type="button" className="btn-quiet min-h-11" onClick={() => setRebriefOpen((o) => !o)}>
              Re-brief (conditions changed)
            </button>
            <button type="button" className="btn-quiet min-h-11" onClick={() => void reload()}>
              Refresh
            </button>
          </div>
          {!view.start.allowed && view.start.reason && <p className="text-sm text-ink-700" data-testid="start-reason">▲ {view.start.reason}</p>}
          {rebriefOpen && (
            <div className="rounded-md border border-rule bg-white p-3">
              <label htmlFor="rebrief-reason" className="label">
                What changed
              </label>
              <input id="rebrief-reason" className="field" value={rebriefReason} onChange={(e) => setRebriefReason(e.target.value)} placeholder="New crew member, weather, a second pole…" />
              <p className="mt-1 text-xs text-ink-500">A new round starts from this one; everyone acknowledges again (1910.269(c)).</p>
              <button type="button" className="btn-accent mt-2 min-h-11" disabled={busy || rebriefReason.trim().length < 3} onClick={rebrief}>
                Start the re-brief
              </button>
            </div>
          )}
        </section>
      )}

      {mode === "lead" && order.status === "on_hold" && (
        <p className="mt-4 text-sm text-ink-700 print:hidden">Dispatch lifts the hold once the pole is replaced or secured; you then brief again.</p>
      )}

      {mode === "viewer" && order.status === "on_hold" && briefing?.state === "on_hold" && (
        <section className="card mt-4 space-y-2 p-4 print:hidden" aria-labelledby="lift-h">
          <h2 id="lift-h" className="text-base font-bold">
            Lift the hold
          </h2>
          <label htmlFor="lift-note" className="label">
            What was done
          </label>
          <input id="lift-note" className="field" value={liftNote} onChange={(e) => setLiftNote(e.target.value)} placeholder="Pole replaced; temporary guys set…" />
          <button type="button" className="btn-primary min-h-11" disabled={busy || liftNote.trim().length < 3} onClick={lift}>
            Lift the hold
          </button>
        </section>
      )}

      {view.history.length > 1 && (
        <section className="mt-4 text-xs text-ink-500" aria-label="Earlier rounds">
          Rounds:{" "}
          {view.history.map((h) => `${h.round} (${h.state}${h.completedAt ? `, ${fmtStamp(h.completedAt, order.timezone)}` : ""})`).join(" · ")}
        </section>
      )}
      <p className="mt-6 hidden text-xs print:block">
        This sheet is a record of the job briefing and an aid to it. It is not a substitute for the employer&apos;s safety procedures, OSHA 29 CFR
        1910.269 / 1926 Subpart V, the NESC, or local codes and agreements.
      </p>
    </div>
  );
}

function CrewCard({ view }: { view: ScreenView }) {
  return (
    <section className="card p-4 print:hidden" aria-labelledby="crew-h">
      <h2 id="crew-h" className="text-xs font-bold uppercase tracking-widest text-copper">
        Crew and positions
      </h2>
      <ul className="mt-2 divide-y divide-rule">
        {view.crew.map((c) => (
          <li key={c.workerId} className="flex flex-wrap items-center justify-between gap-2 py-1.5 text-sm">
            <span>
              <strong>{c.name}</strong> <span className="text-ink-500">· {c.positionLabel}</span>
            </span>
            {c.phone && (
              <a href={`tel:${c.phone}`} className="btn-quiet min-h-11 px-3 tabular-nums" aria-label={`Call ${c.name}`}>
                {phoneText(c.phone)}
              </a>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
