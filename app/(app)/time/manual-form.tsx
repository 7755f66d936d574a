"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, applyIssues, sendJson } from "@/components/form-bits";
import { manualTimeRecordSchema, type ManualTimeRecordValues } from "@/lib/validation/time-record";

/** A manual time entry (reason required), validated like POST /api/time-records. */
export function ManualForm({ workerId, defaults }: { workerId: number; defaults: { start: string; end: string } }) {
  const router = useRouter();
  const [result, setResult] = useState<{ tone: "block" | "clear"; text: string } | null>(null);
  const form = useForm<ManualTimeRecordValues>({
    resolver: zodResolver(manualTimeRecordSchema as never) as never,
    defaultValues: { workerId, start: defaults.start, end: defaults.end, reason: "" },
  });
  const { register, formState } = form;
  const errors = formState.errors;
  async function onSubmit(values: ManualTimeRecordValues) {
    setResult(null);
    const r = await sendJson("/api/time-records", "POST", values);
    if (!r.ok) return setResult({ tone: "block", text: applyIssues(form, r.body) });
    setResult({ tone: "clear", text: "Time entered. Boards re-check rest at once." });
    form.reset({ ...values, reason: "" });
    router.refresh();
  }
  return (
    <form onSubmit={form.handleSubmit(onSubmit)} noValidate className="space-y-3" aria-label="Enter time by hand">
      <input type="hidden" {...register("workerId", { setValueAs: Number })} />
      <div className="grid gap-3 sm:grid-cols-2 xl:grid-cols-1">
        <div>
          <label className="label" htmlFor="tm-start">
            Start
          </label>
          <input id="tm-start" type="datetime-local" className="field" {...register("start")} aria-invalid={errors.start ? true : undefined} />
          <FieldError msg={errors.start?.message as string | undefined} />
        </div>
        <div>
          <label className="label" htmlFor="tm-end">
            End
          </label>
          <input id="tm-end" type="datetime-local" className="field" {...register("end")} aria-invalid={errors.end ? true : undefined} />
          <FieldError msg={errors.end?.message as string | undefined} />
        </div>
      </div>
      <div>
        <label className="label" htmlFor="tm-reason">
          Reason (required)
        </label>
        <input id="tm-reason" className="field" placeholder="e.g. worked storm cleanup, not on an order" {...register("reason")} aria-invalid={errors.reason ? true : undefined} />
        <FieldError msg={errors.reason?.message as string | undefined} />
      </div>
      {result && <FormAlert tone={result.tone}>{result.text}</FormAlert>}
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        Enter time
      </button>
    </form>
  );
}
