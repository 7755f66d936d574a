"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import {
  credentialCreateSchema,
  credentialFormSchema,
  proposeExpiry,
  type CredentialFormInput,
  type CredentialFormValues,
} from "@/lib/credentials/model";
import { ACCEPT_ATTR, MAX_UPLOAD_BYTES, MAX_UPLOAD_LABEL, checkFileName, fmtBytes } from "@/lib/files/model";

export interface FormType {
  id: number;
  code: string;
  name: string;
  renewalMonths: number | null;
  needsEvidence: boolean;
}

interface Props {
  workerId: number;
  /** The qualification being renewed; omitted when adding, then `choices` are offered. */
  type?: FormType;
  choices?: FormType[];
  /** Today in the worker's yard zone: the default issue date and the latest allowed. */
  today: string;
  /** hr: a current record, verified now; own: a lineworker's renewal, pending until HR verifies. */
  mode: "hr" | "own";
  onDone: (message: string) => void;
  onCancel: () => void;
}

const Err = ({ id, msg }: { id: string; msg?: string }) =>
  msg ? (
    <p id={id} className="mt-1 text-xs font-semibold text-block">
      ✖ {msg}
    </p>
  ) : null;

/**
 * Add or renew a credential, with evidence. The file goes to /api/files first (type checked
 * from its bytes there), then the record to /api/credentials. The expiry is proposed from the
 * qualification's renewal period: issued + N months − 1 day, the last valid day.
 */
