"use client";

// A crew member's acknowledgement with their check of their protective equipment and their
// climbing and fall-protection gear, done from their own phone. The lead uses the same form
// to record an acknowledgement given in person by someone without a sign-in. It goes through
// the phone's queue (issue 20): without signal it is saved on this phone and sent later.
import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useMemo, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { FieldError, FormAlert } from "@/components/form-bits";
import { submitAction } from "@/components/offline/field-queue";
import { GEAR, gearCheckSchema, type GearCheck, type GearCheckValues } from "@/lib/briefings/model";

interface Props {
  orderId: number;
  round: number;
  orderNumber: string;
  /** The signed-in user (the queue's owner). */
  userId: number;
  workDate: string;
  climbing: boolean;
  /** Set when the lead records someone else's acknowledgement in person. */
  forWorker?: { id: number; name: string };
  onDone: () => void;
  /** Saved on the phone without signal, not yet sent. */
  onQueued?: () => void;
}

function Choice({ name, legend, hint, register, error }: { name: string; legend: string; hint?: string; register: ReturnType<typeof useForm<GearCheckValues>>["register"]; error?: string }) {
  return (
    <fieldset className="rounded-md border border-rule bg-white p-3">
      <legend className="px-1 text-sm font-semibold">{legend}</legend>
      {hint && <p className="text-xs text-ink-500">{hint}</p>}
      <div className="mt-2 flex flex-wrap gap-2">
        {(
          [
            ["ok", "✓ OK"],
            ["na", "Not used today"],
          ] as const
        ).map(([v, label]) => (
          <label
            key={v}
            className="flex min-h-11 min-w-24 cursor-pointer items-center justify-center gap-2 rounded-md border border-rule px-3 text-sm font-semibold has-[:checked]:border-ink has-[:checked]:bg-ink has-[:checked]:text-paper"
          >
            <input type="radio" value={v} className="sr-only" {...register(name as never)} />
            {label}
          </label>
        ))}
      </div>
      <FieldError msg={error} />
    </fieldset>
  );
}

export function AckForm({ orderId, round, orderNumber, userId, workDate, climbing, forWorker, onDone, onQueued }: Props) {
  const uid = useId();
  const [msg, setMsg] = useState<string | null>(null);
  const schema = useMemo(() => gearCheckSchema({ workDate, climbing }), [workDate, climbing]);
  const form = useForm<GearCheckValues, unknown, GearCheck>({
    resolver: zodResolver(schema),
    defaultValues: {
      gloves: { result: undefined as never, testedOn: null },
      sleeves: { result: undefined as never, testedOn: null },
      notes: "",
      ...(climbing ? {} : { belt: "na", fallArrest: "na", climbers: "na" }),
    },
  });
  const { register, handleSubmit, formState, control, setError } = form;
  const e = formState.errors as Record<string, any>;
  const gloves = useWatch({ control, name: "gloves.result" });
  const sleeves = useWatch({ control, name: "sleeves.result" });

  const submit = handleSubmit(async (gearCheck) => {
    setMsg(null);
    const out = await submitAction({
      kind: "briefing.ack",
      userId,
      orderId,
      label: forWorker ? `${forWorker.name}'s gear check and acknowledgement, ${orderNumber}` : `Gear check and acknowledgement, ${orderNumber}`,
      url: `/api/briefings/${orderId}/ack`,
      method: "POST",
      body: { round, gearCheck, ...(forWorker ? { workerId: forWorker.id } : {}) },
    });
    if (out.kind === "queued") {
      onQueued?.();
      return;
    }
    const r = { ok: out.kind === "sent", body: out.result.body as { error?: string; issues?: { field: string; message: string }[] } | null };
    if (!r.ok) {
      for (const i of r.body?.issues ?? []) {
        try {
          setError(i.field.replace(/^gearCheck\./, "") as never, { type: "server", message: i.message });
        } catch {
          /* not a field */
        }
      }
      setMsg(r.body?.error ?? "Not sent. Try again.");
      return;
    }
    onDone();
  });

  return (
    <form onSubmit={submit} className="space-y-3" noValidate aria-label={forWorker ? `Acknowledgement for ${forWorker.name}` : "Your acknowledgement"} data-testid="ack-form">
      <p className="text-sm text-ink-700">
        {forWorker
          ? `${forWorker.name} was briefed in person and checked their gear with you. Record what they told you.`
          : "Check your gear now, before work. Anything not OK is replaced before you start: tell your crew lead."}
      </p>
      {(
        [
          ["gloves", "Rubber insulating gloves", gloves, "Date of the last electrical test, stamped on the cuff (within 6 months)"],
          ["sleeves", "Rubber insulating sleeves", sleeves, "Date of the last electrical test (within 12 months)"],
        ] as const
      ).map(([key, legend, result, hint]) => (
        <div key={key}>
          <Choice name={`${key}.result`} legend={legend} register={register} error={e[key]?.result?.message} />
          {result === "ok" && (
            <div className="mt-2 pl-3">
              <label htmlFor={`${uid}-${key}-date`} className="label">
                {legend}: tested on
              </label>
              <input id={`${uid}-${key}-date`} type="date" className="field sm:w-48" max={workDate} {...register(`${key}.testedOn`, { setValueAs: (v) => (v ? v : null) })} />
              <p className="mt-1 text-xs text-ink-500">{hint}</p>
              <FieldError msg={e[key]?.testedOn?.message} />
            </div>
          )}
        </div>
      ))}
      {GEAR.map((g) => (
        <Choice
          key={g.key}
          name={g.key}
          legend={g.label}
          hint={g.climbing && climbing ? "You climb today: required" : undefined}
          register={register}
          error={e[g.key]?.message}
        />
      ))}
      <div>
        <label htmlFor={`${uid}-notes`} className="label">
          Notes (optional)
        </label>
        <input id={`${uid}-notes`} className="field" maxLength={300} {...register("notes")} />
      </div>
      {msg && <FormAlert>{msg}</FormAlert>}
      <button type="submit" className="btn-accent min-h-11 w-full sm:w-auto" disabled={formState.isSubmitting}>
        {forWorker ? `Record ${forWorker.name}'s acknowledgement` : "I was briefed: acknowledge"}
      </button>
    </form>
  );
}
