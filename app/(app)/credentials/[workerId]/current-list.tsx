"use client";

import { Fragment, type ReactNode } from "react";
import { CredentialState, CurrentWord } from "@/components/credential-state";
import type { CredentialDetail } from "@/lib/credentials/model";

export function EvidenceLink({ c }: { c: CredentialDetail }) {
  return c.evidenceFileId ? (
    <a className="font-semibold text-copper underline-offset-2 hover:underline" href={`/api/files/${c.evidenceFileId}`}>
      {c.evidenceName ?? "Evidence"}
    </a>
  ) : (
    <span className="text-ink-500">{c.needsEvidence ? "None on file" : "—"}</span>
  );
}

interface ListProps {
  current: CredentialDetail[];
  mode: "hr" | "own" | "read";
  renewButton: (c: CredentialDetail) => ReactNode;
  /** The credential whose renewal form this layout shows (only one layout hosts it). */
  openForm: number | null;
  formFor: (c: CredentialDetail) => ReactNode;
}

/** md and up: the worker's current credentials as a table. */
export function CurrentTable({ current, mode, renewButton, openForm, formFor }: ListProps) {
  return (
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
              {openForm === c.id && (
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
  );
}

/** Below md: the same list as cards. */
export function CurrentCards({ current, mode, renewButton, openForm, formFor }: ListProps) {
  return (
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
          {openForm === c.id && <div className="mt-3">{formFor(c)}</div>}
        </li>
      ))}
    </ul>
  );
}
