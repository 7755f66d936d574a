"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, applyIssues, sendJson } from "@/components/form-bits";
import { unavailabilitySchema, type UnavailabilityFormValues } from "@/lib/validation/unavailability";

interface Props {
  /** Workers the user may enter time off for (a lineworker: only themself). */
  workers: { id: number; name: string; employeeNo: string; yardCode: string }[];
  asks: boolean;
  defaults: { start: string; end: string };
}

const KINDS = [
  { value: "leave", label: "Leave" },
  { value: "training", label: "Training" },
  { value: "sickness", label: "Sickness" },
] as const;

/** Leave, training or sickness; validated with unavailabilitySchema like POST /api/unavailability. */
export function LeaveForm({ workers, asks, defaults }: Props) {
  const router = useRouter();
  const [result, setResult] = useState<{ tone: "block" | "clear"; text: string } | null>(null);
  const form = useForm<UnavailabilityFormValues>({
    resolver: zodResolver(unavailabilitySchema as never) as never,
    defaultValues: { workerId: workers.length === 1 ? workers[0].id : 0, kind: "leave", start: defaults.start, end: defaults.end, note: "" },
  });
  const { register, formState } = form;
  const errors = formState.errors;

  async function onSubmit(values: UnavailabilityFormValues) {
    setResult(null);
    const r = await sendJson("/api/unavailability", "POST", values);
    if (!r.ok) return setResult({ tone: "block", text: applyIssues(form, r.body) });
    setResult({
      tone: "clear",
      text: r.body.status === "requested" ? "Asked. A supervisor approves or refuses it; you see the answer here." : `Entered for ${r.body.workerName}. Boards re-check at once.`,
    });
    form.reset({ ...values, note: "" });
    router.refresh();
  }

  return (
    <form onSubmit={form.handleSubmit(onSubmit)} noValidate className="space-y-3" aria-label={asks ? "Ask for time off" : "Enter time off"}>
      {workers.length > 1 ? (
        <div>
          <label className="label" htmlFor="lv-worker">
            Worker
          </label>
          <select id="lv-worker" className="field" {...register("workerId", { setValueAs: Number })} aria-invalid={errors.workerId ? true : undefined}>
            <option value={0}>Pick the worker…</option>
            {workers.map((w) => (
              <option key={w.id} value={w.id}>
                {w.name} ({w.employeeNo}, {w.yardCode})
              </option>
            ))}
          </select>
          <FieldError msg={errors.workerId?.message as string | undefined} />
        </div>
      ) : (
        <input type="hidden" {...register("workerId", { setValueAs: Number })} />
      )}
      <fieldset>
        <legend className="label">Kind</legend>
        <div className="flex flex-wrap gap-4 text-sm font-semibold">
          {KINDS.map((k) => (
            <label key={k.value} className="flex items-center gap-2">
              <input type="radio" value={k.value} {...register("kind")} /> {k.label}
            </label>
          ))}
        </div>
        <FieldError msg={errors.kind?.message as string | undefined} />
      </fieldset>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label className="label" htmlFor="lv-start">
            From
          </label>
          <input id="lv-start" type="datetime-local" className="field" {...register("start")} aria-invalid={errors.start ? true : undefined} />
          <FieldError msg={errors.start?.message as string | undefined} />
        </div>
        <div>
          <label className="label" htmlFor="lv-end">
            Back at work
          </label>
          <input id="lv-end" type="datetime-local" className="field" {...register("end")} aria-invalid={errors.end ? true : undefined} />
          <FieldError msg={errors.end?.message as string | undefined} />
        </div>
      </div>
      <p className="text-xs text-ink-500">Times are the worker&apos;s yard clock. Whole days: from 00:00 on the first day to 00:00 on the day back.</p>
      <div>
        <label className="label" htmlFor="lv-note">
          Note
        </label>
        <input id="lv-note" className="field" {...register("note")} />
        <FieldError msg={errors.note?.message as string | undefined} />
      </div>
      {result && <FormAlert tone={result.tone}>{result.text}</FormAlert>}
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        {asks ? "Ask for time off" : "Enter time off"}
      </button>
    </form>
  );
}
