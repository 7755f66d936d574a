"use client";

import { useState } from "react";
import { FormAlert, sendJson } from "@/components/form-bits";

/** The worker's calendar feed link, and a button that makes a new one (the old stops working). */
export function CalendarLink({ workerId, url: initial, self }: { workerId: number; url: string | null; self: boolean }) {
  const [url, setUrl] = useState(initial);
  const [msg, setMsg] = useState<{ tone: "block" | "clear"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);
  async function reset() {
    if (url && !window.confirm("Make a new link? Calendars using the old link stop updating.")) return;
    setBusy(true);
    const r = await sendJson("/api/calendar/reset", "POST", self ? {} : { workerId });
    setBusy(false);
    if (!r.ok) return setMsg({ tone: "block", text: r.body.error });
    setUrl(r.body.url);
    setMsg({ tone: "clear", text: "New link made. Add it to your calendar app as a subscription." });
  }
  return (
    <div className="space-y-2">
      {url ? (
        <div className="flex gap-2">
          <input readOnly aria-label="Calendar link" className="field font-mono text-xs" value={url} onFocus={(e) => e.currentTarget.select()} />
          <button type="button" className="btn-quiet" onClick={() => navigator.clipboard?.writeText(url).then(() => setMsg({ tone: "clear", text: "Copied." }))}>
            Copy
          </button>
        </div>
      ) : (
        <p className="text-sm text-ink-500">No link yet.</p>
      )}
      <button type="button" className="btn-quiet" onClick={reset} disabled={busy}>
        {url ? "Make a new link" : "Make a link"}
      </button>
      {msg && <FormAlert tone={msg.tone}>{msg.text}</FormAlert>}
      <p className="text-xs text-ink-500">Anyone with the link sees the orders you are on, 14 days back and 60 ahead. Keep it to yourself.</p>
    </div>
  );
}
