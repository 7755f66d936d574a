"use client";

import Link from "next/link";
import { useMemo, useState } from "react";
import { FormAlert, SelectField, TextField } from "@/components/form/fields";
import { YardOptions } from "@/components/form/options";
import { Badge } from "@/components/status";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import type { WorkerRow } from "@/lib/workers/model";
import { WorkerForm, type YardOption } from "./worker-form";

interface Props {
  workers: WorkerRow[];
  yards: YardOption[];
  canEdit: boolean;
  canSeeCredentials: boolean;
  editId: number | null;
}

/** "+13205550123" → "+1 320 555 0123" for reading; the stored value stays E.164. */
function showPhone(p: string | null) {
  if (!p) return "—";
  const us = /^\+1(\d{3})(\d{3})(\d{4})$/.exec(p);
  return us ? `+1 ${us[1]} ${us[2]} ${us[3]}` : p;
}

export function RosterClient({ workers, yards, canEdit, canSeeCredentials, editId }: Props) {
  const [q, setQ] = useState("");
  const [yard, setYard] = useState("");
  const [state, setState] = useState<"active" | "inactive" | "all">("active");
  const [editing, setEditing] = useState<number | "new" | null>(editId);
  const [done, setDone] = useState<string | null>(null);

  const shown = useMemo(() => {
    const needle = q.trim().toLowerCase();
    return workers.filter(
      (w) =>
        (!yard || w.yardCode === yard) &&
        (state === "all" || (state === "active" ? w.active : !w.active)) &&
        (!needle || `${w.name} ${w.employeeNo} ${w.email ?? ""} ${w.phone ?? ""}`.toLowerCase().includes(needle)),
    );
  }, [workers, q, yard, state]);

  const editingWorker = typeof editing === "number" ? workers.find((w) => w.id === editing) : undefined;
  const finish = (msg: string) => {
    setEditing(null);
    setDone(msg);
  };

  const editButton = (w: WorkerRow) => (
    <button
      type="button"
      className="btn-quiet px-2 py-1"
      onClick={() => {
        setDone(null);
        setEditing(w.id);
        window.scrollTo({ top: 0, behavior: "smooth" });
      }}
      aria-label={`Edit ${w.name}`}
    >
      Edit
    </button>
  );

  return (
    <section aria-label="Workers">
      <div className="card mb-3 grid gap-3 p-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_auto] lg:items-end">
        <TextField id="roster-q" type="search" label="Search" placeholder="Name, employee number, phone, e-mail" value={q} onChange={(e) => setQ(e.target.value)} />
        <SelectField id="roster-yard" label="Yard" value={yard} onChange={(e) => setYard(e.target.value)}>
          <YardOptions yards={yards} by="code" all="All yards" withCode />
        </SelectField>
        <SelectField id="roster-state" label="Show" value={state} onChange={(e) => setState(e.target.value as typeof state)}>
          <option value="active">Active workers</option>
          <option value="inactive">Inactive workers</option>
          <option value="all">Everyone</option>
        </SelectField>
        {canEdit && (
          <button
            type="button"
            className="btn-primary"
            onClick={() => {
              setDone(null);
              setEditing("new");
            }}
          >
            Add worker
          </button>
        )}
      </div>

      {done && (
        <div className="mb-3">
          <FormAlert tone="clear">{done}</FormAlert>
        </div>
      )}
      {canEdit && editing === "new" && (
        <div className="mb-4">
          <WorkerForm yards={yards} onDone={finish} onCancel={() => setEditing(null)} />
        </div>
      )}
      {canEdit && editingWorker && (
        <div className="mb-4">
          <WorkerForm key={editingWorker.id} worker={editingWorker} yards={yards} onDone={finish} onCancel={() => setEditing(null)} />
        </div>
      )}

      <p className="mb-2 text-sm text-ink-500" aria-live="polite">
        {shown.length} of {workers.length} workers
      </p>
      <div className="card hidden overflow-x-auto md:block">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            <tr>
              <th className="px-3 py-2">Emp. no</th>
              <th className="px-3 py-2">Name</th>
              <th className="px-3 py-2">Classification</th>
              <th className="px-3 py-2">Yard</th>
              <th className="px-3 py-2">Phone</th>
              <th className="px-3 py-2">E-mail</th>
              <th className="px-3 py-2">Texts</th>
              <th className="px-3 py-2">State</th>
              {(canEdit || canSeeCredentials) && (
                <th className="px-3 py-2">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {shown.map((w) => (
              <tr key={w.id} className="border-t border-rule" data-testid={`worker-${w.employeeNo}`}>
                <td className="px-3 py-2 tabular-nums">{w.employeeNo}</td>
                <td className="px-3 py-2 font-semibold">{w.name}</td>
                <td className="px-3 py-2">{CLASSIFICATION_LABEL[w.classification] ?? w.classification}</td>
                <td className="px-3 py-2">{w.yardCode}</td>
                <td className="whitespace-nowrap px-3 py-2 tabular-nums">{showPhone(w.phone)}</td>
                <td className="px-3 py-2">{w.email ?? "—"}</td>
                <td className="px-3 py-2">{w.smsOptIn ? "Yes" : <Badge tone="muted">Opted out</Badge>}</td>
                <td className="px-3 py-2">{w.active ? <Badge tone="clear">Active</Badge> : <Badge tone="muted">Inactive</Badge>}</td>
                {(canEdit || canSeeCredentials) && (
                  <td className="whitespace-nowrap px-3 py-2 text-right">
                    {canSeeCredentials && (
                      <Link className="mr-3 text-sm font-semibold text-copper hover:underline" href={`/credentials/${w.id}`}>
                        Credentials
                      </Link>
                    )}
                    {canEdit && editButton(w)}
                  </td>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ul className="space-y-2 md:hidden">
        {shown.map((w) => (
          <li key={w.id} className="card p-3">
            <div className="flex items-start justify-between gap-2">
              <div className="min-w-0">
                <p className="font-bold">{w.name}</p>
                <p className="text-xs text-ink-500">
                  {w.employeeNo} · {CLASSIFICATION_LABEL[w.classification] ?? w.classification} · {w.yardCode}
                </p>
              </div>
              {w.active ? <Badge tone="clear">Active</Badge> : <Badge tone="muted">Inactive</Badge>}
            </div>
            <p className="mt-1 text-sm tabular-nums">{showPhone(w.phone)}{w.smsOptIn ? "" : " · opted out of texts"}</p>
            <p className="truncate text-sm text-ink-700">{w.email ?? "No e-mail"}</p>
            <div className="mt-2 flex gap-2">
              {canSeeCredentials && (
                <Link className="btn-quiet px-2 py-1" href={`/credentials/${w.id}`}>
                  Credentials
                </Link>
              )}
              {canEdit && editButton(w)}
            </div>
          </li>
        ))}
      </ul>
    </section>
  );
}
