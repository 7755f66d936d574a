"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { FormAlert } from "@/components/form-bits";
import { submitAction } from "@/components/offline/field-queue";

/**
 * Confirm / Decline on My week, through the shared respond route (the same state machine as a
 * text reply). Decline asks for an optional reason. Shown for sent and delivered assignments;
 * a confirmed one can still be declined. Through the phone's queue (issue 20): without signal
 * the answer is saved on this phone and sent, with its idempotency key, once back online.
 */
export function RespondButtons({ assignmentId, status, orderNumber, userId }: { assignmentId: number; status: string; orderNumber: string; userId: number }) {
  const router = useRouter();
  const [declining, setDeclining] = useState(false);
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const reasonId = useId();

  async function answer(a: "confirm" | "decline") {
    setBusy(true);
    setError(null);
    const out = await submitAction({
      kind: "assignment.respond",
      userId,
      orderId: null,
      label: `${a === "confirm" ? "Confirm" : "Decline"} ${orderNumber}`,
      url: `/api/assignments/${assignmentId}/respond`,
      method: "POST",
      body: { answer: a, ...(a === "decline" && reason.trim() ? { reason: reason.trim() } : {}) },
    });
    setBusy(false);
    if (out.kind === "queued") {
      setDone(`${a === "confirm" ? "Confirm" : "Decline"} saved on this phone, not yet sent: dispatch gets it when the phone is back online.`);
      setDeclining(false);
      return;
    }
    const r = { ok: out.kind === "sent", body: out.result.body as { outcome?: string; error?: string } | null };
    if (!r.ok) {
      setError(r.body?.error ?? "Not sent. Try again.");
      return;
    }
    setDone(a === "confirm" ? `Confirmed: dispatch sees you on ${orderNumber}.` : `Declined: dispatch will fill your seat on ${orderNumber}.`);
    setDeclining(false);
    router.refresh();
  }

  const open = status === "sent" || status === "delivered";
  return (
    <div className="mt-3 space-y-2">
      {done && <FormAlert tone="clear">{done}</FormAlert>}
      {error && <FormAlert>{error}</FormAlert>}
      {!declining && (open || status === "confirmed") && (
        <div className="flex flex-wrap gap-2">
          {open && (
            <button type="button" className="btn-accent min-h-11 flex-1 sm:flex-none" disabled={busy} onClick={() => answer("confirm")} aria-label={`Confirm ${orderNumber}`}>
              Confirm
            </button>
          )}
          <button
            type="button"
            className={`btn-quiet min-h-11 ${open ? "flex-1 sm:flex-none" : ""}`}
            disabled={busy}
            onClick={() => setDeclining(true)}
            aria-label={`Decline ${orderNumber}`}
          >
            {open ? "Decline" : "Can't make it after all"}
          </button>
        </div>
      )}
      {declining && (
        <form
          className="space-y-2 rounded-md border border-rule bg-white p-3"
          onSubmit={(e) => {
            e.preventDefault();
            void answer("decline");
          }}
        >
          <label htmlFor={reasonId} className="label">
            Reason (optional)
          </label>
          <textarea id={reasonId} className="field" rows={2} maxLength={500} value={reason} onChange={(e) => setReason(e.target.value)} placeholder="Sick, family, short of rest…" />
          <div className="flex flex-wrap gap-2">
            <button type="submit" className="btn-primary min-h-11 flex-1 sm:flex-none" disabled={busy}>
              Decline {orderNumber}
            </button>
            <button type="button" className="btn-quiet min-h-11" onClick={() => setDeclining(false)} disabled={busy}>
              Keep it
            </button>
          </div>
        </form>
      )}
    </div>
  );
}
