"use client";

import { useDraggable, useDroppable } from "@dnd-kit/core";
import { memo, useState } from "react";
import type { OrderCard as Card, OverrideView, Seat } from "@/lib/board/model";
import { findingKey } from "@/lib/board/model";
import type { Finding } from "@/lib/rules/types";
import { Badge, StateIcon } from "@/components/status";
import { CLASSIFICATION_LABEL, fmtTime, POSITION_LABEL } from "@/lib/format";
import { energyLabel } from "@/lib/orders/voltage";
import { seatId } from "./dnd";
import { FindingRow } from "./findings";

const SEAT_STATE: Record<string, { tone: "muted" | "info" | "clear" | "block" | "warn"; word: string }> = {
  draft: { tone: "muted", word: "Not sent" },
  sent: { tone: "info", word: "Sent" },
  delivered: { tone: "info", word: "Delivered" },
  confirmed: { tone: "clear", word: "Confirmed" },
  declined: { tone: "block", word: "Declined" },
};

export interface WorkerInfo {
  name: string;
  classification: string;
  phone: string | null;
}

/** Re-send (issue 5): a fresh text and e-mail for one assignment already sent. */
function ResendButton({ assignmentId, name }: { assignmentId: number; name: string }) {
  const [state, setState] = useState<{ busy?: boolean; msg?: string; error?: boolean }>({});
  return (
    <span className="inline-flex items-center gap-1">
      <button
        type="button"
        className="text-xs font-semibold text-ink-700 underline underline-offset-2 hover:text-copper disabled:opacity-50"
        disabled={state.busy}
        aria-label={`Re-send the text and e-mail to ${name}`}
        data-testid={`resend-${assignmentId}`}
        onClick={async () => {
          setState({ busy: true });
          const res = await fetch(`/api/assignments/${assignmentId}/resend`, { method: "POST" }).catch(() => null);
          const body = res ? await res.json().catch(() => ({})) : {};
          setState(res?.ok ? { msg: "✓ Queued" } : { msg: `✖ ${body.error ?? "Not queued"}`, error: true });
        }}
      >
        {state.busy ? "Re-sending…" : "Re-send"}
      </button>
      {state.msg && (
        <span role="status" className={`text-[11px] font-semibold ${state.error ? "text-block" : "text-clear"}`}>
          {state.msg}
        </span>
      )}
    </span>
  );
}

