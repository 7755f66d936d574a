"use client";

import { useState } from "react";
import { FormAlert } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";

/**
 * A worker's secret calendar-feed link (My week and the time page): copy it into a calendar app
 * as a subscription; make a new one if it leaked (the old one stops working at once).
 * `workerId` is sent only when someone else's link is made (a dispatcher on the time page).
 */
export function CalendarLink({ url: initial, workerId, self = true }: { url: string | null; workerId?: number; self?: boolean }) {
  const [url, setUrl] = useState(initial);
  const [note, setNote] = useState<{ tone: "clear" | "block"; text: string } | null>(null);
  const reset = useApiMutation<void, { url: string }>({
    request: () => ({ url: "/api/calendar/reset", method: "POST", body: self || workerId === undefined ? {} : { workerId } }),
    onSuccess: (r) => {
      setNote({ tone: "clear", text: url ? "New link made; the old one no longer works. Add it to your calendar app as a subscription." : "Link made. Add it to your calendar app as a subscription." });
      setUrl(r.url);
    },
  });

  async function copy() {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setNote({ tone: "clear", text: "Copied." });
    } catch {
      setNote({ tone: "block", text: "Copy did not work here; press and hold the link to copy it." });
    }
  }

  return (
    <div className="space-y-3">
      {url ? (
        <>
          <label htmlFor="cal-url" className="label">
            {self ? "Your calendar feed" : "Calendar feed link"}
          </label>
          <input id="cal-url" readOnly className="field font-mono text-xs" value={url} onFocus={(e) => e.currentTarget.select()} data-testid="calendar-url" />
        </>
      ) : (
        <p className="text-sm text-ink-700">{self ? "Get your jobs in your phone's calendar with a private link." : "No link yet."}</p>
      )}
      {reset.errorText && <FormAlert tone="block">{reset.errorText}</FormAlert>}
      {note && !reset.errorText && <FormAlert tone={note.tone}>{note.text}</FormAlert>}
      <div className="flex flex-wrap gap-2">
        {url && (
          <button type="button" className="btn-quiet min-h-11" onClick={copy}>
            Copy link
          </button>
        )}
        <button
          type="button"
          className="btn-quiet min-h-11"
          disabled={reset.isPending}
          onClick={() => {
            if (url && !window.confirm("Make a new link? The old one stops working at once.")) return;
            setNote(null);
            void reset.submit();
          }}
        >
          {url ? "Make a new link" : self ? "Make my calendar link" : "Make a link"}
        </button>
      </div>
      <p className="text-xs text-ink-500">Anyone with the link sees the orders on it, 14 days back and 60 ahead: keep it private.</p>
    </div>
  );
}
