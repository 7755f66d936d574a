"use client";

import { useState } from "react";
import { call, HttpError } from "./use-board";

export function SendCrewsButton({
  day,
  yard,
  unresolved,
  role,
  onDone,
  notify,
}: {
  day: string;
  yard: string;
  unresolved: number;
  role: string;
  onDone: () => void;
  notify: (msg: string, tone?: "ok" | "error") => void;
}) {
  const [busy, setBusy] = useState(false);
  const allowed = role === "dispatcher" || role === "supervisor";
  const reason = !allowed
    ? "Only dispatchers and supervisors send crews."
    : unresolved > 0
      ? `${unresolved} unresolved block${unresolved > 1 ? "s" : ""}: fix the crew or have a supervisor override.`
      : "";
  // Held back with aria-disabled rather than disabled, so keyboard and screen-reader users still
  // reach the button and hear why it is off (its description); a click then does nothing.
  return (
    <>
      <button
        type="button"
        className="btn-accent aria-disabled:cursor-not-allowed aria-disabled:opacity-50"
        disabled={busy}
        aria-disabled={reason !== "" || undefined}
        title={reason || "Text and e-mail every crew member their assignment"}
        aria-describedby={reason ? "send-disabled-reason" : undefined}
        data-testid="send-crews"
        onClick={async () => {
          if (reason) return;
          setBusy(true);
          try {
            const r = await call<{ assignments: number; messages: number }>("/api/send", {
              method: "POST",
              body: JSON.stringify({ date: day, yard }),
            });
            notify(`Sent: ${r.assignments} assignments, ${r.messages} messages queued.`, "ok");
            onDone();
          } catch (err) {
            notify(err instanceof HttpError ? err.message : "Send crews failed; nothing was sent.", "error");
          } finally {
            setBusy(false);
          }
        }}
      >
        {busy ? "Sending…" : "Send crews"}
      </button>
      {reason && (
        <span id="send-disabled-reason" className="sr-only">
          {reason}
        </span>
      )}
    </>
  );
}
