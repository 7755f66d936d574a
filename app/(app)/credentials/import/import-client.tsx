"use client";

import Link from "next/link";
import { useState } from "react";
import { Badge } from "@/components/status";
import { formatIssue, importRowSchema, type ImportIssue } from "@/lib/credentials/model";
import { parseCredentialCsv, type ImportRow } from "@/lib/credentials/csv";

interface Result {
  ok: boolean;
  dryRun: boolean;
  rows: number;
  issues: ImportIssue[];
  issueCount: number;
  created: number;
  superseded: number;
  /** Rows identical to what is stored (an unchanged export row). */
  unchanged?: number;
  ignoredColumns: string[];
  error?: string;
}

type Phase = "idle" | "reading" | "checking" | "importing" | "checked" | "imported" | "failed";

const TEMPLATE = "employee_no,qualification,issued_on,expires_on\r\nCP-1007,climbing,2026-11-20,\r\nCP-1017,cdl_a,2026-10-02,2030-10-01\r\n";
const PREVIEW_ROWS = 20;

/** POSTs JSON with upload progress (XMLHttpRequest reports it; fetch does not). */
function postJson(url: string, body: unknown, onProgress: (fraction: number) => void): Promise<{ status: number; body: Result }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.setRequestHeader("content-type", "application/json");
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let parsed: Result;
      try {
        parsed = JSON.parse(xhr.responseText);
      } catch {
        parsed = { ok: false, error: "The server answered with something unreadable." } as Result;
      }
      resolve({ status: xhr.status, body: parsed });
    };
    xhr.onerror = () => reject(new Error("network"));
    xhr.send(JSON.stringify(body));
  });
}

