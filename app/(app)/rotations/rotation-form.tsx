"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { CheckField, FieldError, FormAlert, SelectField, TextField } from "@/components/form/fields";
import { LabelOptions, YardOptions } from "@/components/form/options";
import { useApiMutation } from "@/lib/api/mutations";
import { WEEKDAYS, WEEKDAY_LABEL, parseRrule, type WeekdayCode } from "@/lib/time/recurrence";
import { schedule } from "@/lib/rotations/schedule";
import { fmtLocal } from "@/lib/time/zoned-format";
import { rotationSchema, type RotationFormValues } from "@/lib/rotations/model";
import { TurnOrder } from "./turn-order";

export interface WorkerOption {
  id: number;
  name: string;
  employeeNo: string;
  yardId: number;
  yardCode: string;
}

export interface YardOption {
  id: number;
  code: string;
  name: string;
  timezone: string;
}

interface Props {
  yards: YardOption[];
  workers: WorkerOption[];
  initial: RotationFormValues;
  rotationId?: number;
  version?: number;
  onDone?: () => void;
}

const WEEKLY_RE = /^FREQ=WEEKLY;BYDAY=(MO|TU|WE|TH|FR|SA|SU)$/;

/** Create or edit an on-call rotation; validated with rotationSchema, like POST/PATCH /api/rotations. */
export function RotationForm({ yards, workers, initial, rotationId, version, onDone }: Props) {
  const weekly = WEEKLY_RE.exec(initial.rrule ?? "");
  const [simple, setSimple] = useState(Boolean(weekly) || !initial.rrule);
  const [day, setDay] = useState<WeekdayCode>((weekly?.[1] as WeekdayCode) ?? "MO");
  const form = useForm<RotationFormValues>({ resolver: zodResolver(rotationSchema as never) as never, defaultValues: initial });
  const { register, watch, setValue, formState } = form;
  const errors = formState.errors;
  const members = (watch("memberIds") ?? []) as number[];
  const yardId = Number(watch("yardId"));
  const rrule = watch("rrule") ?? "";
  const dtstart = watch("dtstartLocal") ?? "";
  const yard = yards.find((y) => y.id === yardId) ?? yards[0];
  const byId = new Map(workers.map((w) => [w.id, w]));

  const setMembers = (ids: number[]) => setValue("memberIds", ids, { shouldDirty: true, shouldValidate: formState.isSubmitted });

  const preview = useMemo(() => {
    if (!members.length || !/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/.test(dtstart) || !yard) return { list: [], problem: null as string | null };
    const p = parseRrule(rrule, { subDaily: true });
    if (!p.ok) return { list: [], problem: p.message };
    try {
      return { list: schedule({ rrule, dtstartLocal: dtstart, timezone: yard.timezone }, members, Date.now(), 5), problem: null };
    } catch (err) {
      return { list: [], problem: (err as Error).message };
    }
  }, [members, dtstart, rrule, yard]);

  const save = useApiMutation<RotationFormValues>({
    request: (values) => (rotationId ? { url: `/api/rotations/${rotationId}`, method: "PATCH", body: { ...values, version } } : { url: "/api/rotations", method: "POST", body: values }),
    form,
    refresh: true,
    onSuccess: () => onDone?.(),
  });

  const err = (n: keyof RotationFormValues) => errors[n]?.message as string | undefined;
  const key = rotationId ?? "new";

  return (
    <form
      onSubmit={form.handleSubmit(save.submit)}
      noValidate
      className="space-y-3"
    >
      <div className="grid gap-3 sm:grid-cols-2">
        <TextField id={`r-name-${key}`} label="Name" error={err("name")} {...register("name")} />
        <SelectField id={`r-yard-${key}`} label="Yard" error={err("yardId")} {...register("yardId", { setValueAs: Number })}>
          <YardOptions yards={yards} by="id" />
        </SelectField>
      </div>

      <fieldset className="space-y-2">
        <legend className="label">Hand-over</legend>
        <div className="flex flex-wrap gap-4 text-sm">
          <label className="flex items-center gap-2">
            <input
              type="radio"
              checked={simple}
              onChange={() => {
                setSimple(true);
                setValue("rrule", `FREQ=WEEKLY;BYDAY=${day}`);
              }}
            />
            Weekly
          </label>
          <label className="flex items-center gap-2">
            <input type="radio" checked={!simple} onChange={() => setSimple(false)} />
            Other rule (RRULE)
          </label>
        </div>
        {simple ? (
          <SelectField
            id={`r-day-${key}`}
            label="Hand over every"
            className="field w-auto"
            error={err("rrule")}
            value={day}
            onChange={(e) => {
              setDay(e.target.value as WeekdayCode);
              setValue("rrule", `FREQ=WEEKLY;BYDAY=${e.target.value}`);
            }}
          >
            <LabelOptions values={WEEKDAYS} labels={WEEKDAY_LABEL} />
          </SelectField>
        ) : (
          <TextField id={`r-rule-${key}`} label="RRULE (RFC 5545)" className="field font-mono" placeholder="FREQ=DAILY;BYHOUR=7,19" error={err("rrule")} {...register("rrule")} />
        )}
        <TextField
          id={`r-start-${key}`}
          type="datetime-local"
          className="field w-auto"
          label={`First hand-over (${yard?.timezone ?? ""})`}
          hint="Hand-overs keep this clock time across daylight-saving changes; a time that does not exist that night moves an hour later."
          error={err("dtstartLocal")}
          {...register("dtstartLocal")}
        />
      </fieldset>

      <TurnOrder members={members} workers={workers} yardId={yardId} yardName={yard?.name} onChange={setMembers} error={errors.memberIds?.message as string | undefined} />

      {preview.problem && <FieldError msg={preview.problem} />}
      {preview.list.length > 0 && yard && (
        <div className="rounded-md border border-rule bg-white p-3 text-sm">
          <p className="label">Next on call</p>
          <ul className="space-y-0.5">
            {preview.list.map((p) => (
              <li key={p.period.index} className="tabular-nums">
                <strong>{byId.get(p.member)?.name}</strong> · {fmtLocal(p.period.from, yard.timezone)} → {fmtLocal(p.period.to!, yard.timezone)} ({Math.round(((p.period.to! - p.period.from) / 3_600_000) * 10) / 10} h)
              </li>
            ))}
          </ul>
        </div>
      )}

      <CheckField id={`r-active-${key}`} label="Active (shows on the board)" error={err("active")} {...register("active")} />

      {save.errorText && <FormAlert tone="block">{save.errorText}</FormAlert>}
      {save.isSuccess && <FormAlert tone="clear">{rotationId ? "Rotation saved." : "Rotation created."}</FormAlert>}
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        {rotationId ? "Save rotation" : "Create rotation"}
      </button>
    </form>
  );
}
