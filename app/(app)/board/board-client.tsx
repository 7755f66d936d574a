"use client";

import {
  DndContext,
  DragOverlay,
  KeyboardSensor,
  MouseSensor,
  TouchSensor,
  pointerWithin,
  rectIntersection,
  useSensor,
  useSensors,
  type CollisionDetection,
  type DragEndEvent,
  type DragOverEvent,
  type DragStartEvent,
} from "@dnd-kit/core";
import { useQueryClient } from "@tanstack/react-query";
import { usePathname, useRouter } from "next/navigation";
import { useCallback, useEffect, useMemo, useState } from "react";
import type { BoardPayload, OrderCard } from "@/lib/board/model";
import { findingKey } from "@/lib/board/model";
import { findingsForOrders } from "@/lib/rules/engine";
import type { Assignment, Finding, Position } from "@/lib/rules/types";
import { Badge, SafetyNote } from "@/components/status";
import { CLASSIFICATION_LABEL, fmtDate, POSITION_LABEL } from "@/lib/format";
import { addDays } from "@/lib/yards/data";
import { jumpToTargets, makeAnnouncements, parseId, previewBlocks, screenReaderInstructions } from "./dnd";
import { OrderCardView, type WorkerInfo } from "./order-card";
import { PoolPanel } from "./pool-panel";
import { FindingRow, OverrideDialog } from "./findings";
import { call, HttpError, useBoardMutations, useEngine, useToast, type Change } from "./use-board";
import { useBoardData, useLiveBoard } from "./use-board-live";
import { SendCrewsButton } from "./send-crews";
import { describeChange, inverseOf } from "./undo";
import { FillPanel } from "./fill-panel";
import { useEquipmentDnd } from "./use-equipment";
import { EquipmentPool } from "./equipment-pool";
import { EquipmentSeats } from "./equipment-seats";

// Pointer first (what is under the finger or cursor), rectangles for the keyboard.
const collision: CollisionDetection = (args) => {
  const hits = pointerWithin(args);
  return hits.length ? hits : rectIntersection(args);
};

