"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { applyIssues, FieldError, FormAlert, sendJson } from "@/components/form-bits";
import { unavailabilitySchema, type UnavailabilityFormValues, type UnavailabilityInput } from "@/lib/validation/unavailability";

/** Ask for time off: POST /api/unavailability (a lineworker's entry is "requested" until a supervisor decides). */
export function LeaveForm({ workerId, yardName }: { workerId: number; yardName: string }) {
  const router = useRouter();
  const [msg, setMsg] = useState<{ tone: "clear" | "block"; text: string } | null>(null);
  const form = useForm<UnavailabilityFormValues, unknown, UnavailabilityInput>({
    resolver: zodResolver(unavailabilitySchema),
    defaultValues: { workerId, kind: "leave", start: "", end: "", note: "" },
  });
  const { register, handleSubmit, formState } = form;
  const e = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setMsg(null);
    const r = await sendJson("/api/unavailability", "POST", values);
    if (r.ok) {
      setMsg({ tone: "clear", text: "Sent. A supervisor approves or refuses it; you see the answer here." });
      form.reset({ workerId, kind: "leave", start: "", end: "", note: "" });
      router.refresh();
    } else setMsg({ tone: "block", text: applyIssues(form, r.body) });
  });

  return (
    <form onSubmit={onSubmit} className="card space-y-3 p-4" aria-label="Ask for time off" noValidate>
      <input type="hidden" {...register("workerId", { valueAsNumber: true })} />
      <div>
        <label htmlFor="leave-kind" className="label">
          Kind
        </label>
        <select id="leave-kind" className="field" {...register("kind")}>
          <option value="leave">Leave</option>
          <option value="training">Training</option>
          <option value="sickness">Sickness</option>
        </select>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label htmlFor="leave-start" className="label">
            From
          </label>
          <input id="leave-start" type="datetime-local" className="field" aria-invalid={Boolean(e.start)} aria-describedby="leave-start-err" {...register("start")} />
          <FieldError id="leave-start-err" msg={e.start?.message} />
        </div>
        <div>
          <label htmlFor="leave-end" className="label">
            Until
          </label>
          <input id="leave-end" type="datetime-local" className="field" aria-invalid={Boolean(e.end)} aria-describedby="leave-end-err" {...register("end")} />
          <FieldError id="leave-end-err" msg={e.end?.message} />
        </div>
      </div>
      <p className="text-xs text-ink-500">Times on the {yardName} clock. &ldquo;Until&rdquo; is when you are back.</p>
      <div>
        <label htmlFor="leave-note" className="label">
          Note (optional)
        </label>
        <input id="leave-note" className="field" maxLength={500} {...register("note")} />
        <FieldError msg={e.note?.message} />
      </div>
      {msg && <FormAlert tone={msg.tone}>{msg.text}</FormAlert>}
      <button type="submit" className="btn-primary min-h-11 w-full sm:w-auto" disabled={formState.isSubmitting}>
        Ask for time off
      </button>
    </form>
  );
}
