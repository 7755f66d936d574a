"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { TextAreaField, TextField } from "@/components/form/fields";
import { RemindersButton } from "@/components/reminders-button";
import { useApiMutation } from "@/lib/api/mutations";
import { GEAR_CSV_COLUMNS } from "@/lib/gear/model";

type Issue = { line: number; field: string; message: string };

/** HR's "Send test reminders now" for rubber goods (never twice per item and day). */
export function GearReminders() {
  return <RemindersButton url="/api/gear/reminders" label="Send test reminders now" />;
}

/** CSV import: check first (dry run), then import; all or nothing, with each line's problems. */
export function GearImport() {
  const router = useRouter();
  const [csv, setCsv] = useState("");
  const run = useApiMutation<boolean, { created: number; updated: number; unchanged: number }>({
    request: (dryRun) => ({ url: "/api/gear/import", method: "POST", body: { csv, dryRun } }),
    onSuccess: (_b, dryRun) => {
      if (!dryRun) router.refresh();
    },
  });
  const counts = run.data ? `${run.data.created} new, ${run.data.updated} changed, ${run.data.unchanged} unchanged` : "";
  const lineIssues = (run.failure?.body.issues ?? []) as Issue[];

  return (
    <section className="card mt-6 p-4" aria-labelledby="gear-import-h">
      <h2 id="gear-import-h" className="text-base font-bold">
        Import CSV
      </h2>
      <p className="mb-2 text-xs text-ink-500">
        Columns: {GEAR_CSV_COLUMNS.join(", ")} (an export imports as it is). Rows are matched by serial; a new serial is a new item. Nothing is written unless
        every row is valid.
      </p>
      <TextField
        id="gear-csv-file"
        label="File"
        type="file"
        accept=".csv,text/csv"
        onChange={async (e) => {
          const f = e.target.files?.[0];
          if (f) setCsv(await f.text());
        }}
      />
      <TextAreaField id="gear-csv" wrapperClassName="mt-2" label="Or paste the rows" className="field font-mono" rows={5} value={csv} onChange={(e) => setCsv(e.target.value)} name="csv" />
      <div className="mt-2 flex gap-2">
        <button type="button" className="btn-quiet" disabled={run.isPending || !csv} onClick={() => run.submit(true)}>
          Check
        </button>
        <button type="button" className="btn-primary" disabled={run.isPending || !csv} onClick={() => run.submit(false)}>
          Import
        </button>
      </div>
      {run.isSuccess && (
        <p role="status" className="mt-2 text-sm text-clear">
          ✓ {run.variables ? `The file checks out: ${counts}. Nothing written yet.` : `Imported: ${counts}.`}
        </p>
      )}
      {run.failure && (
        <div role="alert" className="mt-2 text-sm text-block">
          <p>✖ {run.failure.message}</p>
          {lineIssues.length > 0 && (
            <ul className="mt-1 list-disc pl-5">
              {lineIssues.slice(0, 50).map((i) => (
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
