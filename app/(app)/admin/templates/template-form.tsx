"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useState } from "react";
import { useForm } from "react-hook-form";
import { CheckField, FieldError, FormAlert, TextField } from "@/components/form/fields";
import { AddPosition, PositionOptions } from "@/components/form/position-options";
import { useApiMutation } from "@/lib/api/mutations";
import { POSITION_LABEL } from "@/lib/format";
import type { WorkTypeView } from "@/lib/orders/model";
import type { Position } from "@/lib/rules/types";
import { crewTemplateSchema, type CrewTemplateInput } from "@/lib/orders/schema";

const RULE_LABEL: Record<string, string> = {
  pole_climb: "climbing",
  bucket: "bucket truck",
  digger_derrick: "digger derrick",
  patrol: "patrol / inspection",
  storm: "storm restoration",
  other: "other",
};

/** One work type's crew template: default positions (exactly one lead) and minimum crew. */
export function TemplateForm({ type }: { type: WorkTypeView }) {
  const [rows, setRows] = useState<Position[]>(type.positions);
  const form = useForm<CrewTemplateInput>({
    resolver: zodResolver(crewTemplateSchema as never) as never,
    defaultValues: { name: type.name, minCrew: type.minCrew, digs: type.digs, positions: type.positions },
  });
  const { register, setValue, formState } = form;
  const errors = formState.errors;
  useEffect(() => {
    setValue("positions", rows, { shouldDirty: true, shouldValidate: formState.isSubmitted });
  }, [rows, setValue, formState.isSubmitted]);
  const leads = rows.filter((r) => r === "lead").length;

  const save = useApiMutation<CrewTemplateInput>({
    request: (values) => ({ url: `/api/work-types/${type.id}`, method: "PUT", body: values }),
    form,
    refresh: true,
  });

  return (
    <form
      onSubmit={form.handleSubmit(save.submit)}
      noValidate className="card space-y-3 p-4" aria-label={`Crew template: ${type.name}`}>
      <div className="flex items-baseline justify-between gap-2">
        <p className="text-xs font-bold uppercase tracking-widest text-copper">
          {type.code} · rules read it as {RULE_LABEL[type.ruleType] ?? type.ruleType}
        </p>
      </div>
      <TextField id={`wt-name-${type.id}`} label="Name" error={errors.name?.message} {...register("name")} />
      <div className="flex flex-wrap items-end gap-4">
        <TextField id={`wt-min-${type.id}`} wrapperClassName="w-32" type="number" min={1} max={30} label="Minimum crew" error={errors.minCrew?.message} {...register("minCrew", { valueAsNumber: true })} />
        <CheckField id={`wt-digs-${type.id}`} wrapperClassName="pb-2" label="Digs (needs a locate ticket)" error={errors.digs?.message} {...register("digs")} />
      </div>
      <div>
        <p className="label">Default positions</p>
        <ul className="space-y-1.5">
          {rows.map((p, i) => (
            <li key={i} className="flex items-center gap-2">
              <select
                aria-label={`${type.name} position ${i + 1}`}
                className="field"
                value={p}
                onChange={(e) => setRows(rows.map((r, j) => (j === i ? (e.target.value as Position) : r)))}
              >
                <PositionOptions explain />
              </select>
              <button type="button" className="btn-quiet px-2" aria-label={`Remove ${POSITION_LABEL[p]}`} onClick={() => setRows(rows.filter((_, j) => j !== i))}>
                ✕
              </button>
            </li>
          ))}
        </ul>
        <AddPosition onAdd={(p) => setRows([...rows, p])} />
        <FieldError msg={errors.positions?.message as string | undefined} />
        {leads !== 1 && !errors.positions && (
          <p className="mt-1 text-xs font-semibold text-warn">▲ Exactly one lead position is needed (the employee in charge, who holds the job briefing).</p>
        )}
      </div>
      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      {save.isSuccess && <FormAlert tone="clear">Saved. New orders of this type start with this crew.</FormAlert>}
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        Save template
      </button>
    </form>
  );
}
