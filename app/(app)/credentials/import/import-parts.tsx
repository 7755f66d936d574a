"use client";

import { Badge } from "@/components/status";
import { formatIssue, type ImportIssue } from "@/lib/credentials/model";
import type { ImportRow } from "@/lib/credentials/csv";

export type Phase = "idle" | "reading" | "checking" | "importing" | "checked" | "imported" | "failed";

const PREVIEW_ROWS = 20;

/** Reading, checking or importing, as a bar with its percentage. */
export function ImportProgress({ phase, progress }: { phase: Phase; progress: number }) {
  const pct = Math.round(progress * 100);
  return (
    <div className="mt-3">
      <div className="flex justify-between text-xs text-ink-500">
        <span>{phase === "reading" ? "Reading the file" : phase === "checking" ? "Checking every row" : phase === "importing" ? "Importing" : "Done"}</span>
        <span>{pct}%</span>
      </div>
      <div className="mt-1 h-2 overflow-hidden rounded bg-paper-200" role="progressbar" aria-valuemin={0} aria-valuemax={100} aria-valuenow={pct} aria-label="Progress">
        <div className="h-full bg-copper transition-all" style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

/** Every problem found, by line; `final` once the route refused the file. */
export function ImportIssues({ issues, issueCount, final }: { issues: ImportIssue[]; issueCount: number; final: boolean }) {
  return (
    <section className="card p-4" aria-labelledby="issues-h">
      <h2 id="issues-h" className="mb-2 font-bold text-block">
        ✖ {issueCount} problem{issueCount === 1 ? "" : "s"}: nothing {final ? "was" : "will be"} imported
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
  );
}

/** The first rows as read, each with the fields found wrong on its line. */
export function ImportPreview({ rows, issues, checked }: { rows: ImportRow[]; issues: ImportIssue[]; checked: boolean }) {
  return (
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
                  {bad.length ? <Badge tone="block">{bad.map((b) => b.field).join(", ")}</Badge> : <Badge tone="clear">{checked ? "OK" : "OK so far"}</Badge>}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </section>
  );
}

/** The qualification codes a file may use, with their renewal periods. */
export function CodesAside({ codes }: { codes: { code: string; name: string; renewalMonths: number | null }[] }) {
  return (
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
        A row newer than the worker&apos;s current record renews it (the old one stays in the history). Rows for several years of one qualification are chained oldest
        to newest. Imported records are recorded as verified by you.
      </p>
    </aside>
  );
}
