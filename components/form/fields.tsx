"use client";

// The form-field set every form uses: a label tied to its control (htmlFor/id), the control,
// an optional hint and the field's error, with aria-invalid and aria-describedby (hint, then
// error) set for it. Spread react-hook-form's register() straight in; the ref is passed on.
//
//   <TextField label="Title" error={errorAt(errors, "title")} {...register("title")} />
//   <SelectField id="yardId" label="Yard" error={…} {...register("yardId")}>…options…</SelectField>
//   <TextAreaField label="Notes" rows={3} … />   <CheckField label="Emergency" {...register("emergency")} />
//
// `id` defaults to the field's `name` when given (tests and labels rely on stable ids), else a
// React id. `hideLabel` keeps the label for screen readers only.
import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes, type TextareaHTMLAttributes } from "react";
import type { FieldErrors } from "react-hook-form";

export function FieldError({ id, msg }: { id?: string; msg?: string | null }) {
  if (!msg) return null;
  return (
    <p id={id} className="mt-1 text-xs font-semibold text-block">
      <span aria-hidden="true">✖ </span>
      {msg}
    </p>
  );
}

export function FormAlert({ tone = "block", children }: { tone?: "block" | "clear" | "warn" | "info"; children: ReactNode }) {
  if (!children) return null;
  const cls = {
    block: "bg-block-bg text-block",
    clear: "bg-clear-bg text-clear",
    warn: "bg-warn-bg text-warn",
    info: "bg-info-bg text-info",
  }[tone];
  const icon = { block: "✖", clear: "✓", warn: "▲", info: "●" }[tone];
  return (
    <div role={tone === "block" ? "alert" : "status"} className={`rounded-md px-3 py-2 text-sm font-medium ${cls}`}>
      <span aria-hidden="true">{icon} </span>
      {children}
    </div>
  );
}

/** The message react-hook-form holds for a dotted field name ("shifts.0.start"), if any. */
export function errorAt(errors: FieldErrors<any> | undefined, name: string): string | undefined {
  let e: unknown = errors;
  for (const p of name.split(".")) e = (e as Record<string, unknown> | undefined)?.[p];
  const m = (e as { message?: unknown } | undefined)?.message;
  return typeof m === "string" && m ? m : undefined;
}

export interface FieldFrameProps {
  label: ReactNode;
  hint?: ReactNode;
  error?: string | null;
  id?: string;
  /** The wrapper's class (grid spans and the like). */
  wrapperClassName?: string;
  hideLabel?: boolean;
}

/** The ids and aria attributes of one field. */
export function useFieldIds(id: string | undefined, name: string | undefined, hint: unknown, error: string | null | undefined) {
  const auto = useId();
  const controlId = id ?? name ?? auto;
  const hintId = hint ? `${controlId}-hint` : undefined;
  const errorId = error ? `${controlId}-error` : undefined;
  const describedBy = [hintId, errorId].filter(Boolean).join(" ") || undefined;
  return { controlId, hintId, errorId, aria: { "aria-invalid": error ? (true as const) : undefined, "aria-describedby": describedBy } };
}

/** Label, control (children), hint and error around any control that already has `controlId`. */
export function FieldFrame({
  label,
  hint,
  error,
  controlId,
  hintId,
  errorId,
  wrapperClassName,
  hideLabel,
  children,
}: Omit<FieldFrameProps, "id"> & { controlId: string; hintId?: string; errorId?: string; children: ReactNode }) {
  return (
    <div className={wrapperClassName}>
      <label className={hideLabel ? "sr-only" : "label"} htmlFor={controlId}>
        {label}
      </label>
      {children}
      {hint && (
        <p id={hintId} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      )}
      <FieldError id={errorId} msg={error} />
    </div>
  );
}

type InputProps = Omit<InputHTMLAttributes<HTMLInputElement>, "id"> & { ref?: Ref<HTMLInputElement> };
type SelectProps = Omit<SelectHTMLAttributes<HTMLSelectElement>, "id"> & { ref?: Ref<HTMLSelectElement> };
type TextAreaProps = Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, "id"> & { ref?: Ref<HTMLTextAreaElement> };

/** One labelled field around the control `render` draws (it gets the id, class and aria attributes). */
function labelled<P extends { name?: string; className?: string }>(render: (control: P & { id: string }) => ReactNode) {
  return function Field({ label, hint, error, id, wrapperClassName, hideLabel, className = "field", ...control }: FieldFrameProps & P) {
    const f = useFieldIds(id, control.name, hint, error);
    const props = { id: f.controlId, className, ...f.aria, ...control } as unknown as P & { id: string };
    return (
      <FieldFrame label={label} hint={hint} error={error} wrapperClassName={wrapperClassName} hideLabel={hideLabel} {...f}>
        {render(props)}
      </FieldFrame>
    );
  };
}

export const TextField = labelled<InputProps>((p) => <input {...p} />);
/** Its <option>s are its children. */
export const SelectField = labelled<SelectProps>((p) => <select {...p} />);
export const TextAreaField = labelled<TextAreaProps>((p) => <textarea {...p} />);

/** A checkbox (or radio) with its label beside it, and its error and hint below. */
export function CheckField({
  label,
  hint,
  error,
  id,
  wrapperClassName,
  labelClassName = "flex items-center gap-2 text-sm font-semibold",
  type = "checkbox",
  ...input
}: Omit<FieldFrameProps, "hideLabel"> & InputProps & { labelClassName?: string }) {
  const f = useFieldIds(id, input.name && type === "checkbox" ? input.name : undefined, hint, error);
  return (
    <div className={wrapperClassName}>
      <label className={labelClassName} htmlFor={f.controlId}>
        <input id={f.controlId} type={type} {...f.aria} {...input} /> {label}
      </label>
      {hint && (
        <p id={f.hintId} className="mt-1 text-xs text-ink-500">
          {hint}
        </p>
      )}
      <FieldError id={f.errorId} msg={error} />
    </div>
  );
}

/** A group of radios or checkboxes under one legend, with the group's error. */
export function ChoiceGroup({
  legend,
  error,
  hint,
  className,
  children,
}: {
  legend: ReactNode;
  error?: string | null;
  hint?: ReactNode;
  className?: string;
  children: ReactNode;
}) {
  const auto = useId();
  const errorId = error ? `${auto}-error` : undefined;
  return (
    <fieldset className={className} aria-describedby={errorId}>
      <legend className="label">{legend}</legend>
      {children}
      {hint && <p className="mt-1 text-xs text-ink-500">{hint}</p>}
      <FieldError id={errorId} msg={error} />
    </fieldset>
  );
}

/** A form's submit button (with its busy wording) and an optional Cancel. */
export function FormActions({
  label,
  busy,
  busyLabel = "Saving…",
  onCancel,
  className = "flex gap-2",
  children,
}: {
  label: ReactNode;
  busy?: boolean;
  busyLabel?: ReactNode;
  onCancel?: () => void;
  className?: string;
  children?: ReactNode;
}) {
  return (
    <div className={className}>
      <button type="submit" className="btn-primary" disabled={busy}>
        {busy ? busyLabel : label}
      </button>
      {onCancel && (
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
      )}
      {children}
    </div>
  );
}

/** A write's refusal as an alert inside its wrapper (grid spans); nothing when there is none. */
export function FormError({ text, className }: { text?: string | null; className?: string }) {
  if (!text) return null;
  return (
    <div className={className}>
      <FormAlert tone="block">{text}</FormAlert>
    </div>
  );
}
