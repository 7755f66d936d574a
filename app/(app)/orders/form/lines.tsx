"use client";

import { CheckField, SelectField, TextAreaField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { locateWarning } from "@/lib/orders/locate";
import { CREW_EXCEPTION_LABEL } from "@/lib/orders/status";
import type { WorkTypeView } from "@/lib/orders/model";
import { voltageLabel } from "@/lib/orders/voltage";
import { emptyToNull, fieldError, nullableNumber, type OrderFormApi } from "./shared";

/** Energized or not, voltages, site elevation, the two-person exception, the locate and notes. */
export function LinesSection({ form, type }: { form: OrderFormApi; type: WorkTypeView | undefined }) {
  const { register, watch } = form;
  const err = (name: string) => fieldError(form, name);
  const phases = Number(watch("phases") ?? 3);
  const tapLabel = voltageLabel({ voltageKv: watch("voltageKv") ?? null, phases, systemKv: watch("systemKv") ?? null });
  const start = watch("start") ?? "";
  const end = watch("end") ?? "";
  const locate = type
    ? locateWarning({
        digs: type.digs,
        locateTicket: watch("locateTicket") ?? null,
        locateValidThrough: watch("locateValidThrough") || null,
        workDate: start.slice(0, 10),
        lastDate: end.slice(11, 16) === "00:00" ? null : end.slice(0, 10),
      })
    : null;
  const kv = { type: "number", step: "0.001", min: 0 } as const;

  return (
    <section className="card space-y-3 p-4">
      <h2 className="font-bold">Lines and exceptions</h2>
      <div className="grid gap-3 sm:grid-cols-2">
        <CheckField label="Work on or near energized lines" {...register("energized")} />
        <CheckField label="Emergency (storm, public safety)" {...register("emergency")} />
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField {...kv} label="Nominal voltage (kV)" error={err("voltageKv")} {...register("voltageKv", { setValueAs: nullableNumber })} />
        <SelectField label="Phases" error={err("phases")} {...register("phases", { setValueAs: (v) => (Number(v) === 1 ? 1 : 3) })}>
          <option value={3}>Three-phase (voltage phase to phase)</option>
          <option value={1}>Single-phase tap (voltage to ground)</option>
        </SelectField>
        {phases === 1 && (
          <TextField
            {...kv}
            label="System voltage, phase to phase (kV)"
            placeholder="e.g. 12.47"
            error={err("systemKv")}
            hint={
              tapLabel && (
                <span data-testid="voltage-label">
                  Shows as <strong>{tapLabel}</strong>
                </span>
              )
            }
            {...register("systemKv", { setValueAs: nullableNumber })}
          />
        )}
        <TextField
          {...kv}
          label="Energized parts nearby (kV)"
          hint="When this work is de-energized: the highest voltage of exposed live parts within reach of the crew or its equipment (a live feeder beside the pole). Above 0.6 kV the two-worker minimum and the observer rule still apply."
          error={err("nearEnergizedKv")}
          {...register("nearEnergizedKv", { setValueAs: nullableNumber })}
        />
        <TextField
          type="number"
          step="1"
          label="Site elevation (m)"
          placeholder="the yard's"
          hint="Leave empty to use the yard's elevation. Above 900 m the minimum approach distance grows (29 CFR 1910.269 Table R-5)."
          error={err("altitudeM")}
          {...register("altitudeM", { setValueAs: nullableNumber })}
        />
        <SelectField label="Two-person exception" error={err("crewException")} {...register("crewException", { setValueAs: emptyToNull })}>
          <option value="">None</option>
          <LabelOptions values={Object.keys(CREW_EXCEPTION_LABEL)} labels={CREW_EXCEPTION_LABEL} />
        </SelectField>
      </div>
      {type?.digs && (
        <div className="space-y-2 rounded-md border border-rule bg-white p-3">
          <p className="text-sm font-bold">Underground locate (this work digs)</p>
          <div className="grid gap-3 sm:grid-cols-2">
            <TextField label="Locate ticket no." error={err("locateTicket")} {...register("locateTicket")} />
            <TextField type="date" label="Valid through" error={err("locateValidThrough")} {...register("locateValidThrough", { setValueAs: emptyToNull })} />
          </div>
          {locate && (
            <p className="rounded-md bg-warn-bg px-2 py-1.5 text-xs font-semibold text-warn" role="status">
              <span aria-hidden="true">▲ </span>
              {locate}
            </p>
          )}
        </div>
      )}
      <TextAreaField label="Notes for the crew" rows={3} error={err("notes")} {...register("notes")} />
    </section>
  );
}
