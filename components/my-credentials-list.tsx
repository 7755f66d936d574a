"use client";

import { useState } from "react";
import type { CredentialDetail } from "@/lib/credentials/model";
import { CredentialForm, type FormType } from "./credential-form";
import { CredentialState } from "./credential-state";

interface Props {
  workerId: number;
  current: CredentialDetail[];
  pending: CredentialDetail[];
  types: FormType[];
  today: string;
}

/** The lineworker's list: one card per qualification, most urgent first, with "Send renewal". */
export function MyCredentialsList({ workerId, current, pending, types, today }: Props) {
  const [open, setOpen] = useState<number | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const waiting = new Map(pending.map((p) => [p.typeId, p]));
  const sorted = [...current].sort((a, b) => (a.daysLeft ?? 1e9) - (b.daysLeft ?? 1e9));
  if (!sorted.length && !pending.length) return <p className="card p-4 text-sm text-ink-500">No credentials on file. Ask HR.</p>;
  return (
    <>
      {done && (
        <p role="status" className="mb-2 rounded-md bg-clear-bg px-3 py-2 text-sm font-semibold text-clear">
          ✓ {done}
        </p>
      )}
      <ul className="space-y-2">
        {sorted.map((c) => {
          const w = waiting.get(c.typeId);
          const type = types.find((t) => t.id === c.typeId);
          return (
            <li key={c.id} className="card p-3" data-testid={`my-${c.type}`}>
              <div className="flex items-start justify-between gap-2">
                <div className="min-w-0">
                  <p className="font-semibold">{c.typeName}</p>
                  <p className="text-sm text-ink-700 tabular-nums">
                    {c.expiresOn ? `Valid through ${c.expiresOn}` : "No expiry"}
                  </p>
                </div>
                <CredentialState status={c.status} daysLeft={c.daysLeft} warnDays={c.warnDays} />
              </div>
              {w ? (
                <p className="mt-2 text-sm text-info">● Renewal sent {w.createdAt.slice(0, 10)}: waiting for HR to verify.</p>
              ) : open === c.id && type ? (
                <div className="mt-3">
                  <CredentialForm
                    workerId={workerId}
                    type={type}
                    today={today}
                    mode="own"
                    onDone={(m) => {
                      setOpen(null);
                      setDone(m);
                    }}
                    onCancel={() => setOpen(null)}
                  />
                </div>
              ) : (
                c.renewalMonths !== null && (
                  <button
                    type="button"
                    className="btn-quiet mt-2 px-2 py-1"
                    onClick={() => {
                      setDone(null);
                      setOpen(c.id);
                    }}
                    aria-label={`Send a renewal of ${c.typeName}`}
                  >
                    Send renewal
                  </button>
                )
              )}
            </li>
          );
        })}
      </ul>
    </>
  );
}