export function ImportClient({ codes }: { codes: { code: string; name: string; renewalMonths: number | null }[] }) {
  const [fileName, setFileName] = useState<string | null>(null);
  const [csv, setCsv] = useState<string | null>(null);
  const [rows, setRows] = useState<ImportRow[]>([]);
  const [localIssues, setLocalIssues] = useState<ImportIssue[]>([]);
  const [ignored, setIgnored] = useState<string[]>([]);
  const [phase, setPhase] = useState<Phase>("idle");
  const [progress, setProgress] = useState(0);
  const [result, setResult] = useState<Result | null>(null);
  const [error, setError] = useState<string | null>(null);

  async function pick(file: File | null) {
    setResult(null);
    setError(null);
    setRows([]);
    setLocalIssues([]);
    setCsv(null);
    setFileName(file?.name ?? null);
    if (!file) return;
    if (file.size > 900_000) {
      setError("The file is larger than 900 KB (about 10,000 rows); split it into smaller files.");
      return;
    }
    setPhase("reading");
    setProgress(0);
    const text = await new Promise<string>((resolve, reject) => {
      const r = new FileReader();
      r.onprogress = (e) => e.lengthComputable && setProgress((e.loaded / e.total) * 0.5);
      r.onload = () => resolve(String(r.result ?? ""));
      r.onerror = () => reject(r.error);
      r.readAsText(file);
    }).catch(() => null);
    if (text === null) {
      setPhase("failed");
      setError("The file could not be read.");
      return;
    }
    // Parse here for the preview; the route parses the same text again and decides.
    const parsed = parseCredentialCsv(text);
    const issues = [...parsed.issues];
    for (const row of parsed.rows) {
      const r = importRowSchema.safeParse(row);
      if (!r.success) for (const i of r.error.issues) issues.push({ line: row.line, field: String(i.path[0]), message: i.message });
    }
    setProgress(1);
    setCsv(text);
    setRows(parsed.rows);
    setIgnored(parsed.ignoredColumns);
    setLocalIssues(issues.sort((a, b) => a.line - b.line));
    setPhase("idle");
  }

  async function send(dryRun: boolean) {
    if (!csv) return;
    setError(null);
    setPhase(dryRun ? "checking" : "importing");
    setProgress(0);
    try {
      const res = await postJson("/api/credentials/import", { csv, dryRun }, (f) => setProgress(f * 0.9));
      setProgress(1);
      setResult(res.body);
      if (res.status >= 200 && res.status < 300) setPhase(dryRun ? "checked" : "imported");
      else {
        setPhase("failed");
        if (!res.body.issues?.length) setError(res.body.error ?? `The server answered ${res.status}.`);
      }
    } catch {
      setPhase("failed");
      setError("The server did not answer; nothing was imported.");
    }
  }

  function downloadTemplate() {
    const url = URL.createObjectURL(new Blob([TEMPLATE], { type: "text/csv" }));
    const a = document.createElement("a");
    a.href = url;
    a.download = "credentials-template.csv";
    a.click();
    URL.revokeObjectURL(url);
  }

  const busy = phase === "reading" || phase === "checking" || phase === "importing";
  const issues = result && !result.ok ? result.issues : localIssues;
  const issueCount = result && !result.ok ? result.issueCount : localIssues.length;

  return (
    <div className="grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,1fr)_320px]">
      <div className="min-w-0 space-y-4">
        <section className="card p-4">
          <label className="label" htmlFor="csv-file">
            CSV file
          </label>
          <input
            id="csv-file"
            type="file"
            accept=".csv,text/csv"
            className="field file:mr-3 file:rounded file:border-0 file:bg-paper-200 file:px-2 file:py-1 file:text-sm file:font-semibold"
            onChange={(e) => pick(e.target.files?.[0] ?? null)}
            disabled={busy}
          />
          <p className="mt-2 break-words text-xs text-ink-500">
            Columns: <code>employee_no</code>, <code>qualification</code> (a code), <code>issued_on</code> and, optionally,{" "}
            <code>expires_on</code> (the last valid day; empty = proposed from the renewal period). Dates as YYYY-MM-DD.
            Nothing is written unless every row is good.{" "}
            <button type="button" className="font-semibold text-copper underline" onClick={downloadTemplate}>
              Download a template
            </button>
          </p>

          {(busy || progress > 0) && phase !== "idle" && (
            <div className="mt-3">
              <div className="flex justify-between text-xs text-ink-500">
                <span>
                  {phase === "reading" ? "Reading the file" : phase === "checking" ? "Checking every row" : phase === "importing" ? "Importing" : "Done"}
                </span>
                <span>{Math.round(progress * 100)}%</span>
              </div>
              <div className="mt-1 h-2 overflow-hidden rounded bg-paper-200" role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={Math.round(progress * 100)} aria-label="Progress">
                <div className="h-full bg-copper transition-all" style={{ width: `${Math.round(progress * 100)}%` }} />
              </div>
            </div>
          )}

          {fileName && csv !== null && (
            <div className="mt-4 flex flex-wrap items-center gap-2">
              <span className="text-sm">
                <strong>{fileName}</strong>: {rows.length} row{rows.length === 1 ? "" : "s"}
              </span>
              <button type="button" className="btn-quiet" disabled={busy || !rows.length} onClick={() => send(true)}>
                Check file
              </button>
              <button
                type="button"
                className="btn-primary"
                disabled={busy || phase !== "checked" || !result?.ok}
                onClick={() => send(false)}
                title={phase !== "checked" ? "Check the file first" : undefined}
              >
                Import {rows.length} row{rows.length === 1 ? "" : "s"}
              </button>
            </div>
          )}
          {ignored.length > 0 && <p className="mt-2 text-xs text-ink-500">Columns ignored: {ignored.join(", ")}.</p>}
          {error && (
            <p role="alert" className="mt-3 rounded-md bg-block-bg px-3 py-2 text-sm font-medium text-block">
              ✖ {error}
            </p>
          )}
          {result?.ok && phase === "checked" && (
            <p role="status" className="mt-3 rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear">
              ✓ All {result.rows} rows are good: {result.created} record{result.created === 1 ? "" : "s"} to write
              {result.superseded ? `, replacing ${result.superseded} current record${result.superseded === 1 ? "" : "s"}` : ""}
              {result.unchanged ? `; ${result.unchanged} row${result.unchanged === 1 ? "" : "s"} already match what is stored and stay as they are` : ""}. Nothing is written until you import.
            </p>
          )}
          {result?.ok && phase === "imported" && (
            <p role="status" className="mt-3 rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear">
              ✓ Imported {result.created} record{result.created === 1 ? "" : "s"}
              {result.superseded ? `; ${result.superseded} older record${result.superseded === 1 ? "" : "s"} kept as history` : ""}
              {result.unchanged ? `; ${result.unchanged} unchanged row${result.unchanged === 1 ? "" : "s"} left as they were` : ""}.{" "}
              <Link href="/credentials" className="underline">
                Open the credentials
              </Link>
            </p>
          )}
        </section>

        {issueCount > 0 && (
          <section className="card p-4" aria-labelledby="issues-h">
            <h2 id="issues-h" className="mb-2 font-bold text-block">
              ✖ {issueCount} problem{issueCount === 1 ? "" : "s"}: nothing {result && !result.ok ? "was" : "will be"} imported
            </h2>
            <ul className="max-h-80 space-y-1 overflow-y-auto break-words text-sm" data-testid="import-issues">
              {issues.map((i, n) => (
                <li key={n} className="tabular-nums">
                  {formatIssue(i)}
                </li>
              ))}
            </ul>
            {issueCount > issues.length && <p className="mt-2 text-xs text-ink-500">…and {issueCount - issues.length} more.</p>}
          </section>
        )}

        {rows.length > 0 && (
          <section className="card overflow-x-auto" aria-labelledby="preview-h">
            <h2 id="preview-h" className="px-4 pt-3 font-bold">
              Preview{rows.length > PREVIEW_ROWS ? ` (first ${PREVIEW_ROWS} of ${rows.length})` : ""}
            </h2>
            <table className="mt-2 w-full text-left text-sm">
              <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                <tr>
                  <th className="px-3 py-2">Line</th>
                  <th className="px-3 py-2">employee_no</th>
                  <th className="px-3 py-2">qualification</th>
                  <th className="px-3 py-2">issued_on</th>
                  <th className="px-3 py-2">expires_on</th>
                  <th className="px-3 py-2">Check</th>
                </tr>
              </thead>
              <tbody>
                {rows.slice(0, PREVIEW_ROWS).map((r) => {
                  const bad = issues.filter((i) => i.line === r.line);
                  return (
                    <tr key={r.line} className="border-t border-rule tabular-nums">
                      <td className="px-3 py-1.5 text-ink-500">{r.line}</td>
                      <td className="px-3 py-1.5">{r.employee_no}</td>
                      <td className="px-3 py-1.5">{r.qualification}</td>
                      <td className="px-3 py-1.5">{r.issued_on}</td>
                      <td className="px-3 py-1.5">{r.expires_on ?? <span className="text-ink-500">proposed</span>}</td>
                      <td className="px-3 py-1.5">
                        {bad.length ? <Badge tone="block">{bad.map((b) => b.field).join(", ")}</Badge> : <Badge tone="clear">{result ? "OK" : "OK so far"}</Badge>}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </section>
        )}
      </div>

      <aside className="card h-fit p-4 text-sm">
        <h2 className="mb-2 font-bold">Qualification codes</h2>
        <ul className="space-y-1">
          {codes.map((c) => (
            <li key={c.code}>
              <code className="text-xs">{c.code}</code> — {c.name}
              <span className="text-ink-500"> ({c.renewalMonths ? `${c.renewalMonths} months` : "no renewal"})</span>
            </li>
          ))}
        </ul>
        <p className="mt-3 text-xs text-ink-500">
          A row newer than the worker&apos;s current record renews it (the old one stays in the history). Rows for several
          years of one qualification are chained oldest to newest. Imported records are recorded as verified by you.
        </p>
      </aside>
    </div>
  );
}
