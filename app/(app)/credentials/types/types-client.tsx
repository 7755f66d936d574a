"use client";

import { useState } from "react";
import { FormAlert } from "@/components/form/fields";
import { Badge } from "@/components/status";
import { useApiMutation } from "@/lib/api/mutations";
import type { QualificationType } from "@/lib/credentials/model";
import { TypeForm } from "./type-form";

export function TypesClient({ types, canEdit }: { types: QualificationType[]; canEdit: boolean }) {
  const [editing, setEditing] = useState<number | "new" | null>(null);
  const [msg, setMsg] = useState<string | null>(null);
  const close = (text?: string) => {
    setEditing(null);
    if (text) setMsg(text);
  };
  const del = useApiMutation<QualificationType>({
    request: (t) => ({ url: `/api/qualification-types/${t.id}`, method: "DELETE" }),
    refresh: true,
    onSuccess: (_r, t) => setMsg(`Deleted ${t.name}.`),
  });
  function remove(t: QualificationType) {
    if (!window.confirm(`Delete ${t.name}? This cannot be undone.`)) return;
    setMsg(null);
    void del.submit(t);
  }
  return (
    <>
      {(del.errorText || msg) && <div className="mb-3">{del.errorText ? <FormAlert tone="block">{del.errorText}</FormAlert> : <FormAlert tone="clear">{msg}</FormAlert>}</div>}
      {canEdit && editing !== "new" && (
        <button type="button" className="btn-primary mb-3" onClick={() => setEditing("new")}>
          Add a qualification type
        </button>
      )}
      {editing === "new" && <TypeForm onClose={close} />}
      <div className="card overflow-x-auto">
        <table className="w-full text-left text-sm">
          <thead className="bg-paper-200 text-xs uppercase text-ink-500">
            <tr>
              <th className="px-3 py-2">Qualification</th>
              <th className="hidden px-3 py-2 sm:table-cell">Renewal</th>
              <th className="hidden px-3 py-2 sm:table-cell">Warn</th>
              <th className="hidden px-3 py-2 sm:table-cell">Evidence</th>
              <th className="hidden px-3 py-2 sm:table-cell">Records</th>
              {canEdit && (
                <th className="px-3 py-2">
                  <span className="sr-only">Actions</span>
                </th>
              )}
            </tr>
          </thead>
          <tbody>
            {types.map((t) =>
              editing === t.id ? (
                <tr key={t.id} className="border-t border-rule">
                  <td colSpan={6}>
                    <TypeForm t={t} onClose={close} />
                  </td>
                </tr>
              ) : (
                <tr key={t.id} className="border-t border-rule" data-testid={`type-${t.code}`}>
                  <td className="px-3 py-2">
                    <span className="block font-semibold">{t.name}</span>
                    <span className="mt-0.5 flex flex-wrap items-center gap-2">
                      <code className="text-xs text-ink-700">{t.code}</code>
                      {t.locked && (
                        <Badge tone="info" title="The crew rules read this code; it cannot be renamed or deleted">
                          Read by the crew rules
                        </Badge>
                      )}
                    </span>
                    <span className="mt-1 block text-xs text-ink-700 sm:hidden">
                      {t.renewalMonths ? `Renew every ${t.renewalMonths} months` : "No renewal"} · warn {t.warnDays} days before ·{" "}
                      {t.needsEvidence ? "evidence needed" : "no evidence needed"}
                    </span>
                  </td>
                  <td className="hidden px-3 py-2 sm:table-cell">{t.renewalMonths ? `${t.renewalMonths} months` : "No renewal"}</td>
                  <td className="hidden px-3 py-2 sm:table-cell">{t.warnDays} days before</td>
                  <td className="hidden px-3 py-2 sm:table-cell">{t.needsEvidence ? "Needed" : "Not needed"}</td>
                  <td className="hidden px-3 py-2 tabular-nums sm:table-cell">{t.inUse}</td>
                  {canEdit && (
                    <td className="whitespace-nowrap px-3 py-2 text-right">
                      <button type="button" className="btn-quiet px-2 py-1" onClick={() => setEditing(t.id)} aria-label={`Edit ${t.name}`}>
                        Edit
                      </button>
                      {!t.locked && t.inUse === 0 && (
                        <button type="button" className="btn-quiet ml-2 px-2 py-1" onClick={() => remove(t)} aria-label={`Delete ${t.name}`}>
                          Delete
                        </button>
                      )}
                    </td>
                  )}
                </tr>
              ),
            )}
          </tbody>
        </table>
      </div>
    </>
  );
}
