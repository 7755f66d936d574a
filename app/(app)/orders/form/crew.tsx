"use client";

import { FieldError, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions } from "@/components/form/options";
import { AddPosition, PositionOptions } from "@/components/form/position-options";
import { POSITION_LABEL } from "@/lib/format";
import { LICENCE_LABEL } from "@/lib/orders/status";
import type { WorkTypeView } from "@/lib/orders/model";
import type { Position } from "@/lib/rules/types";
import { useState } from "react";
import { emptyToNull, fieldError, nullableNumber, type Mode, type OrderFormApi, type Row } from "./shared";

/** Minimum crew, the driver licence and the positions (seats) with who holds them. */
export function CrewSection({
  form,
  mode,
  type,
  rows,
  setRows,
  held,
}: {
  form: OrderFormApi;
  mode: Mode;
  type: WorkTypeView | undefined;
  rows: Row[];
  setRows: (rows: Row[]) => void;
  held: Map<number, { name: string }>;
}) {
  const { register } = form;
  const err = (name: string) => fieldError(form, name);

  function resetToTemplate() {
    if (!type) return;
    const keep = rows.filter((r) => r.id && held.has(r.id));
    const missing = [...type.positions];
    for (const k of keep) {
      const at = missing.indexOf(k.position);
      if (at >= 0) missing.splice(at, 1);
    }
    setRows([...keep, ...missing.map((position) => ({ position }))]);
  }

  return (
    <section className="card space-y-3 p-4">
      <h2 className="font-bold">Crew</h2>
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField type="number" min={1} max={30} label="Minimum crew (people on site)" error={err("minCrew")} {...register("minCrew", { setValueAs: nullableNumber })} />
        <SelectField label="Driver licence needed" error={err("driverLicence")} {...register("driverLicence", { setValueAs: emptyToNull })}>
          <option value="">No driver position rule</option>
          <LabelOptions values={Object.keys(LICENCE_LABEL)} labels={LICENCE_LABEL} />
        </SelectField>
      </div>
      <div>
        <p className="label">Positions</p>
        <ul className="space-y-1.5" aria-label="Positions">
          {rows.map((row, i) => {
            const who = row.id ? held.get(row.id) : undefined;
            return (
              <li key={row.id ?? `new-${i}`} className="flex items-center gap-2">
                <select
                  aria-label={`Position ${i + 1}`}
                  className="field"
                  value={row.position}
                  onChange={(e) => setRows(rows.map((r, j) => (j === i ? { ...r, position: e.target.value as Position } : r)))}
                >
                  <PositionOptions explain />
                </select>
                {who && <span className="whitespace-nowrap text-xs font-semibold text-ink-700">{who.name}</span>}
                <button
                  type="button"
                  className="btn-quiet px-2"
                  aria-label={`Remove ${POSITION_LABEL[row.position]} position`}
                  disabled={Boolean(who) || rows.length <= 1}
                  title={who ? "Take the worker off on the board first" : undefined}
                  onClick={() => setRows(rows.filter((_, j) => j !== i))}
                >
                  ✕
                </button>
              </li>
            );
          })}
        </ul>
        <AddPosition onAdd={(position) => setRows([...rows, { position }])}>
          {mode === "edit" && type && (
            <button type="button" className="text-xs font-semibold text-copper hover:underline" onClick={resetToTemplate}>
              Reset to template
            </button>
          )}
        </AddPosition>
        <FieldError msg={err("positions")} />
        {!rows.some((r) => r.position === "lead") && (
          <p className="mt-1 text-xs font-semibold text-warn">▲ No lead position: an order with two or more people needs an employee in charge.</p>
        )}
      </div>
    </section>
  );
}
