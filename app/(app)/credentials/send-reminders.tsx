"use client";

import { useState } from "react";

/** HR's "Send reminders now": queues the reminder e-mails (never twice per credential and day). */
export function SendReminders() {
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);

  async function send() {
    setBusy(true);
    setMsg(null);
    try {
      const res = await fetch("/api/reminders", { method: "POST" });
      const body = await res.json();
      if (!res.ok) {
        setMsg({ ok: false, text: body.error ?? "Not sent." });
        return;
      }
      const parts = [
        `${body.reminders} reminder${body.reminders === 1 ? "" : "s"} queued`,
        body.alreadySent ? `${body.alreadySent} already sent today` : null,
        body.noEmail ? `${body.noEmail} with no e-mail on file` : null,
        body.renewalWaiting ? `${body.renewalWaiting} with a renewal waiting for you` : null,
        body.digests ? "digest sent to HR" : null,
      ].filter(Boolean);
      setMsg({ ok: true, text: parts.join(" · ") + "." });
    } catch {
      setMsg({ ok: false, text: "The server did not answer; nothing was sent." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-wrap items-center gap-2">
      {msg && (
        <span role="status" className={`text-sm ${msg.ok ? "text-clear" : "text-block"}`}>
          {msg.ok ? "✓ " : "✖ "}
          {msg.text}
        </span>
      )}
      <button type="button" className="btn-quiet" onClick={send} disabled={busy}>
        {busy ? "Sending…" : "Send reminders now"}
      </button>
    </div>
  );
}