export function BoardClient({
  day,
  yardCode,
  initial,
  initialVersion,
  role,
}: {
  day: string;
  yardCode: string;
  initial?: BoardPayload;
  /** The version of `initial` (lib/board/serve.ts), so the first refresh is a patch. */
  initialVersion?: string;
  role: string;
}) {
  const router = useRouter();
  const path = usePathname();
  const qc = useQueryClient();
  const { toast, notify } = useToast();
  const { key, data, error, isFetching } = useBoardData(day, yardCode, initial, initialVersion);
  const mutation = useBoardMutations(key, notify);
  const engine = useEngine(data);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [overId, setOverId] = useState<string | null>(null);
  const [overriding, setOverriding] = useState<Finding | null>(null);
  // Undo (issue 18): the changes made here, newest last; undo sends the opposite change.
  const [history, setHistory] = useState<{ change: Change; label: string }[]>([]);
  const live = useLiveBoard(key, data?.cursor, activeId !== null || mutation.isPending);
  // Equipment (issue 16): trucks dragged with the same sensors; their own locked write path.
  const equipmentDnd = useEquipmentDnd(key, data, notify, { activeId, overId });
  const equipmentById = useMemo(() => new Map((data?.equipment ?? []).map((e) => [e.id, e])), [data?.equipment]);
  const equipmentRow = useCallback(
    (card: OrderCard) => (
      <EquipmentSeats card={card} bookings={data?.equipmentBookings ?? []} equipment={equipmentById} day={data?.day ?? day} preview={equipmentDnd.preview} />
    ),
    [data?.equipmentBookings, equipmentById, data?.day, day, equipmentDnd.preview],
  );

  // Leaving the page while a change is still on its way would lose it: ask first.
  useEffect(() => {
    if (!mutation.isPending) return;
    const warn = (e: BeforeUnloadEvent) => e.preventDefault();
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [mutation.isPending]);

  const sensors = useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 4 } }),
    useSensor(TouchSensor, { activationConstraint: { delay: 180, tolerance: 6 } }),
    useSensor(KeyboardSensor, { coordinateGetter: jumpToTargets }),
  );

  const go = (d: string, y: string) => router.replace(`${path}?date=${d}&yard=${y}`);

  const seatIndex = useMemo(() => {
    const m = new Map<number, { card: OrderCard; position: Position; workerId: number | null }>();
    for (const o of data?.orders ?? []) for (const s of o.seats) m.set(s.id, { card: o, position: s.position, workerId: s.assignment?.workerId ?? null });
    return m;
  }, [data?.orders]);

  const workers = useMemo(() => {
    const m = new Map<number, WorkerInfo>();
    for (const p of data?.pool ?? []) m.set(p.id, { name: p.name, classification: p.classification, phone: p.phone });
    return m;
  }, [data?.pool]);

  const placedOn = useMemo(() => {
    const m = new Map<number, string[]>();
    for (const o of data?.orders ?? [])
      for (const s of o.seats)
        if (s.assignment) {
          const list = m.get(s.assignment.workerId) ?? [];
          if (!list.includes(o.number)) list.push(o.number);
          m.set(s.assignment.workerId, list);
        }
    // Held on another yard's order that day: placed there, not free (issue 18).
    for (const e of data?.placedElsewhere ?? []) {
      const list = m.get(e.workerId) ?? [];
      const label = `${e.number} at ${e.yardName}`;
      if (!list.includes(label)) list.push(label);
      m.set(e.workerId, list);
    }
    return m;
  }, [data?.orders, data?.placedElsewhere]);

  // While a write is in flight the view shows the client engine's findings over the
  // optimistic crew; once the server answers, its own findings (the authority) come back.
  const findings = useMemo(() => {
    if (!data) return [];
    if (mutation.isPending) return findingsForOrders(data.snapshot, data.boardOrderIds);
    return data.findings;
  }, [data, mutation.isPending]);

  const byOrder = useMemo(() => {
    const m = new Map<string, Finding[]>();
    for (const f of findings) {
      const list = m.get(f.workOrderId) ?? [];
      list.push(f);
      m.set(f.workOrderId, list);
    }
    return m;
  }, [findings]);

  const validOverrides = useMemo(() => new Set((data?.overrides ?? []).filter((o) => o.valid).map(findingKey)), [data?.overrides]);
  const unresolved = findings.filter((f) => f.level === "block" && (f.locked || !validOverrides.has(findingKey(f))));
  const warnCount = findings.filter((f) => f.level === "warn").length;

  // What the dragged thing would do to the hovered seat (computed once per hover target).
  const dragged = useMemo(() => {
    const p = parseId(activeId);
    if (!p || p.kind === "pool-zone") return null;
    if (p.kind === "pool") return { workerId: p.n, from: null as Assignment | null };
    const s = seatIndex.get(p.n);
    if (!s || s.workerId === null) return null;
    return { workerId: s.workerId, from: { workOrderId: String(s.card.id), workerId: String(s.workerId), position: s.position } };
  }, [activeId, seatIndex]);

  const preview = useMemo(() => {
    const p = parseId(overId);
    if (!engine || !dragged || !p || p.kind !== "seat") return null;
    const target = seatIndex.get(p.n);
    if (!target) return null;
    if (target.workerId !== null) return null;
    const add: Assignment = { workOrderId: String(target.card.id), workerId: String(dragged.workerId), position: target.position };
    return { positionId: p.n, blocks: previewBlocks(engine, { add, from: dragged.from ?? undefined }) };
  }, [engine, dragged, overId, seatIndex]);

  const previewFor = useCallback((positionId: number) => (preview && preview.positionId === positionId ? preview.blocks : null), [preview]);

  const describe = useCallback(
    (id: string | number) => {
      const p = parseId(String(id));
      if (!p) return equipmentDnd.describe(String(id)) ?? "nothing";
      if (p.kind === "pool-zone") return "the pool (off the order)";
      if (p.kind === "pool") return workers.get(p.n)?.name ?? "a worker";
      const s = seatIndex.get(p.n);
      if (!s) return "a position";
      const who = s.workerId !== null ? `${workers.get(s.workerId)?.name}, ` : "";
      return `${who}${POSITION_LABEL[s.position]} on ${s.card.number}`;
    },
    [workers, seatIndex],
  );

  function onDragStart(e: DragStartEvent) {
    setActiveId(String(e.active.id));
  }
  function onDragOver(e: DragOverEvent) {
    setOverId(e.over ? String(e.over.id) : null);
  }
  function onDragEnd(e: DragEndEvent) {
    if (equipmentDnd.onDragEnd(e)) {
      setActiveId(null);
      setOverId(null);
      return;
    }
    const from = parseId(String(e.active.id));
    const to = parseId(e.over ? String(e.over.id) : null);
    setActiveId(null);
    setOverId(null);
    if (!from || !to || from.kind === "pool-zone") return;
    let change: Change | null = null;
    if (from.kind === "seat" && to.kind === "seat" && to.n !== from.n && seatIndex.get(to.n)?.workerId != null) {
      // Dropped on another placed worker: the two trade seats (issue 18).
      change = { kind: "swap", positionA: from.n, positionB: to.n };
    } else if (from.kind === "pool" && to.kind === "seat") {
      const target = seatIndex.get(to.n);
      if (target?.workerId !== null) return notify("That position is taken: move its worker out first.", "error");
      change = { kind: "add", positionId: to.n, workerId: from.n };
    } else if (from.kind === "seat") {
      const src = seatIndex.get(from.n);
      const seat = src?.card.seats.find((s) => s.id === from.n);
      if (!seat?.assignment) return;
      if (to.kind === "pool-zone") change = { kind: "remove", assignment: seat.assignment, fromPositionId: from.n };
      else if (to.kind === "seat" && to.n !== from.n) {
        if (seatIndex.get(to.n)?.workerId !== null) return notify("That position is taken: move its worker out first.", "error");
        change = { kind: "move", assignment: seat.assignment, fromPositionId: from.n, positionId: to.n };
      }
    }
    if (change) apply(change);
  }

  const nameOf = useCallback((id: number) => workers.get(id)?.name ?? "a worker", [workers]);

  /** Every board change goes through here: the locked write path, then into the undo history. */
  function apply(change: Change, opts: { undo?: boolean } = {}) {
    const label = data ? describeChange(change, data, nameOf) : "the last change";
    mutation
      .mutateAsync(change)
      .then(() => {
        if (!opts.undo) setHistory((h) => [...h.slice(-19), { change, label }]);
      })
      .catch(() => {
        /* onError has put the board back and said why */
      });
  }

  const undo = useCallback(() => {
    const last = history[history.length - 1];
    if (!last || !data || mutation.isPending) return;
    const inverse = inverseOf(last.change, data);
    setHistory((h) => h.slice(0, -1));
    if (!inverse) {
      notify(`Cannot undo ${last.label}: those seats have changed since.`, "error");
      return;
    }
    notify(`Undoing ${last.label}…`, "ok");
    apply(inverse, { undo: true });
  }, [history, data, mutation.isPending]); // eslint-disable-line react-hooks/exhaustive-deps

  // Ctrl+Z / Cmd+Z undoes the last board change, except while typing in a field.
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!(e.ctrlKey || e.metaKey) || e.shiftKey || e.altKey || e.key.toLowerCase() !== "z") return;
      const t = e.target as HTMLElement | null;
      if (t && (t.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(t.tagName))) return;
      e.preventDefault();
      undo();
    };
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [undo]);

  async function submitOverride(reason: string): Promise<string | null> {
    if (!overriding) return null;
    try {
      await call("/api/overrides", {
        method: "POST",
        body: JSON.stringify({
          workOrderId: Number(overriding.workOrderId),
          rule: overriding.rule,
          workerId: overriding.workerId === null ? null : Number(overriding.workerId),
          reason,
        }),
      });
      setOverriding(null);
      notify(`${overriding.rule} overridden.`, "ok");
      await qc.invalidateQueries({ queryKey: key });
      return null;
    } catch (err) {
      return err instanceof HttpError ? err.message : "Not saved; try again.";
    }
  }

  if (error && !data) {
    return (
      <div role="alert" className="card p-6">
        <p className="font-bold text-block">✖ The board could not be loaded.</p>
        <p className="mt-1 text-sm text-ink-700">{error.message}</p>
      </div>
    );
  }
  if (!data) return <p className="p-6 text-sm text-ink-500">Loading the board…</p>;

  const orders = [...data.orders].sort((a, b) => {
    // A declined seat raises its order to the top of the day's list.
    const da = a.seats.some((s) => !s.assignment && s.declinedBy) ? 0 : 1;
    const dbb = b.seats.some((s) => !s.assignment && s.declinedBy) ? 0 : 1;
    return da - dbb;
  });
  const activeName = dragged ? workers.get(dragged.workerId) : undefined;
  const canOverride = role === "supervisor";
  const overridingCard = overriding ? data.orders.find((o) => String(o.id) === overriding.workOrderId) : undefined;
  const dayLevel = findings.filter((f) => !data.boardOrderIds.includes(f.workOrderId));

  return (
    <DndContext
      sensors={sensors}
      collisionDetection={collision}
      onDragStart={onDragStart}
      onDragOver={onDragOver}
      onDragEnd={onDragEnd}
      onDragCancel={() => {
        setActiveId(null);
        setOverId(null);
      }}
      accessibility={{ announcements: makeAnnouncements(describe), screenReaderInstructions }}
      // Issue 18: scroll only when the pointer is right at the window's edge (5 % of its height,
      // not dnd-kit's default 20 %), and slowly; the pool is sticky, so lower orders are reached
      // by scrolling the page first, not by dragging into the edge.
      autoScroll={{ threshold: { x: 0.05, y: 0.05 }, acceleration: 3 }}
    >
      <div className="mb-4 flex flex-wrap items-end justify-between gap-3">
        <div>
          <p className="text-xs font-bold uppercase tracking-widest text-copper">Board · {data.yard.name}</p>
          <h1 className="text-xl font-extrabold tracking-tight" data-testid="board-day">
            {fmtDate(data.day, { weekday: "long", month: "long", day: "numeric", year: "numeric" })}
          </h1>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className="btn-quiet" onClick={() => go(addDays(day, -1), yardCode)} aria-label="Previous day">
            ←
          </button>
          <input
            type="date"
            aria-label="Day"
            className="field w-auto"
            value={day}
            onChange={(e) => e.target.value && go(e.target.value, yardCode)}
          />
          <button type="button" className="btn-quiet" onClick={() => go(addDays(day, 1), yardCode)} aria-label="Next day">
            →
          </button>
          <select aria-label="Yard" className="field w-auto" value={yardCode} onChange={(e) => go(day, e.target.value)}>
            {data.yards.map((y) => (
              <option key={y.id} value={y.code}>
                {y.name}
              </option>
            ))}
          </select>
          {(role === "dispatcher" || role === "supervisor") && (
            <button
              type="button"
              className="btn-quiet"
              data-testid="undo"
              disabled={history.length === 0 || mutation.isPending}
              aria-keyshortcuts="Control+Z Meta+Z"
              title={history.length ? `Undo ${history[history.length - 1].label} (Ctrl+Z)` : "Nothing to undo"}
              onClick={undo}
            >
              ↶ Undo
              <span className="sr-only">{history.length ? `: ${history[history.length - 1].label}` : ""}</span>
            </button>
          )}
          <FillPanel day={day} yard={yardCode} role={role} />
          <SendCrewsButton day={day} yard={yardCode} unresolved={unresolved.length} role={role} onDone={() => qc.invalidateQueries({ queryKey: key })} notify={notify} />
        </div>
      </div>

      <div className="mb-4 flex flex-wrap items-center gap-2 text-sm" data-testid="day-summary">
        {unresolved.length ? (
          <Badge tone="block">
            {unresolved.length} unresolved block{unresolved.length > 1 ? "s" : ""}
          </Badge>
        ) : (
          <Badge tone="clear">No unresolved blocks</Badge>
        )}
        {warnCount > 0 && <Badge tone="warn">{warnCount} warning{warnCount === 1 ? "" : "s"}</Badge>}
        <span className="text-ink-500">
          {data.orders.length} orders · {data.orders.reduce((n, o) => n + o.seats.filter((s) => !s.assignment).length, 0)} open positions
        </span>
        <span className="text-xs text-ink-500" data-testid="live-status" data-mode={live}>
          · {live === "stream" ? "live" : live === "polling" ? "checking every 2 s" : "connecting…"}
        </span>
        {isFetching && <span className="text-xs text-ink-500">· refreshing…</span>}
        {unresolved.length > 0 && (
          <span className="text-xs text-ink-700" data-testid="send-reason">
            Send crews stays off until every block is fixed or overridden by a supervisor.
          </span>
        )}
      </div>

      {data.onCall.length > 0 && (
        <p className="mb-3 text-sm text-ink-700" data-testid="on-call">
          <span className="font-bold">On call tonight:</span>{" "}
          {data.onCall.map((o) => `${o.workerName} (${o.rotationName})`).join(", ")} — a call-out can leave them short of rest.
        </p>
      )}

      <SafetyNote className="mb-4" />

      <div className="grid gap-4 md:grid-cols-[260px_minmax(0,1fr)] lg:grid-cols-[320px_minmax(0,1fr)]">
        <aside className="card min-w-0 p-3 md:sticky md:top-3 md:max-h-[calc(100vh-1.5rem)] md:self-start md:overflow-y-auto" data-testid="pool-panel">
          <PoolPanel payload={data} placedOn={placedOn} />
          <EquipmentPool payload={data} />
        </aside>
        <div className="grid min-w-0 grid-cols-1 content-start gap-3 xl:grid-cols-2 2xl:grid-cols-3" data-testid="orders">
          {orders.map((o) => (
            <OrderCardView
              key={o.id}
              card={o}
              timezone={data.yard.timezone}
              findings={byOrder.get(String(o.id)) ?? []}
              overrides={data.overrides.filter((v) => v.workOrderId === o.id)}
              workers={workers}
              previewFor={previewFor}
              dragging={activeId !== null}
              canOverride={canOverride}
              onOverride={setOverriding}
              locateWarning={o.locateWarning}
              canResend={role === "dispatcher" || role === "supervisor"}
              equipmentRow={equipmentRow}
            />
          ))}
          {orders.length === 0 && <p className="card p-6 text-sm text-ink-500">No work orders for this yard on this day.</p>}
          {dayLevel.length > 0 && (
            <section className="card p-3 xl:col-span-2">
              <h2 className="text-sm font-bold">Findings on other yards&apos; orders these workers share</h2>
              <ul className="mt-1 space-y-1">
                {dayLevel.map((f) => (
                  <FindingRow key={findingKey(f)} finding={f} canOverride={false} onOverride={() => {}} />
                ))}
              </ul>
            </section>
          )}
        </div>
      </div>

      <DragOverlay dropAnimation={null}>
        {activeName ? (
          <div data-testid="drag-overlay" className="rounded-md border border-copper bg-white px-2.5 py-1.5 text-sm font-bold shadow-lg">
            {activeName.name} <span className="text-xs font-semibold text-ink-500">{CLASSIFICATION_LABEL[activeName.classification]}</span>
          </div>
        ) : equipmentDnd.dragged(activeId) ? (
          <div data-testid="drag-overlay" className="rounded-md border border-copper bg-white px-2.5 py-1.5 text-sm font-bold shadow-lg">
            {equipmentDnd.dragged(activeId)!.unitNumber} <span className="text-xs font-semibold text-ink-500">{equipmentDnd.dragged(activeId)!.name}</span>
          </div>
        ) : null}
      </DragOverlay>

      {overriding && overridingCard && (
        <OverrideDialog finding={overriding} orderNumber={overridingCard.number} onClose={() => setOverriding(null)} onSubmit={submitOverride} />
      )}

      <div aria-live="polite" className="fixed bottom-4 right-4 z-40">
        {toast && (
          <p
            role={toast.tone === "error" ? "alert" : "status"}
            className={`max-w-sm rounded-md px-3 py-2 text-sm font-semibold shadow-lg ${
              toast.tone === "error" ? "bg-block text-white" : "bg-ink text-paper"
            }`}
          >
            {toast.tone === "error" ? "✖ " : "✓ "}
            {toast.msg}
          </p>
        )}
      </div>
    </DndContext>
  );
}
