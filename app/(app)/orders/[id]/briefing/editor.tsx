"use client";

// The crew lead's briefing form: hazards, drop zone, procedure, energy-source controls, the
// pole check (pass/fail, notes, photo) with the trade's choices after a failure, and the
// emergency plan. The same zod schema as the route (lib/briefings/model.ts).
import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useId, useRef, useState } from "react";
import { Controller, useForm, useWatch, type FieldErrors } from "react-hook-form";
import { FieldError, FormAlert, sendJson } from "@/components/form-bits";
import { StateIcon } from "@/components/status";
import type { BriefingView } from "@/lib/briefings/data";
import { ACCEPT_ATTR } from "@/lib/files/model";
import {
  briefingDataSchema,
  CONTROLS,
  DEFAULT_DROP_ZONE_FT,
  FAIL_ACTIONS,
  FT_TO_M,
  HAZARDS,
  POLE_CHECKS,
  POLE_MATERIALS,
  poleCheckHint,
  type BriefingData,
  type BriefingFormValues,
} from "@/lib/briefings/model";
import { PoleCite, Section } from "./sheet";
import { earliestCompletion, fmtEarliest } from "@/lib/briefings/checks";

export type ScreenView = BriefingView & { mode: "lead" | "crew" | "viewer"; me: number | null };

