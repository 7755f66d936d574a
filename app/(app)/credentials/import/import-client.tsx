"use client";

import Link from "next/link";
import { useState } from "react";
import { FormError, TextField } from "@/components/form/fields";
import { apiUpload, asFailure } from "@/lib/api/client";
import { importRowSchema, type ImportIssue } from "@/lib/credentials/model";
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

import { CodesAside, ImportIssues, ImportPreview, ImportProgress, type Phase } from "./import-parts";

const TEMPLATE = "employee_no,qualification,issued_on,expires_on\r\nCP-1007,climbing,2026-11-20,\r\nCP-1017,cdl_a,2026-10-02,2030-10-01\r\n";

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
      setResult(await apiUpload<Result>("/api/credentials/import", { csv, dryRun }, (f) => setProgress(f * 0.9)));
      setProgress(1);
      setPhase(dryRun ? "checked" : "imported");
    } catch (err) {
      const f = asFailure(err);
      setProgress(1);
      setPhase("failed");
      if (f.unreachable) return setError("The server did not answer; nothing was imported.");
      setResult({ ok: false, ...(f.body as Partial<Result>) } as Result);
      if (!f.issues.length) setError(f.message);
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
          <TextField
            id="csv-file"
            type="file"
            accept=".csv,text/csv"
            label="CSV file"
            className="field file:mr-3 file:rounded file:border-0 file:bg-paper-200 file:px-2 file:py-1 file:text-sm file:font-semibold"
            onChange={(e) => pick(e.target.files?.[0] ?? null)}
            disabled={busy}
            hint={
              <span className="break-words">
                Columns: <code>employee_no</code>, <code>qualification</code> (a code), <code>issued_on</code> and, optionally, <code>expires_on</code> (the last valid
                day; empty = proposed from the renewal period). Dates as YYYY-MM-DD. Nothing is written unless every row is good.{" "}
                <button type="button" className="font-semibold text-copper underline" onClick={downloadTemplate}>
                  Download a template
                </button>
              </span>
            }
          />

          {(busy || progress > 0) && phase !== "idle" && <ImportProgress phase={phase} progress={progress} />}

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
          <FormError className="mt-3" text={error} />
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

        {issueCount > 0 && <ImportIssues issues={issues} issueCount={issueCount} final={Boolean(result && !result.ok)} />}
        {rows.length > 0 && <ImportPreview rows={rows} issues={issues} checked={Boolean(result)} />}
      </div>

      <CodesAside codes={codes} />
    </div>
  );
}
