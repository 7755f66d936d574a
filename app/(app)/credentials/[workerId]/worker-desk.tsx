"use client";

import { useRouter } from "next/navigation";
import { Fragment, useState, useSyncExternalStore } from "react";
import { CredentialForm, type FormType } from "@/components/credential-form";
import { CredentialState, CurrentWord } from "@/components/credential-state";
import type { CredentialDetail } from "@/lib/credentials/data";

interface Props {
  worker: { id: number; name: string };
  current: CredentialDetail[];
  pending: CredentialDetail[];
  types: FormType[];
  today: string;
  /** hr: add, renew, verify; own: the lineworker sends renewals; read: supervisor. */
  mode: "hr" | "own" | "read";
}

function EvidenceLink({ c }: { c: CredentialDetail }) {
  return c.evidenceFileId ? (
    <a className="font-semibold text-copper underline-offset-2 hover:underline" href={`/api/files/${c.evidenceFileId}`}>
      {c.evidenceName ?? "Evidence"}
    </a>
  ) : (
    <span className="text-ink-500">{c.needsEvidence ? "None on file" : "—"}</span>
  );
}

function PendingActions({ c }: { c: CredentialDetail }) {
  const router = useRouter();
  const [rejecting, setRejecting] = useState(false);
  const [reason, setReason] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  async function patch(body: Record<string, unknown>) {
    setBusy(true);
    setError(null);
    const res = await fetch(`/api/credentials/${c.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(body),
    });
    const out = await res.json().catch(() => ({}));
    setBusy(false);
    if (!res.ok) {
      setError(out.issues?.[0]?.message ?? out.error ?? "Not saved.");
      return;
    }
    router.refresh();
  }

  if (rejecting) {
    return (
      <div className="flex flex-wrap items-start gap-2">
        <div>
          <label className="sr-only" htmlFor={`reject-${c.id}`}>
            Why is it rejected?
          </label>
          <input
            id={`reject-${c.id}`}
            className="field w-56"
            placeholder="Why? e.g. card unreadable"
            value={reason}
            onChange={(e) => setReason(e.target.value)}
            aria-invalid={error ? true : undefined}
          />
          {error && <p className="mt-1 text-xs font-semibold text-block">✖ {error}</p>}
        </div>
        <button type="button" className="btn-primary" disabled={busy} onClick={() => patch({ action: "reject", reason })}>
          Reject
        </button>
        <button type="button" className="btn-quiet" onClick={() => setRejecting(false)}>
          Cancel
        </button>
      </div>
    );
  }
  return (
    <div className="flex flex-wrap gap-2">
      <button type="button" className="btn-primary" disabled={busy} onClick={() => patch({ action: "verify" })} aria-label={`Verify ${c.typeName}`}>
        Verify
      </button>
      <button type="button" className="btn-quiet" disabled={busy} onClick={() => setRejecting(true)}>
        Reject…
      </button>
      {error && <p className="w-full text-xs font-semibold text-block">✖ {error}</p>}
    </div>
  );
}

const WIDE = "(min-width: 768px)";
/** md and up: the table; below: cards. Only one layout hosts the open form. */
function useIsWide() {
  return useSyncExternalStore(
    (cb) => {
      const m = window.matchMedia(WIDE);
      m.addEventListener("change", cb);
      return () => m.removeEventListener("change", cb);
    },
    () => window.matchMedia(WIDE).matches,
    () => true,
  );
}

export function WorkerDesk({ worker, current, pending, types, today, mode }: Props) {
  const [open, setOpen] = useState<number | "add" | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const held = new Set(current.map((c) => c.typeId));
  const waiting = new Set(pending.map((c) => c.typeId));
  const missing = types.filter((t) => !held.has(t.id) && !waiting.has(t.id));
  const typeOf = (id: number) => types.find((t) => t.id === id)!;
  const finish = (msg: string) => {
    setOpen(null);
    setDone(msg);
  };
  const formMode = mode === "own" ? "own" : "hr";
  const wide = useIsWide();
  const renewButton = (c: CredentialDetail) =>
    waiting.has(c.typeId) ? (
      <span className="text-xs text-ink-500">Renewal waiting</span>
    ) : (
      open !== c.id && (
        <button
          type="button"
          className="btn-quiet"
          onClick={() => {
            setDone(null);
            setOpen(c.id);
          }}
          aria-label={`${mode === "own" ? "Send a renewal of" : "Renew"} ${c.typeName}`}
        >
          {mode === "own" ? "Send renewal" : "Renew"}
        </button>
      )
    );
  const formFor = (c: CredentialDetail) => (
    <CredentialForm workerId={worker.id} type={typeOf(c.typeId)} today={today} mode={formMode} onDone={finish} onCancel={() => setOpen(null)} />
  );

  return (
    <div className="space-y-6">
      {done && (
        <p role="status" className="rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear">
          ✓ {done}
        </p>
      )}

      {pending.length > 0 && (
        <section aria-labelledby="pending-h">
          <h2 id="pending-h" className="mb-2 text-base font-bold">
            Renewals waiting for HR
          </h2>
          <ul className="space-y-2">
            {pending.map((c) => (
              <li key={c.id} className="card flex flex-wrap items-center justify-between gap-3 p-3" data-testid={`pending-${c.type}`}>
                <div>
                  <p className="font-semibold">{c.typeName}</p>
                  <p className="text-sm text-ink-700 tabular-nums">
                    Issued {c.issuedOn} · last valid day {c.expiresOn ?? "none"} · sent {c.createdAt.slice(0, 10)}
                    {c.createdByName ? ` by ${c.createdByName}` : ""}
                  </p>
                  <p className="text-sm">
                    <EvidenceLink c={c} />
                  </p>
                </div>
                {mode === "hr" ? <PendingActions c={c} /> : <CredentialState status="pending" daysLeft={null} warnDays={0} />}
              </li>
            ))}
          </ul>
        </section>
      )}

      <section aria-labelledby="current-h">
        <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
          <h2 id="current-h" className="text-base font-bold">
            Current qualifications
          </h2>
          {mode === "hr" && missing.length > 0 && open !== "add" && (
            <button type="button" className="btn-quiet" onClick={() => setOpen("add")}>
              Add a qualification
            </button>
          )}
        </div>
        {open === "add" && (
          <div className="mb-3">
            <CredentialForm workerId={worker.id} choices={missing} today={today} mode="hr" onDone={finish} onCancel={() => setOpen(null)} />
          </div>
        )}
        {current.length === 0 ? (
          <p className="card p-4 text-sm text-ink-500">No qualifications on file.</p>
        ) : (
          <>
            <div className="card hidden overflow-x-auto md:block">
              <table className="w-full text-left text-sm">
                <thead className="bg-paper-200 text-xs uppercase text-ink-500">
                  <tr>
                    <th className="px-3 py-2">Qualification</th>
                    <th className="px-3 py-2">State</th>
                    <th className="px-3 py-2">Issued</th>
                    <th className="px-3 py-2">Last valid day</th>
                    <th className="px-3 py-2">Days left</th>
                    <th className="px-3 py-2">Evidence</th>
                    <th className="hidden px-3 py-2 lg:table-cell">Verified</th>
                    {mode !== "read" && (
                      <th className="px-3 py-2">
                        <span className="sr-only">Actions</span>
                      </th>
                    )}
                  </tr>
                </thead>
                <tbody>
                  {current.map((c) => (
                    <Fragment key={c.id}>
                      <tr className="border-t border-rule align-top" data-testid={`current-${c.type}`}>
                        <td className="px-3 py-2 font-semibold">{c.typeName}</td>
                        <td className="px-3 py-2">
                          <CurrentWord daysLeft={c.daysLeft} />
                        </td>
                        <td className="px-3 py-2 tabular-nums">{c.issuedOn}</td>
                        <td className="px-3 py-2 tabular-nums" data-testid="expires">
                          {c.expiresOn ?? "No expiry"}
                        </td>
                        <td className="px-3 py-2">
                          <CredentialState status={c.status} daysLeft={c.daysLeft} warnDays={c.warnDays} />
                        </td>
                        <td className="max-w-56 truncate px-3 py-2">
                          <EvidenceLink c={c} />
                        </td>
                        <td className="hidden px-3 py-2 text-ink-700 lg:table-cell">
                          {c.verifiedByName ?? "Not yet"}
                          {c.verifiedAt && <span className="block text-xs text-ink-500">{c.verifiedAt.slice(0, 10)}</span>}
                        </td>
                        {mode !== "read" && <td className="px-3 py-2 text-right">{renewButton(c)}</td>}
                      </tr>
                      {wide && open === c.id && (
                        <tr>
                          <td colSpan={8} className="px-3 pb-3">
                            {formFor(c)}
                          </td>
                        </tr>
                      )}
                    </Fragment>
                  ))}
                </tbody>
              </table>
            </div>
            <ul className="space-y-2 md:hidden">
              {current.map((c) => (
                <li key={c.id} className="card p-3" data-testid={`current-card-${c.type}`}>
                  <div className="flex items-start justify-between gap-2">
                    <p className="font-semibold">{c.typeName}</p>
                    <CredentialState status={c.status} daysLeft={c.daysLeft} warnDays={c.warnDays} />
                  </div>
                  <p className="text-sm text-ink-700 tabular-nums">
                    Issued {c.issuedOn} · last valid day {c.expiresOn ?? "none"}
                  </p>
                  <div className="mt-1 flex flex-wrap items-center justify-between gap-2 text-sm">
                    <span className="min-w-0 truncate">
                      <EvidenceLink c={c} />
                    </span>
                    <span className="text-xs text-ink-500">{c.verifiedByName ? `Verified by ${c.verifiedByName}, ${c.verifiedAt?.slice(0, 10)}` : "Not verified yet"}</span>
                  </div>
                  {mode !== "read" && <div className="mt-2">{renewButton(c)}</div>}
                  {!wide && open === c.id && <div className="mt-3">{formFor(c)}</div>}
                </li>
              ))}
            </ul>
          </>
        )}
      </section>
    </div>
  );
}
