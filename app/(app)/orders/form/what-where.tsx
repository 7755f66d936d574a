"use client";

import { SelectField, TextField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
import { ORDER_STATUSES, PRIORITY_LABEL, STATUS_LABEL } from "@/lib/orders/status";
import type { WorkTypeView } from "@/lib/orders/model";
import { emptyToNull, fieldError, type Mode, type OrderFormApi, type YardOption } from "./shared";

/** Title, yard, work type, place, priority and status (with the hold reason and actual times). */
export function WhatWhere({
  form,
  mode,
  yards,
  workTypes,
  fixedYardId,
  onPickType,
}: {
  form: OrderFormApi;
  mode: Mode;
  yards: YardOption[];
  workTypes: WorkTypeView[];
  fixedYardId: number;
  onPickType: (id: number) => void;
}) {
  const { register, watch } = form;
  const err = (name: string) => fieldError(form, name);
  const status = watch("status");
  const statuses = mode === "edit" ? ORDER_STATUSES : (["draft", "planned"] as const);
  return (
    <section className="card space-y-3 p-4">
      <h2 className="font-bold">What and where</h2>
      <TextField label="Title" error={err("title")} {...register("title")} />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Yard" error={err("yardId")} {...register("yardId", { setValueAs: Number })}>
          <YardOptions yards={yards.filter((y) => mode !== "series" || y.id === fixedYardId)} by="id" withCode />
        </SelectField>
        <SelectField label="Work type" error={err("workTypeId")} {...register("workTypeId", { setValueAs: Number, onChange: (e) => onPickType(Number(e.target.value)) })}>
          {workTypes.map((t) => (
            <option key={t.id} value={t.id}>
              {t.name}
            </option>
          ))}
        </SelectField>
      </div>
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField wrapperClassName="sm:col-span-2" label="Address or location" error={err("address")} {...register("address")} />
        <TextField label="Pole / structure no." error={err("structureNo")} {...register("structureNo")} />
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField label="Priority" error={err("priority")} {...register("priority", { setValueAs: Number })}>
          {[1, 2, 3, 4, 5].map((p) => (
            <option key={p} value={p}>
              {PRIORITY_LABEL[p]}
            </option>
          ))}
        </SelectField>
        <SelectField label="Status" error={err("status")} {...register("status")}>
          <LabelOptions values={statuses} labels={STATUS_LABEL} />
        </SelectField>
      </div>
      {mode === "edit" && status === "on_hold" && (
        <TextField label="Why on hold" placeholder="e.g. pole rejected at the pole check" error={err("holdReason")} {...register("holdReason")} />
      )}
      {mode === "edit" && status === "done" && (
        <div className="grid gap-3 sm:grid-cols-2">
          <TextField type="datetime-local" label="Actually started" error={err("actualStart")} {...register("actualStart", { setValueAs: emptyToNull })} />
          <TextField type="datetime-local" label="Actually ended" error={err("actualEnd")} {...register("actualEnd", { setValueAs: emptyToNull })} />
          <p className="text-xs text-ink-500 sm:col-span-2">Saving as done records this time for everyone holding a position; the rest rule reads it.</p>
        </div>
      )}
    </section>
  );
}
