"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { FormActions, FormError, SelectField, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import type { LiftPlan, RiggingChoice } from "@/lib/gear/lift";

type Values = Record<
  | "loadLabel"
  | "loadLb"
  | "partsOfLine"
  | "sheaves"
  | "blockRiggingId"
  | "blockWllLb"
  | "lineRiggingId"
  | "lineWllLb"
  | "slingRiggingId"
  | "slingWllLb"
  | "slingLegs"
  | "slingAngleDeg",
  string
>;

const num = (s: string) => (s.trim() === "" ? null : Number(s));

/**
 * The lift plan editor on the order page: nameplate weight, rigging chosen from what the
 * order's truck carries (or a WLL typed in when the item is not in the register), parts of
 * line, sheaves, sling legs and angle. Saved with PUT /api/orders/[id]/lift; a 422 names the
 * field and nothing is stored.
 */
export function LiftPlanEditor({ orderId, plan, rigging, canEdit, lifting }: { orderId: number; plan: LiftPlan | null; rigging: RiggingChoice[]; canEdit: boolean; lifting: boolean }) {
  const [open, setOpen] = useState(false);
  const s = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));
  const form = useForm<Values>({
    defaultValues: {
      loadLabel: plan?.loadLabel ?? "",
      loadLb: s(plan?.loadLb),
      partsOfLine: s(plan?.partsOfLine ?? 3),
      sheaves: s(plan?.sheaves),
      blockRiggingId: s(plan?.blockRiggingId),
      blockWllLb: s(plan?.blockRiggingId ? null : plan?.blockWllLb),
      lineRiggingId: s(plan?.lineRiggingId),
      lineWllLb: s(plan?.lineRiggingId ? null : plan?.lineWllLb),
      slingRiggingId: s(plan?.slingRiggingId),
      slingWllLb: s(plan?.slingRiggingId ? null : plan?.slingWllLb),
      slingLegs: s(plan?.slingLegs ?? 1),
      slingAngleDeg: s(plan?.slingAngleDeg ?? 90),
    },
  });
  const { register, watch } = form;
  const errors = form.formState.errors;
  const save = useApiMutation<Values>({
    request: (f) => {
      const body: Record<string, unknown> = {
        ...(plan ? { version: plan.version } : {}),
        loadLabel: f.loadLabel || null,
        loadLb: num(f.loadLb),
        partsOfLine: num(f.partsOfLine),
        slingLegs: num(f.slingLegs),
        slingAngleDeg: num(f.slingAngleDeg),
        blockRiggingId: num(f.blockRiggingId),
        lineRiggingId: num(f.lineRiggingId),
        slingRiggingId: num(f.slingRiggingId),
        blockWllLb: f.blockRiggingId ? null : num(f.blockWllLb),
        lineWllLb: f.lineRiggingId ? null : num(f.lineWllLb),
        slingWllLb: f.slingRiggingId ? null : num(f.slingWllLb),
      };
      if (f.sheaves.trim() !== "") body.sheaves = num(f.sheaves);
      return { url: `/api/orders/${orderId}/lift`, method: "PUT", body };
    },
    form,
    refresh: true,
    onSuccess: () => setOpen(false),
  });
  const of = (kind: RiggingChoice["kind"]) => rigging.filter((r) => r.kind === kind);

  if (!canEdit) return null;
  if (!open)
    return (
      <button type="button" className="btn-quiet mt-2" onClick={() => setOpen(true)} data-testid="lift-edit">
        {plan ? "Change the lift plan" : lifting ? "Make the lift plan" : "Add a lift plan"}
      </button>
    );

  const field = (k: keyof Values, label: string, extra: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <TextField id={`lift-${k}`} label={label} error={errors[k]?.message} {...extra} {...register(k)} />
  );
  const pick = (idKey: "blockRiggingId" | "lineRiggingId" | "slingRiggingId", wllKey: "blockWllLb" | "lineWllLb" | "slingWllLb", kind: RiggingChoice["kind"], label: string) => (
    <div className="grid gap-1">
      <SelectField id={`lift-${idKey}`} label={label} error={errors[idKey]?.message} {...register(idKey)}>
        <option value="">Not from the truck: type its WLL</option>
        {of(kind).map((r) => (
          <option key={r.id} value={r.id}>
            {r.unitNumber} · {r.label} · WLL {r.wllLb.toLocaleString("en-US")} lb
          </option>
        ))}
      </SelectField>
      {!watch(idKey) && field(wllKey, "WLL (lb)", { type: "number", min: 1, step: 1 })}
    </div>
  );

  return (
    <form onSubmit={form.handleSubmit(save.submit)} className="mt-3 grid gap-3 sm:grid-cols-3" aria-label="Lift plan" noValidate>
      <FormError className="sm:col-span-3" text={save.errorText} />
      {rigging.length === 0 && (
        <p className="text-xs text-ink-500 sm:col-span-3">No truck with rigging is on this order yet: type each part&apos;s working load limit from its tag.</p>
      )}
      {field("loadLabel", "What is lifted")}
      {field("loadLb", "Nameplate weight (lb)", { type: "number", min: 1, step: "any" })}
      {field("partsOfLine", "Parts of line", { type: "number", min: 1, max: 12, step: 1 })}
      {field("sheaves", "Sheaves (empty: as parts of line)", { type: "number", min: 0, max: 12, step: 1 })}
      {pick("blockRiggingId", "blockWllLb", "rope_block", "Rope blocks")}
      {pick("lineRiggingId", "lineWllLb", "hand_line", "Hand line")}
      {pick("slingRiggingId", "slingWllLb", "sling", "Sling")}
      {field("slingLegs", "Sling legs", { type: "number", min: 1, max: 4, step: 1 })}
      {field("slingAngleDeg", "Sling angle from the horizontal (°)", { type: "number", min: 1, max: 90, step: "any" })}
      <FormActions className="flex gap-2 sm:col-span-3" label="Save the lift plan" busy={save.isPending} onCancel={() => setOpen(false)} />
    </form>
  );
}
