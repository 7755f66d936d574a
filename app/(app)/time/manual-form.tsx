"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { FormAlert, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import { manualTimeRecordSchema, type ManualTimeRecordValues } from "@/lib/time-records/model";

/** A manual time entry (reason required), validated like POST /api/time-records. */
export function ManualForm({ workerId, defaults }: { workerId: number; defaults: { start: string; end: string } }) {
  const form = useForm<ManualTimeRecordValues>({
    resolver: zodResolver(manualTimeRecordSchema as never) as never,
    defaultValues: { workerId, start: defaults.start, end: defaults.end, reason: "" },
  });
  const { register } = form;
  const errors = form.formState.errors;
  const save = useApiMutation<ManualTimeRecordValues>({
    request: (values) => ({ url: "/api/time-records", method: "POST", body: values }),
    form,
    refresh: true,
    onSuccess: (_r, values) => form.reset({ ...values, reason: "" }),
  });
  return (
    <form onSubmit={form.handleSubmit(save.submit)} noValidate className="space-y-3" aria-label="Enter time by hand">
      <input type="hidden" {...register("workerId", { setValueAs: Number })} />
      <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-1">
        <TextField id="tm-start" type="datetime-local" label="Start" error={errors.start?.message} {...register("start")} />
        <TextField id="tm-end" type="datetime-local" label="End" error={errors.end?.message} {...register("end")} />
      </div>
      <TextField id="tm-reason" label="Reason (required)" placeholder="e.g. worked storm cleanup, not on an order" error={errors.reason?.message} {...register("reason")} />
      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      {save.isSuccess && <FormAlert tone="clear">Time entered. Boards re-check rest at once.</FormAlert>}
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        Enter time
      </button>
    </form>
  );
}
