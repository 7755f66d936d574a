"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useForm } from "react-hook-form";
import { FormAlert, SelectField, TextField } from "@/components/form/fields";
import { WorkerOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { callOutSchema, type CallOutFormValues } from "@/lib/rotations/model";
import type { WorkerOption } from "./rotation-form";

interface Props {
  workers: WorkerOption[];
  rotations: { id: number; name: string; yardId: number; timezone: string; onCallWorkerId: number | null }[];
  defaults: { start: string; end: string };
}

/** Record a call-out: it becomes a time record (kind call_out), which the rest rule reads. */
export function CallOutForm({ workers, rotations, defaults }: Props) {
  const form = useForm<CallOutFormValues>({
    resolver: zodResolver(callOutSchema as never) as never,
    defaultValues: { workerId: 0, rotationId: rotations[0]?.id ?? null, start: defaults.start, end: defaults.end, note: "" },
  });
  const { register, setValue, watch } = form;
  const errors = form.formState.errors;
  const rotationId = Number(watch("rotationId")) || null;
  const rotation = rotations.find((r) => r.id === rotationId);
  const save = useApiMutation<CallOutFormValues, { hours: number }>({
    request: (values) => ({ url: "/api/call-outs", method: "POST", body: values }),
    form,
    refresh: true,
    onSuccess: (_r, values) => form.reset({ ...values, note: "" }),
  });
  const sent = save.isSuccess ? save.variables : undefined;
  const who = sent && workers.find((x) => x.id === Number(sent.workerId));

  return (
    <form onSubmit={form.handleSubmit(save.submit)} noValidate className="space-y-3" aria-label="Record a call-out">
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          id="co-rotation"
          label="Rotation"
          error={errors.rotationId?.message}
          {...register("rotationId", {
            setValueAs: (v) => (v === "" || v === null ? null : Number(v)),
            onChange: (e) => {
              const r = rotations.find((x) => x.id === Number(e.target.value));
              if (r?.onCallWorkerId) setValue("workerId", r.onCallWorkerId);
            },
          })}
        >
          <option value="">Not on a rotation</option>
          {rotations.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </SelectField>
        <SelectField id="co-worker" label="Worker called out" error={errors.workerId?.message} {...register("workerId", { setValueAs: Number })}>
          <WorkerOptions workers={workers} />
        </SelectField>
        <TextField id="co-start" type="datetime-local" label="Started" error={errors.start?.message} {...register("start")} />
        <TextField id="co-end" type="datetime-local" label="Ended" error={errors.end?.message} {...register("end")} />
      </div>
      <p className="text-xs text-ink-500">
        Times are {rotation ? `${rotation.name}'s yard` : "the worker's yard"} clock{rotation ? ` (${rotation.timezone})` : ""}.
      </p>
      <TextField id="co-note" label="What was it" placeholder="e.g. transformer fuse out at N-2871" error={errors.note?.message} {...register("note")} />
      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      {sent && (
        <FormAlert tone="clear">
          Call-out recorded: {save.data?.hours} h for {who?.name ?? "the worker"}. Boards re-check rest at once.{" "}
          <Link href={`/time?${new URLSearchParams({ worker: String(sent.workerId), week: String(sent.start).slice(0, 10) })}`} className="underline">
            See the week
          </Link>
        </FormAlert>
      )}
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        Record call-out
      </button>
    </form>
  );
}