function SeatSlot({
  seat,
  worker,
  preview,
  dragging,
  canResend = false,
}: {
  seat: Seat;
  worker: WorkerInfo | undefined;
  preview: Finding[] | null;
  dragging: boolean;
  canResend?: boolean;
}) {
  const { setNodeRef: dropRef, isOver } = useDroppable({ id: seatId(seat.id), data: { positionId: seat.id } });
  const a = seat.assignment;
  const drag = useDraggable({ id: seatId(seat.id), data: { positionId: seat.id }, disabled: !a });
  const label = POSITION_LABEL[seat.position];
  const state = a ? (a.noReply ? { tone: "warn" as const, word: "No reply: call" } : SEAT_STATE[a.status]) : null;
  const hoverBlock = isOver && preview && preview.length > 0;
  const hoverOk = isOver && preview && preview.length === 0;
  return (
    <li
      ref={dropRef}
      data-testid={`seat-${seat.id}`}
      data-position={seat.position}
      aria-label={`${label} position${a && worker ? `, ${worker.name}` : ", open"}`}
      className={`relative rounded-md border px-2 py-1.5 text-sm transition-colors ${
        hoverBlock
          ? "border-block bg-block-bg ring-2 ring-block"
          : hoverOk
            ? "border-clear bg-clear-bg ring-2 ring-clear"
            : dragging && !a
              ? "border-dashed border-copper bg-copper-100/40"
              : a
                ? "border-rule bg-white"
                : "border-dashed border-ink-300 bg-paper"
      }`}
    >
      <div className="flex items-center justify-between gap-2">
        <span className="text-[11px] font-extrabold uppercase tracking-wide text-ink-500">{label}</span>
        {state && <Badge tone={state.tone}>{state.word}</Badge>}
      </div>
      {a && worker ? (
        <div
          ref={drag.setNodeRef}
          {...drag.listeners}
          {...drag.attributes}
          aria-label={`${worker.name}, ${label}`}
          data-testid={`seated-${seat.id}`}
          className={`mt-0.5 cursor-grab touch-none rounded outline-none focus-visible:ring-2 focus-visible:ring-copper ${drag.isDragging ? "opacity-40" : ""}`}
        >
          <span className="font-bold">{worker.name}</span>{" "}
          <span className="text-xs text-ink-500">{CLASSIFICATION_LABEL[worker.classification]}</span>
          {a.replyCode && a.status !== "draft" && <span className="ml-1 text-[11px] text-ink-500">code {a.replyCode}</span>}
        </div>
      ) : (
        <div className="mt-0.5 text-xs text-ink-500">
          {seat.declinedBy ? (
            <span className="font-semibold text-block">
              ✖ Declined by {seat.declinedBy.name}
              {seat.declinedBy.reason ? `: “${seat.declinedBy.reason}”` : ""} — refill
            </span>
          ) : (
            "Open — drop a worker here"
          )}
        </div>
      )}
      {isOver && preview && (
        <p role="status" className={`mt-1 text-xs font-bold ${preview.length ? "text-block" : "text-clear"}`}>
          {preview.length ? `✖ Would block: ${[...new Set(preview.map((f) => f.rule))].join(", ")}` : "✓ No new block"}
        </p>
      )}
      {a && worker?.phone && (a.noReply || a.status === "declined") && (
        <a className="text-xs font-semibold text-info underline" href={`tel:${worker.phone}`}>
          Call {worker.phone}
        </a>
      )}
      {a && worker && canResend && ["sent", "delivered", "confirmed"].includes(a.status) && (
        <div className="mt-0.5">
          <ResendButton assignmentId={a.id} name={worker.name} />
        </div>
      )}
    </li>
  );
}

