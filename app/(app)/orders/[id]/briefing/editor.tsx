"use client";

// The crew lead's briefing form: hazards, drop zone, procedure, energy-source controls, the
// pole check (pass/fail, notes, photo) with the trade's choices after a failure, and the
// emergency plan. The same zod schema as the route (lib/briefings/model.ts). The sections are
// in editor-sections.tsx and pole-check.tsx.
//
// Every write goes through the phone's queue (components/offline/field-queue.ts, issue 20):
// with signal it is sent at once and the server's answer is shown as before; without, the
// save, the hold and the pole-check photo are saved on this phone with their time of entry and
// sent in order, each with its idempotency key, when the phone is back online.
import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useId, useRef, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { FormAlert } from "@/components/form-bits";
import { submitAction, useFieldQueue } from "@/components/offline/field-queue";
import { briefingDataSchema, POLE_CHECKS, type BriefingData, type BriefingFormValues } from "@/lib/briefings/model";
import { earliestCompletion, fmtEarliest } from "@/lib/briefings/checks";
import { EmergencySection, PlanSections, type ScreenView } from "./editor-sections";
import { PoleCheckSection, type PendingPhoto } from "./pole-check";

export type { ScreenView } from "./editor-sections";

type Answer = ScreenView & { error?: string; issues?: { field: string; message: string }[]; file?: { id: number } };

