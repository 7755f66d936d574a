"use client";

// One order's job briefing on the phone and at dispatch: the head (screen-head.tsx), the
// crew lead's editor while the round is a draft (editor.tsx), the sheet once it is complete,
// the crew member's gear check and acknowledgement (ack-form.tsx), the lead's panel
// (lead-panel.tsx) and dispatch's "lift the hold". For a lineworker it also keeps the page on
// the phone and shows what is saved there and not yet sent (issue 20, components/offline).
import { useCallback, useEffect, useRef, useState } from "react";
import { FormAlert, sendJson } from "@/components/form-bits";
import { fmtEntered, useFieldQueue } from "@/components/offline/field-queue";
import { OfflineSync } from "@/components/offline/offline-sync";
import { describeChanges } from "@/lib/offline/changes";
import { AckForm } from "./ack-form";
import { BriefingEditor, type ScreenView } from "./editor";
import { CrewCard, LeadPanel } from "./lead-panel";
import { BriefingHead } from "./screen-head";
import { BriefingSheet } from "./sheet";
import { fmtStamp } from "./when";

type Notice = { tone: "clear" | "block" | "warn"; text: string };

export function BriefingScreen({ initial, userId, backHref, figures }: { initial: ScreenView; userId: number | null; backHref: string; figures?: React.ReactNode }) {
  const [view, setView] = useState<ScreenView>(initial);
  const [notice, setNotice] = useState<Notice | null>(null);
  const [changes, setChanges] = useState<string[]>([]);
  const [liftNote, setLiftNote] = useState("");
  const [busy, setBusy] = useState(false);
  const { order, briefing, mode } = view;
  const me = mode === "viewer" ? undefined : view.crew.find((c) => c.workerId === view.me);
  const editing = mode === "lead" && (!briefing || briefing.state === "draft") && order.status !== "on_hold";
  const acked = new Set(view.acks.map((a) => a.workerId));
  const queue = useFieldQueue(userId);
  const myQueuedAck = queue.actions.find(
    (a) => a.state === "queued" && a.kind === "briefing.ack" && a.orderId === order.id && !(a.body as { workerId?: number } | undefined)?.workerId,
  );
  const myAckDue = me && briefing?.state === "briefed" && !acked.has(me.workerId) && !myQueuedAck;
  const viewRef = useRef(view);
  viewRef.current = view;

  const reload = useCallback(async () => {
    const r = await sendJson<ScreenView>(`/api/briefings/${order.id}`, "GET");
    if (r.ok) setView(r.body);
  }, [order.id]);

  /** After the phone sent what it kept: the server's view wins, and the phone says what changed. */
  const afterDelivery = useCallback(async () => {
    const before = viewRef.current;
    const r = await sendJson<ScreenView>(`/api/briefings/${order.id}`, "GET");
    if (!r.ok) return;
    setChanges(describeChanges(before, r.body));
    setView(r.body);
  }, [order.id]);

  // While acknowledgements are outstanding, the lead's and dispatch's screens follow them.
  useEffect(() => {
    if (editing || view.briefing?.state !== "briefed" || view.pending.length === 0) return;
    const t = setInterval(() => void reload(), 10_000);
    return () => clearInterval(t);
  }, [editing, view.briefing?.state, view.pending.length, reload]);

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

  return (
    <div className="mx-auto max-w-3xl [font-feature-settings:'liga'_0,'calt'_0] print:max-w-none">
      <BriefingHead view={view} backHref={backHref} figures={figures} />
      {userId !== null && mode !== "viewer" && (
        <OfflineSync userId={userId} keep={[`/orders/${order.id}/briefing`]} orderId={order.id} onDelivered={afterDelivery} />
      )}
      {changes.length > 0 && (
        <div className="mb-3 rounded-md bg-info-bg px-3 py-2 text-sm text-info print:hidden" role="status" data-testid="server-changes">
          <p className="font-semibold">The server&apos;s state wins; since your copy:</p>
          <ul className="list-disc pl-5">
            {changes.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
        </div>
      )}

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
              userId={userId ?? 0}
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

      {myAckDue && me && userId !== null && (
        <section className="card mt-4 border-copper p-4 print:hidden" aria-labelledby="ack-h" data-testid="my-ack">
          <h2 id="ack-h" className="text-base font-bold">
            Your gear check and acknowledgement
          </h2>
          <div className="mt-2">
            <AckForm
              orderId={order.id}
              orderNumber={order.number}
              userId={userId}
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
      {myQueuedAck && (
        <p className="mt-4 rounded-md bg-warn-bg px-3 py-2 text-sm font-semibold text-warn print:hidden" data-testid="my-ack-queued">
          Your gear check and acknowledgement are saved on this phone, not yet sent (entered {fmtEntered(myQueuedAck.createdAt)}).
        </p>
      )}
      {me && briefing?.state === "briefed" && acked.has(me.workerId) && (
        <p className="mt-4 rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear print:hidden" data-testid="my-ack-done">
          ✓ You acknowledged this briefing.
        </p>
      )}

      {mode === "lead" && userId !== null && <LeadPanel view={view} userId={userId} reload={reload} onView={setView} onNotice={setNotice} />}

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
