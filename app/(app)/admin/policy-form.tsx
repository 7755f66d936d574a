"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { useState } from "react";
import { policySchema, type PolicyInput } from "@/lib/validation/policy";
import { RULE_CODES } from "@/lib/rules/types";

// Rules whose default level is warn, which a policy may raise to block.
const RAISABLE = ["IN_CHARGE", "CLIMB_CERT"] as const;

const FIELDS: { name: keyof PolicyInput; label: string; step: string }[] = [
  { name: "minRestHours", label: "Minimum rest between stretches (h)", step: "0.5" },
  { name: "maxShiftHours", label: "Maximum stretch containing an order (h)", step: "0.5" },
  { name: "credentialWarnDays", label: "Credential warning window (days)", step: "1" },
  { name: "regularHoursDay", label: "Regular hours per day", step: "0.5" },
  { name: "regularHoursWeek", label: "Regular hours per week", step: "0.5" },
  { name: "replyDeadlineHours", label: "Flag no reply this many hours before start", step: "1" },
];

export function PolicyForm({ policy }: { policy: PolicyInput }) {
  const [saved, setSaved] = useState<string | null>(null);
  const form = useForm<PolicyInput>({ resolver: zodResolver(policySchema) as never, defaultValues: policy });
  const errors = form.formState.errors;

  async function onSubmit(values: PolicyInput) {
    setSaved(null);
    const res = await fetch("/api/policies", {
      method: "PUT",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(values),
    });
    const body = await res.json();
    if (!res.ok) {
      for (const issue of body.issues ?? []) form.setError(issue.field as keyof PolicyInput, { message: issue.message });
      setSaved(body.error ?? "Not saved.");
      return;
    }
    setSaved("Saved. Open boards re-check at once.");
  }

  return (
    <form onSubmit={form.handleSubmit(onSubmit)} className="grid gap-3 sm:grid-cols-2" noValidate>
      {FIELDS.map((f) => (
        <div key={f.name}>
          <label className="label" htmlFor={f.name}>
            {f.label}
          </label>
          <input
            id={f.name}
            type="number"
            step={f.step}
            className="field"
            {...form.register(f.name, { valueAsNumber: true })}
            aria-invalid={errors[f.name] ? true : undefined}
          />
          {errors[f.name] && <p className="mt-1 text-xs font-semibold text-block">✖ {String(errors[f.name]?.message)}</p>}
        </div>
      ))}
      <fieldset className="sm:col-span-2">
        <legend className="label">Raise to block</legend>
        {RAISABLE.filter((r) => (RULE_CODES as readonly string[]).includes(r)).map((r) => (
          <label key={r} className="mr-4 inline-flex items-center gap-2 text-sm">
            <input type="checkbox" value={r} {...form.register("raisedToBlock")} /> {r}
          </label>
        ))}
      </fieldset>
      <div className="flex items-center gap-3 sm:col-span-2">
        <button className="btn-primary" type="submit" disabled={form.formState.isSubmitting}>
          Save policy
        </button>
        {saved && (
          <span role="status" className="text-sm text-ink-700">
            {saved}
          </span>
        )}
      </div>
    </form>
  );
}
