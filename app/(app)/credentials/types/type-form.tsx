"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { CheckField, FormActions, FormAlert, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import type { QualificationType } from "@/lib/credentials/model";
import { qualificationTypeCreateSchema, type QualificationTypeCreate, type QualificationTypeCreateInput } from "@/lib/credentials/qualification-types";

const editSchema = qualificationTypeCreateSchema.omit({ code: true });

const months = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

/**
 * Add a qualification type (POST, with its code) or edit one in its table row (PATCH, the code
 * stays): the same schema as the routes; their 422 issues land on the fields.
 */
export function TypeForm({ t, onClose }: { t?: QualificationType; onClose: (msg?: string) => void }) {
  const key = t ? String(t.id) : "new";
  const form = useForm<QualificationTypeCreateInput, unknown, QualificationTypeCreate>({
    resolver: zodResolver((t ? editSchema : qualificationTypeCreateSchema) as never) as never,
    defaultValues: t
      ? { name: t.name, renewalMonths: t.renewalMonths, warnDays: t.warnDays, needsEvidence: t.needsEvidence }
      : { code: "", name: "", renewalMonths: 12, warnDays: 30, needsEvidence: true },
  });
  const e = form.formState.errors;
  const save = useApiMutation<QualificationTypeCreate, { type: { name: string } }>({
    request: (values) => (t ? { url: `/api/qualification-types/${t.id}`, method: "PATCH", body: values } : { url: "/api/qualification-types", method: "POST", body: values }),
    form,
    refresh: true,
    onSuccess: (body) => onClose(t ? `Saved ${body.type.name}.` : `Added ${body.type.name}.`),
  });
  const span = t ? "sm:col-span-2 lg:col-span-5" : "sm:col-span-2 lg:col-span-6";
  const buttons = (
    <FormActions className={t ? "flex gap-2 self-end" : `flex gap-2 ${span}`} label={t ? "Save" : "Add"} busy={save.isPending} onCancel={() => onClose()} />
  );
  return (
    <form
      onSubmit={form.handleSubmit(save.submit)}
      noValidate
      className={
        t
          ? "grid gap-3 bg-white p-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr_auto] lg:items-start"
          : "card mb-4 grid gap-3 bg-white p-4 sm:grid-cols-2 lg:grid-cols-6 lg:items-start"
      }
      aria-label={t ? `Edit ${t.name}` : "Add a qualification type"}
    >
      {!t && <p className={`font-bold ${span}`}>Add a qualification type</p>}
      {!t && <TextField id="qt-new-code" label="Code" placeholder="e.g. confined_space" error={e.code?.message} {...form.register("code")} />}
      <TextField id={`qt-name-${key}`} wrapperClassName={t ? undefined : "lg:col-span-2"} label="Name" error={e.name?.message} {...form.register("name")} />
      <TextField
        id={`qt-months-${key}`}
        type="number"
        min={1}
        placeholder="No renewal"
        label="Renewal (months)"
        error={e.renewalMonths?.message}
        {...form.register("renewalMonths", { setValueAs: months })}
      />
      <TextField id={`qt-warn-${key}`} type="number" min={0} label="Warn (days before)" error={e.warnDays?.message} {...form.register("warnDays", { valueAsNumber: true })} />
      <CheckField
        id={`qt-evidence-${key}`}
        wrapperClassName="self-center"
        labelClassName="inline-flex items-center gap-2 text-sm"
        label="Needs evidence"
        error={e.needsEvidence?.message}
        {...form.register("needsEvidence")}
      />
      {t && buttons}
      {save.errorText && (
        <div className={span}>
          <FormAlert tone="block">{save.errorText}</FormAlert>
        </div>
      )}
      {!t && buttons}
    </form>
  );
}
