"use client";

import { DndContext, DragOverlay, type DragEndEvent } from "@dnd-kit/core";
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useState } from "react";
import type { BoardPayload, OrderCard } from "@/lib/board/model";
import { findingKey } from "@/lib/board/model";
import type { Finding } from "@/lib/rules/types";
import { SafetyNote } from "@/components/status";
import { CLASSIFICATION_LABEL } from "@/lib/format";
import { makeAnnouncements, screenReaderInstructions } from "./dnd";
import { OrderCardView } from "./order-card";
import { PoolPanel } from "./pool-panel";
import { FindingRow, OverrideDialog } from "./findings";
import { call, HttpError, useBoardMutations, useEngine, useToast } from "./use-board";
import { useBoardData, useLiveBoard } from "./use-board-live";
import { useEquipmentDnd } from "./use-equipment";
import { EquipmentPool } from "./equipment-pool";
import { EquipmentSeats } from "./equipment-seats";
import { collision, dropChange, useBoardSensors, useDescribe, useDragPreview, useSeatIndex } from "./use-board-drag";
import { useUndoableChanges } from "./use-undo";
import { useBoardViews } from "./use-board-views";
import { BoardToolbar, DaySummary, Toast } from "./board-toolbar";

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
  /** The version of `initial` (lib/board/data-serve.ts), so the first refresh is a patch. */
  initialVersion?: string;
  role: string;
}) {
  const qc = useQueryClient();
  const { toast, notify } = useToast();
  const { key, data, error, isFetching } = useBoardData(day, yardCode, initial, initialVersion);
  const mutation = useBoardMutations(key, notify);
  const engine = useEngine(data);
  const [activeId, setActiveId] = useState<string | null>(null);
  const [overId, setOverId] = useState<string | null>(null);
  const [overriding, setOverriding] = useState<Finding | null>(null);
  // Pushed changes (Server-Sent Events), polling while the stream is down; paused mid-drag.
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

  const sensors = useBoardSensors();
  const seatIndex = useSeatIndex(data?.orders);
  const { workers, placedOn, findings, byOrder, unresolved, warnCount } = useBoardViews(data, mutation.isPending);
  const { dragged, previewFor } = useDragPreview(activeId, overId, seatIndex, engine);
  const describe = useDescribe(workers, seatIndex, equipmentDnd.describe);
  const nameOf = useCallback((id: number) => workers.get(id)?.name ?? "a worker", [workers]);
  // Undo (issue 18): every change goes through apply, then into the undo history.
  const { history, apply, undo } = useUndoableChanges(data, mutation, nameOf, notify);

  function onDragEnd(e: DragEndEvent) {
    if (equipmentDnd.onDragEnd(e)) {
      setActiveId(null);
      setOverId(null);
      return;
    }
    setActiveId(null);
    setOverId(null);
    const change = dropChange(String(e.active.id), e.over ? String(e.over.id) : null, seatIndex);
    if (typeof change === "string") notify(change, "error");
    else if (change) apply(change);
  }

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
  const draggedTruck = equipmentDnd.dragged(activeId);

  return (
    <DndContext
      id="board"
      sensors={sensors}
      collisionDetection={collision}
      onDragStart={(e) => setActiveId(String(e.active.id))}
      onDragOver={(e) => setOverId(e.over ? String(e.over.id) : null)}
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
      <BoardToolbar
        data={data}
        day={day}
        yardCode={yardCode}
        role={role}
        history={history}
        pending={mutation.isPending}
        onUndo={undo}
        unresolved={unresolved.length}
        onSent={() => qc.invalidateQueries({ queryKey: key })}
        notify={notify}
      />
      <DaySummary data={data} unresolved={unresolved.length} warnCount={warnCount} live={live} isFetching={isFetching} />

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
        ) : draggedTruck ? (
          <div data-testid="drag-overlay" className="rounded-md border border-copper bg-white px-2.5 py-1.5 text-sm font-bold shadow-lg">
            {draggedTruck.unitNumber} <span className="text-xs font-semibold text-ink-500">{draggedTruck.name}</span>
          </div>
        ) : null}
      </DragOverlay>

      {overriding && overridingCard && (
        <OverrideDialog finding={overriding} orderNumber={overridingCard.number} onClose={() => setOverriding(null)} onSubmit={submitOverride} />
      )}

      <Toast toast={toast} />
    </DndContext>
  );
}
