"use client";

// The crew lead's part of a completed briefing (split from screen.tsx): who has not
// acknowledged yet (with "record in person"), Mark work started and Re-brief.
import { useState } from "react";
import { sendJson } from "@/components/form-bits";
import { AckForm } from "./ack-form";
import type { ScreenView } from "./editor-sections";
import { phoneText } from "./when";

type Notice = { tone: "clear" | "block" | "warn"; text: string };

export function LeadPanel({
  view,
  userId,
  reload,
  onView,
  onNotice,
}: {
  view: ScreenView;
  userId: number;
  reload: () => Promise<void>;
  onView: (v: ScreenView) => void;
  onNotice: (n: Notice) => void;
}) {
  const { order, briefing, mode } = view;
  const me = view.crew.find((c) => c.workerId === view.me);
  const [recording, setRecording] = useState<number | null>(null);
  const [rebriefOpen, setRebriefOpen] = useState(false);
  const [rebriefReason, setRebriefReason] = useState("");
  const [busy, setBusy] = useState(false);
  const setNotice = onNotice;
  const setView = onView;
  if (!briefing) return null;

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

  return (
    <>
      {mode === "lead" && briefing.state === "briefed" && (
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
                            userId={userId}
                            orderNumber={order.number}
                            onQueued={() => setRecording(null)}
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
    </>
  );
}

export function CrewCard({ view }: { view: ScreenView }) {
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

