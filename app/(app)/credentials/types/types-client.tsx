"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Badge } from "@/components/status";
import type { QualificationType } from "@/lib/credentials/data";
import { qualificationTypeCreateSchema, type QualificationTypeCreate, type QualificationTypeCreateInput } from "@/lib/credentials/qualification-types";

const editSchema = qualificationTypeCreateSchema.omit({ code: true });
type EditInput = Omit<QualificationTypeCreateInput, "code">;
type EditValues = Omit<QualificationTypeCreate, "code">;

const months = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

function Err({ msg }: { msg?: string }) {
  return msg ? <p className="mt-1 text-xs font-semibold text-block">✖ {msg}</p> : null;
}

function EditRow({ t, onClose }: { t: QualificationType; onClose: (msg?: string) => void }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const form = useForm<EditInput, unknown, EditValues>({
    resolver: zodResolver(editSchema),
    defaultValues: { name: t.name, renewalMonths: t.renewalMonths, warnDays: t.warnDays, needsEvidence: t.needsEvidence },
  });
  const e = form.formState.errors;
  async function save(values: EditValues) {
    setError(null);
    const res = await fetch(`/api/qualification-types/${t.id}`, {
      method: "PATCH",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(values),
    });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) {
      for (const i of body.issues ?? []) if (i.field in values) form.setError(i.field as keyof EditInput, { message: i.message });
      setError(body.error ?? "Not saved.");
      return;
    }
    router.refresh();
    onClose(`Saved ${body.type.name}.`);
  }
  return (
    <form onSubmit={form.handleSubmit(save)} noValidate className="grid gap-3 bg-white p-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto] lg:items-start" aria-label={`Edit ${t.name}`}>
      <div>
        <label className="label" htmlFor={`qt-name-${t.id}`}>
          Name
        </label>
        <input id={`qt-name-${t.id}`} className="field" {...form.register("name")} aria-invalid={e.name ? true : undefined} />
        <Err msg={e.name?.message} />
      </div>
      <div>
        <label className="label" htmlFor={`qt-months-${t.id}`}>
          Renewal (months)
        </label>
        <input
          id={`qt-months-${t.id}`}
          className="field"
          type="number"
          min={1}
          placeholder="No renewal"
          {...form.register("renewalMonths", { setValueAs: months })}
          aria-invalid={e.renewalMonths ? true : undefined}
        />
        <Err msg={e.renewalMonths?.message} />
      </div>
      <div>
        <label className="label" htmlFor={`qt-warn-${t.id}`}>
          Warn (days before)
        </label>
        <input id={`qt-warn-${t.id}`} className="field" type="number" min={0} {...form.register("warnDays", { valueAsNumber: true })} aria-invalid={e.warnDays ? true : undefined} />
        <Err msg={e.warnDays?.message} />
      </div>
      <label className="inline-flex items-center gap-2 self-center text-sm">
        <input type="checkbox" {...form.register("needsEvidence")} /> Needs evidence
      </label>
      <div className="flex gap-2 self-end">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          Save
        </button>
        <button type="button" className="btn-quiet" onClick={() => onClose()}>
          Cancel
        </button>
      </div>
      {error && (
        <p role="alert" className="text-sm font-medium text-block sm:col-span-2 lg:col-span-5">
          ✖ {error}
        </p>
      )}
    </form>
  );
}

function AddForm({ onClose }: { onClose: (msg?: string) => void }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const form = useForm<QualificationTypeCreateInput, unknown, QualificationTypeCreate>({
    resolver: zodResolver(qualificationTypeCreateSchema),
    defaultValues: { code: "", name: "", renewalMonths: 12, warnDays: 30, needsEvidence: true },
  });
  const e = form.formState.errors;
  async function save(values: QualificationTypeCreate) {
    setError(null);
    const res = await fetch("/api/qualification-types", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(values),
    });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) {
      for (const i of body.issues ?? []) form.setError(i.field as keyof QualificationTypeCreateInput, { message: i.message });
      setError(body.error ?? "Not saved.");
      return;
    }
    router.refresh();
    onClose(`Added ${body.type.name}.`);
  }
  return (
    <form onSubmit={form.handleSubmit(save)} noValidate className="card mb-4 grid gap-3 bg-white p-4 sm:grid-cols-2 lg:grid-cols-6 lg:items-start" aria-label="Add a qualification type">
      <p className="font-bold sm:col-span-2 lg:col-span-6">Add a qualification type</p>
      <div>
        <label className="label" htmlFor="qt-new-code">
          Code
        </label>
        <input id="qt-new-code" className="field" placeholder="e.g. confined_space" {...form.register("code")} aria-invalid={e.code ? true : undefined} />
        <Err msg={e.code?.message} />
      </div>
      <div className="lg:col-span-2">
        <label className="label" htmlFor="qt-new-name">
          Name
        </label>
        <input id="qt-new-name" className="field" {...form.register("name")} aria-invalid={e.name ? true : undefined} />
        <Err msg={e.name?.message} />
      </div>
      <div>
        <label className="label" htmlFor="qt-new-months">
          Renewal (months)
        </label>
        <input id="qt-new-months" className="field" type="number" placeholder="No renewal" {...form.register("renewalMonths", { setValueAs: months })} />
        <Err msg={e.renewalMonths?.message} />
      </div>
      <div>
        <label className="label" htmlFor="qt-new-warn">
          Warn (days before)
        </label>
        <input id="qt-new-warn" className="field" type="number" {...form.register("warnDays", { valueAsNumber: true })} />
        <Err msg={e.warnDays?.message} />
      </div>
      <label className="inline-flex items-center gap-2 self-center text-sm">
        <input type="checkbox" {...form.register("needsEvidence")} /> Needs evidence
      </label>
      {error && (
        <p role="alert" className="text-sm font-medium text-block sm:col-span-2 lg:col-span-6">
          ✖ {error}
        </p>
      )}
      <div className="flex gap-2 sm:col-span-2 lg:col-span-6">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          Add
        </button>
        <button type="button" className="btn-quiet" onClick={() => onClose()}>
          Cancel
        </button>
      </div>
    </form>
  );
}

export function TypesClient({ types, canEdit }: { types: QualificationType[]; canEdit: boolean }) {
  const router = useRouter();
  const [editing, setEditing] = useState<number | "new" | null>(null);
  const [msg, setMsg] = useState<{ ok: boolean; text: string } | null>(null);
  const close = (text?: string) => {
    setEditing(null);
    if (text) setMsg({ ok: true, text });
  };
  async function remove(t: QualificationType) {
    if (!window.confirm(`Delete ${t.name}? This cannot be undone.`)) return;
    const res = await fetch(`/api/qualification-types/${t.id}`, { method: "DELETE" });
    const body = await res.json().catch(() => ({}));
    setMsg(res.ok ? { ok: true, text: `Deleted ${t.name}.` } : { ok: false, text: body.error ?? "Not deleted." });
    if (res.ok) router.refresh();
  }
  return (
    <>
      {msg && (
        <p role="status" className={`mb-3 rounded-md px-3 py-2 text-sm font-semibold ${msg.ok ? "bg-clear-bg text-clear" : "bg-block-bg text-block"}`}>
          {msg.ok ? "✓" : "✖"} {msg.text}
        </p>
      )}
      {canEdit && editing !== "new" && (
        <button type="button" className="btn-primary mb-3" onClick={() => setEditing("new")}>
          Add a qualification type
        </button>
      )}
      {editing === "new" && <AddForm onClose={close} />}
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
                    <EditRow t={t} onClose={close} />
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
