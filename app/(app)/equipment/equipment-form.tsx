"use client";

import { useForm } from "react-hook-form";
import { CheckField, FormActions, FormError, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { EQUIPMENT_KINDS, EQUIPMENT_KIND_LABEL, type Equipment, type EquipmentKind } from "@/lib/equipment/model";

export type YardOpt = { id: number; code: string; name: string };

type Values = {
  yardId: string;
  kind: EquipmentKind;
  unitNumber: string;
  name: string;
  insulated: boolean;
  dielectricTestedOn: string;
  annualInspectionOn: string;
  licence: string;
  outOfService: boolean;
  outOfServiceReason: string;
};

/** Add a truck, trailer or other unit, or edit one (with its version); the route names the field it refuses. */
export function EquipmentForm({ equipment: e, yards, homeYardCode, onClose }: { equipment: Equipment | null; yards: YardOpt[]; homeYardCode: string; onClose: () => void }) {
  const form = useForm<Values>({
    defaultValues: {
      yardId: String(e?.yardId ?? yards.find((y) => y.code === homeYardCode)?.id ?? yards[0]?.id ?? ""),
      kind: e?.kind ?? "bucket_truck",
      unitNumber: e?.unitNumber ?? "",
      name: e?.name ?? "",
      insulated: e?.insulated ?? false,
      dielectricTestedOn: e?.dielectricTestedOn ?? "",
      annualInspectionOn: e?.annualInspectionOn ?? "",
      licence: e?.licence ?? "",
      outOfService: e?.outOfService ?? false,
      outOfServiceReason: e?.outOfServiceReason ?? "",
    },
  });
  const { register, watch } = form;
  const err = form.formState.errors;
  const save = useApiMutation<Values>({
    request: (v) => ({
      url: e ? `/api/equipment/${e.id}` : "/api/equipment",
      method: e ? "PATCH" : "POST",
      body: {
        yardId: Number(v.yardId),
        kind: v.kind,
        unitNumber: v.unitNumber,
        name: v.name,
        insulated: v.insulated,
        dielectricTestedOn: v.dielectricTestedOn || null,
        annualInspectionOn: v.annualInspectionOn || null,
        licence: v.licence || null,
        outOfService: v.outOfService,
        outOfServiceReason: v.outOfService ? v.outOfServiceReason : null,
        ...(e ? { version: e.version } : {}),
      },
    }),
    form,
    refresh: true,
    onSuccess: onClose,
  });
  const id = (f: string) => `eq-${f}`;
  return (
    <form className="card grid gap-3 p-4 sm:grid-cols-2 lg:grid-cols-4" aria-label={e ? `Edit ${e.unitNumber}` : "Add equipment"} onSubmit={form.handleSubmit(save.submit)} noValidate>
      <h2 className="font-extrabold sm:col-span-2 lg:col-span-4">{e ? `Edit ${e.unitNumber}` : "Add equipment"}</h2>
      <TextField id={id("unit")} label="Unit number" error={err.unitNumber?.message} {...register("unitNumber")} />
      <TextField id={id("name")} wrapperClassName="lg:col-span-2" label="Name" error={err.name?.message} {...register("name")} />
      <SelectField id={id("yard")} label="Yard" error={err.yardId?.message} {...register("yardId")}>
        <YardOptions yards={yards} by="id" />
      </SelectField>
      <SelectField id={id("kind")} label="Kind" error={err.kind?.message} {...register("kind")}>
        <LabelOptions values={EQUIPMENT_KINDS} labels={EQUIPMENT_KIND_LABEL} />
      </SelectField>
      <SelectField id={id("licence")} label="Driver licence needed" error={err.licence?.message} {...register("licence")}>
        <option value="">None</option>
        <option value="cdl_b">CDL class B</option>
        <option value="cdl_a">CDL class A</option>
      </SelectField>
      <TextField id={id("dielectric")} type="date" label="Last dielectric test" error={err.dielectricTestedOn?.message} {...register("dielectricTestedOn")} />
      <TextField id={id("inspection")} type="date" label="Annual inspection" error={err.annualInspectionOn?.message} {...register("annualInspectionOn")} />
      <CheckField id={id("insulated")} label="Insulated aerial device" error={err.insulated?.message} {...register("insulated")} />
      <CheckField id={id("oos")} label="Out of service" {...register("outOfService")} />
      {watch("outOfService") && (
        <TextField
          id={id("reason")}
          wrapperClassName="sm:col-span-2 lg:col-span-4"
          label="Why it is out of service"
          error={err.outOfServiceReason?.message ?? err.outOfService?.message}
          {...register("outOfServiceReason")}
        />
      )}
      <FormActions className="flex gap-2 sm:col-span-2 lg:col-span-4" label="Save" busy={save.isPending} onCancel={onClose} />
      <FormError className="sm:col-span-2 lg:col-span-4" text={save.errorText} />
    </form>
  );
}