export function BriefingEditor({ view, userId, onChange }: { view: ScreenView; userId: number; onChange: (v: ScreenView) => void }) {
  const orderId = view.order.id;
  const version = view.briefing?.version ?? 0;
  const versionRef = useRef(version);
  versionRef.current = version;
  const [msg, setMsg] = useState<{ tone: "block" | "clear" | "warn"; text: string } | null>(null);
  const [busy, setBusy] = useState<null | "save" | "complete" | "hold" | "photo">(null);
  const [pending, setPending] = useState<Record<string, PendingPhoto>>({});
  const uid = useId();

  const form = useForm<BriefingFormValues, unknown, BriefingData>({
    resolver: zodResolver(briefingDataSchema),
    defaultValues: view.data,
    mode: "onBlur",
  });
  const { control, handleSubmit, setValue, setError, clearErrors } = form;
  const values = useWatch({ control }) as BriefingFormValues;
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

  function placeIssues(body: { error?: string; issues?: { field: string; message: string }[] } | null) {
    let first = true;
    for (const i of body?.issues ?? []) {
      const field = i.field.replace(/^data\./, "");
      try {
        setError(field as never, { type: "server", message: i.message }, { shouldFocus: first });
        first = false;
      } catch {
        /* not a form field */
      }
    }
    return body?.error ?? "Not saved.";
  }

  /** The data with { $photo: key } where a photo taken offline is still on the phone. */
  function withPhotoRefs(data: BriefingData): unknown {
    const items = { ...data.poleCheck.items } as Record<string, unknown>;
    for (const [key, p] of Object.entries(pending)) {
      const item = items[key] as { photoFileId: number | null } | undefined;
      if (item && item.photoFileId === null) items[key] = { ...item, photoFileId: { $photo: p.ref } };
    }
    return { ...data, poleCheck: { ...data.poleCheck, items } };
  }

  async function send(action: "save" | "complete", data: BriefingData) {
    setBusy(action);
    setMsg(null);
    clearErrors();
    const out = await submitAction({
      kind: "briefing.save",
      userId,
      orderId,
      label: `${action === "complete" ? "Briefing completed" : "Briefing draft"}, ${view.order.number}`,
      url: `/api/briefings/${orderId}`,
      method: "PUT",
      body: { action, version: versionRef.current, data: withPhotoRefs(data) },
    });
    setBusy(null);
    if (out.kind === "queued") {
      setMsg({ tone: "warn", text: `${action === "complete" ? "Briefing" : "Draft"} saved on this phone, not yet sent. It goes when the phone is back online.` });
      return false;
    }
    const body = out.result.body as Answer | null;
    if (out.kind === "refused" || !body) {
      setMsg({ tone: "block", text: out.result.status === 409 ? (body?.error ?? "Someone else saved first; reload.") : placeIssues(body) });
      return false;
    }
    versionRef.current = body.briefing?.version ?? versionRef.current;
    onChange(body);
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
    const out = await submitAction({
      kind: "briefing.hold",
      userId,
      orderId,
      label: `Hold ${view.order.number} (pole check failed)`,
      url: `/api/briefings/${orderId}/hold`,
      method: "POST",
      body: { version: versionRef.current, data: withPhotoRefs(data), reason: holdReason.trim() },
    });
    setBusy(null);
    if (out.kind === "queued") {
      setMsg({
        tone: "warn",
        text: "Hold saved on this phone, not yet sent. The order goes on hold and dispatch is told the moment it reaches the server. Nobody climbs this pole.",
      });
      return;
    }
    const body = out.result.body as Answer | null;
    if (out.kind === "refused" || !body) {
      setMsg({ tone: "block", text: placeIssues(body) });
      return;
    }
    onChange(body);
  }

  async function upload(key: string, file: File) {
    setBusy("photo");
    setMsg(null);
    const out = await submitAction({
      kind: "briefing.photo",
      userId,
      orderId,
      label: `Pole-check photo (${POLE_CHECKS.find((c) => c.key === key)?.label ?? key}), ${view.order.number}`,
      url: `/api/briefings/${orderId}/photo`,
      method: "POST",
      file: { blob: file, name: file.name },
    });
    setBusy(null);
    if (out.kind === "queued") {
      setPending((p) => ({ ...p, [key]: { ref: out.action.key, preview: URL.createObjectURL(file) } }));
      setValue(`poleCheck.items.${key}.photoFileId` as never, null as never, { shouldDirty: true });
    } else if (out.kind === "refused" || !(out.result.body as Answer | null)?.file) {
      setMsg({ tone: "block", text: (out.result.body as Answer | null)?.error ?? "The photo was not taken." });
      return;
    } else {
      setValue(`poleCheck.items.${key}.photoFileId` as never, (out.result.body as Answer).file!.id as never, { shouldDirty: true });
    }
    // Save at once so the photo is on the record (and viewable) before anything else happens.
    await handleSubmit((d) => send("save", d))();
  }

  // Opened again without signal: the form shows what is saved on this phone for this order (the
  // last queued save or hold, its photos from the phone), not the older copy of the page.
  const q = useFieldQueue(userId);
  const restored = useRef(false);
  useEffect(() => {
    if (restored.current || !q.loaded) return;
    restored.current = true;
    const mine = q.actions.filter((a) => a.state === "queued" && a.orderId === orderId);
    const last = [...mine].reverse().find((a) => a.kind === "briefing.save" || a.kind === "briefing.hold");
    const body = last?.body as { data?: BriefingFormValues; reason?: string } | undefined;
    if (!last || !body?.data) return;
    const data = structuredClone(body.data) as BriefingFormValues & { poleCheck: { items: Record<string, { photoFileId: unknown }> } };
    const photos: Record<string, PendingPhoto> = {};
    for (const [key, item] of Object.entries(data.poleCheck.items)) {
      const ref = (item.photoFileId as { $photo?: unknown } | null)?.$photo;
      if (typeof ref !== "string") continue;
      item.photoFileId = null;
      const up = mine.find((a) => a.key === ref);
      if (up?.file) photos[key] = { ref, preview: URL.createObjectURL(up.file.blob) };
    }
    form.reset(data);
    setPending(photos);
    if (last.kind === "briefing.hold" && body.reason) {
      holdTouched.current = true;
      setHoldReason(body.reason);
    }
    setMsg({ tone: "warn", text: "Shown as saved on this phone: not yet sent." });
  }, [q.loaded, q.actions, orderId, form]);

  const invalid = () => setMsg({ tone: "block", text: "Some fields need a look (marked below)." });

  return (
    <form className="space-y-3" noValidate onSubmit={(e) => e.preventDefault()} aria-label="Job briefing" data-testid="briefing-editor">
      <PlanSections form={form} view={view} uid={uid} />
      <PoleCheckSection
        form={form}
        orderId={orderId}
        uid={uid}
        busy={busy}
        pending={pending}
        holdReason={holdReason}
        onHoldReason={(text) => {
          holdTouched.current = true;
          setHoldReason(text);
        }}
        onPhoto={(key, file) => void upload(key, file)}
      />
      <EmergencySection form={form} view={view} uid={uid} />

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
