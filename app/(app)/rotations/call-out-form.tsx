"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, applyIssues, sendJson } from "@/components/form-bits";
import { callOutSchema, type CallOutFormValues } from "@/lib/validation/rotation";
import type { WorkerOption } from "./rotation-form";

interface Props {
  workers: WorkerOption[];
  rotations: { id: number; name: string; yardId: number; timezone: string; onCallWorkerId: number | null }[];
  defaults: { start: string; end: string };
}

/** Record a call-out: it becomes a time record (kind call_out), which the rest rule reads. */
export function CallOutForm({ workers, rotations, defaults }: Props) {
  const router = useRouter();
  const [done, setDone] = useState<{ text: string; href: string } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const form = useForm<CallOutFormValues>({
    resolver: zodResolver(callOutSchema as never) as never,
    defaultValues: { workerId: 0, rotationId: rotations[0]?.id ?? null, start: defaults.start, end: defaults.end, note: "" },
  });
  const { register, formState, setValue, watch } = form;
  const errors = formState.errors;
  const rotationId = Number(watch("rotationId")) || null;
  const rotation = rotations.find((r) => r.id === rotationId);

  async function onSubmit(values: CallOutFormValues) {
    setDone(null);
    setError(null);
    const r = await sendJson("/api/call-outs", "POST", values);
    if (!r.ok) return setError(applyIssues(form, r.body));
    const w = workers.find((x) => x.id === Number(values.workerId));
    setDone({
      text: `Call-out recorded: ${r.body.hours} h for ${w?.name ?? "the worker"}. Boards re-check rest at once.`,
      href: `/time?${new URLSearchParams({ worker: String(values.workerId), week: String(values.start).slice(0, 10) })}`,
    });
    form.reset({ ...values, note: "" });
    router.refresh();
  }

  return (
    <form onSubmit={form.handleSubmit(onSubmit)} noValidate className="space-y-3" aria-label="Record a call-out">
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label className="label" htmlFor="co-rotation">
            Rotation
          </label>
          <select
            id="co-rotation"
            className="field"
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
          </select>
        </div>
        <div>
          <label className="label" htmlFor="co-worker">
            Worker called out
          </label>
          <select id="co-worker" className="field" {...register("workerId", { setValueAs: Number })} aria-invalid={errors.workerId ? true : undefined}>
            <option value={0}>Pick the worker…</option>
            {workers.map((w) => (
              <option key={w.id} value={w.id}>
                {w.name} ({w.employeeNo}, {w.yardCode})
              </option>
            ))}
          </select>
          <FieldError msg={errors.workerId?.message as string | undefined} />
        </div>
        <div>
          <label className="label" htmlFor="co-start">
            Started
          </label>
          <input id="co-start" type="datetime-local" className="field" {...register("start")} aria-invalid={errors.start ? true : undefined} />
          <FieldError msg={errors.start?.message as string | undefined} />
        </div>
        <div>
          <label className="label" htmlFor="co-end">
            Ended
          </label>
          <input id="co-end" type="datetime-local" className="field" {...register("end")} aria-invalid={errors.end ? true : undefined} />
          <FieldError msg={errors.end?.message as string | undefined} />
        </div>
      </div>
      <p className="text-xs text-ink-500">
        Times are {rotation ? `${rotation.name}'s yard` : "the worker's yard"} clock{rotation ? ` (${rotation.timezone})` : ""}.
      </p>
      <div>
        <label className="label" htmlFor="co-note">
          What was it
        </label>
        <input id="co-note" className="field" placeholder="e.g. transformer fuse out at N-2871" {...register("note")} />
        <FieldError msg={errors.note?.message as string | undefined} />
      </div>
      {error && <FormAlert tone="block">{error}</FormAlert>}
      {done && (
        <FormAlert tone="clear">
          {done.text}{" "}
          <Link href={done.href} className="underline">
            See the week
          </Link>
        </FormAlert>
      )}
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        Record call-out
      </button>
    </form>
  );
}
