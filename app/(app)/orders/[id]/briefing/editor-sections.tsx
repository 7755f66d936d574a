"use client";

// The briefing editor's plain sections (hazards, drop zone, work procedure, energy-source
// controls, emergency plan), split from editor.tsx; the pole check is in pole-check.tsx.
import { Controller, useWatch, type FieldErrors, type UseFormReturn } from "react-hook-form";
import { FieldError } from "@/components/form-bits";
import type { BriefingView } from "@/lib/briefings/model";
import { CONTROLS, DEFAULT_DROP_ZONE_FT, FT_TO_M, HAZARDS, type BriefingData, type BriefingFormValues } from "@/lib/briefings/model";
import { Section } from "./sheet";

export type ScreenView = BriefingView & { mode: "lead" | "crew" | "viewer"; me: number | null };
export type EditorForm = UseFormReturn<BriefingFormValues, unknown, BriefingData>;

export function errAt(errors: FieldErrors<BriefingFormValues>, path: string): string | undefined {
  let cur: unknown = errors;
  for (const part of path.split(".")) {
    if (!cur || typeof cur !== "object") return undefined;
    cur = (cur as Record<string, unknown>)[part];
  }
  const m = (cur as { message?: unknown } | undefined)?.message;
  return typeof m === "string" ? m : undefined;
}

const workerIdValue = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

function useParts(form: EditorForm) {
  const { register, control, formState } = form;
  const values = useWatch({ control }) as BriefingFormValues;
  return { register, control, errors: formState.errors, values };
}

/** Hazards, drop zone, work procedure and energy-source controls. */
export function PlanSections({ form, view, uid }: { form: EditorForm; view: ScreenView; uid: string }) {
  const { register, control, errors, values } = useParts(form);
  const radius = Number(values.dropZone?.radiusFt);
  return (
    <>
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
    </>
  );
}

export function EmergencySection({ form, view, uid }: { form: EditorForm; view: ScreenView; uid: string }) {
  const { register, errors } = useParts(form);
  return (
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
  );
}
