"use client";

import { useForm } from "react-hook-form";
import { FormActions, FormError, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { GEAR_CLASSES, GEAR_KIND_LABEL, GEAR_KINDS, classLabel } from "@/lib/gear/model";

type Values = { kind: string; class: string; size: string; serial: string; testedOn: string; issuedOn: string };

/** Record a pair of rubber gloves or sleeves (POST /api/gear); the route checks it and names the field. */
export function GearForm({ workerId, today, onDone, onCancel }: { workerId: number; today: string; onDone: () => void; onCancel: () => void }) {
  const form = useForm<Values>({ defaultValues: { kind: "rubber_gloves", class: "2", size: "", serial: "", testedOn: today, issuedOn: today } });
  const { register } = form;
  const e = form.formState.errors;
  const save = useApiMutation<Values>({
    request: (v) => ({ url: "/api/gear", method: "POST", body: { workerId, ...v, size: v.size || null, issuedOn: v.issuedOn || null } }),
    form,
    refresh: true,
    onSuccess: onDone,
  });
  return (
    <form onSubmit={form.handleSubmit(save.submit)} className="card mb-3 grid gap-3 p-4 sm:grid-cols-3" aria-label="Record rubber goods" noValidate>
      <FormError className="sm:col-span-3" text={save.errorText} />
      <SelectField label="Kind" error={e.kind?.message} {...register("kind")}>
        <LabelOptions values={GEAR_KINDS} labels={GEAR_KIND_LABEL} />
      </SelectField>
      <SelectField label="Class" error={e.class?.message} {...register("class")}>
        <LabelOptions values={GEAR_CLASSES} labels={classLabel} />
      </SelectField>
      <TextField label="Size" maxLength={10} error={e.size?.message} {...register("size")} />
      <TextField label="Serial or label" required error={e.serial?.message} {...register("serial")} />
      <TextField type="date" max={today} label="Last electrical test" error={e.testedOn?.message} {...register("testedOn")} />
      <TextField type="date" label="Issued" error={e.issuedOn?.message} {...register("issuedOn")} />
      <FormActions className="flex gap-2 sm:col-span-3" label="Save" busy={save.isPending} onCancel={onCancel} />
    </form>
  );
}
