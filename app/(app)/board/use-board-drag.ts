"use client";

// The board's drag and drop of people (split out of board-client.tsx): sensors, the seat
// index, what the dragged worker would do to the hovered seat (the client engine's preview),
// the words screen readers hear, and which change a drop asks for.
import {
  KeyboardSensor,
  MouseSensor,
  TouchSensor,
  pointerWithin,
  rectIntersection,
  useSensor,
  useSensors,
  type CollisionDetection,
} from "@dnd-kit/core";
import { useCallback, useMemo } from "react";
import type { BoardPayload, OrderCard } from "@/lib/board/model";
import type { RuleEngine } from "@/lib/rules/engine";
import type { Assignment, Position } from "@/lib/rules/types";
import { POSITION_LABEL } from "@/lib/format";
import { jumpToTargets, parseId, previewBlocks } from "./dnd";
import type { WorkerInfo } from "./order-card";
import type { Change } from "./use-board";

// Pointer first (what is under the finger or cursor), rectangles for the keyboard.
export const collision: CollisionDetection = (args) => {
  const hits = pointerWithin(args);
  return hits.length ? hits : rectIntersection(args);
};

export type SeatIndex = Map<number, { card: OrderCard; position: Position; workerId: number | null }>;

export function useBoardSensors() {
  return useSensors(
    useSensor(MouseSensor, { activationConstraint: { distance: 4 } }),
    useSensor(TouchSensor, { activationConstraint: { delay: 180, tolerance: 6 } }),
    useSensor(KeyboardSensor, { coordinateGetter: jumpToTargets }),
  );
}

export function useSeatIndex(orders: BoardPayload["orders"] | undefined): SeatIndex {
  return useMemo(() => {
    const m: SeatIndex = new Map();
    for (const o of orders ?? []) for (const s of o.seats) m.set(s.id, { card: o, position: s.position, workerId: s.assignment?.workerId ?? null });
    return m;
  }, [orders]);
}

/** The dragged worker and the blocks the hovered seat would get (computed once per hover target). */
export function useDragPreview(activeId: string | null, overId: string | null, seatIndex: SeatIndex, engine: RuleEngine | null) {
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
  return { dragged, previewFor };
}

/** What screen readers hear for a draggable or a drop target. */
export function useDescribe(workers: Map<number, WorkerInfo>, seatIndex: SeatIndex, describeEquipment: (id: string) => string | null | undefined) {
  return useCallback(
    (id: string | number) => {
      const p = parseId(String(id));
      if (!p) return describeEquipment(String(id)) ?? "nothing";
      if (p.kind === "pool-zone") return "the pool (off the order)";
      if (p.kind === "pool") return workers.get(p.n)?.name ?? "a worker";
      const s = seatIndex.get(p.n);
      if (!s) return "a position";
      const who = s.workerId !== null ? `${workers.get(s.workerId)?.name}, ` : "";
      return `${who}${POSITION_LABEL[s.position]} on ${s.card.number}`;
    },
    [workers, seatIndex, describeEquipment],
  );
}

/** The change a drop of `activeId` on `overId` asks for; a string when it is refused (why). */
export function dropChange(activeId: string, overId: string | null, seatIndex: SeatIndex): Change | string | null {
  const from = parseId(activeId);
  const to = parseId(overId);
  if (!from || !to || from.kind === "pool-zone") return null;
  if (from.kind === "seat" && to.kind === "seat" && to.n !== from.n && seatIndex.get(to.n)?.workerId != null) {
    // Dropped on another placed worker: the two trade seats (issue 18).
    return { kind: "swap", positionA: from.n, positionB: to.n };
  }
  if (from.kind === "pool" && to.kind === "seat") {
    const target = seatIndex.get(to.n);
    if (target?.workerId !== null) return "That position is taken: move its worker out first.";
    return { kind: "add", positionId: to.n, workerId: from.n };
  }
  if (from.kind === "seat") {
    const src = seatIndex.get(from.n);
    const seat = src?.card.seats.find((s) => s.id === from.n);
    if (!seat?.assignment) return null;
    if (to.kind === "pool-zone") return { kind: "remove", assignment: seat.assignment, fromPositionId: from.n };
    if (to.kind === "seat" && to.n !== from.n) {
      if (seatIndex.get(to.n)?.workerId !== null) return "That position is taken: move its worker out first.";
      return { kind: "move", assignment: seat.assignment, fromPositionId: from.n, positionId: to.n };
    }
  }
  return null;
}