export function CredentialForm({ workerId, type, choices = [], today, mode, onDone, onCancel }: Props) {
  const router = useRouter();
  const uid = useId();
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  const [formError, setFormError] = useState<string | null>(null);
  const uploaded = useRef<{ file: File; id: number } | null>(null);
  const expiryTouched = useRef(false);

  const form = useForm<CredentialFormInput, unknown, CredentialFormValues>({
    resolver: zodResolver(credentialFormSchema),
    defaultValues: {
      qualificationTypeId: type?.id ?? "",
      issuedOn: today,
      expiresOn: type ? (proposeExpiry(today, type.renewalMonths) ?? "") : "",
      note: "",
    },
  });
  const errors = form.formState.errors;
  const typeId = Number(form.watch("qualificationTypeId"));
  const issuedOn = form.watch("issuedOn");
  const chosen = type ?? choices.find((c) => c.id === typeId);
  const evidenceRequired = mode === "own" || Boolean(chosen?.needsEvidence);

  // Keep the proposal in step with the issue date until the user types their own expiry.
  useEffect(() => {
    if (expiryTouched.current || !chosen) return;
    form.setValue("expiresOn", proposeExpiry(issuedOn, chosen.renewalMonths) ?? "");
  }, [issuedOn, chosen, form]);

  function pickFile(f: File | null) {
    setFile(f);
    setFileError(undefined);
    if (!f) return;
    const name = checkFileName(f.name);
    if (!name.ok) setFileError(name.message);
    else if (f.size > MAX_UPLOAD_BYTES) setFileError(`The file is ${fmtBytes(f.size)}; the limit is ${MAX_UPLOAD_LABEL}.`);
  }

  async function onSubmit(values: CredentialFormValues) {
    setFormError(null);
    if (fileError) return;
    if (evidenceRequired && !file) {
      setFileError(mode === "own" ? "Add a scan or photo of the new card or certificate." : `${chosen?.name ?? "This qualification"} needs evidence: add the card or certificate.`);
      return;
    }
    let evidenceFileId: number | null = null;
    if (file) {
      if (uploaded.current?.file === file) evidenceFileId = uploaded.current.id;
      else {
        const body = new FormData();
        body.set("file", file);
        body.set("workerId", String(workerId));
        const res = await fetch("/api/files", { method: "POST", body });
        const out = await res.json().catch(() => ({}));
        if (!res.ok) {
          setFileError(out.error ?? "The file was not accepted.");
          return;
        }
        uploaded.current = { file, id: out.file.id };
        evidenceFileId = out.file.id;
      }
    }
    const payload = credentialCreateSchema.parse({
      workerId,
      qualificationTypeId: values.qualificationTypeId,
      issuedOn: values.issuedOn,
      ...(values.expiresOn ? { expiresOn: values.expiresOn } : {}),
      evidenceFileId,
      status: mode === "own" ? "pending" : "current",
      ...(values.note ? { note: values.note } : {}),
    });
    const res = await fetch("/api/credentials", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify(payload),
    });
    const out = await res.json().catch(() => ({}));
    if (!res.ok) {
      for (const i of out.issues ?? []) {
        if (i.field === "evidenceFileId") setFileError(i.message);
        else if (["qualificationTypeId", "issuedOn", "expiresOn", "note"].includes(i.field)) {
          form.setError(i.field as keyof CredentialFormInput, { message: i.message });
        }
      }
      setFormError(out.error ?? "Not saved.");
      return;
    }
    const c = out.credential;
    router.refresh();
    onDone(
      mode === "own"
        ? `Sent to HR: ${c.typeName} issued ${c.issuedOn}. HR verifies it before it counts.`
        : `${c.typeName} recorded: ${c.expiresOn ? `valid through ${c.expiresOn}` : "no expiry"}.`,
    );
  }

  const f = (name: string) => `${uid}-${name}`;
  const title = type ? (mode === "own" ? `Send a renewal of ${type.name}` : `Renew ${type.name}`) : "Add a qualification";

  return (
    <form
      onSubmit={form.handleSubmit(onSubmit)}
      noValidate
      aria-label={title}
      className="grid gap-3 rounded-card border border-copper/40 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <p className="font-bold sm:col-span-2 lg:col-span-4">{title}</p>
      {!type && (
        <div className="sm:col-span-2 lg:col-span-4">
          <label className="label" htmlFor={f("type")}>
            Qualification
          </label>
          <select
            id={f("type")}
            className="field"
            {...form.register("qualificationTypeId")}
            aria-invalid={errors.qualificationTypeId ? true : undefined}
            aria-describedby={errors.qualificationTypeId ? f("type-err") : undefined}
          >
            <option value="">Pick one…</option>
            {choices.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
          <Err id={f("type-err")} msg={errors.qualificationTypeId?.message} />
        </div>
      )}
      <div>
        <label className="label" htmlFor={f("issued")}>
          Issued on
        </label>
        <input
          id={f("issued")}
          type="date"
          max={today}
          className="field"
          {...form.register("issuedOn")}
          aria-invalid={errors.issuedOn ? true : undefined}
          aria-describedby={errors.issuedOn ? f("issued-err") : undefined}
        />
        <Err id={f("issued-err")} msg={errors.issuedOn?.message} />
      </div>
      <div>
        <label className="label" htmlFor={f("expires")}>
          Last valid day
        </label>
        <input
          id={f("expires")}
          type="date"
          className="field"
          {...form.register("expiresOn", { onChange: () => (expiryTouched.current = true) })}
          aria-invalid={errors.expiresOn ? true : undefined}
          aria-describedby={errors.expiresOn ? f("expires-err") : f("expires-hint")}
        />
        {errors.expiresOn ? (
          <Err id={f("expires-err")} msg={errors.expiresOn.message} />
        ) : (
          <p id={f("expires-hint")} className="mt-1 text-xs text-ink-500">
            {chosen?.renewalMonths
              ? `Proposed: issued + ${chosen.renewalMonths} months − 1 day.`
              : chosen
                ? "No renewal period: leave empty for no expiry."
                : "Proposed from the renewal period."}
          </p>
        )}
      </div>
      <div className="sm:col-span-2">
        <label className="label" htmlFor={f("file")}>
          Evidence {evidenceRequired ? "" : "(optional)"}
        </label>
        <input
          id={f("file")}
          name="evidence"
          type="file"
          accept={ACCEPT_ATTR}
          className="field file:mr-3 file:rounded file:border-0 file:bg-paper-200 file:px-2 file:py-1 file:text-sm file:font-semibold"
          onChange={(e) => pickFile(e.target.files?.[0] ?? null)}
          aria-invalid={fileError ? true : undefined}
          aria-describedby={fileError ? f("file-err") : f("file-hint")}
        />
        {fileError ? (
          <Err id={f("file-err")} msg={fileError} />
        ) : (
          <p id={f("file-hint")} className="mt-1 text-xs text-ink-500">
            PDF, JPEG or PNG, up to {MAX_UPLOAD_LABEL}.
          </p>
        )}
      </div>
      <div className="sm:col-span-2 lg:col-span-4">
        <label className="label" htmlFor={f("note")}>
          Note (optional)
        </label>
        <input id={f("note")} className="field" {...form.register("note")} placeholder="e.g. evaluated by the training centre" />
        <Err id={f("note-err")} msg={errors.note?.message} />
      </div>
      {formError && (
        <p role="alert" className="rounded-md bg-block-bg px-3 py-2 text-sm font-medium text-block sm:col-span-2 lg:col-span-4">
          ✖ {formError}
        </p>
      )}
      <div className="flex flex-wrap gap-2 sm:col-span-2 lg:col-span-4">
        <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
          {form.formState.isSubmitting ? "Saving…" : mode === "own" ? "Send to HR" : type ? "Save renewal" : "Save qualification"}
        </button>
        <button type="button" className="btn-quiet" onClick={onCancel}>
          Cancel
        </button>
        {mode === "hr" && (
          <span className="self-center text-xs text-ink-500">Saved as verified by you, now. The old record stays in the history.</span>
        )}
      </div>
    </form>
  );
}
