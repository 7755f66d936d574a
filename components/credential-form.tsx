"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useId, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { FormActions, FormError, SelectField, TextField } from "@/components/form/fields";
import { useApiMutation } from "@/lib/api/mutations";
import {
  credentialCreateSchema,
  credentialFormSchema,
  proposeExpiry,
  type CredentialCreate,
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

/**
 * Add or renew a credential, with evidence. The file goes to /api/files first (type checked
 * from its bytes there), then the record to /api/credentials. The expiry is proposed from the
 * qualification's renewal period: issued + N months − 1 day, the last valid day.
 */
export function CredentialForm({ workerId, type, choices = [], today, mode, onDone, onCancel }: Props) {
  const uid = useId();
  const [file, setFile] = useState<File | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
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

  const upload = useApiMutation<File, { file: { id: number } }>({
    request: (f) => {
      const body = new FormData();
      body.set("file", f);
      body.set("workerId", String(workerId));
      return { url: "/api/files", method: "POST", body };
    },
    onFailure: (f) => setFileError(f.issues[0]?.message ?? f.message),
  });
  const save = useApiMutation<CredentialCreate, { credential: { typeName: string; issuedOn: string; expiresOn: string | null } }>({
    request: (payload) => ({ url: "/api/credentials", method: "POST", body: payload }),
    form,
    fields: ["qualificationTypeId", "issuedOn", "expiresOn", "note"],
    refresh: true,
    onFailure: (f) => {
      const onFile = f.issues.find((i) => i.field === "evidenceFileId");
      if (onFile) setFileError(onFile.message);
    },
    onSuccess: ({ credential: c }) =>
      onDone(
        mode === "own"
          ? `Sent to HR: ${c.typeName} issued ${c.issuedOn}. HR verifies it before it counts.`
          : `${c.typeName} recorded: ${c.expiresOn ? `valid through ${c.expiresOn}` : "no expiry"}.`,
      ),
  });

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
    save.reset();
    if (fileError) return;
    if (evidenceRequired && !file) {
      setFileError(mode === "own" ? "Add a scan or photo of the new card or certificate." : `${chosen?.name ?? "This qualification"} needs evidence: add the card or certificate.`);
      return;
    }
    let evidenceFileId: number | null = null;
    if (file) {
      if (uploaded.current?.file === file) evidenceFileId = uploaded.current.id;
      else {
        const out = await upload.submit(file);
        if (!out) return;
        uploaded.current = { file, id: out.file.id };
        evidenceFileId = out.file.id;
      }
    }
    await save.submit(
      credentialCreateSchema.parse({
        workerId,
        qualificationTypeId: values.qualificationTypeId,
        issuedOn: values.issuedOn,
        ...(values.expiresOn ? { expiresOn: values.expiresOn } : {}),
        evidenceFileId,
        status: mode === "own" ? "pending" : "current",
        ...(values.note ? { note: values.note } : {}),
      }),
    );
  }

  const f = (name: string) => `${uid}-${name}`;
  const title = type ? (mode === "own" ? `Send a renewal of ${type.name}` : `Renew ${type.name}`) : "Add a qualification";
  const busy = form.formState.isSubmitting;

  return (
    <form
      onSubmit={form.handleSubmit(onSubmit)}
      noValidate
      aria-label={title}
      className="grid gap-3 rounded-card border border-copper/40 bg-white p-4 sm:grid-cols-2 lg:grid-cols-4"
    >
      <p className="font-bold sm:col-span-2 lg:col-span-4">{title}</p>
      {!type && (
        <SelectField id={f("type")} wrapperClassName="sm:col-span-2 lg:col-span-4" label="Qualification" error={errors.qualificationTypeId?.message} {...form.register("qualificationTypeId")}>
          <option value="">Pick one…</option>
          {choices.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
      )}
      <TextField id={f("issued")} type="date" max={today} label="Issued on" error={errors.issuedOn?.message} {...form.register("issuedOn")} />
      <TextField
        id={f("expires")}
        type="date"
        label="Last valid day"
        hint={
          chosen?.renewalMonths
            ? `Proposed: issued + ${chosen.renewalMonths} months − 1 day.`
            : chosen
              ? "No renewal period: leave empty for no expiry."
              : "Proposed from the renewal period."
        }
        error={errors.expiresOn?.message}
        {...form.register("expiresOn", { onChange: () => (expiryTouched.current = true) })}
      />
      <TextField
        id={f("file")}
        wrapperClassName="sm:col-span-2"
        name="evidence"
        type="file"
        accept={ACCEPT_ATTR}
        className="field file:mr-3 file:rounded file:border-0 file:bg-paper-200 file:px-2 file:py-1 file:text-sm file:font-semibold"
        label={`Evidence ${evidenceRequired ? "" : "(optional)"}`}
        hint={`PDF, JPEG or PNG, up to ${MAX_UPLOAD_LABEL}.`}
        error={fileError}
        onChange={(e) => pickFile(e.target.files?.[0] ?? null)}
      />
      <TextField
        id={f("note")}
        wrapperClassName="sm:col-span-2 lg:col-span-4"
        label="Note (optional)"
        placeholder="e.g. evaluated by the training centre"
        error={errors.note?.message}
        {...form.register("note")}
      />
      <FormError className="sm:col-span-2 lg:col-span-4" text={save.errorText} />
      <FormActions className="flex flex-wrap gap-2 sm:col-span-2 lg:col-span-4" label={mode === "own" ? "Send to HR" : type ? "Save renewal" : "Save qualification"} busy={busy} onCancel={onCancel}>
        {mode === "hr" && <span className="self-center text-xs text-ink-500">Saved as verified by you, now. The old record stays in the history.</span>}
      </FormActions>
    </form>
  );
}
