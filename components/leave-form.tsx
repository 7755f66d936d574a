"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { ChoiceGroup, FormAlert, SelectField, TextField } from "@/components/form/fields";
import { WorkerOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { unavailabilitySchema, type UnavailabilityFormValues } from "@/lib/leave/model";

export interface LeaveWorker {
  id: number;
  name: string;
  employeeNo: string;
  yardCode: string;
}

interface Props {
  /** Workers the user may enter leave for; with one (or `workerId`) there is no picker. */
  workers?: LeaveWorker[];
  workerId?: number;
  /** A lineworker asks (a supervisor decides); a dispatcher or supervisor enters it approved. */
  asks: boolean;
  defaults?: { start: string; end: string };
  /** Named in the hint: "Times on the North yard clock". */
  yardName?: string;
  className?: string;
}

const KINDS = [
  { value: "leave", label: "Leave" },
  { value: "training", label: "Training" },
  { value: "sickness", label: "Sickness" },
] as const;

/**
 * Leave, training or sickness (the leave page and My week): validated with unavailabilitySchema
 * like POST /api/leave, which answers 422 naming the field.
 */
export function LeaveForm({ workers = [], workerId, asks, defaults = { start: "", end: "" }, yardName, className = "space-y-3" }: Props) {
  const fixedId = workerId ?? (workers.length === 1 ? workers[0].id : 0);
  const blank = { workerId: fixedId, kind: "leave" as const, start: defaults.start, end: defaults.end, note: "" };
  const form = useForm<UnavailabilityFormValues>({ resolver: zodResolver(unavailabilitySchema as never) as never, defaultValues: blank });
  const { register } = form;
  const errors = form.formState.errors;
  const save = useApiMutation<UnavailabilityFormValues, { status?: string; workerName?: string }>({
    request: (values) => ({ url: "/api/leave", method: "POST", body: values }),
    form,
    refresh: true,
    onSuccess: (_r, values) => form.reset({ ...values, note: "" }),
  });
  const done = save.isSuccess && save.data
    ? save.data.status === "requested"
      ? "Asked. A supervisor approves or refuses it; you see the answer here."
      : `Entered for ${save.data.workerName}. Boards re-check at once.`
    : null;
  const title = asks ? "Ask for leave" : "Enter leave";

  return (
    <form
      onSubmit={form.handleSubmit(save.submit)}
      noValidate
      className={className}
      aria-label={title}
    >
      {workerId === undefined && workers.length > 1 ? (
        <SelectField id="lv-worker" label="Worker" error={errors.workerId?.message} {...register("workerId", { setValueAs: Number })}>
          <WorkerOptions workers={workers} />
        </SelectField>
      ) : (
        <input type="hidden" {...register("workerId", { setValueAs: Number })} />
      )}
      <ChoiceGroup legend="Kind" error={errors.kind?.message}>
        <div className="flex flex-wrap gap-4 text-sm font-semibold">
          {KINDS.map((k) => (
            <label key={k.value} className="flex min-h-11 items-center gap-2 sm:min-h-0">
              <input type="radio" value={k.value} {...register("kind")} /> {k.label}
            </label>
          ))}
        </div>
      </ChoiceGroup>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField id="lv-start" type="datetime-local" label="From" error={errors.start?.message} {...register("start")} />
        <TextField id="lv-end" type="datetime-local" label="Back at work" error={errors.end?.message} {...register("end")} />
      </div>
      <p className="text-xs text-ink-500">
        Times are {yardName ? `on the ${yardName} clock` : "the worker's yard clock"}. Whole days: from 00:00 on the first day to 00:00 on the day back.
      </p>
      <TextField id="lv-note" label="Note (optional)" maxLength={500} error={errors.note?.message} {...register("note")} />
      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      {done && <FormAlert tone="clear">{done}</FormAlert>}
      <button type="submit" className="btn-primary min-h-11 w-full sm:w-auto" disabled={save.isPending}>
        {title}
      </button>
    </form>
  );
}
