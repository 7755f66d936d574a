"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { FormAlert } from "@/components/form/fields";
import type { OrderSeat, WorkTypeView } from "@/lib/orders/model";
import { buildRrule, defaultRepeatForm, floating, type RepeatForm } from "@/lib/time/recurrence";
import { orderEditSchema, orderInputSchema, seriesEditSchema } from "@/lib/orders/schema";
import { CrewSection } from "./form/crew";
import { LinesSection } from "./form/lines";
import type { Mode, OrderFormShape, Row, YardOption } from "./form/shared";
import { useOrderSave } from "./form/use-order-save";
import { WhatWhere } from "./form/what-where";
import { WhenSection } from "./form/when";

export { dailyShifts, type OrderFormShape, type YardOption } from "./form/shared";

interface Props {
  mode: Mode;
  yards: YardOption[];
  workTypes: WorkTypeView[];
  initial: OrderFormShape;
  /** edit: the seats as they are, to show who holds which position. */
  seats?: OrderSeat[];
  orderId?: number;
  seriesId?: number;
  initialRepeat?: RepeatForm;
  /** Today in the yard (series edits preview from today on). */
  today?: string;
  readOnly?: boolean;
}

const SCHEMA = { new: orderInputSchema, edit: orderEditSchema, series: seriesEditSchema };

/**
 * One form for a new order, an existing order and a repeating order's series, validated by
 * the same zod schema as its route (orderInputSchema, orderEditSchema, seriesEditSchema).
 * Its sections live in ./form; the writes in ./form/use-order-save.ts.
 */
export function OrderForm({ mode, yards, workTypes, initial, seats = [], orderId, seriesId, initialRepeat, today, readOnly }: Props) {
  const [rows, setRows] = useState<Row[]>(initial.positions as Row[]);
  const [repeat, setRepeat] = useState<RepeatForm>(initialRepeat ?? defaultRepeatForm(initial.start.slice(0, 10)));
  const [exdates, setExdates] = useState<string[]>(initial.recurrence?.exdates ?? []);

  const form = useForm<OrderFormShape>({
    resolver: zodResolver(SCHEMA[mode] as never) as never,
    defaultValues: initial,
    mode: "onTouched",
  });
  const { watch, setValue, formState } = form;
  const save = useOrderSave({ form, mode, orderId, seriesId, version: initial.version, setRows });

  const yard = yards.find((y) => y.id === Number(watch("yardId"))) ?? yards[0];
  const type = workTypes.find((t) => t.id === Number(watch("workTypeId")));
  const held = new Map(seats.filter((s) => s.worker).map((s) => [s.id, s.worker!]));
  const start = watch("start") ?? "";
  const end = watch("end") ?? "";

  useEffect(() => {
    setValue("positions", rows, { shouldDirty: true, shouldValidate: formState.isSubmitted });
  }, [rows, setValue, formState.isSubmitted]);

  useEffect(() => {
    if (mode === "edit") return;
    const rrule = buildRrule(repeat);
    setValue("recurrence", rrule ? { rrule, exdates } : null, { shouldValidate: formState.isSubmitted });
  }, [repeat, exdates, mode, setValue, formState.isSubmitted]);

  function pickType(id: number) {
    const t = workTypes.find((x) => x.id === id);
    if (!t || mode === "edit") return;
    // A new order takes the work type's crew template; edit the positions after.
    setRows(t.positions.map((position) => ({ position })));
    setValue("minCrew", t.minCrew);
  }

  const duration = useMemo(() => {
    try {
      const m = (floating(end) - floating(start)) / 60_000;
      return m > 0 ? m : null;
    } catch {
      return null;
    }
  }, [start, end]);

  return (
    <form onSubmit={form.handleSubmit(save.submit)} noValidate className="space-y-4">
      <fieldset disabled={readOnly} className="grid gap-4 lg:grid-cols-2">
        <WhatWhere form={form} mode={mode} yards={yards} workTypes={workTypes} fixedYardId={initial.yardId} onPickType={pickType} />
        <WhenSection form={form} mode={mode} yard={yard} repeat={{ value: repeat, set: setRepeat, exdates, setExdates }} durationMinutes={duration} today={today} />
        <LinesSection form={form} type={type} />
        <CrewSection form={form} mode={mode} type={type} rows={rows} setRows={setRows} held={held} />
      </fieldset>

      {save.alert && (
        <FormAlert tone={save.alert.tone}>
          {save.alert.text}{" "}
          {save.conflict && (
            <button type="button" className="underline" onClick={() => window.location.reload()}>
              Reload
            </button>
          )}
        </FormAlert>
      )}

      {!readOnly && (
        <div className="flex flex-wrap items-center gap-3">
          <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
            {mode === "new" ? (repeat.kind === "none" ? "Create order" : "Create repeating order") : mode === "series" ? "Save series" : "Save order"}
          </button>
          {mode === "edit" && initial.status !== "cancelled" && (
            <button type="button" className="btn-quiet text-block" onClick={save.cancelOrder}>
              Cancel order
            </button>
          )}
          {mode === "series" && (
            <button type="button" className="btn-quiet text-block" onClick={save.endSeries}>
              End series
            </button>
          )}
          {Object.keys(formState.errors).length > 0 && <span className="text-sm font-semibold text-block">✖ Check the fields marked above.</span>}
        </div>
      )}
    </form>
  );
}
