"use client";

import { useDraggable, useDroppable } from "@dnd-kit/core";
import { useVirtualizer } from "@tanstack/react-virtual";
import { memo, useMemo, useRef, useState } from "react";
import type { BoardPayload, PoolWorker } from "@/lib/board/model";
import type { Worker } from "@/lib/rules/types";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import { daysBetween } from "@/lib/time/days";
import { POOL_DROP, poolId } from "./dnd";

export const CRED_LABEL: Record<string, string> = {
  climbing: "Climb",
  first_aid_cpr: "FA/CPR",
  pole_top_rescue: "Pole rescue",
  aerial_rescue: "Lift rescue",
  equipment_operator: "Operator",
  // An operator who also counts toward the two-worker minimum (CREW-CHECK.md, Corrections 1).
  qualified_electrical: "Qualified elec.",
  cdl_a: "CDL-A",
  cdl_b: "CDL-B",
};

export type CredState = "valid" | "lapsing" | "lapsed";

export function credState(expiresOn: string | null, day: string, warnDays: number): CredState {
  if (expiresOn === null) return "valid";
  const left = daysBetween(day, expiresOn);
  if (left < 0) return "lapsed";
  return left < warnDays ? "lapsing" : "valid";
}

function CredChip({ type, state }: { type: string; state: CredState }) {
  const cls =
    state === "lapsed"
      ? "border-block text-block line-through"
      : state === "lapsing"
        ? "border-warn bg-warn-bg text-warn"
        : "border-rule text-ink-700";
  const mark = state === "lapsed" ? "✖ " : state === "lapsing" ? "▲ " : "";
  return (
    <span
      className={`rounded border px-1 text-[11px] font-semibold leading-4 ${cls}`}
      title={`${CRED_LABEL[type] ?? type}: ${state === "lapsed" ? "lapsed" : state === "lapsing" ? "lapsing soon" : "valid"}`}
    >
      {mark}
      {CRED_LABEL[type] ?? type}
    </span>
  );
}

export interface PoolItem {
  pw: PoolWorker;
  w: Worker | undefined;
  placedOn: string[];
}

const WorkerCard = memo(function WorkerCard({
  item,
  day,
  warnDays,
  minRest,
}: {
  item: PoolItem;
  day: string;
  warnDays: number;
  minRest: number;
}) {
  const { pw, w, placedOn } = item;
  const { attributes, listeners, setNodeRef, isDragging } = useDraggable({ id: poolId(pw.id), data: { workerId: pw.id } });
  const short = pw.restHours !== null && pw.restHours < minRest;
  // The name a screen reader hears replaces the card's text, so it carries what the chips show.
  const notes = [
    ...(w?.credentials ?? [])
      .filter((c) => CRED_LABEL[c.type])
      .map((c) => ({ label: CRED_LABEL[c.type], state: credState(c.expiresOn, day, warnDays) }))
      .filter((c) => c.state !== "valid")
      .map((c) => `${c.label} ${c.state === "lapsed" ? "lapsed" : "lapsing soon"}`),
    pw.unavailableReason ? `on ${pw.unavailableReason}` : "",
    short ? `rest ${pw.restHours} h` : "",
    pw.onCallTonight ? "on call tonight" : "",
    placedOn.length > 0 ? `on ${placedOn.join(", ")}` : "",
  ].filter(Boolean);
  return (
    <div
      ref={setNodeRef}
      {...listeners}
      {...attributes}
      aria-label={[`${pw.name}, ${CLASSIFICATION_LABEL[pw.classification]}, ${pw.yardCode}`, ...notes].join(", ")}
      data-testid={`pool-worker-${pw.employeeNo}`}
      className={`cursor-grab touch-none rounded-md border border-rule bg-white px-2.5 py-1.5 text-sm shadow-sm outline-none focus-visible:ring-2 focus-visible:ring-copper ${
        isDragging ? "opacity-40" : ""
      }`}
    >
      <div className="flex items-center justify-between gap-2">
        <span className="truncate font-bold">{pw.name}</span>
        <span className="shrink-0 text-[11px] font-semibold text-ink-500">
          {pw.yardCode} · {pw.employeeNo}
        </span>
      </div>
      <div className="mt-0.5 flex flex-wrap items-center gap-1">
        <span className="text-xs text-ink-700">{CLASSIFICATION_LABEL[pw.classification]}</span>
        {(w?.credentials ?? [])
          .filter((c) => CRED_LABEL[c.type])
          .map((c) => (
            <CredChip key={c.type} type={c.type} state={credState(c.expiresOn, day, warnDays)} />
          ))}
      </div>
      <div className="mt-0.5 flex flex-wrap gap-1 text-[11px] font-semibold">
        {pw.unavailableReason && <span className="rounded bg-block-bg px-1 text-block">✖ On {pw.unavailableReason}</span>}
        {short && <span className="rounded bg-warn-bg px-1 text-warn">▲ Rest {pw.restHours} h</span>}
        {pw.onCallTonight && <span className="rounded bg-info-bg px-1 text-info">● On call</span>}
        {placedOn.length > 0 && <span className="rounded bg-paper-200 px-1 text-ink-700">On {placedOn.join(", ")}</span>}
      </div>
    </div>
  );
});

