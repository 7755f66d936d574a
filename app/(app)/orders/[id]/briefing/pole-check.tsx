"use client";

// The pole check of the briefing editor (split from editor.tsx): pass/fail per check with its
// notes and photo, and the trade's choices after a failure (hold, secure, bucket). A photo taken
// without signal shows from the phone until it is sent (issue 20).
import { StateIcon } from "@/components/status";
import { FieldError } from "@/components/form-bits";
import { ACCEPT_ATTR } from "@/lib/files/model";
import { FAIL_ACTIONS, POLE_CHECKS, POLE_MATERIALS, poleCheckHint, type BriefingFormValues } from "@/lib/briefings/model";
import { useWatch } from "react-hook-form";
import { PoleCite, Section } from "./sheet";
import { errAt, type EditorForm } from "./editor-sections";

export interface PendingPhoto {
  /** The queued upload's idempotency key (the save refers to it as { $photo: key }). */
  ref: string;
  preview: string;
}

interface Props {
  form: EditorForm;
  orderId: number;
  uid: string;
  busy: string | null;
  pending: Record<string, PendingPhoto>;
  holdReason: string;
  onHoldReason: (text: string) => void;
  onPhoto: (checkKey: string, file: File) => void;
}

export function PoleCheckSection({ form, orderId, uid, busy, pending, holdReason, onHoldReason, onPhoto }: Props) {
  const { register, control, formState } = form;
  const errors = formState.errors;
  const values = useWatch({ control }) as BriefingFormValues;
  const material = values.poleCheck?.material ?? "wood";
  const failed = POLE_CHECKS.filter((c) => values.poleCheck?.items?.[c.key]?.result === "fail");
  const failAction = values.poleCheck?.failAction ?? null;
  return (
    <Section title="Pole check before anyone climbs" id={`${uid}-pc`} cite={<PoleCite />}>
      <p className="mb-3 text-xs text-ink-500">Record each check as it is done. A photo (PDF, JPEG or PNG, up to 10 MB) may go with any of them.</p>
      <label htmlFor={`${uid}-mat`} className="label">
        Pole material
      </label>
      <select id={`${uid}-mat`} className="field sm:w-48" {...register("poleCheck.material")}>
        {POLE_MATERIALS.map((m) => (
          <option key={m} value={m}>
            {m[0].toUpperCase() + m.slice(1)}
          </option>
        ))}
      </select>
      <div className="mt-3 space-y-3">
        {POLE_CHECKS.map((c) => {
          const item = values.poleCheck?.items?.[c.key];
          const showNa = c.woodOnly && material !== "wood";
          const photo = item?.photoFileId;
          return (
            <fieldset key={c.key} className={`rounded-md border bg-white p-3 ${item?.result === "fail" ? "border-block" : "border-rule"}`} data-testid={`pole-${c.key}`}>
              <legend className="px-1 font-semibold">{c.label}</legend>
              <p className="text-xs text-ink-500" data-testid={`pole-${c.key}-hint`}>{poleCheckHint(c.key, material)}</p>
              <div className="mt-2 flex flex-wrap items-center gap-2">
                <div className="flex gap-2" role="radiogroup" aria-label={`${c.label}: result`}>
                  {(["pass", "fail", ...(showNa ? ["na"] : [])] as const).map((r) => (
                    <label
                      key={r}
                      className={`flex min-h-11 min-w-20 cursor-pointer items-center justify-center gap-1.5 rounded-md border px-3 text-sm font-semibold has-[:checked]:border-ink has-[:checked]:bg-ink has-[:checked]:text-paper ${r === "fail" ? "border-block text-block" : "border-rule"}`}
                    >
                      <input type="radio" value={r} className="sr-only" {...register(`poleCheck.items.${c.key}.result`)} />
                      {r !== "na" && <StateIcon tone={r === "pass" ? "clear" : "block"} />}
                      {r === "pass" ? "Pass" : r === "fail" ? "Fail" : "n/a"}
                    </label>
                  ))}
                </div>
                <label className="btn-quiet ml-auto min-h-11 cursor-pointer" title="PDF, JPEG or PNG, up to 10 MB">
                  {photo ? "Replace photo" : "Photo"}
                  <input
                    type="file"
                    accept={ACCEPT_ATTR}
                    capture="environment"
                    className="sr-only"
                    aria-label={`${c.label}: photo`}
                    disabled={busy !== null}
                    onChange={(e) => {
                      const f = e.target.files?.[0];
                      e.target.value = "";
                      if (f) onPhoto(c.key, f);
                    }}
                  />
                </label>
              </div>
              <FieldError msg={errAt(errors, `poleCheck.items.${c.key}.result`)} />
              <label htmlFor={`${uid}-pcn-${c.key}`} className="sr-only">
                {c.label}: notes
              </label>
              <input
                id={`${uid}-pcn-${c.key}`}
                className="field mt-2"
                placeholder={item?.result === "fail" ? "What failed, where" : "Notes (optional)"}
                aria-label={`${c.label} notes`}
                {...register(`poleCheck.items.${c.key}.notes`)}
              />
              <FieldError msg={errAt(errors, `poleCheck.items.${c.key}.notes`)} />
              {photo && (
                <p className="mt-2 text-sm">
                  <a href={`/api/briefings/${orderId}/photo/${photo}`} target="_blank" rel="noopener noreferrer" className="font-semibold text-copper underline">
                    View photo
                  </a>
                </p>
              )}
              {pending[c.key] && (
                <p className="mt-2 flex items-center gap-2 text-sm text-warn" data-testid={`pole-${c.key}-pending-photo`}>
                  {/* eslint-disable-next-line @next/next/no-img-element */}
                  <img src={pending[c.key].preview} alt={`${c.label}: photo saved on this phone`} className="h-12 w-12 rounded object-cover" />
                  Photo saved on this phone, not yet sent.
                </p>
              )}
            </fieldset>
          );
        })}
      </div>

      {failed.length > 0 && (
        <fieldset className="mt-4 rounded-md border-2 border-block bg-block-bg/40 p-3" data-testid="fail-choices">
          <legend className="flex items-center gap-1.5 px-1 font-bold text-block">
            <StateIcon tone="block" /> The pole failed: what now?
          </legend>
          <p className="text-sm text-ink-700">Failed: {failed.map((c) => c.label).join(", ")}. Nobody climbs this pole as it stands.</p>
          <div className="mt-2 space-y-2">
            {FAIL_ACTIONS.map((a) => (
              <label key={a.key} className="flex min-h-11 cursor-pointer items-start gap-3 rounded-md border border-rule bg-white p-3 has-[:checked]:border-ink">
                <input type="radio" value={a.key} className="mt-1 h-5 w-5 accent-copper" {...register("poleCheck.failAction")} />
                <span>
                  <span className="block font-semibold">{a.label}</span>
                  <span className="block text-xs text-ink-500">{a.hint}</span>
                </span>
              </label>
            ))}
          </div>
          <FieldError msg={errAt(errors, "poleCheck.failAction")} />
          {failAction === "secure" || failAction === "bucket" ? (
            <>
              <label htmlFor={`${uid}-fan`} className="label mt-3">
                {failAction === "secure" ? "How the pole is secured" : "How the work is done instead"}
              </label>
              <textarea id={`${uid}-fan`} rows={2} className="field" {...register("poleCheck.failActionNotes")} />
              <FieldError msg={errAt(errors, "poleCheck.failActionNotes")} />
            </>
          ) : null}
          {failAction === "hold" && (
            <>
              <label htmlFor={`${uid}-hold`} className="label mt-3">
                Reason for the hold (dispatch gets it by text and e-mail)
              </label>
              <textarea
                id={`${uid}-hold`}
                rows={3}
                maxLength={400}
                className="field"
                value={holdReason}
                onChange={(e) => onHoldReason(e.target.value)}
              />
            </>
          )}
        </fieldset>
      )}
    </Section>
  );
}
