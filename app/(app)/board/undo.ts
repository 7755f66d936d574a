import type { BoardPayload } from "@/lib/board/model";
import type { Change } from "./use-board";

// Undo of the last board change (issue 18): the opposite change, worked out against the board
// as it is now and sent through the same locked write path as any drop (so a version check
// refuses it when someone else changed those seats meanwhile). null = it cannot be undone now.

function seatOf(p: BoardPayload, positionId: number) {
  for (const o of p.orders) for (const s of o.seats) if (s.id === positionId) return { order: o, seat: s };
  return null;
}

export function inverseOf(c: Change, now: BoardPayload): Change | null {
  switch (c.kind) {
    case "add": {
      const at = seatOf(now, c.positionId);
      if (!at?.seat.assignment || at.seat.assignment.workerId !== c.workerId) return null;
      return { kind: "remove", assignment: at.seat.assignment, fromPositionId: c.positionId };
    }
    case "remove": {
      const at = seatOf(now, c.fromPositionId);
      if (!at || at.seat.assignment) return null;
      return { kind: "add", positionId: c.fromPositionId, workerId: c.assignment.workerId };
    }
    case "move": {
      const at = seatOf(now, c.positionId);
      const back = seatOf(now, c.fromPositionId);
      if (!at?.seat.assignment || at.seat.assignment.workerId !== c.assignment.workerId || !back || back.seat.assignment) return null;
      return { kind: "move", assignment: at.seat.assignment, fromPositionId: c.positionId, positionId: c.fromPositionId };
    }
    case "swap": {
      const a = seatOf(now, c.positionA);
      const b = seatOf(now, c.positionB);
      if (!a?.seat.assignment || !b?.seat.assignment) return null;
      return { kind: "swap", positionA: c.positionA, positionB: c.positionB };
    }
    default:
      return null;
  }
}

/** Words for the Undo button: what the last change did. */
export function describeChange(c: Change, p: BoardPayload, nameOf: (workerId: number) => string): string {
  const where = (positionId: number) => {
    const at = seatOf(p, positionId);
    return at ? `${at.seat.position} on ${at.order.number}` : "a seat";
  };
  switch (c.kind) {
    case "add":
      return `${nameOf(c.workerId)} placed as ${where(c.positionId)}`;
    case "remove":
      return `${nameOf(c.assignment.workerId)} taken off ${where(c.fromPositionId)}`;
    case "move":
      return `${nameOf(c.assignment.workerId)} moved to ${where(c.positionId)}`;
    case "swap":
      return `swap of ${where(c.positionA)} and ${where(c.positionB)}`;
    default:
      return "the last change";
  }
}
