"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useEffect, useMemo, useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { FieldError, FormAlert, applyIssues, sendJson } from "@/components/form-bits";
import { POSITION_LABEL } from "@/lib/format";
import { locateWarning } from "@/lib/orders/locate";
import { voltageLabel } from "@/lib/orders/voltage";
import { CREW_EXCEPTION_LABEL, LICENCE_LABEL, ORDER_STATUSES, PRIORITY_LABEL, STATUS_LABEL } from "@/lib/orders/status";
import type { OrderSeat, WorkTypeView } from "@/lib/orders/types";
import { buildRrule, defaultRepeatForm, floating, type RepeatForm } from "@/lib/recurrence-core";
import { POSITIONS, type Position } from "@/lib/rules/types";
import { orderEditSchema, orderInputSchema, seriesEditSchema, type OrderEditValues } from "@/lib/validation/order";
import { RecurrenceFields } from "./recurrence-fields";

export interface YardOption {
  id: number;
  code: string;
  name: string;
  timezone: string;
}

type Mode = "new" | "edit" | "series";

export type OrderFormShape = Omit<OrderEditValues, "version"> & {
  version?: number;
  recurrence?: { rrule: string; exdates: string[] } | null;
};

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

interface Row {
  id?: number;
  position: Position;
}

const SCHEMA = { new: orderInputSchema, edit: orderEditSchema, series: seriesEditSchema };
const nullableNumber = (v: unknown) => (v === "" || v === null || v === undefined ? null : Number(v));

/** "YYYY-MM-DDTHH:mm" moved by whole calendar days (wall clock, no zone). */
function plusDays(wall: string, days: number) {
  const [y, m, d] = wall.slice(0, 10).split("-").map(Number);
  const t = new Date(Date.UTC(y, m - 1, d + days));
  return `${t.toISOString().slice(0, 10)}${wall.slice(10, 16)}`;
}

/** One shift a day from the order's first day to its last, each at the order's start and end clock times. */
export function dailyShifts(start: string, end: string): { start: string; end: string }[] {
  if (start.length < 16 || end.length < 16 || end <= start) return [];
  const out: { start: string; end: string }[] = [];
  const from = start.slice(11, 16);
  const to = end.slice(11, 16);
  for (let day = start.slice(0, 10), i = 0; day <= end.slice(0, 10) && i < 31; day = plusDays(`${day}T00:00`, 1).slice(0, 10), i++) {
    const s = `${day}T${from}`;
    const e = to > from ? `${day}T${to}` : plusDays(`${day}T${to}`, 1);
    if (s >= start.slice(0, 16) && e <= end.slice(0, 16)) out.push({ start: s, end: e });
  }
  return out;
}

/**
 * One form for a new order, an existing order and a repeating order's series, validated by
 * the same zod schema as its route (orderInputSchema, orderEditSchema, seriesEditSchema).
 */
