"use client";

import { KeyboardCode, type Announcements, type KeyboardCoordinateGetter } from "@dnd-kit/core";
import type { RuleEngine } from "@/lib/rules/engine";
import type { Assignment, Finding } from "@/lib/rules/types";
import { findingKey } from "@/lib/board/model";

// Drag ids: "pool:<workerId>" and "seat:<positionId>" for things picked up;
// "seat:<positionId>" and "pool" for places to drop.
export const poolId = (workerId: number) => `pool:${workerId}`;
export const seatId = (positionId: number) => `seat:${positionId}`;
export const POOL_DROP = "pool";

export function parseId(id: string | number | undefined | null): { kind: "pool" | "seat"; n: number } | { kind: "pool-zone" } | null {
  if (id === undefined || id === null) return null;
  const s = String(id);
  if (s === POOL_DROP) return { kind: "pool-zone" };
  const [kind, n] = s.split(":");
  if ((kind === "pool" || kind === "seat") && Number.isFinite(Number(n))) return { kind, n: Number(n) };
  return null;
}

/**
 * Keyboard dragging that jumps from one drop target to the next in the arrow's direction
 * (rather than nudging a few pixels), so a keyboard user reaches any position in a few presses.
 */
export const jumpToTargets: KeyboardCoordinateGetter = (event, { context, currentCoordinates }) => {
  const dirs: Record<string, [number, number]> = {
    [KeyboardCode.Right]: [1, 0],
    [KeyboardCode.Left]: [-1, 0],
    [KeyboardCode.Down]: [0, 1],
    [KeyboardCode.Up]: [0, -1],
  };
  const dir = dirs[event.code];
  if (!dir) return undefined;
  event.preventDefault();
  const { collisionRect, droppableRects, droppableContainers, active } = context;
  if (!collisionRect) return undefined;
  const cx = collisionRect.left + collisionRect.width / 2;
  const cy = collisionRect.top + collisionRect.height / 2;
  let best: { x: number; y: number; score: number } | null = null;
  for (const container of droppableContainers.getEnabled()) {
    if (container.id === active?.id) continue;
    const rect = droppableRects.get(container.id);
    if (!rect) continue;
    const tx = rect.left + rect.width / 2;
    const ty = rect.top + rect.height / 2;
    const dx = tx - cx;
    const dy = ty - cy;
    const along = dx * dir[0] + dy * dir[1];
    if (along <= 4) continue; // not in that direction
    const across = Math.abs(dx * dir[1]) + Math.abs(dy * dir[0]);
    const score = along + across * 2;
    if (!best || score < best.score) best = { x: tx, y: ty, score };
  }
  if (!best) return currentCoordinates;
  return {
    x: currentCoordinates.x + (best.x - cx),
    y: currentCoordinates.y + (best.y - cy),
  };
};

/** New block findings a hypothetical change would raise (compared with the crew as it is). */
export function previewBlocks(engine: RuleEngine, change: { add?: Assignment; from?: Assignment }): Finding[] {
  const before = new Set(engine.findings().filter((f) => f.level === "block").map(findingKey));
  let after: Finding[];
  try {
    if (change.add && change.from) {
      after = engine.apply({ kind: "move", from: change.from, to: change.add });
      engine.apply({ kind: "move", from: change.add, to: change.from });
    } else if (change.add) {
      after = engine.apply({ kind: "add", assignment: change.add });
      engine.apply({ kind: "remove", assignment: change.add });
    } else {
      return [];
    }
  } catch {
    return [];
  }
  return after.filter((f) => f.level === "block" && !before.has(findingKey(f)));
}

export function makeAnnouncements(describe: (id: string | number) => string): Announcements {
  return {
    onDragStart: ({ active }) => `Picked up ${describe(active.id)}. Use the arrow keys to move between positions, Space to drop, Escape to cancel.`,
    onDragOver: ({ active, over }) =>
      over ? `${describe(active.id)} is over ${describe(over.id)}.` : `${describe(active.id)} is not over a position.`,
    onDragEnd: ({ active, over }) =>
      over ? `${describe(active.id)} was dropped on ${describe(over.id)}.` : `${describe(active.id)} was dropped outside any position.`,
    onDragCancel: ({ active }) => `Dragging ${describe(active.id)} was cancelled.`,
  };
}

export const screenReaderInstructions = {
  draggable:
    "To pick up a worker, press Space or Enter. Use the arrow keys to move to a position on a work order, then press Space or Enter to place them there, or Escape to cancel.",
};