export const OrderCardView = memo(function OrderCardView({
  card,
  timezone,
  findings,
  overrides,
  workers,
  previewFor,
  dragging,
  canOverride,
  onOverride,
  locateWarning,
  canResend = false,
  equipmentRow,
}: {
  card: Card;
  timezone: string;
  findings: Finding[];
  overrides: OverrideView[];
  workers: Map<number, WorkerInfo>;
  previewFor: (positionId: number) => Finding[] | null;
  dragging: boolean;
  canOverride: boolean;
  onOverride: (f: Finding) => void;
  locateWarning: string | null;
  canResend?: boolean;
  /** The order's equipment seats (issue 16: app/(app)/board/equipment-seats.tsx). */
  equipmentRow?: (card: Card) => React.ReactNode;
}) {
  const [open, setOpen] = useState(false);
  const valid = new Map(overrides.filter((o) => o.valid).map((o) => [findingKey(o), o]));
  const blocks = findings.filter((f) => f.level === "block" && (f.locked || !valid.has(findingKey(f))));
  const waived = findings.filter((f) => f.level === "block" && !f.locked && valid.has(findingKey(f)));
  const warns = findings.filter((f) => f.level === "warn");
  const filled = card.seats.filter((s) => s.assignment).length;
  const people = new Set(card.seats.filter((s) => s.assignment).map((s) => s.assignment!.workerId)).size;
  const declined = card.seats.some((s) => !s.assignment && s.declinedBy);
  const onHold = card.status === "on_hold" || card.briefingState === "on_hold";
  return (
    <article
      data-testid={`order-${card.number}`}
      aria-label={`${card.number} ${card.title}`}
      className={`card flex min-w-0 flex-col p-3 ${declined ? "ring-2 ring-block" : ""}`}
    >
      <header className="flex items-start justify-between gap-2">
        <div className="min-w-0">
          <p className="text-[11px] font-bold uppercase tracking-wide text-copper">
            {card.number} · {fmtTime(card.start, timezone)}–{fmtTime(card.end, timezone)} · P{card.priority}
          </p>
          <h3 className="truncate font-extrabold leading-snug" title={card.title}>
            {card.title}
          </h3>
          <p className="truncate text-xs text-ink-500">
            {card.workTypeName}
            {` · ${energyLabel(card)}`}
            {card.shifts && card.shifts.length > 1 ? ` · ${card.shifts.length} shifts` : ""}
            {card.emergency ? " · emergency" : ""}
            {card.address ? ` · ${card.address}` : ""}
            {card.structureNo ? ` · pole ${card.structureNo}` : ""}
          </p>
        </div>
        <div className="flex shrink-0 flex-col items-end gap-1" data-testid="crew-state">
          {/* "Clear" only when nothing stops the crew: no unresolved block, and not held. */}
          {blocks.length > 0 && <Badge tone="block">{blocks.length} block{blocks.length > 1 ? "s" : ""}</Badge>}
          {onHold && <Badge tone="block">On hold</Badge>}
          {blocks.length === 0 && !onHold && <Badge tone="clear">Clear</Badge>}
          {warns.length > 0 && <Badge tone="warn">{warns.length} warn</Badge>}
          {waived.length > 0 && <Badge tone="overridden">{waived.length} overridden</Badge>}
        </div>
      </header>
      <div className="mt-1 flex flex-wrap gap-1">
        <span className="text-[11px] font-semibold text-ink-500">
          {filled}/{card.seats.length} seats · {people} {people === 1 ? "person" : "people"}
          {card.minCrew ? ` · min ${card.minCrew}` : ""}
        </span>
        {onHold && (
          <p className="flex w-full items-start gap-1 rounded bg-block-bg px-1.5 py-0.5 text-xs font-bold text-block" data-testid="hold">
            <StateIcon tone="block" className="mt-0.5 h-3 w-3 shrink-0" />
            On hold{card.holdReason ? `: ${card.holdReason}` : ""}
          </p>
        )}
        {!onHold && card.briefingState === "briefed" && <Badge tone="clear">Briefed</Badge>}
        {!onHold && card.briefingState === "not_started" && <Badge tone="muted">Briefing not started</Badge>}
        <a href={`/orders/${card.id}/briefing`} className="text-[11px] font-semibold text-info underline underline-offset-2">
          Briefing
        </a>
        <a href={`/orders/${card.id}`} className="text-[11px] font-semibold text-info underline underline-offset-2">
          Order
        </a>
        {locateWarning && (
          <p className="flex w-full items-start gap-1 rounded bg-warn-bg px-1.5 py-0.5 text-xs font-semibold text-warn">
            <StateIcon tone="warn" className="mt-0.5 h-3 w-3 shrink-0" />
            {locateWarning}
          </p>
        )}
      </div>
      <ul className="mt-2 grid gap-1.5 sm:grid-cols-2">
        {card.seats.map((s) => (
          <SeatSlot
            key={s.id}
            seat={s}
            worker={s.assignment ? workers.get(s.assignment.workerId) : undefined}
            preview={previewFor(s.id)}
            dragging={dragging}
            canResend={canResend}
          />
        ))}
      </ul>
      {equipmentRow?.(card)}
      {findings.length > 0 && (
        <div className="mt-2 border-t border-rule pt-2">
          <button
            type="button"
            className="text-xs font-bold text-ink-700 underline-offset-2 hover:underline"
            aria-expanded={open}
            onClick={() => setOpen((v) => !v)}
          >
            {open ? "Hide findings" : `Show findings (${findings.length})`}
          </button>
          {open && (
            <ul className="mt-1 space-y-1.5">
              {findings.map((f) => (
                <FindingRow
                  key={findingKey(f) + f.message}
                  finding={f}
                  override={valid.get(findingKey(f))}
                  workerName={f.workerId ? workers.get(Number(f.workerId))?.name : undefined}
                  canOverride={canOverride}
                  onOverride={onOverride}
                />
              ))}
            </ul>
          )}
        </div>
      )}
    </article>
  );
});