export function PoolPanel({ payload, placedOn }: { payload: BoardPayload; placedOn: Map<number, string[]> }) {
  const [text, setText] = useState("");
  const [classification, setClassification] = useState("");
  const [cred, setCred] = useState("");
  const [yard, setYard] = useState<string>(String(payload.yard.id));
  const [readyOnly, setReadyOnly] = useState(false);
  const [hidePlaced, setHidePlaced] = useState(true);
  const { setNodeRef, isOver } = useDroppable({ id: POOL_DROP });
  const workers = useMemo(() => new Map(payload.snapshot.workers.map((w) => [w.id, w])), [payload.snapshot.workers]);
  const { day } = payload;
  const { credentialWarnDays: warnDays, minRestHours } = payload.policy;

  const items = useMemo(() => {
    const t = text.trim().toLowerCase();
    return payload.pool
      .map((pw): PoolItem => ({ pw, w: workers.get(String(pw.id)), placedOn: placedOn.get(pw.id) ?? [] }))
      .filter(({ pw, w, placedOn: on }) => {
        if (t && !`${pw.name} ${pw.employeeNo}`.toLowerCase().includes(t)) return false;
        if (classification && pw.classification !== classification) return false;
        if (yard && String(pw.yardId) !== yard) return false;
        if (hidePlaced && on.length) return false;
        if (cred) {
          const c = w?.credentials.find((x) => x.type === cred);
          if (!c || credState(c.expiresOn, day, warnDays) === "lapsed") return false;
        }
        if (readyOnly && (pw.unavailableReason || (pw.restHours !== null && pw.restHours < minRestHours))) return false;
        return true;
      });
  }, [payload.pool, workers, placedOn, text, classification, yard, cred, readyOnly, hidePlaced, day, warnDays, minRestHours]);

  return (
    <section aria-label="Available workers" className="flex min-h-0 flex-col">
      <div className="space-y-2 border-b border-rule pb-3">
        <h2 className="text-sm font-extrabold uppercase tracking-wide text-ink-700">
          Pool <span className="font-semibold text-ink-500">({items.length})</span>
        </h2>
        <input
          type="search"
          aria-label="Search workers"
          placeholder="Search name or number"
          className="field"
          value={text}
          onChange={(e) => setText(e.target.value)}
        />
        <div className="grid grid-cols-3 gap-2">
          <select aria-label="Classification" className="field min-w-0 px-2" value={classification} onChange={(e) => setClassification(e.target.value)}>
            <option value="">Any class</option>
            {Object.entries(CLASSIFICATION_LABEL).map(([k, v]) => (
              <option key={k} value={k}>
                {v}
              </option>
            ))}
          </select>
          <select aria-label="Credential" className="field min-w-0 px-2" value={cred} onChange={(e) => setCred(e.target.value)}>
            <option value="">Any credential</option>
            {Object.entries(CRED_LABEL).map(([k, v]) => (
              <option key={k} value={k}>
                {v}
              </option>
            ))}
          </select>
          <select aria-label="Yard" className="field min-w-0 px-2" value={yard} onChange={(e) => setYard(e.target.value)}>
            <option value="">All yards</option>
            {payload.yards.map((y) => (
              <option key={y.id} value={y.id}>
                {y.code}
              </option>
            ))}
          </select>
        </div>
        <div className="flex flex-wrap gap-x-4 gap-y-1 text-xs font-semibold text-ink-700">
          <label className="inline-flex items-center gap-1.5">
            <input type="checkbox" checked={readyOnly} onChange={(e) => setReadyOnly(e.target.checked)} /> Available and rested only
          </label>
          <label className="inline-flex items-center gap-1.5">
            <input type="checkbox" checked={hidePlaced} onChange={(e) => setHidePlaced(e.target.checked)} /> Hide placed
          </label>
        </div>
      </div>
      <div
        ref={setNodeRef}
        data-testid="pool-drop"
        className={`mt-2 min-h-24 flex-1 rounded-md ${isOver ? "bg-copper-100 ring-2 ring-copper" : ""}`}
      >
        {isOver && <p className="p-2 text-xs font-semibold text-copper">Drop here to take them off the order</p>}
        <PoolList items={items} day={day} warnDays={warnDays} minRest={minRestHours} />
      </div>
    </section>
  );
}

/** Plain list for ordinary yards; virtualised past a few hundred people. */
function PoolList({ items, day, warnDays, minRest }: { items: PoolItem[]; day: string; warnDays: number; minRest: number }) {
  const parent = useRef<HTMLDivElement>(null);
  const virtual = items.length > 200;
  const v = useVirtualizer({
    count: virtual ? items.length : 0,
    getScrollElement: () => parent.current,
    estimateSize: () => 78,
    overscan: 12,
  });
  if (!virtual) {
    return (
      <div className="max-h-[45vh] space-y-1.5 overflow-y-auto pr-1 md:max-h-[calc(100vh-330px)]">
        {items.map((it) => (
          <WorkerCard key={it.pw.id} item={it} day={day} warnDays={warnDays} minRest={minRest} />
        ))}
        {items.length === 0 && <p className="p-3 text-sm text-ink-500">Nobody matches these filters.</p>}
      </div>
    );
  }
  return (
    <div ref={parent} className="max-h-[45vh] overflow-y-auto pr-1 md:max-h-[calc(100vh-330px)]">
      <div style={{ height: v.getTotalSize(), position: "relative" }}>
        {v.getVirtualItems().map((row) => (
          <div
            key={items[row.index].pw.id}
            ref={v.measureElement}
            data-index={row.index}
            style={{ position: "absolute", top: 0, left: 0, right: 0, transform: `translateY(${row.start}px)` }}
            className="pb-1.5"
          >
            <WorkerCard item={items[row.index]} day={day} warnDays={warnDays} minRest={minRest} />
          </div>
        ))}
      </div>
    </div>
  );
}
