"use client";

import { useState, useSyncExternalStore } from "react";
import { CredentialForm, type FormType } from "@/components/credential-form";
import { CredentialState } from "@/components/credential-state";
import { FormAlert } from "@/components/form/fields";
import type { CredentialDetail } from "@/lib/credentials/model";
import { CurrentCards, CurrentTable, EvidenceLink } from "./current-list";
import { PendingActions } from "./pending-actions";

interface Props {
  worker: { id: number; name: string };
  current: CredentialDetail[];
  pending: CredentialDetail[];
  types: FormType[];
  today: string;
  /** hr: add, renew, verify; own: the lineworker sends renewals; read: supervisor. */
  mode: "hr" | "own" | "read";
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
      {done && <FormAlert tone="clear">{done}</FormAlert>}

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
            Current credentials
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
          <p className="card p-4 text-sm text-ink-500">No credentials on file.</p>
        ) : (
          <>
            <CurrentTable current={current} mode={mode} renewButton={renewButton} openForm={wide && typeof open === "number" ? open : null} formFor={formFor} />
            <CurrentCards current={current} mode={mode} renewButton={renewButton} openForm={!wide && typeof open === "number" ? open : null} formFor={formFor} />
          </>
        )}
      </section>
    </div>
  );
}
