"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { GEAR_CSV_COLUMNS } from "@/lib/gear/model";

type Issue = { line: number; field: string; message: string };

/** HR's "Send test reminders now" for rubber goods (never twice per item and day). */
export function GearReminders() {
  const [busy, setBusy] = useState(false);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  async function send() {
    setBusy(true);
    setMsg(null);
    try {
      const res = await fetch("/api/gear/reminders", { method: "POST" });
      const body = await res.json();
      if (!res.ok) setMsg({ ok: false, text: body.error ?? "Not sent." });
      else
        setMsg({
          ok: true,
          text: [`${body.reminders} reminder${body.reminders === 1 ? "" : "s"} queued`, body.alreadySent ? `${body.alreadySent} already sent today` : null, body.noEmail ? `${body.noEmail} with no e-mail on file` : null]
            .filter(Boolean)
            .join(" · ") + ".",
        });
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
        {busy ? "Sending…" : "Send test reminders now"}
      </button>
    </div>
  );
}

/** CSV import: check first (dry run), then import; all or nothing, with each line's problems. */
export function GearImport() {
  const router = useRouter();
  const [csv, setCsv] = useState("");
  const [busy, setBusy] = useState(false);
  const [result, setResult] = useState<{ ok: boolean; text: string; issues: Issue[] } | null>(null);

  async function run(dryRun: boolean) {
    setBusy(true);
    setResult(null);
    try {
      const res = await fetch("/api/gear/import", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ csv, dryRun }) });
      const body = await res.json();
      if (!res.ok) {
        setResult({ ok: false, text: body.error ?? "Not imported.", issues: body.issues ?? [] });
        return;
      }
      const counts = `${body.created} new, ${body.updated} changed, ${body.unchanged} unchanged`;
      setResult({ ok: true, text: dryRun ? `The file checks out: ${counts}. Nothing written yet.` : `Imported: ${counts}.`, issues: [] });
      if (!dryRun) router.refresh();
    } catch {
      setResult({ ok: false, text: "The server did not answer; nothing was imported.", issues: [] });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="card mt-6 p-4" aria-labelledby="gear-import-h">
      <h2 id="gear-import-h" className="text-base font-bold">
        Import CSV
      </h2>
      <p className="mb-2 text-xs text-ink-500">
        Columns: {GEAR_CSV_COLUMNS.join(", ")} (an export imports as it is). Rows are matched by serial; a new serial is a new item. Nothing is written unless
        every row is valid.
      </p>
      <label className="text-sm">
        <span className="label">File</span>
        <input
          type="file"
          accept=".csv,text/csv"
          className="field"
          onChange={async (e) => {
            const f = e.target.files?.[0];
            if (f) setCsv(await f.text());
          }}
        />
      </label>
      <label className="mt-2 block text-sm">
        <span className="label">Or paste the rows</span>
        <textarea className="field font-mono" rows={5} value={csv} onChange={(e) => setCsv(e.target.value)} name="csv" />
      </label>
      <div className="mt-2 flex gap-2">
        <button type="button" className="btn-quiet" disabled={busy || !csv} onClick={() => run(true)}>
          Check
        </button>
        <button type="button" className="btn-primary" disabled={busy || !csv} onClick={() => run(false)}>
          Import
        </button>
      </div>
      {result && (
        <div role={result.ok ? "status" : "alert"} className={`mt-2 text-sm ${result.ok ? "text-clear" : "text-block"}`}>
          <p>
            {result.ok ? "✓ " : "✖ "}
            {result.text}
          </p>
          {result.issues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {result.issues.slice(0, 50).map((i) => (
                <li key={`${i.line}-${i.field}-${i.message}`}>
                  line {i.line}, {i.field}: {i.message}
                </li>
              ))}
            </ul>
          )}
        </div>
      )}
    </section>
  );
}