export function OrderForm({ mode, yards, workTypes, initial, seats = [], orderId, seriesId, initialRepeat, today, readOnly }: Props) {
  const router = useRouter();
  const [alert, setAlert] = useState<{ tone: "block" | "clear" | "warn"; text: string } | null>(null);
  const [conflict, setConflict] = useState(false);
  const [rows, setRows] = useState<Row[]>(initial.positions as Row[]);
  const [addPosition, setAddPosition] = useState<Position>("ground");
  const [repeat, setRepeat] = useState<RepeatForm>(initialRepeat ?? defaultRepeatForm(initial.start.slice(0, 10)));
  const [exdates, setExdates] = useState<string[]>(initial.recurrence?.exdates ?? []);

  const form = useForm<OrderFormShape>({
    resolver: zodResolver(SCHEMA[mode] as never) as never,
    defaultValues: initial,
    mode: "onTouched",
  });
  const { register, watch, setValue, formState } = form;
  const errors = formState.errors;
  const shiftRows = useFieldArray({ control: form.control, name: "shifts" as never });

  const yardId = Number(watch("yardId"));
  const workTypeId = Number(watch("workTypeId"));
  const start = watch("start") ?? "";
  const end = watch("end") ?? "";
  const status = watch("status");
  const yard = yards.find((y) => y.id === yardId) ?? yards[0];
  const type = workTypes.find((t) => t.id === workTypeId);
  const held = new Map(seats.filter((s) => s.worker).map((s) => [s.id, s.worker!]));

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

  const phases = Number(watch("phases") ?? 3);
  const tapLabel = voltageLabel({ voltageKv: watch("voltageKv") ?? null, phases, systemKv: watch("systemKv") ?? null });
  const multiDay = start.length >= 10 && end.length >= 10 && end.slice(0, 10) > start.slice(0, 10);
  const shiftList = (watch("shifts") ?? []) as { start: string; end: string }[];

  const locate = type
    ? locateWarning({
        digs: type.digs,
        locateTicket: watch("locateTicket") ?? null,
        locateValidThrough: watch("locateValidThrough") || null,
        workDate: start.slice(0, 10),
        lastDate: end.slice(11, 16) === "00:00" ? null : end.slice(0, 10),
      })
    : null;

  async function onSubmit(values: OrderFormShape) {
    setAlert(null);
    setConflict(false);
    if (mode === "new") {
      const r = await sendJson("/api/orders", "POST", values);
      if (!r.ok) return setAlert({ tone: "block", text: applyIssues(form, r.body) });
      const n = r.body.created as number;
      router.push(`/orders/${r.body.id}?created=${n}`);
      router.refresh();
      return;
    }
    if (mode === "edit") {
      const r = await sendJson(`/api/orders/${orderId}`, "PATCH", values);
      if (r.status === 409) {
        setConflict(true);
        return setAlert({ tone: "block", text: r.body.error });
      }
      if (!r.ok) return setAlert({ tone: "block", text: applyIssues(form, r.body) });
      form.reset({ ...values, version: r.body.version, positions: r.body.seats.map((s: OrderSeat) => ({ id: s.id, position: s.position })) });
      setRows(r.body.seats.map((s: OrderSeat) => ({ id: s.id, position: s.position })));
      setAlert({ tone: "clear", text: `Saved. ${r.body.timeRecords.length ? `Time recorded for ${r.body.timeRecords.length} crew member(s). ` : ""}Open boards re-check at once.` });
      router.refresh();
      return;
    }
    const r = await sendJson(`/api/order-series/${seriesId}`, "PATCH", values);
    if (r.status === 409) {
      setConflict(true);
      return setAlert({ tone: "block", text: r.body.error });
    }
    if (!r.ok) return setAlert({ tone: "block", text: applyIssues(form, r.body) });
    const kept = r.body.kept as { number: string; workDate: string }[];
    form.reset({ ...values, version: (values.version ?? 0) + 1 });
    setAlert({
      tone: kept.length ? "warn" : "clear",
      text:
        `Series saved: ${r.body.removed} future order(s) replaced, ${r.body.created} made.` +
        (kept.length ? ` Kept as they were (staffed or edited on their own): ${kept.map((k) => `${k.number} on ${k.workDate}`).join(", ")}. Review them.` : ""),
    });
    router.refresh();
  }

  async function cancelOrder() {
    if (!orderId || !window.confirm("Cancel this work order? It stays on record as cancelled.")) return;
    const r = await sendJson(`/api/orders/${orderId}?version=${initial.version}`, "DELETE");
    if (!r.ok) return setAlert({ tone: "block", text: r.body.error });
    router.refresh();
    setAlert({ tone: "clear", text: "Order cancelled." });
  }

  async function endSeries() {
    if (!seriesId || !window.confirm("End this series? Future orders nobody is on are removed; staffed ones stay.")) return;
    const r = await sendJson(`/api/order-series/${seriesId}`, "DELETE");
    if (!r.ok) return setAlert({ tone: "block", text: r.body.error });
    const kept = r.body.kept as { number: string }[];
    setAlert({ tone: "clear", text: `Series ended: ${r.body.removed} future order(s) removed${kept.length ? `; kept ${kept.map((k) => k.number).join(", ")}` : ""}.` });
    router.refresh();
  }

  const err = (name: string) => {
    const parts = name.split(".");
    let e: unknown = errors;
    for (const p of parts) e = (e as Record<string, unknown> | undefined)?.[p];
    return (e as { message?: string } | undefined)?.message;
  };
  const aria = (name: string) => (err(name) ? { "aria-invalid": true as const, "aria-describedby": `${name}-error` } : {});
  const statuses = mode === "edit" ? ORDER_STATUSES : (["draft", "planned"] as const);

  return (
    <form onSubmit={form.handleSubmit(onSubmit)} noValidate className="space-y-4">
      <fieldset disabled={readOnly} className="grid gap-4 lg:grid-cols-2">
        <section className="card space-y-3 p-4">
          <h2 className="font-bold">What and where</h2>
          <div>
            <label className="label" htmlFor="title">
              Title
            </label>
            <input id="title" className="field" {...register("title")} {...aria("title")} />
            <FieldError id="title-error" msg={err("title")} />
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <div>
              <label className="label" htmlFor="yardId">
                Yard
              </label>
              <select id="yardId" className="field" {...register("yardId", { setValueAs: Number })} {...aria("yardId")}>
                {yards.filter((y) => mode !== "series" || y.id === initial.yardId).map((y) => (
                  <option key={y.id} value={y.id}>
                    {y.name} ({y.code})
                  </option>
                ))}
              </select>
              <FieldError id="yardId-error" msg={err("yardId")} />
            </div>
            <div>
              <label className="label" htmlFor="workTypeId">
                Work type
              </label>
              <select
                id="workTypeId"
                className="field"
                {...register("workTypeId", { setValueAs: Number, onChange: (e) => pickType(Number(e.target.value)) })}
                {...aria("workTypeId")}
              >
                {workTypes.map((t) => (
                  <option key={t.id} value={t.id}>
                    {t.name}
                  </option>
                ))}
              </select>
              <FieldError id="workTypeId-error" msg={err("workTypeId")} />
            </div>
          </div>
          <div className="grid gap-3 sm:grid-cols-3">
            <div className="sm:col-span-2">
              <label className="label" htmlFor="address">
                Address or location
              </label>
              <input id="address" className="field" {...register("address")} {...aria("address")} />
              <FieldError id="address-error" msg={err("address")} />
            </div>
            <div>
              <label className="label" htmlFor="structureNo">
                Pole / structure no.
              </label>
              <input id="structureNo" className="field" {...register("structureNo")} {...aria("structureNo")} />
              <FieldError id="structureNo-error" msg={err("structureNo")} />
            </div>
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <div>
              <label className="label" htmlFor="priority">
                Priority
              </label>
              <select id="priority" className="field" {...register("priority", { setValueAs: Number })}>
                {[1, 2, 3, 4, 5].map((p) => (
                  <option key={p} value={p}>
                    {PRIORITY_LABEL[p]}
                  </option>
                ))}
              </select>
            </div>
            <div>
              <label className="label" htmlFor="status">
                Status
              </label>
              <select id="status" className="field" {...register("status")} {...aria("status")}>
                {statuses.map((s) => (
                  <option key={s} value={s}>
                    {STATUS_LABEL[s]}
                  </option>
                ))}
              </select>
              <FieldError id="status-error" msg={err("status")} />
            </div>
          </div>
          {mode === "edit" && status === "on_hold" && (
            <div>
              <label className="label" htmlFor="holdReason">
                Why on hold
              </label>
              <input id="holdReason" className="field" placeholder="e.g. pole rejected at the pole check" {...register("holdReason")} {...aria("holdReason")} />
              <FieldError id="holdReason-error" msg={err("holdReason")} />
            </div>
          )}
          {mode === "edit" && status === "done" && (
            <div className="grid gap-3 sm:grid-cols-2">
              <div>
                <label className="label" htmlFor="actualStart">
                  Actually started
                </label>
                <input id="actualStart" type="datetime-local" className="field" {...register("actualStart", { setValueAs: (v) => v || null })} {...aria("actualStart")} />
                <FieldError id="actualStart-error" msg={err("actualStart")} />
              </div>
              <div>
                <label className="label" htmlFor="actualEnd">
                  Actually ended
                </label>
                <input id="actualEnd" type="datetime-local" className="field" {...register("actualEnd", { setValueAs: (v) => v || null })} {...aria("actualEnd")} />
                <FieldError id="actualEnd-error" msg={err("actualEnd")} />
              </div>
              <p className="text-xs text-ink-500 sm:col-span-2">Saving as done records this time for everyone holding a position; the rest rule reads it.</p>
            </div>
          )}
        </section>

        <section className="card space-y-3 p-4">
          <h2 className="font-bold">When</h2>
          <p className="text-xs text-ink-500">
            Wall-clock time at {yard?.name ?? "the yard"} ({yard?.timezone}). A repeating order keeps the same clock time across daylight-saving changes.
          </p>
          <div className="grid gap-3 sm:grid-cols-2">
            <div>
              <label className="label" htmlFor="start">
                {mode === "series" ? "First start" : "Start"}
              </label>
              <input
                id="start"
                type="datetime-local"
                className="field"
                {...register("start", {
                  onChange: (e) => {
                    if (mode !== "edit" && repeat.kind === "none") setRepeat(defaultRepeatForm(String(e.target.value).slice(0, 10)));
                  },
                })}
                {...aria("start")}
              />
              <FieldError id="start-error" msg={err("start")} />
            </div>
            <div>
              <label className="label" htmlFor="end">
                {mode === "series" ? "First end" : "End"}
              </label>
              <input id="end" type="datetime-local" className="field" {...register("end")} {...aria("end")} />
              <FieldError id="end-error" msg={err("end")} />
            </div>
          </div>
          {mode !== "edit" && yard && (
            <RecurrenceFields
              value={repeat}
              onChange={setRepeat}
              exdates={exdates}
              onExdatesChange={setExdates}
              start={start}
              durationMinutes={duration}
              timezone={yard.timezone}
              previewFrom={mode === "series" ? today : undefined}
              allowNone={mode === "new"}
              error={err("recurrence.rrule") ?? err("recurrence")}
            />
          )}
          {mode !== "series" && (multiDay || shiftList.length > 0) && (
            <div className="space-y-2 rounded-md border border-rule bg-white p-3" data-testid="order-shifts">
              <p className="text-sm font-bold">Shifts</p>
              <p className="text-xs text-ink-500">
                A multi-day order lists the hours the crew actually works, inside the order and not overlapping. The rest rule counts these
                shifts, not the whole span; credentials must be valid on every day.
              </p>
              <ul className="space-y-1.5" aria-label="Shifts">
                {shiftRows.fields.map((f, i) => (
                  <li key={f.id} className="grid grid-cols-[1fr_1fr_auto] items-start gap-2">
                    <div>
                      <label className="sr-only" htmlFor={`shifts.${i}.start`}>
                        Shift {i + 1} start
                      </label>
                      <input id={`shifts.${i}.start`} type="datetime-local" className="field" {...register(`shifts.${i}.start` as never)} {...aria(`shifts.${i}.start`)} />
                      <FieldError id={`shifts.${i}.start-error`} msg={err(`shifts.${i}.start`)} />
                    </div>
                    <div>
                      <label className="sr-only" htmlFor={`shifts.${i}.end`}>
                        Shift {i + 1} end
                      </label>
                      <input id={`shifts.${i}.end`} type="datetime-local" className="field" {...register(`shifts.${i}.end` as never)} {...aria(`shifts.${i}.end`)} />
                      <FieldError id={`shifts.${i}.end-error`} msg={err(`shifts.${i}.end`)} />
                    </div>
                    <button type="button" className="btn-quiet px-2" aria-label={`Remove shift ${i + 1}`} onClick={() => shiftRows.remove(i)}>
                      ✕
                    </button>
                  </li>
                ))}
              </ul>
              <div className="flex flex-wrap items-center gap-2">
                <button
                  type="button"
                  className="btn-quiet"
                  onClick={() => {
                    const last = shiftList[shiftList.length - 1];
                    const next = last ? { start: plusDays(last.start, 1), end: plusDays(last.end, 1) } : dailyShifts(start, end)[0] ?? { start, end };
                    shiftRows.append(next as never);
                  }}
                >
                  Add shift
                </button>
                {shiftList.length === 0 && (
                  <button type="button" className="text-xs font-semibold text-copper hover:underline" onClick={() => shiftRows.replace(dailyShifts(start, end) as never)}>
                    One shift a day at the order&apos;s hours
                  </button>
                )}
              </div>
              <FieldError msg={err("shifts")} />
            </div>
          )}
        </section>

        <section className="card space-y-3 p-4">
          <h2 className="font-bold">Lines and exceptions</h2>
          <div className="grid gap-3 sm:grid-cols-2">
            <label className="flex items-center gap-2 text-sm font-semibold">
              <input type="checkbox" {...register("energized")} /> Work on or near energized lines
            </label>
            <label className="flex items-center gap-2 text-sm font-semibold">
              <input type="checkbox" {...register("emergency")} /> Emergency (storm, public safety)
            </label>
          </div>
          <div className="grid gap-3 sm:grid-cols-2">
            <div>
              <label className="label" htmlFor="voltageKv">
                Nominal voltage (kV)
              </label>
              <input id="voltageKv" type="number" step="0.001" min={0} className="field" {...register("voltageKv", { setValueAs: nullableNumber })} {...aria("voltageKv")} />
              <FieldError id="voltageKv-error" msg={err("voltageKv")} />
            </div>
            <div>
              <label className="label" htmlFor="phases">
                Phases
              </label>
              <select id="phases" className="field" {...register("phases", { setValueAs: (v) => (Number(v) === 1 ? 1 : 3) })} {...aria("phases")}>
                <option value={3}>Three-phase (voltage phase to phase)</option>
                <option value={1}>Single-phase tap (voltage to ground)</option>
              </select>
              <FieldError id="phases-error" msg={err("phases")} />
            </div>
            {phases === 1 && (
              <div>
                <label className="label" htmlFor="systemKv">
                  System voltage, phase to phase (kV)
                </label>
                <input id="systemKv" type="number" step="0.001" min={0} className="field" placeholder="e.g. 12.47" {...register("systemKv", { setValueAs: nullableNumber })} {...aria("systemKv")} />
                <FieldError id="systemKv-error" msg={err("systemKv")} />
                {tapLabel && (
                  <p className="mt-1 text-xs text-ink-500" data-testid="voltage-label">
                    Shows as <strong>{tapLabel}</strong>
                  </p>
                )}
              </div>
            )}
            <div>
              <label className="label" htmlFor="nearEnergizedKv">
                Energized parts nearby (kV)
              </label>
              <input
                id="nearEnergizedKv"
                type="number"
                step="0.001"
                min={0}
                className="field"
                {...register("nearEnergizedKv", { setValueAs: nullableNumber })}
                aria-invalid={err("nearEnergizedKv") ? true : undefined}
                aria-describedby={err("nearEnergizedKv") ? "nearEnergizedKv-hint nearEnergizedKv-error" : "nearEnergizedKv-hint"}
              />
              <p id="nearEnergizedKv-hint" className="mt-1 text-xs text-ink-500">
                When this work is de-energized: the highest voltage of exposed live parts within reach of the crew or its equipment (a live
                feeder beside the pole). Above 0.6 kV the two-worker minimum and the observer rule still apply.
              </p>
              <FieldError id="nearEnergizedKv-error" msg={err("nearEnergizedKv")} />
            </div>
            <div>
              <label className="label" htmlFor="altitudeM">
                Site elevation (m)
              </label>
              <input
                id="altitudeM"
                type="number"
                step="1"
                className="field"
                placeholder="the yard's"
                {...register("altitudeM", { setValueAs: nullableNumber })}
                aria-invalid={err("altitudeM") ? true : undefined}
                aria-describedby={err("altitudeM") ? "altitudeM-hint altitudeM-error" : "altitudeM-hint"}
              />
              <p id="altitudeM-hint" className="mt-1 text-xs text-ink-500">
                Leave empty to use the yard&apos;s elevation. Above 900 m the minimum approach distance grows (29 CFR 1910.269 Table R-5).
              </p>
              <FieldError id="altitudeM-error" msg={err("altitudeM")} />
            </div>
            <div>
              <label className="label" htmlFor="crewException">
                Two-person exception
              </label>
              <select id="crewException" className="field" {...register("crewException", { setValueAs: (v) => v || null })}>
                <option value="">None</option>
                {Object.entries(CREW_EXCEPTION_LABEL).map(([k, v]) => (
                  <option key={k} value={k}>
                    {v}
                  </option>
                ))}
              </select>
            </div>
          </div>
          {type?.digs && (
            <div className="space-y-2 rounded-md border border-rule bg-white p-3">
              <p className="text-sm font-bold">Underground locate (this work digs)</p>
              <div className="grid gap-3 sm:grid-cols-2">
                <div>
                  <label className="label" htmlFor="locateTicket">
                    Locate ticket no.
                  </label>
                  <input id="locateTicket" className="field" {...register("locateTicket")} {...aria("locateTicket")} />
                  <FieldError id="locateTicket-error" msg={err("locateTicket")} />
                </div>
                <div>
                  <label className="label" htmlFor="locateValidThrough">
                    Valid through
                  </label>
                  <input id="locateValidThrough" type="date" className="field" {...register("locateValidThrough", { setValueAs: (v) => v || null })} {...aria("locateValidThrough")} />
                  <FieldError id="locateValidThrough-error" msg={err("locateValidThrough")} />
                </div>
              </div>
              {locate && (
                <p className="rounded-md bg-warn-bg px-2 py-1.5 text-xs font-semibold text-warn" role="status">
                  <span aria-hidden="true">▲ </span>
                  {locate}
                </p>
              )}
            </div>
          )}
          <div>
            <label className="label" htmlFor="notes">
              Notes for the crew
            </label>
            <textarea id="notes" rows={3} className="field" {...register("notes")} {...aria("notes")} />
            <FieldError id="notes-error" msg={err("notes")} />
          </div>
        </section>

        <section className="card space-y-3 p-4">
          <h2 className="font-bold">Crew</h2>
          <div className="grid gap-3 sm:grid-cols-2">
            <div>
              <label className="label" htmlFor="minCrew">
                Minimum crew (people on site)
              </label>
              <input id="minCrew" type="number" min={1} max={30} className="field" {...register("minCrew", { setValueAs: nullableNumber })} {...aria("minCrew")} />
              <FieldError id="minCrew-error" msg={err("minCrew")} />
            </div>
            <div>
              <label className="label" htmlFor="driverLicence">
                Driver licence needed
              </label>
              <select id="driverLicence" className="field" {...register("driverLicence", { setValueAs: (v) => v || null })}>
                <option value="">No driver position rule</option>
                {Object.entries(LICENCE_LABEL).map(([k, v]) => (
                  <option key={k} value={k}>
                    {v}
                  </option>
                ))}
              </select>
            </div>
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
                      {POSITIONS.map((p) => (
                        <option key={p} value={p}>
                          {POSITION_LABEL[p]}
                          {p === "lead" ? " (employee in charge)" : ""}
                        </option>
                      ))}
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
            <div className="mt-2 flex items-center gap-2">
              <select aria-label="Position to add" className="field w-auto" value={addPosition} onChange={(e) => setAddPosition(e.target.value as Position)}>
                {POSITIONS.map((p) => (
                  <option key={p} value={p}>
                    {POSITION_LABEL[p]}
                  </option>
                ))}
              </select>
              <button type="button" className="btn-quiet" onClick={() => setRows([...rows, { position: addPosition }])}>
                Add position
              </button>
              {mode === "edit" && type && (
                <button
                  type="button"
                  className="text-xs font-semibold text-copper hover:underline"
                  onClick={() => {
                    const keep = rows.filter((r) => r.id && held.has(r.id));
                    const missing = [...type.positions];
                    for (const k of keep) {
                      const at = missing.indexOf(k.position);
                      if (at >= 0) missing.splice(at, 1);
                    }
                    setRows([...keep, ...missing.map((position) => ({ position }))]);
                  }}
                >
                  Reset to template
                </button>
              )}
            </div>
            <FieldError msg={err("positions")} />
            {!rows.some((r) => r.position === "lead") && (
              <p className="mt-1 text-xs font-semibold text-warn">▲ No lead position: an order with two or more people needs an employee in charge.</p>
            )}
          </div>
        </section>
      </fieldset>

      {alert && (
        <FormAlert tone={alert.tone}>
          {alert.text}{" "}
          {conflict && (
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
            <button type="button" className="btn-quiet text-block" onClick={cancelOrder}>
              Cancel order
            </button>
          )}
          {mode === "series" && (
            <button type="button" className="btn-quiet text-block" onClick={endSeries}>
              End series
            </button>
          )}
          {Object.keys(errors).length > 0 && <span className="text-sm font-semibold text-block">✖ Check the fields marked above.</span>}
        </div>
      )}
    </form>
  );
}
