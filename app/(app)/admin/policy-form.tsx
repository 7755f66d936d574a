"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, type FieldErrors } from "react-hook-form";
import { useState } from "react";
import { TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import { policyFields, policySchema, type PolicyInput } from "@/lib/policies/model";
import { POLICY_FIELD_LABELS, RAISABLE_RULES, RULE_LABELS } from "@/lib/rules/rule-labels";

const FIELDS: { name: Exclude<keyof PolicyInput, "raisedToBlock">; step: string }[] = [
  { name: "minRestHours", step: "0.5" },
  { name: "maxShiftHours", step: "0.5" },
  { name: "credentialWarnDays", step: "1" },
  { name: "regularHoursDay", step: "0.5" },
  { name: "regularHoursWeek", step: "0.5" },
  { name: "replyDeadlineHours", step: "1" },
];

type Status = { kind: "saved" | "error"; text: string } | null;

export function PolicyForm({ policy }: { policy: PolicyInput }) {
  const [status, setStatus] = useState<Status>(null);
  // Only the policy's own fields: the schema is strict, and an extra key (the engine's derived
  // rules) used to fail validation on a key no input shows, so nothing was sent and nothing said.
  const form = useForm<PolicyInput>({ resolver: zodResolver(policySchema) as never, defaultValues: policyFields(policy) });
  const errors = form.formState.errors;

  const save = useApiMutation<PolicyInput, PolicyInput>({
    request: (values) => ({ url: "/api/policies", method: "PUT", body: policyFields(values) }),
    form,
    fields: Object.keys(POLICY_FIELD_LABELS),
    onSuccess: (body) => {
      form.reset(policyFields(body));
      setStatus({ kind: "saved", text: "Saved. Open boards re-check at once." });
    },
    onFailure: (f) => setStatus({ kind: "error", text: `Not saved: ${f.message}` }),
  });

  function onSubmit(values: PolicyInput) {
    setStatus(null);
    return save.submit(values);
  }

  function onInvalid(errs: FieldErrors<PolicyInput>) {
    const first = Object.values(errs)[0];
    setStatus({ kind: "error", text: `Not saved: ${String(first?.message ?? "check the fields marked above")}` });
  }

  const raised = form.watch("raisedToBlock") ?? [];
  function toggle(code: string, on: boolean) {
    const next = on ? [...new Set([...raised, code])] : raised.filter((r) => r !== code);
    form.setValue("raisedToBlock", next as PolicyInput["raisedToBlock"], { shouldDirty: true });
  }

  return (
    <form onSubmit={form.handleSubmit(onSubmit, onInvalid)} className="grid gap-3 sm:grid-cols-2" noValidate>
      {FIELDS.map((f) => (
        <TextField
          key={f.name}
          type="number"
          step={f.step}
          label={POLICY_FIELD_LABELS[f.name]}
          error={errors[f.name]?.message}
          {...form.register(f.name, { valueAsNumber: true })}
        />
      ))}
      <fieldset className="sm:col-span-2">
        <legend className="label">{POLICY_FIELD_LABELS.raisedToBlock}</legend>
        <p className="mb-2 text-xs text-ink-500">These rules can come out as a warning; tick one to make it block instead.</p>
        <ul className="grid gap-2">
          {RAISABLE_RULES.map((r) => (
            <li key={r}>
              <label className="flex items-start gap-2 text-sm">
                <input
                  type="checkbox"
                  className="mt-1"
                  checked={raised.includes(r)}
                  onChange={(e) => toggle(r, e.target.checked)}
                  aria-describedby={`raise-${r}`}
                />
                <span>
                  <span className="font-semibold">{RULE_LABELS[r].name}</span>{" "}
                  <span className="text-xs text-ink-500">({r})</span>
                  <span id={`raise-${r}`} className="block text-xs text-ink-700">
                    {RULE_LABELS[r].meaning} It {RULE_LABELS[r].warnsWhen}.
                  </span>
                </span>
              </label>
            </li>
          ))}
        </ul>
        {/* Rules raised earlier that this list no longer offers stay raised, and are shown. */}
        {raised.filter((r) => !(RAISABLE_RULES as readonly string[]).includes(r)).length > 0 && (
          <p className="mt-2 text-xs text-ink-700">
            Also raised: {raised.filter((r) => !(RAISABLE_RULES as readonly string[]).includes(r)).map((r) => RULE_LABELS[r]?.name ?? r).join(", ")}
          </p>
        )}
      </fieldset>
      <div className="flex items-center gap-3 sm:col-span-2">
        <button className="btn-primary" type="submit" disabled={save.isPending}>
          Save policy
        </button>
        {status && (
          <span
            role={status.kind === "error" ? "alert" : "status"}
            className={`text-sm font-semibold ${status.kind === "error" ? "text-block" : "text-clear"}`}
          >
            {status.kind === "error" ? "✖ " : "✓ "}
            {status.text}
          </span>
        )}
      </div>
    </form>
  );
}
