"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import type { WorkerRow } from "@/lib/workers/data";
import { CLASSIFICATIONS, workerSchema, type WorkerFormInput, type WorkerInput } from "@/lib/workers/model";

export interface YardOption {
  id: number;
  code: string;
  name: string;
}

interface Props {
  worker?: WorkerRow;
  yards: YardOption[];
  onDone: (message: string) => void;
  onCancel: () => void;
}

const FIELDS = ["employeeNo", "firstName", "lastName", "classification", "yardId", "phone", "email", "smsOptIn", "active"] as const;

const toForm = (w?: WorkerRow, yards?: YardOption[]): WorkerFormInput => ({
  employeeNo: w?.employeeNo ?? "",
  firstName: w?.firstName ?? "",
  lastName: w?.lastName ?? "",
  classification: (w?.classification as WorkerFormInput["classification"]) ?? "journeyman",
  yardId: w?.yardId ?? yards?.[0]?.id ?? "",
  phone: w?.phone ?? "",
  email: w?.email ?? "",
  smsOptIn: w?.smsOptIn ?? true,
  active: w?.active ?? true,
});

/** Create or edit a worker. The same zod schema checks here and in the route; the route's 422 issues land beside their fields. */
export function WorkerForm({ worker, yards, onDone, onCancel }: Props) {
  const router = useRouter();
  const [version, setVersion] = useState(worker?.version ?? 1);
  const [formError, setFormError] = useState<string | null>(null);
  const [stale, setStale] = useState<WorkerRow | null>(null);
  const form = useForm<WorkerFormInput, unknown, WorkerInput>({
    resolver: zodResolver(workerSchema),
    defaultValues: toForm(worker, yards),
  });
  const errors = form.formState.errors;

  async function onSubmit(values: WorkerInput) {
    setFormError(null);
    setStale(null);
    const res = await fetch(worker ? `/api/workers/${worker.id}` : "/api/workers", {
      method: worker ? "PATCH" : "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(worker ? { ...values, version } : values),
    });
    const body = await res.json().catch(() => ({}));
    if (!res.ok) {
      for (const i of body.issues ?? []) {
        if ((FIELDS as readonly string[]).includes(i.field)) form.setError(i.field as (typeof FIELDS)[number], { message: i.message });
      }
      if (res.status === 409 && body.current) setStale(body.current);
      setFormError(body.error ?? "Not saved.");
      return;
    }
    router.refresh();
    onDone(worker ? `Saved ${body.worker.name}.` : `Added ${body.worker.name} (${body.worker.employeeNo}).`);
  }

  function takeTheirs() {
    if (!stale) return;
    form.reset(toForm(stale, yards));
    setVersion(stale.version);
    setStale(null);
    setFormError("Loaded the latest version. Make your change again and save.");
  }

  const field = (name: (typeof FIELDS)[number]) => ({
    id: `wf-${name}`,
    "aria-invalid": errors[name] ? true : undefined,
    "aria-describedby": errors[name] ? `wf-${name}-err` : undefined,
  });
  const err = (name: (typeof FIELDS)[number]) =>
    errors[name] ? (
      <p id={`wf-${name}-err`} className="mt-1 text-xs font-semibold text-block">
        ✖ {String(errors[name]?.message)}
      </p>
    ) : null;

  return (
    <form
      onSubmit={form.handleSubmit(onSubmit)}
      noValidate
      aria-label={worker ? `Edit ${worker.name}` : "Add a worker"}
      className="card grid gap-3 border-copper/40 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <p className="font-bold sm:col-span-2 lg:col-span-4">{worker ? `Edit ${worker.name}` : "Add a worker"}</p>
      <div>
        <label className="label" htmlFor="wf-employeeNo">
          Employee number
        </label>
        <input className="field" autoComplete="off" {...field("employeeNo")} {...form.register("employeeNo")} />
        {err("employeeNo")}
      </div>
      <div>
        <label className="label" htmlFor="wf-firstName">
          First name
        </label>
        <input className="field" autoComplete="off" {...field("firstName")} {...form.register("firstName")} />
        {err("firstName")}
      </div>
      <div>
        <label className="label" htmlFor="wf-lastName">
          Last name
        </label>
        <input className="field" autoComplete="off" {...field("lastName")} {...form.register("lastName")} />
        {err("lastName")}
      </div>
      <div>
        <label className="label" htmlFor="wf-classification">
          Classification
        </label>
        <select className="field" {...field("classification")} {...form.register("classification")}>
          {CLASSIFICATIONS.map((c) => (
            <option key={c} value={c}>
              {CLASSIFICATION_LABEL[c]}
            </option>
          ))}
        </select>
        {err("classification")}
      </div>
      <div>
        <label className="label" htmlFor="wf-yardId">
          Yard
        </label>
        <select className="field" {...field("yardId")} {...form.register("yardId")}>
          {yards.map((y) => (
            <option key={y.id} value={y.id}>
              {y.name} ({y.code})
            </option>
          ))}
        </select>
        {err("yardId")}
      </div>
      <div>
        <label className="label" htmlFor="wf-phone">
          Mobile phone
        </label>
        <input className="field" type="tel" inputMode="tel" placeholder="(320) 555-0123 or +44 …" {...field("phone")} {...form.register("phone")} />
        {err("phone") ?? <p className="mt-1 text-xs text-ink-500">US numbers need no +1; stored as +1…</p>}
      </div>
      <div className="sm:col-span-2">
        <label className="label" htmlFor="wf-email">
          E-mail
        </label>
        <input className="field" type="email" autoComplete="off" {...field("email")} {...form.register("email")} />
        {err("email")}
      </div>
      <fieldset className="flex flex-wrap gap-x-6 gap-y-2 sm:col-span-2 lg:col-span-4">
        <legend className="sr-only">Options</legend>
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" {...form.register("smsOptIn")} /> Sends texts (SMS opt-in)
        </label>
        <label className="inline-flex items-center gap-2 text-sm">
          <input type="checkbox" {...form.register("active")} /> Active (shown on the board)
        </label>
      </fieldset>
      {formError && (
        <div role="alert" className="rounded-md bg-block-bg px-3 py-2 text-sm font-medium text-block sm:col-span-2 lg:col-span-4">
          ✖ {formError}
          {stale && (
            <button type="button" className="btn-quiet ml-3 px-2 py-1" onClick={takeTheirs}>
              Load the latest version
            </button>
          )}
        </div>
      )}
      <div className="flex gap-2 sm:col-span-2 lg:col-span-4">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          {form.formState.isSubmitting ? "Saving…" : worker ? "Save changes" : "Add worker"}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
      </div>
    </form>
  );
}
