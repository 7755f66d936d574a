"use client";

import { useForm } from "react-hook-form";
import { FormActions, FormError, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { RIGGING_KINDS, RIGGING_KIND_LABEL, type RiggingKind } from "@/lib/equipment/model";

type Values = { kind: RiggingKind; label: string; partsOfLine: string; sheaves: string; wllLb: string; inspectedOn: string };

const num = (s: string) => (s.trim() === "" ? undefined : Number(s));

/** Add a rope block, sling or shackle to a truck (POST /api/equipment/:id/rigging); 422 issues land on their fields. */
export function RiggingForm({ equipmentId, unit, onClose }: { equipmentId: number; unit: string; onClose: () => void }) {
  const form = useForm<Values>({ defaultValues: { kind: "rope_block", label: "", partsOfLine: "3", sheaves: "", wllLb: "", inspectedOn: "" } });
  const { register, watch } = form;
  const e = form.formState.errors;
  const kind = watch("kind");
  const save = useApiMutation<Values>({
    request: (v) => {
      const body: Record<string, unknown> = { kind: v.kind, label: v.label, wllLb: num(v.wllLb), inspectedOn: v.inspectedOn || null };
      if (v.kind === "rope_block") {
        body.partsOfLine = num(v.partsOfLine);
        if (v.sheaves.trim()) body.sheaves = num(v.sheaves);
      }
      return { url: `/api/equipment/${equipmentId}/rigging`, method: "POST", body };
    },
    form,
    refresh: true,
    onSuccess: onClose,
  });
  const id = (f: string) => `rig-${equipmentId}-${f}`;
  return (
    <form className="mt-2 grid gap-2 rounded-md border border-rule p-2 text-xs sm:grid-cols-3" aria-label={`Add rigging to ${unit}`} onSubmit={form.handleSubmit(save.submit)} noValidate>
      <SelectField id={id("kind")} label="Kind" error={e.kind?.message} {...register("kind")}>
        <LabelOptions values={RIGGING_KINDS} labels={RIGGING_KIND_LABEL} />
      </SelectField>
      <TextField id={id("label")} wrapperClassName="sm:col-span-2" label="Label" error={e.label?.message} {...register("label")} />
      {kind === "rope_block" && (
        <>
          <TextField id={id("parts")} inputMode="numeric" label="Parts of line" error={e.partsOfLine?.message} {...register("partsOfLine")} />
          <TextField id={id("sheaves")} inputMode="numeric" label="Sheaves (blank = parts)" error={e.sheaves?.message} {...register("sheaves")} />
        </>
      )}
      <TextField id={id("wll")} inputMode="numeric" label="WLL (lb)" error={e.wllLb?.message} {...register("wllLb")} />
      <TextField id={id("inspected")} type="date" label="Last inspection" error={e.inspectedOn?.message} {...register("inspectedOn")} />
      <FormActions className="flex items-end gap-2 sm:col-span-3" label="Add" busyLabel="Add" busy={save.isPending} onCancel={onClose} />
      <FormError className="sm:col-span-3" text={save.errorText} />
    </form>
  );
}