function errAt(errors: FieldErrors<BriefingFormValues>, path: string): string | undefined {
  let cur: unknown = errors;
  for (const part of path.split(".")) {
    if (!cur || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[part];
  }
  const m = (cur as { message?: unknown } | undefined)?.message;
  return typeof m === "string" ? m : undefined;
}

const workerIdValue = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

export function BriefingEditor({ view, onChange }: { view: ScreenView; onChange: (v: ScreenView) => void }) {
  const orderId = view.order.id;
  const version = view.briefing?.version ?? 0;
  const versionRef = useRef(version);
  versionRef.current = version;
  const [msg, setMsg] = useState<{ tone: "block" | "clear" | "warn"; text: string } | null>(null);
  const [busy, setBusy] = useState<null | "save" | "complete" | "hold" | "photo">(null);
  const uid = useId();

  const form = useForm<BriefingFormValues, unknown, BriefingData>({
    resolver: zodResolver(briefingDataSchema),
    defaultValues: view.data,
    mode: "onBlur",
  });
  const { register, control, handleSubmit, formState, setValue, setError, clearErrors } = form;
  const errors = formState.errors;
  const values = useWatch({ control }) as BriefingFormValues;
  const radius = Number(values.dropZone?.radiusFt);
  const material = values.poleCheck?.material ?? "wood";
  const failed = POLE_CHECKS.filter((c) => values.poleCheck?.items?.[c.key]?.result === "fail");
  const failAction = values.poleCheck?.failAction ?? null;
  const pole = view.order.structureNo ? `Pole ${view.order.structureNo}` : "The pole";
  const [holdReason, setHoldReason] = useState("");
  const holdTouched = useRef(false);

  useEffect(() => {
    if (holdTouched.current) return;
    const bits = failed.map((c) => {
      const n = values.poleCheck?.items?.[c.key]?.notes;
      return `${c.label.toLowerCase()}${n ? ` (${n})` : ""}`;
    });
    setHoldReason(bits.length ? `${pole} failed its pole check: ${bits.join("; ")}.` : "");
  }, [JSON.stringify(failed.map((c) => [c.key, values.poleCheck?.items?.[c.key]?.notes]))]);

  function placeIssues(body: { error?: string; issues?: { field: string; message: string }[] }) {
    let first = true;
    for (const i of body.issues ?? []) {
      const field = i.field.replace(/^data\./, "");
      try {
        setError(field as never, { type: "server", message: i.message }, { shouldFocus: first });
        first = false;
      } catch {
        /* not a form field */
      }
    }
    return body.error ?? "Not saved.";
  }

  async function send(action: "save" | "complete", data: BriefingData) {
    setBusy(action);
    setMsg(null);
    clearErrors();
    const r = await sendJson<ScreenView & { error?: string; issues?: { field: string; message: string }[] }>(`/api/briefings/${orderId}`, "PUT", {
      action,
      version: versionRef.current,
      data,
    });
    setBusy(null);
    if (!r.ok) {
      setMsg({ tone: "block", text: r.status === 409 ? (r.body.error ?? "Someone else saved first; reload.") : placeIssues(r.body) });
      return false;
    }
    versionRef.current = r.body.briefing?.version ?? versionRef.current;
    onChange(r.body);
    setMsg({ tone: "clear", text: action === "complete" ? "Briefing completed. Each crew member now acknowledges it from their phone." : "Draft saved." });
    return true;
  }

  async function hold(data: BriefingData) {
    if (holdReason.trim().length < 3) {
      setMsg({ tone: "block", text: "Give the reason for the hold." });
      return;
    }
    setBusy("hold");
    setMsg(null);
    const r = await sendJson<ScreenView & { error?: string; issues?: { field: string; message: string }[] }>(`/api/briefings/${orderId}/hold`, "POST", {
      version: versionRef.current,
      data,
      reason: holdReason.trim(),
    });
    setBusy(null);
    if (!r.ok) {
      setMsg({ tone: "block", text: placeIssues(r.body) });
      return;
    }
    onChange(r.body);
  }

  async function upload(key: string, file: File) {
    setBusy("photo");
    setMsg(null);
    const fd = new FormData();
    fd.append("file", file);
    let res: Response | null = null;
    try {
      res = await fetch(`/api/briefings/${orderId}/photo`, { method: "POST", body: fd });
    } catch {
      /* offline */
    }
    const body = res ? await res.json().catch(() => ({})) : { error: "The server could not be reached." };
    setBusy(null);
    if (!res?.ok) {
      setMsg({ tone: "block", text: body.error ?? "The photo was not taken." });
      return;
    }
    setValue(`poleCheck.items.${key}.photoFileId` as never, body.file.id as never, { shouldDirty: true });
    // Save at once so the photo is on the record (and viewable) before anything else happens.
    await handleSubmit((d) => send("save", d))();
  }

  const invalid = () => setMsg({ tone: "block", text: "Some fields need a look (marked below)." });

  return (
    <form className="space-y-3" noValidate onSubmit={(e) => e.preventDefault()} aria-label="Job briefing" data-testid="briefing-editor">
      <Section title="Hazards" id={`${uid}-hz`} cite="Talk through each one; tick it when it is present on this job.">
        <div className="space-y-3">
          {HAZARDS.map((h) => {
            const present = values.hazards?.[h.key]?.present;
            return (
              <div key={h.key} className="rounded-md border border-rule bg-white p-3">
                <label className="flex min-h-11 items-center gap-3 font-semibold">
                  <input type="checkbox" className="h-5 w-5 accent-copper" {...register(`hazards.${h.key}.present`)} />
                  {h.label}
                </label>
                <p className="text-xs text-ink-500">
                  {h.hint}
                  {h.key === "energized" &&
                    ` · From the order: ${view.order.energized ? `energized${view.order.voltageKv !== null ? `, ${view.order.voltageKv} kV` : ""}` : "de-energized"}`}
                </p>
                {(present || values.hazards?.[h.key]?.notes) && (
                  <>
                    <label htmlFor={`${uid}-hz-${h.key}`} className="sr-only">
                      {h.label}: notes
                    </label>
                    <textarea
                      id={`${uid}-hz-${h.key}`}
                      rows={2}
                      className="field mt-2"
                      placeholder="What it is and how the crew handles it"
                      aria-label={`${h.label} notes`}
                      {...register(`hazards.${h.key}.notes`)}
                    />
                    <FieldError msg={errAt(errors, `hazards.${h.key}.notes`)} />
                  </>
                )}
              </div>
            );
          })}
        </div>
      </Section>

      <Section title="Drop zone" id={`${uid}-dz`} cite={`Default ${DEFAULT_DROP_ZONE_FT} ft (4.6 m) around the pole, common practice. Make it larger for greater heights, heavy loads on the hand line and boom swing.`}>
        <div className="grid gap-3 sm:grid-cols-[10rem_1fr]">
          <div>
            <label htmlFor={`${uid}-radius`} className="label">
              Radius (ft)
            </label>
            <input id={`${uid}-radius`} type="number" inputMode="numeric" min={DEFAULT_DROP_ZONE_FT} max={300} step={1} className="field" {...register("dropZone.radiusFt", { valueAsNumber: true })} />
            <p className="mt-1 text-xs text-ink-500 tabular-nums">{Number.isFinite(radius) ? `${(radius * FT_TO_M).toFixed(1)} m` : ""}</p>
            <FieldError msg={errAt(errors, "dropZone.radiusFt")} />
          </div>
          {Number.isFinite(radius) && radius > DEFAULT_DROP_ZONE_FT && (
            <div>
              <label htmlFor={`${uid}-dzr`} className="label">
                Why larger
              </label>
              <input id={`${uid}-dzr`} className="field" placeholder="45 ft pole, transformer on the hand line…" {...register("dropZone.reason")} />
              <FieldError msg={errAt(errors, "dropZone.reason")} />
            </div>
          )}
        </div>
        <fieldset className="mt-3">
          <legend className="label">Who may enter while someone is aloft</legend>
          <Controller
            control={control}
            name="dropZone.entrants"
            render={({ field }) => {
              const list = (field.value ?? []) as number[];
              return (
                <div className="grid gap-1 sm:grid-cols-2">
                  {view.crew
                    .filter((c) => !c.climbs)
                    .map((c) => (
                      <label key={c.workerId} className="flex min-h-11 items-center gap-3 rounded-md border border-rule bg-white px-3 text-sm">
                        <input
                          type="checkbox"
                          className="h-5 w-5 accent-copper"
                          checked={list.includes(c.workerId)}
                          onChange={(e) => field.onChange(e.target.checked ? [...list, c.workerId] : list.filter((w) => w !== c.workerId))}
                        />
                        <span>
                          {c.name} <span className="text-ink-500">· {c.positionLabel}</span>
                        </span>
                      </label>
                    ))}
                </div>
              );
            }}
          />
          <FieldError msg={errAt(errors, "dropZone.entrants")} />
        </fieldset>
        <label htmlFor={`${uid}-dzn`} className="label mt-3">
          Notes
        </label>
        <input id={`${uid}-dzn`} className="field" placeholder="Cones on the road side, hand signals…" {...register("dropZone.notes")} />
      </Section>

      <Section title="Work procedure" id={`${uid}-wp`} cite="In a few lines: the steps, who does what, and any special precautions.">
        <label htmlFor={`${uid}-steps`} className="label">
          Steps
        </label>
        <textarea id={`${uid}-steps`} rows={4} className="field" {...register("procedure.steps")} />
        <FieldError msg={errAt(errors, "procedure.steps")} />
        <label htmlFor={`${uid}-prec`} className="label mt-3">
          Special precautions
        </label>
        <textarea id={`${uid}-prec`} rows={2} className="field" {...register("procedure.precautions")} />
      </Section>

      <Section title="Energy-source controls" id={`${uid}-ec`}>
        <div className="grid gap-1 sm:grid-cols-2">
          {CONTROLS.map((c) => (
            <label key={c.key} className="flex min-h-11 items-center gap-3 rounded-md border border-rule bg-white px-3 text-sm">
              <input type="checkbox" className="h-5 w-5 accent-copper" {...register(`controls.${c.key}`)} />
              {c.label}
            </label>
          ))}
        </div>
        <label htmlFor={`${uid}-ecn`} className="label mt-3">
          Devices, tags and grounds
        </label>
        <textarea id={`${uid}-ecn`} rows={2} className="field" placeholder="Cutout C-114 open and tagged; grounds at both ends…" {...register("controls.notes")} />
        <FieldError msg={errAt(errors, "controls.notes")} />
      </Section>

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
                        if (f) void upload(c.key, f);
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
                  onChange={(e) => {
                    holdTouched.current = true;
                    setHoldReason(e.target.value);
                  }}
                />
              </>
            )}
          </fieldset>
        )}
      </Section>

      <Section title="Emergency plan" id={`${uid}-em`}>
        <div className="grid gap-3 sm:grid-cols-2">
          <div>
            <label htmlFor={`${uid}-hosp`} className="label">
              Nearest hospital
            </label>
            <input id={`${uid}-hosp`} className="field" {...register("emergency.hospital")} />
            <FieldError msg={errAt(errors, "emergency.hospital")} />
          </div>
          <div>
            <label htmlFor={`${uid}-hadr`} className="label">
              Hospital address
            </label>
            <input id={`${uid}-hadr`} className="field" {...register("emergency.hospitalAddress")} />
            <FieldError msg={errAt(errors, "emergency.hospitalAddress")} />
          </div>
          <div>
            <label htmlFor={`${uid}-call`} className="label">
              Calls 911
            </label>
            <select id={`${uid}-call`} className="field" {...register("emergency.callerWorkerId", { setValueAs: workerIdValue })}>
              <option value="">Pick…</option>
              {view.crew.map((c) => (
                <option key={c.workerId} value={c.workerId}>
                  {c.name} ({c.positionLabel})
                </option>
              ))}
            </select>
            <FieldError msg={errAt(errors, "emergency.callerWorkerId")} />
          </div>
          <div>
            <label htmlFor={`${uid}-resc`} className="label">
              Does the rescue
            </label>
            <select id={`${uid}-resc`} className="field" {...register("emergency.rescuerWorkerId", { setValueAs: workerIdValue })}>
              <option value="">Pick…</option>
              {view.crew.map((c) => (
                <option key={c.workerId} value={c.workerId}>
                  {c.name} ({c.positionLabel})
                </option>
              ))}
            </select>
            <FieldError msg={errAt(errors, "emergency.rescuerWorkerId")} />
          </div>
        </div>
        <label htmlFor={`${uid}-emn`} className="label mt-3">
          Notes
        </label>
        <input id={`${uid}-emn`} className="field" placeholder="Rescue kit on the truck, road to meet the ambulance…" {...register("emergency.notes")} />
      </Section>

      <div className="sticky bottom-0 z-10 -mx-4 border-t border-rule bg-paper/95 px-4 py-3 backdrop-blur sm:static sm:mx-0 sm:border-0 sm:bg-transparent sm:px-0 print:hidden">
        {msg && (
          <div className="mb-2">
            <FormAlert tone={msg.tone}>{msg.text}</FormAlert>
          </div>
        )}
        <p className="text-xs text-ink-700" data-testid="briefing-window">
          {/* Issue 18: completed at the earliest the evening before the job, on the yard's clock. */}
          A briefing is about the day&apos;s conditions: complete it from{" "}
          <strong>{fmtEarliest(earliestCompletion(view.order.workDate, view.order.timezone), view.order.timezone)}</strong> (18:00 the evening
          before the job) at the earliest. Save a draft before then.
        </p>
        <div className="flex flex-wrap gap-2">
          <button type="button" className="btn-quiet min-h-11 flex-1 sm:flex-none" disabled={busy !== null} onClick={handleSubmit((d) => send("save", d), invalid)}>
            {busy === "save" ? "Saving…" : "Save draft"}
          </button>
          {failAction === "hold" && failed.length > 0 ? (
            <button type="button" className="btn min-h-11 flex-1 bg-block text-white hover:opacity-90 sm:flex-none" disabled={busy !== null} onClick={handleSubmit(hold, invalid)}>
              {busy === "hold" ? "Holding…" : "Hold the order"}
            </button>
          ) : (
            <button type="button" className="btn-accent min-h-11 flex-1 sm:flex-none" disabled={busy !== null} onClick={handleSubmit((d) => send("complete", d), invalid)}>
              {busy === "complete" ? "Completing…" : "Complete briefing"}
            </button>
          )}
        </div>
      </div>
    </form>
  );
}
