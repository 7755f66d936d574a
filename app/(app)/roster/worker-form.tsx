"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { CheckField, FormActions, FormAlert, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import type { WorkerRow } from "@/lib/workers/model";
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
  const [version, setVersion] = useState(worker?.version ?? 1);
  const [note, setNote] = useState<string | null>(null);
  const [stale, setStale] = useState<WorkerRow | null>(null);
  const form = useForm<WorkerFormInput, unknown, WorkerInput>({
    resolver: zodResolver(workerSchema),
    defaultValues: toForm(worker, yards),
  });
  const errors = form.formState.errors;
  const save = useApiMutation<WorkerInput, { worker: { name: string; employeeNo: string } }>({
    request: (values) => (worker ? { url: `/api/workers/${worker.id}`, method: "PATCH", body: { ...values, version } } : { url: "/api/workers", method: "POST", body: values }),
    form,
    fields: FIELDS,
    refresh: true,
    onSuccess: (body) => onDone(worker ? `Saved ${body.worker.name}.` : `Added ${body.worker.name} (${body.worker.employeeNo}).`),
    onFailure: (f) => {
      if (f.conflict && f.body.current) setStale(f.body.current as WorkerRow);
    },
  });

  function takeTheirs() {
    if (!stale) return;
    form.reset(toForm(stale, yards));
    setVersion(stale.version);
    setStale(null);
    save.reset();
    setNote("Loaded the latest version. Make your change again and save.");
  }

  const formError = save.errorText ?? note;
  const e = (name: (typeof FIELDS)[number]) => errors[name]?.message;

  return (
    <form
      onSubmit={form.handleSubmit((v) => {
        setNote(null);
        setStale(null);
        return save.submit(v);
      })}
      noValidate
      aria-label={worker ? `Edit ${worker.name}` : "Add a worker"}
      className="card grid gap-3 border-copper/40 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <p className="font-bold sm:col-span-2 lg:col-span-4">{worker ? `Edit ${worker.name}` : "Add a worker"}</p>
      <TextField id="wf-employeeNo" label="Employee number" autoComplete="off" error={e("employeeNo")} {...form.register("employeeNo")} />
      <TextField id="wf-firstName" label="First name" autoComplete="off" error={e("firstName")} {...form.register("firstName")} />
      <TextField id="wf-lastName" label="Last name" autoComplete="off" error={e("lastName")} {...form.register("lastName")} />
      <SelectField id="wf-classification" label="Classification" error={e("classification")} {...form.register("classification")}>
        <LabelOptions values={CLASSIFICATIONS} labels={CLASSIFICATION_LABEL} />
      </SelectField>
      <SelectField id="wf-yardId" label="Yard" error={e("yardId")} {...form.register("yardId")}>
        <YardOptions yards={yards} by="id" withCode />
      </SelectField>
      <TextField
        id="wf-phone"
        label="Mobile phone"
        type="tel"
        inputMode="tel"
        placeholder="(320) 555-0123 or +44 …"
        hint={e("phone") ? undefined : "US numbers need no +1; stored as +1…"}
        error={e("phone")}
        {...form.register("phone")}
      />
      <TextField id="wf-email" wrapperClassName="sm:col-span-2" label="E-mail" type="email" autoComplete="off" error={e("email")} {...form.register("email")} />
      <fieldset className="flex flex-wrap gap-x-6 gap-y-2 sm:col-span-2 lg:col-span-4">
        <legend className="sr-only">Options</legend>
        <CheckField id="wf-smsOptIn" labelClassName="inline-flex items-center gap-2 text-sm" label="Sends texts (SMS opt-in)" error={e("smsOptIn")} {...form.register("smsOptIn")} />
        <CheckField id="wf-active" labelClassName="inline-flex items-center gap-2 text-sm" label="Active (shown on the board)" error={e("active")} {...form.register("active")} />
      </fieldset>
      {formError && (
        <div className="sm:col-span-2 lg:col-span-4">
          <FormAlert tone="block">
            {formError}
            {stale && (
              <button type="button" className="btn-quiet ml-3 px-2 py-1" onClick={takeTheirs}>
                Load the latest version
              </button>
            )}
          </FormAlert>
        </div>
      )}
      <FormActions className="flex gap-2 sm:col-span-2 lg:col-span-4" label={worker ? "Save changes" : "Add worker"} busy={save.isPending} onCancel={onCancel} />
    </form>
  );
}
