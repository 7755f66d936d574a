"use client";

import { useState } from "react";
import { FormAlert, sendJson } from "@/components/form-bits";

/** The secret calendar-feed link: copy it into a phone calendar; make a new one if it leaked. */
export function CalendarLink({ url: initial }: { url: string | null }) {
  const [url, setUrl] = useState(initial);
  const [msg, setMsg] = useState<{ tone: "clear" | "block"; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function reset() {
    if (url && !window.confirm("Make a new link? The old one stops working at once.")) return;
    setBusy(true);
    const r = await sendJson<{ url?: string; error?: string }>("/api/calendar/reset", "POST", {});
    setBusy(false);
    if (r.ok && r.body.url) {
      setUrl(r.body.url);
      setMsg({ tone: "clear", text: url ? "New link made; the old one no longer works." : "Link made." });
    } else setMsg({ tone: "block", text: r.body?.error ?? "Not made. Try again." });
  }

  async function copy() {
    if (!url) return;
    try {
      await navigator.clipboard.writeText(url);
      setMsg({ tone: "clear", text: "Copied." });
    } catch {
      setMsg({ tone: "block", text: "Copy did not work here; press and hold the link to copy it." });
    }
  }

  return (
    <div className="card space-y-3 p-4">
      {url ? (
        <>
          <label htmlFor="cal-url" className="label">
            Your calendar feed
          </label>
          <input id="cal-url" readOnly className="field font-mono text-xs" value={url} onFocus={(e) => e.currentTarget.select()} data-testid="calendar-url" />
          <p className="text-xs text-ink-500">Add it to your phone&apos;s calendar as a subscription. Anyone with the link sees your jobs: keep it to yourself.</p>
        </>
      ) : (
        <p className="text-sm text-ink-700">Get your jobs in your phone&apos;s calendar with a private link.</p>
      )}
      {msg && <FormAlert tone={msg.tone}>{msg.text}</FormAlert>}
      <div className="flex flex-wrap gap-2">
        {url && (
          <button type="button" className="btn-quiet min-h-11" onClick={copy}>
            Copy link
          </button>
        )}
        <button type="button" className="btn-quiet min-h-11" onClick={reset} disabled={busy}>
          {url ? "Make a new link" : "Make my calendar link"}
        </button>
      </div>
    </div>
  );
}
