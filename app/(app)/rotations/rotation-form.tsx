"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { useForm } from "react-hook-form";
import { FieldError, FormAlert, applyIssues, sendJson } from "@/components/form-bits";
import { WEEKDAYS, WEEKDAY_LABEL, parseRrule, type WeekdayCode } from "@/lib/recurrence-core";
import { schedule } from "@/lib/rotations";
import { fmtLocal } from "@/lib/zoned-format";
import { rotationSchema, type RotationFormValues } from "@/lib/validation/rotation";

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
  const router = useRouter();
  const [alert, setAlert] = useState<{ tone: "block" | "clear"; text: string } | null>(null);
  const weekly = WEEKLY_RE.exec(initial.rrule ?? "");
  const [simple, setSimple] = useState(Boolean(weekly) || !initial.rrule);
  const [day, setDay] = useState<WeekdayCode>((weekly?.[1] as WeekdayCode) ?? "MO");
  const [pick, setPick] = useState<number>(0);
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
  const move = (i: number, d: -1 | 1) => {
    const next = [...members];
    [next[i], next[i + d]] = [next[i + d], next[i]];
    setMembers(next);
  };

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

  async function onSubmit(values: RotationFormValues) {
    setAlert(null);
    const r = rotationId
      ? await sendJson(`/api/rotations/${rotationId}`, "PATCH", { ...values, version })
      : await sendJson("/api/rotations", "POST", values);
    if (!r.ok) return setAlert({ tone: "block", text: r.status === 409 ? `${r.body.error}` : applyIssues(form, r.body) });
    setAlert({ tone: "clear", text: rotationId ? "Rotation saved." : "Rotation created." });
    router.refresh();
    onDone?.();
  }

  const err = (n: keyof RotationFormValues) => errors[n]?.message as string | undefined;
  const yardWorkers = workers.filter((w) => w.yardId === yardId && !members.includes(w.id));
  const otherWorkers = workers.filter((w) => w.yardId !== yardId && !members.includes(w.id));

  return (
    <form onSubmit={form.handleSubmit(onSubmit)} noValidate className="space-y-3">
      <div className="grid gap-3 sm:grid-cols-2">
        <div>
          <label className="label" htmlFor={`r-name-${rotationId ?? "new"}`}>
            Name
          </label>
          <input id={`r-name-${rotationId ?? "new"}`} className="field" {...register("name")} />
          <FieldError msg={err("name")} />
        </div>
        <div>
          <label className="label" htmlFor={`r-yard-${rotationId ?? "new"}`}>
            Yard
          </label>
          <select id={`r-yard-${rotationId ?? "new"}`} className="field" {...register("yardId", { setValueAs: Number })}>
            {yards.map((y) => (
              <option key={y.id} value={y.id}>
                {y.name}
              </option>
            ))}
          </select>
        </div>
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
          <div>
            <label className="label" htmlFor={`r-day-${rotationId ?? "new"}`}>
              Hand over every
            </label>
            <select
              id={`r-day-${rotationId ?? "new"}`}
              className="field w-auto"
              value={day}
              onChange={(e) => {
                setDay(e.target.value as WeekdayCode);
                setValue("rrule", `FREQ=WEEKLY;BYDAY=${e.target.value}`);
              }}
            >
              {WEEKDAYS.map((d) => (
                <option key={d} value={d}>
                  {WEEKDAY_LABEL[d]}
                </option>
              ))}
            </select>
          </div>
        ) : (
          <div>
            <label className="label" htmlFor={`r-rule-${rotationId ?? "new"}`}>
              RRULE (RFC 5545)
            </label>
            <input id={`r-rule-${rotationId ?? "new"}`} className="field font-mono" placeholder="FREQ=DAILY;BYHOUR=7,19" {...register("rrule")} />
          </div>
        )}
        <FieldError msg={err("rrule")} />
        <div>
          <label className="label" htmlFor={`r-start-${rotationId ?? "new"}`}>
            First hand-over ({yard?.timezone})
          </label>
          <input id={`r-start-${rotationId ?? "new"}`} type="datetime-local" className="field w-auto" {...register("dtstartLocal")} />
          <FieldError msg={err("dtstartLocal")} />
          <p className="mt-1 text-xs text-ink-500">Hand-overs keep this clock time across daylight-saving changes; a time that does not exist that night moves an hour later.</p>
        </div>
      </fieldset>

      <div>
        <p className="label">Turn order</p>
        <ol className="space-y-1">
          {members.map((id, i) => {
            const w = byId.get(id);
            return (
              <li key={id} className="flex items-center gap-2 rounded-md border border-rule bg-white px-2 py-1 text-sm">
                <span className="w-5 text-right font-bold tabular-nums text-ink-500">{i + 1}</span>
                <span className="flex-1 font-semibold">
                  {w?.name ?? `Worker ${id}`} <span className="text-xs text-ink-500">{w?.employeeNo}</span>
                </span>
                <button type="button" className="btn-quiet px-2 py-1" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move ${w?.name} up`}>
                  ↑
                </button>
                <button type="button" className="btn-quiet px-2 py-1" disabled={i === members.length - 1} onClick={() => move(i, 1)} aria-label={`Move ${w?.name} down`}>
                  ↓
                </button>
                <button type="button" className="btn-quiet px-2 py-1" onClick={() => setMembers(members.filter((m) => m !== id))} aria-label={`Remove ${w?.name}`}>
                  ✕
                </button>
              </li>
            );
          })}
        </ol>
        <div className="mt-2 flex flex-wrap items-center gap-2">
          <select aria-label="Worker to add" className="field w-auto" value={pick} onChange={(e) => setPick(Number(e.target.value))}>
            <option value={0}>Add a worker…</option>
            <optgroup label={`${yard?.name ?? "This yard"}`}>
              {yardWorkers.map((w) => (
                <option key={w.id} value={w.id}>
                  {w.name} ({w.employeeNo})
                </option>
              ))}
            </optgroup>
            <optgroup label="Other yards">
              {otherWorkers.map((w) => (
                <option key={w.id} value={w.id}>
                  {w.name} ({w.employeeNo}, {w.yardCode})
                </option>
              ))}
            </optgroup>
          </select>
          <button
            type="button"
            className="btn-quiet"
            disabled={!pick}
            onClick={() => {
              setMembers([...members, pick]);
              setPick(0);
            }}
          >
            Add
          </button>
        </div>
        <FieldError msg={errors.memberIds?.message as string | undefined} />
      </div>

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

      <label className="flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" {...register("active")} /> Active (shows on the board)
      </label>

      {alert && <FormAlert tone={alert.tone}>{alert.text}</FormAlert>}
      <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>
        {rotationId ? "Save rotation" : "Create rotation"}
      </button>
    </form>
  );
}
