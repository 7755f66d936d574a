"use client";

import { useApiMutation } from "@/lib/api/mutations";

export interface ReminderCounts {
  reminders: number;
  alreadySent?: number;
  noEmail?: number;
  renewalWaiting?: number;
  digests?: number;
}

/** "12 reminders queued · 3 already sent today · 1 with no e-mail on file." */
export function reminderSummary(b: ReminderCounts) {
  return (
    [
      `${b.reminders} reminder${b.reminders === 1 ? "" : "s"} queued`,
      b.alreadySent ? `${b.alreadySent} already sent today` : null,
      b.noEmail ? `${b.noEmail} with no e-mail on file` : null,
      b.renewalWaiting ? `${b.renewalWaiting} with a renewal waiting for you` : null,
      b.digests ? "digest sent to HR" : null,
    ]
      .filter(Boolean)
      .join(" · ") + "."
  );
}

/** HR's "send reminders now" button (credentials and rubber goods): POSTs, then says what was queued. */
export function RemindersButton({ url, label }: { url: string; label: string }) {
  const send = useApiMutation<void, ReminderCounts>({ request: () => ({ url, method: "POST" }) });
  return (
    <div className="flex flex-wrap items-center gap-2">
      {send.isSuccess && send.data && (
        <span role="status" className="text-sm text-clear">
          ✓ {reminderSummary(send.data)}
        </span>
      )}
      {send.errorText && (
        <span role="status" className="text-sm text-block">
          ✖ {send.errorText}
        </span>
      )}
      <button type="button" className="btn-quiet" onClick={() => send.submit()} disabled={send.isPending}>
        {send.isPending ? "Sending…" : label}
      </button>
    </div>
  );
}
